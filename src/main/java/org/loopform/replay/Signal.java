package org.loopform.replay;

import java.util.Arrays;

/**
 * One logged signal: its points in time order, seconds from the record's start, values in the
 * units logged (engineering units). A historian keeps a point only where the value moved enough
 * (compression) or at its own logging interval, so points may be irregular; {@link #at} reads the
 * signal between them by linear interpolation, the reconstruction historian compression is built
 * for (common practice: swinging-door and deadband compression keep the points a straight line
 * between them stays within the deadband of). Immutable.
 */
public final class Signal {

    private final String name;
    private final double[] timesSeconds;
    private final double[] values;

    /**
     * @param name         the column's name, for messages
     * @param timesSeconds strictly increasing, finite
     * @param values       finite, one per time
     */
    public Signal(String name, double[] timesSeconds, double[] values) {
        if (name == null || timesSeconds == null || values == null) {
            throw new IllegalArgumentException("a signal needs a name, times and values");
        }
        if (timesSeconds.length != values.length || timesSeconds.length < 2) {
            throw new IllegalArgumentException("signal " + name + " needs at least two points, one value a time (got "
                    + timesSeconds.length + " times, " + values.length + " values)");
        }
        for (int k = 0; k < timesSeconds.length; k++) {
            if (!Double.isFinite(timesSeconds[k]) || !Double.isFinite(values[k])) {
                throw new IllegalArgumentException("signal " + name + ": point " + k + " is not finite");
            }
            if (k > 0 && !(timesSeconds[k] > timesSeconds[k - 1])) {
                throw new IllegalArgumentException("signal " + name + ": times must increase (point " + k + ")");
            }
        }
        this.name = name;
        this.timesSeconds = timesSeconds.clone();
        this.values = values.clone();
    }

    public String name() {
        return name;
    }

    public int size() {
        return values.length;
    }

    public double firstSeconds() {
        return timesSeconds[0];
    }

    public double lastSeconds() {
        return timesSeconds[timesSeconds.length - 1];
    }

    public double timeSeconds(int k) {
        return timesSeconds[k];
    }

    public double value(int k) {
        return values[k];
    }

    /**
     * The value at {@code t} seconds by linear interpolation between the points either side
     * (the first or last value outside them).
     */
    public double at(double t) {
        int k = Arrays.binarySearch(timesSeconds, t);
        if (k >= 0) {
            return values[k];
        }
        int after = -k - 1;
        if (after == 0) {
            return values[0];
        }
        if (after == values.length) {
            return values[values.length - 1];
        }
        double t0 = timesSeconds[after - 1];
        double t1 = timesSeconds[after];
        double w = (t - t0) / (t1 - t0);
        return values[after - 1] + w * (values[after] - values[after - 1]);
    }

    /** The median interval between consecutive points, s. */
    public double medianIntervalSeconds() {
        double[] d = new double[timesSeconds.length - 1];
        for (int k = 1; k < timesSeconds.length; k++) {
            d[k - 1] = timesSeconds[k] - timesSeconds[k - 1];
        }
        Arrays.sort(d);
        int n = d.length;
        return n % 2 == 1 ? d[n / 2] : 0.5 * (d[n / 2 - 1] + d[n / 2]);
    }

    /** The share (0..1) of values outside {@code low..high}. */
    public double shareOutside(double low, double high) {
        int out = 0;
        for (double v : values) {
            if (v < low || v > high) {
                out++;
            }
        }
        return (double) out / values.length;
    }
}

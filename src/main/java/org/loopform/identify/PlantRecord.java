package org.loopform.identify;

import java.util.Arrays;
import org.loopform.units.BadInput;

/**
 * A logged test: sample times (seconds from the first sample, strictly increasing, any spacing),
 * the controller output and the PV, both in percent of their spans. Between samples the output is
 * taken as held (the controller writes it and holds it).
 */
public final class PlantRecord {

    private final double[] timeSeconds;
    private final double[] outputPercent;
    private final double[] pvPercent;

    public PlantRecord(double[] timeSeconds, double[] outputPercent, double[] pvPercent) {
        if (timeSeconds.length != outputPercent.length || timeSeconds.length != pvPercent.length) {
            throw new IllegalArgumentException("columns of different lengths");
        }
        if (timeSeconds.length < 3) {
            throw new BadInput("record: needs at least 3 samples (got " + timeSeconds.length + ")");
        }
        for (int k = 0; k < timeSeconds.length; k++) {
            if (!Double.isFinite(timeSeconds[k]) || !Double.isFinite(outputPercent[k]) || !Double.isFinite(pvPercent[k])) {
                throw new IllegalArgumentException("sample " + k + " is not finite");
            }
            if (k > 0 && !(timeSeconds[k] > timeSeconds[k - 1])) {
                throw new IllegalArgumentException("times must increase (sample " + k + ")");
            }
        }
        this.timeSeconds = timeSeconds.clone();
        this.outputPercent = outputPercent.clone();
        this.pvPercent = pvPercent.clone();
    }

    public int size() {
        return timeSeconds.length;
    }

    public double time(int k) {
        return timeSeconds[k];
    }

    public double output(int k) {
        return outputPercent[k];
    }

    public double pv(int k) {
        return pvPercent[k];
    }

    public double durationSeconds() {
        return timeSeconds[timeSeconds.length - 1] - timeSeconds[0];
    }

    double[] times() {
        return timeSeconds.clone();
    }

    double[] outputs() {
        return outputPercent.clone();
    }

    double[] pvs() {
        return pvPercent.clone();
    }

    /** The output held at time {@code t} (the last sample at or before it; the first before the record). */
    double outputAt(double t) {
        int k = Arrays.binarySearch(timeSeconds, t);
        if (k >= 0) {
            return outputPercent[k];
        }
        int before = -k - 2;
        return before < 0 ? outputPercent[0] : outputPercent[before];
    }
}

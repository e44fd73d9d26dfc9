package org.loopform.simulate;

import java.util.Arrays;
import java.util.Objects;

/**
 * A closed-loop response sampled at increasing times: the process value and the controller
 * output at each time, both in percent of span, times in seconds. The step under study happens
 * at the first time. The controller output at a sample is the one held from that sample to the
 * next (it changes only at scan instants). Immutable; the arrays are copied in and out. A
 * response recorded on a uniform step ({@link #recorder(int, double)}) keeps only the step and
 * gives sample k the time {@code k * stepSeconds}; one recorded between scans
 * ({@link #recorder(int, double, double[])}) has the same sub-instants in every scan. A
 * recorded run may end in a held tail ({@link Recorder#holdRemaining}): from {@link #heldFrom()}
 * on, every sample repeats the last one recorded, and those samples are not stored.
 */
public final class SampledResponse {

    /** Null for a response on a uniform step. */
    private final double[] timesSeconds;
    /** The uniform step (the scan between scans), or NaN when the times are given one by one. */
    private final double stepSeconds;
    /** Sample instants within each step, {0} on a uniform step; null when the times are given one by one. */
    private final double[] offsetsSeconds;
    private final double[] processValuesPercent;
    private final double[] controllerOutputsPercent;
    /** Samples stored; the samples from here to {@link #size} repeat the last stored one. */
    private final int stored;
    private final int size;

    private SampledResponse(double[] timesSeconds, double stepSeconds, double[] offsetsSeconds,
            double[] processValuesPercent, double[] controllerOutputsPercent, int stored) {
        this.timesSeconds = timesSeconds;
        this.stepSeconds = stepSeconds;
        this.offsetsSeconds = offsetsSeconds;
        this.processValuesPercent = processValuesPercent;
        this.controllerOutputsPercent = controllerOutputsPercent;
        this.stored = stored;
        this.size = processValuesPercent.length;
    }

    /**
     * A response from equally long arrays of at least two samples, times strictly increasing and
     * every value finite.
     */
    public static SampledResponse of(double[] timesSeconds, double[] processValuesPercent,
            double[] controllerOutputsPercent) {
        Objects.requireNonNull(timesSeconds, "timesSeconds");
        Objects.requireNonNull(processValuesPercent, "processValuesPercent");
        Objects.requireNonNull(controllerOutputsPercent, "controllerOutputsPercent");
        int n = timesSeconds.length;
        if (n < 2) {
            throw new IllegalArgumentException("a sampled response needs at least 2 samples (got " + n + ")");
        }
        if (processValuesPercent.length != n || controllerOutputsPercent.length != n) {
            throw new IllegalArgumentException("a sampled response needs as many values as times: " + n
                    + " times, " + processValuesPercent.length + " process values, "
                    + controllerOutputsPercent.length + " controller outputs");
        }
        for (int k = 0; k < n; k++) {
            requireFinite("time", k, timesSeconds[k]);
            requireFinite("process value", k, processValuesPercent[k]);
            requireFinite("controller output", k, controllerOutputsPercent[k]);
            if (k > 0 && !(timesSeconds[k] > timesSeconds[k - 1])) {
                throw new IllegalArgumentException("sample times must increase: sample " + k + " at "
                        + timesSeconds[k] + " s follows " + timesSeconds[k - 1] + " s");
            }
        }
        return new SampledResponse(timesSeconds.clone(), Double.NaN, null, processValuesPercent.clone(),
                controllerOutputsPercent.clone(), n);
    }

    /**
     * A recorder of {@code samples} samples (at least 2) taken every {@code stepSeconds}, the
     * first at time 0: a simulation fills it in place, and {@link Recorder#toResponse} hands its
     * arrays over without copying them.
     */
    public static Recorder recorder(int samples, double stepSeconds) {
        return new Recorder(samples, stepSeconds, new double[] {0.0});
    }

    /**
     * A recorder of a run over {@code scans} scans of {@code scanSeconds}, sampled in every scan
     * at the instants {@code offsetsSeconds} after its start (the first 0, increasing, all below
     * the scan time) and once more at the end: {@code scans * offsetsSeconds.length + 1}
     * samples, sample {@code i = k m + j} at {@code k * scanSeconds + offsetsSeconds[j]}.
     */
    public static Recorder recorder(int scans, double scanSeconds, double[] offsetsSeconds) {
        Objects.requireNonNull(offsetsSeconds, "offsetsSeconds");
        int m = offsetsSeconds.length;
        if (m < 1 || offsetsSeconds[0] != 0.0) {
            throw new IllegalArgumentException("a scan's sample instants must start at 0 s (got "
                    + Arrays.toString(offsetsSeconds) + ")");
        }
        for (int j = 1; j < m; j++) {
            if (!(offsetsSeconds[j] > offsetsSeconds[j - 1]) || !(offsetsSeconds[j] < scanSeconds)) {
                throw new IllegalArgumentException("a scan's sample instants must increase and stay below the scan"
                        + " time " + scanSeconds + " s (got " + Arrays.toString(offsetsSeconds) + ")");
            }
        }
        if (scans < 1 || (long) scans * m + 1 > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("a run between scans needs 1 to " + (Integer.MAX_VALUE / m - 1)
                    + " scans of " + m + " samples (got " + scans + ")");
        }
        return new Recorder(scans * m + 1, scanSeconds, offsetsSeconds.clone());
    }

    public int size() {
        return size;
    }

    /**
     * The first sample of the held tail: every sample from here on repeats the one before it
     * ({@link #size} when the run was recorded to its end). At least 1.
     */
    public int heldFrom() {
        return stored;
    }

    public double timeSeconds(int k) {
        if (timesSeconds != null) {
            return timesSeconds[k];
        }
        int m = offsetsSeconds.length;
        return m == 1 ? k * stepSeconds : (k / m) * stepSeconds + offsetsSeconds[k % m];
    }

    public double processValuePercent(int k) {
        return processValuesPercent[k < stored ? k : checkedTail(k)];
    }

    public double controllerOutputPercent(int k) {
        return controllerOutputsPercent[k < stored ? k : checkedTail(k)];
    }

    /** The stored sample that a held tail's sample {@code k} repeats. */
    private int checkedTail(int k) {
        Objects.checkIndex(k, size);
        return stored - 1;
    }

    public double[] timesSeconds() {
        if (timesSeconds != null) {
            return timesSeconds.clone();
        }
        double[] t = new double[size()];
        for (int k = 0; k < t.length; k++) {
            t[k] = timeSeconds(k);
        }
        return t;
    }

    public double[] processValuesPercent() {
        return withTail(processValuesPercent);
    }

    public double[] controllerOutputsPercent() {
        return withTail(controllerOutputsPercent);
    }

    private double[] withTail(double[] values) {
        double[] all = values.clone();
        Arrays.fill(all, stored, size, values[stored - 1]);
        return all;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof SampledResponse r
                && Arrays.equals(processValuesPercent(), r.processValuesPercent())
                && Arrays.equals(controllerOutputsPercent(), r.controllerOutputsPercent())
                && Arrays.equals(timesSeconds(), r.timesSeconds());
    }

    @Override
    public int hashCode() {
        return Objects.hash(Arrays.hashCode(timesSeconds()), Arrays.hashCode(processValuesPercent()),
                Arrays.hashCode(controllerOutputsPercent()));
    }

    @Override
    public String toString() {
        return "SampledResponse[" + size() + " samples, " + timeSeconds(0) + " s to "
                + timeSeconds(size() - 1) + " s]";
    }

    private static void requireFinite(String what, int k, double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(what + " at sample " + k + " must be finite (got " + value + ")");
        }
    }

    /**
     * Collects the samples of one response, one {@link #add} per sample in time order, on a
     * uniform step or on the same sub-instants of every scan; used once. Not thread-safe.
     */
    public static final class Recorder {

        private final double stepSeconds;
        /** Sample instants within one step, seconds after its start; {0} for a uniform step. */
        private final double[] offsetsSeconds;
        private double[] processValuesPercent;
        private double[] controllerOutputsPercent;
        private int count;
        /** Samples stored; below {@code count} once a held tail has been recorded. */
        private int stored = -1;

        private Recorder(int samples, double stepSeconds, double[] offsetsSeconds) {
            if (samples < 2) {
                throw new IllegalArgumentException("a sampled response needs at least 2 samples (got " + samples + ")");
            }
            if (!(stepSeconds > 0) || !Double.isFinite(stepSeconds)) {
                throw new IllegalArgumentException("sample step must be finite and > 0 s (got " + stepSeconds + " s)");
            }
            this.stepSeconds = stepSeconds;
            this.offsetsSeconds = offsetsSeconds;
            this.processValuesPercent = new double[samples];
            this.controllerOutputsPercent = new double[samples];
        }

        /**
         * Every sample not yet recorded repeats the last one recorded (a settled run's tail); they
         * are not stored. At least one sample must have been recorded.
         */
        public void holdRemaining() {
            if (count < 1) {
                throw new IllegalStateException("a held tail repeats the last sample: record one first");
            }
            stored = count;
            count = processValuesPercent.length;
        }

        /**
         * Ends the response at the samples recorded so far (at least 2): a run whose controller's own
         * arithmetic overflowed (an unstable derivative filter, say) has nothing to record past that point.
         */
        public void endHere() {
            if (count < 2) {
                throw new IllegalStateException("a response needs at least 2 samples (recorded " + count + ")");
            }
            processValuesPercent = java.util.Arrays.copyOf(processValuesPercent, count);
            controllerOutputsPercent = java.util.Arrays.copyOf(controllerOutputsPercent, count);
        }

        /** Records the next sample, at the next instant of the recorder's grid. */
        public void add(double processValuePercent, double controllerOutputPercent) {
            processValuesPercent[count] = processValuePercent;
            controllerOutputsPercent[count] = controllerOutputPercent;
            count++;
        }

        /** The response recorded; every sample must have been added and be finite. */
        public SampledResponse toResponse() {
            if (processValuesPercent == null) {
                throw new IllegalStateException("this recorder already gave its response");
            }
            if (count != processValuesPercent.length) {
                throw new IllegalStateException("recorded " + count + " of " + processValuesPercent.length
                        + " samples");
            }
            // x * 0 is 0 for a finite x and NaN otherwise: one sum says whether any sample is not
            // finite, and only then are they searched for the first one
            int kept = stored < 0 ? count : stored;
            double poison = 0;
            for (int k = 0; k < kept; k++) {
                poison += processValuesPercent[k] * 0.0 + controllerOutputsPercent[k] * 0.0;
            }
            if (poison != 0) {
                for (int k = 0; k < kept; k++) {
                    requireFinite("process value", k, processValuesPercent[k]);
                    requireFinite("controller output", k, controllerOutputsPercent[k]);
                }
            }
            SampledResponse r = new SampledResponse(null, stepSeconds, offsetsSeconds, processValuesPercent,
                    controllerOutputsPercent, kept);
            processValuesPercent = null;
            controllerOutputsPercent = null;
            return r;
        }
    }
}

package org.loopform.analysis;

import java.util.Arrays;
import java.util.Objects;

/**
 * A closed-loop response sampled at increasing times: the process value and the controller
 * output at each time, both in percent of span, times in seconds. The step under study happens
 * at the first time. Immutable; the arrays are copied in and out.
 */
public final class SampledResponse {

    private final double[] timesSeconds;
    private final double[] processValuesPercent;
    private final double[] controllerOutputsPercent;

    private SampledResponse(double[] timesSeconds, double[] processValuesPercent, double[] controllerOutputsPercent) {
        this.timesSeconds = timesSeconds;
        this.processValuesPercent = processValuesPercent;
        this.controllerOutputsPercent = controllerOutputsPercent;
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
        return new SampledResponse(timesSeconds.clone(), processValuesPercent.clone(),
                controllerOutputsPercent.clone());
    }

    public int size() {
        return timesSeconds.length;
    }

    public double timeSeconds(int k) {
        return timesSeconds[k];
    }

    public double processValuePercent(int k) {
        return processValuesPercent[k];
    }

    public double controllerOutputPercent(int k) {
        return controllerOutputsPercent[k];
    }

    public double[] timesSeconds() {
        return timesSeconds.clone();
    }

    public double[] processValuesPercent() {
        return processValuesPercent.clone();
    }

    public double[] controllerOutputsPercent() {
        return controllerOutputsPercent.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof SampledResponse r
                && Arrays.equals(timesSeconds, r.timesSeconds)
                && Arrays.equals(processValuesPercent, r.processValuesPercent)
                && Arrays.equals(controllerOutputsPercent, r.controllerOutputsPercent);
    }

    @Override
    public int hashCode() {
        return Objects.hash(Arrays.hashCode(timesSeconds), Arrays.hashCode(processValuesPercent),
                Arrays.hashCode(controllerOutputsPercent));
    }

    @Override
    public String toString() {
        return "SampledResponse[" + size() + " samples, " + timesSeconds[0] + " s to "
                + timesSeconds[size() - 1] + " s]";
    }

    private static void requireFinite(String what, int k, double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(what + " at sample " + k + " must be finite (got " + value + ")");
        }
    }
}

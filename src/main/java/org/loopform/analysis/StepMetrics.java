package org.loopform.analysis;

import org.loopform.simulate.SampledResponse;
import java.util.Objects;
import java.util.OptionalDouble;

/**
 * Time-domain figures of one closed-loop step response, the error being
 * {@code e(t) = setpoint - y(t)} in percent of span.
 *
 * <ul>
 *   <li>{@code integralAbsoluteErrorPercentSeconds}: IAE, the integral of {@code |e|} by the
 *       trapezoid rule, each interval where {@code e} changes sign split at its linear zero.
 *   <li>{@code overshootPercent}: the largest excursion beyond the setpoint, in percent of the
 *       setpoint step; empty for a load response (no setpoint step).
 *   <li>{@code settlingTimeSeconds}: time from the first sample until {@code |e|} enters the
 *       settling band for good (2 % of the step for a setpoint step), the entry found by linear
 *       interpolation; empty when the last sample is still outside the band.
 *   <li>{@code peakDeviationPercent}: the largest {@code |e|}, the figure for a load response.
 *   <li>{@code outputTravelPercent}: the sum of {@code |du|} over the samples.
 * </ul>
 *
 * The figures are the usual ones of Ogata, Modern Control Engineering, 4th ed., 2002,
 * section 5-3 (transient-response specifications; from memory for the section number); the IAE,
 * the 2 % band and the output travel as defined here are common practice.
 *
 * <p>They are read from the samples given. For a sampled loop these are the continuous PV
 * between the scans as well as at them ({@code simulate.LoopSimulator#runBetweenScans}), so
 * overshoot, peak and settling are what the process does, not what the scan instants show; the
 * controller output is held between scans, so its travel is the same either way. A response
 * read only at the scan instants understates a slow scan's overshoot (Astrom &amp; Wittenmark,
 * Computer-Controlled Systems, 3rd ed., 1997, ch. 2, intersample behaviour - from memory).
 */
public record StepMetrics(
        double integralAbsoluteErrorPercentSeconds,
        OptionalDouble overshootPercent,
        OptionalDouble settlingTimeSeconds,
        double peakDeviationPercent,
        double outputTravelPercent) {

    /** Settling band of a setpoint step, in percent of the step (common practice). */
    public static final double SETTLING_BAND_PERCENT_OF_STEP = 2.0;

    public StepMetrics {
        requireNonNegative("IAE", integralAbsoluteErrorPercentSeconds);
        Objects.requireNonNull(overshootPercent, "overshootPercent");
        Objects.requireNonNull(settlingTimeSeconds, "settlingTimeSeconds");
        overshootPercent.ifPresent(v -> requireNonNegative("overshoot", v));
        settlingTimeSeconds.ifPresent(v -> requireNonNegative("settling time", v));
        requireNonNegative("peak deviation", peakDeviationPercent);
        requireNonNegative("output travel", outputTravelPercent);
    }

    /**
     * Figures of a setpoint step from {@code initialPercent} to {@code setpointPercent}, made at
     * the first sample; the settling band is {@value #SETTLING_BAND_PERCENT_OF_STEP} % of the step.
     */
    public static StepMetrics ofSetpointStep(SampledResponse response, double initialPercent, double setpointPercent) {
        Objects.requireNonNull(response, "response");
        double stepPercent = setpointPercent - initialPercent;
        if (!Double.isFinite(stepPercent) || stepPercent == 0) {
            throw new IllegalArgumentException("a setpoint step needs different finite initial and final values (got "
                    + initialPercent + " % to " + setpointPercent + " %); use ofLoadStep for a load response");
        }
        double bandPercent = Math.abs(stepPercent) * SETTLING_BAND_PERCENT_OF_STEP / 100;
        double direction = Math.signum(stepPercent);
        double largestExcursionPercent = 0;
        // a held tail repeats the last stored sample
        for (int k = 0; k < response.heldFrom(); k++) {
            double excursion = direction * (response.processValuePercent(k) - setpointPercent);
            largestExcursionPercent = excursion > largestExcursionPercent ? excursion : largestExcursionPercent;
        }
        double overshootPercent = 100 * largestExcursionPercent / Math.abs(stepPercent);
        return of(response, setpointPercent, bandPercent, OptionalDouble.of(overshootPercent));
    }

    /**
     * Figures of a load response about a fixed setpoint, the load step made at the first
     * sample, settling judged against a band of {@code settlingBandPercent} either side.
     */
    public static StepMetrics ofLoadStep(SampledResponse response, double setpointPercent, double settlingBandPercent) {
        Objects.requireNonNull(response, "response");
        if (!Double.isFinite(setpointPercent)) {
            throw new IllegalArgumentException("setpoint must be finite (got " + setpointPercent + " %)");
        }
        if (!(settlingBandPercent > 0) || Double.isInfinite(settlingBandPercent)) {
            throw new IllegalArgumentException(
                    "settling band must be finite and > 0 % (got " + settlingBandPercent + " %)");
        }
        return of(response, setpointPercent, settlingBandPercent, OptionalDouble.empty());
    }

    private static StepMetrics of(SampledResponse response, double setpointPercent, double bandPercent,
            OptionalDouble overshootPercent) {
        int n = response.size();
        // a held tail (simulate.SampledResponse#heldFrom) repeats its last stored sample: read to there
        int stored = response.heldFrom();
        double iae = 0;
        double peak = 0;
        double travel = 0;
        int lastOutside = -1;
        double previous = 0;
        double previousTime = 0;
        for (int k = 0; k < stored; k++) {
            double error = setpointPercent - response.processValuePercent(k);
            double time = response.timeSeconds(k);
            double size = Math.abs(error);
            // a comparison, not a Math.max call: a response's samples are finite
            peak = size > peak ? size : peak;
            if (Math.abs(error) > bandPercent) {
                lastOutside = k;
            }
            if (k > 0) {
                iae += trapezoidOfAbsolute(previous, error, time - previousTime);
                travel += Math.abs(response.controllerOutputPercent(k) - response.controllerOutputPercent(k - 1));
            }
            previous = error;
            previousTime = time;
        }
        // the held tail: the error stays at its last value, so its IAE is |e| times the tail's
        // length (each trapezoid is |e| dt), nothing moves the output, and it stays outside the
        // band to the end if it was outside at its start. Without a tail (stored == n) the length
        // is 0 and the last sample is the end: neither line changes anything.
        iae += Math.abs(previous) * (response.timeSeconds(n - 1) - previousTime);
        if (lastOutside == stored - 1) {
            lastOutside = n - 1;
        }
        OptionalDouble settling;
        if (lastOutside == n - 1) {
            settling = OptionalDouble.empty();
        } else if (lastOutside < 0) {
            settling = OptionalDouble.of(0);
        } else {
            settling = OptionalDouble.of(bandEntrySeconds(response, setpointPercent, bandPercent, lastOutside)
                    - response.timeSeconds(0));
        }
        return new StepMetrics(iae, overshootPercent, settling, peak, travel);
    }

    /** Integral of |e| over one interval with e linear in it: split at the zero when e changes sign. */
    private static double trapezoidOfAbsolute(double e0, double e1, double dtSeconds) {
        if ((e0 < 0) == (e1 < 0) || e0 == 0 || e1 == 0) {
            return 0.5 * dtSeconds * Math.abs(e0 + e1);
        }
        return 0.5 * dtSeconds * (e0 * e0 + e1 * e1) / (Math.abs(e0) + Math.abs(e1));
    }

    /** Time where e, linear between sample k (outside the band) and k + 1 (inside), meets the band edge. */
    private static double bandEntrySeconds(SampledResponse response, double setpointPercent, double bandPercent, int k) {
        double e0 = setpointPercent - response.processValuePercent(k);
        double e1 = setpointPercent - response.processValuePercent(k + 1);
        double edge = Math.copySign(bandPercent, e0);
        double t0 = response.timeSeconds(k);
        return t0 + (response.timeSeconds(k + 1) - t0) * (e0 - edge) / (e0 - e1);
    }

    private static void requireNonNegative(String what, double value) {
        if (!(value >= 0) || Double.isInfinite(value)) {
            throw new IllegalArgumentException(what + " must be finite and >= 0 (got " + value + ")");
        }
    }
}

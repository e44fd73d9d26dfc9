package org.loopform.analysis;

import java.util.Objects;
import java.util.OptionalDouble;

/**
 * Robustness figures of one loop, from its open-loop response {@code L(i omega)} over a band.
 *
 * <ul>
 *   <li>{@code gainMargin}: {@code 1 / |L|} at the phase crossover (phase -180 degrees, modulo
 *       360), a ratio; empty when the band holds no phase crossover.
 *   <li>{@code phaseCrossoverRadPerSecond}: where that gain margin is read.
 *   <li>{@code phaseMarginDegrees}: {@code 180 + arg L} at the gain crossover ({@code |L| = 1}),
 *       the phase unwrapped continuously from the bottom of the band; empty when the band
 *       holds no gain crossover.
 *   <li>{@code crossoverRadPerSecond}: the gain crossover where that phase margin is read.
 *   <li>{@code delayMarginSeconds}: the smallest {@code PM[rad] / omega} over the gain
 *       crossovers, the extra dead time that brings the loop to the stability limit.
 *   <li>{@code maximumSensitivity}: {@code Ms = max |1 / (1 + L)|} over the band, and
 *       {@code maximumSensitivityRadPerSecond} where it peaks.
 *   <li>{@code stability}: the Nyquist verdict for an open loop with no right-half-plane poles.
 * </ul>
 *
 * Definitions after Astrom and Murray, Feedback Systems, 2008, section 9.3 (stability margins;
 * from memory for the section number).
 */
public record LoopMargins(
        OptionalDouble gainMargin,
        OptionalDouble phaseCrossoverRadPerSecond,
        OptionalDouble phaseMarginDegrees,
        OptionalDouble crossoverRadPerSecond,
        OptionalDouble delayMarginSeconds,
        double maximumSensitivity,
        double maximumSensitivityRadPerSecond,
        ClosedLoopStability stability) {

    public LoopMargins {
        requireFinite("gain margin", gainMargin, true);
        requireFinite("phase crossover", phaseCrossoverRadPerSecond, true);
        requireFinite("phase margin", phaseMarginDegrees, false);
        requireFinite("gain crossover", crossoverRadPerSecond, true);
        requireFinite("delay margin", delayMarginSeconds, false);
        if (gainMargin.isPresent() != phaseCrossoverRadPerSecond.isPresent()) {
            throw new IllegalArgumentException("gain margin " + gainMargin
                    + " and phase crossover " + phaseCrossoverRadPerSecond + " must come together");
        }
        if (phaseMarginDegrees.isPresent() != crossoverRadPerSecond.isPresent()
                || phaseMarginDegrees.isPresent() != delayMarginSeconds.isPresent()) {
            throw new IllegalArgumentException("phase margin " + phaseMarginDegrees + ", gain crossover "
                    + crossoverRadPerSecond + " and delay margin " + delayMarginSeconds + " must come together");
        }
        if (!(maximumSensitivity > 0) || Double.isInfinite(maximumSensitivity)) {
            throw new IllegalArgumentException(
                    "maximum sensitivity must be finite and > 0 (got " + maximumSensitivity + ")");
        }
        if (!(maximumSensitivityRadPerSecond > 0) || Double.isInfinite(maximumSensitivityRadPerSecond)) {
            throw new IllegalArgumentException("maximum sensitivity frequency must be finite and > 0 rad/s (got "
                    + maximumSensitivityRadPerSecond + " rad/s)");
        }
        Objects.requireNonNull(stability, "stability");
    }

    /** True when both margins that exist are on the safe side: gain margin above 1, phase margin above 0. */
    public boolean marginsPositive() {
        return (gainMargin.isEmpty() || gainMargin.getAsDouble() > 1)
                && (phaseMarginDegrees.isEmpty() || phaseMarginDegrees.getAsDouble() > 0);
    }

    private static void requireFinite(String what, OptionalDouble value, boolean positive) {
        Objects.requireNonNull(value, what);
        if (value.isPresent()) {
            double v = value.getAsDouble();
            if (!Double.isFinite(v) || (positive && !(v > 0))) {
                throw new IllegalArgumentException(
                        what + " must be finite" + (positive ? " and > 0" : "") + " (got " + v + ")");
            }
        }
    }
}

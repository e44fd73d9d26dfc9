package org.loopform.analysis;

import java.util.List;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;

/**
 * Robustness figures of one loop, from its open-loop response {@code L(i omega)} over a band.
 *
 * <ul>
 *   <li>{@code gainMargin}: the smallest {@code 1 / |L|} at or above 1 over the phase crossovers
 *       (phase -180 degrees modulo 360), the factor by which the loop gain may grow; empty when
 *       no such crossover exists ({@code gainMarginNote} says why).
 *   <li>{@code phaseCrossoverRadPerSecond}: where that gain margin is read.
 *   <li>{@code lowerGainMargin}: the largest {@code 1 / |L|} below 1 over the phase crossovers,
 *       the factor by which the gain may shrink (a conditionally stable loop); empty when every
 *       phase crossover has {@code |L| <= 1}.
 *   <li>{@code phaseMarginDegrees}: {@code 180 + arg L} wrapped into (-180, 180] degrees at the
 *       gain crossover ({@code |L| = 1}) where it is smallest in size, with its sign: the crossover
 *       nearest -1, which the least phase change (lag or lead) puts on -1. On a stable loop with
 *       several crossovers one may wrap near -180 degrees: it lies near +1, far from -1, and does not
 *       set the margin. Empty when there is no gain crossover ({@code phaseMarginNote} says why).
 *   <li>{@code crossoverRadPerSecond}: the gain crossover where that phase margin is read.
 *   <li>{@code delayMarginSeconds}: the smallest {@code ((PM_j mod 360) in rad) / omega_j} over
 *       the gain crossovers j, the least extra dead time that puts a crossover on -1; exact for a
 *       continuous loop, and for a sampled loop only when it is a whole number of scans, so a check
 *       replaces it there ({@link #withDelayMarginSeconds}) by the exact one, found with the process
 *       sampled again at each extra dead time.
 *   <li>{@code maximumSensitivity}: {@code Ms = max |1 / (1 + L)|} over the band, and
 *       {@code maximumSensitivityRadPerSecond} where it peaks.
 *   <li>{@code phaseCrossovers}, {@code gainCrossovers}: every crossing found, in rising frequency.
 * </ul>
 * Margins describe robustness only: whether the loop is stable at all is decided from its
 * closed-loop poles ({@link SampledStability}, {@link ContinuousStability}), never from margins.
 *
 * Definitions after Astrom and Murray, Feedback Systems, 2008, section 9.3 (stability margins;
 * from memory for the section number); the gain interval of a conditionally stable loop and the
 * delay margin as in the same book, ch. 9-10 (from memory).
 */
public record LoopMargins(
        OptionalDouble gainMargin,
        OptionalDouble phaseCrossoverRadPerSecond,
        OptionalDouble lowerGainMargin,
        OptionalDouble phaseMarginDegrees,
        OptionalDouble crossoverRadPerSecond,
        OptionalDouble delayMarginSeconds,
        double maximumSensitivity,
        double maximumSensitivityRadPerSecond,
        Optional<MarginNote> gainMarginNote,
        Optional<MarginNote> phaseMarginNote,
        List<PhaseCrossover> phaseCrossovers,
        List<GainCrossover> gainCrossovers) {

    public LoopMargins {
        requireFinite("gain margin", gainMargin, true);
        requireFinite("phase crossover", phaseCrossoverRadPerSecond, true);
        requireFinite("lower gain margin", lowerGainMargin, true);
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
        if (lowerGainMargin.isPresent() && !(lowerGainMargin.getAsDouble() < 1)) {
            throw new IllegalArgumentException(
                    "lower gain margin must be below 1 (got " + lowerGainMargin.getAsDouble() + ")");
        }
        // infinite where 1 + L vanishes on the band: a closed-loop pole on the stability boundary
        if (!(maximumSensitivity > 0)) {
            throw new IllegalArgumentException(
                    "maximum sensitivity must be > 0 (got " + maximumSensitivity + ")");
        }
        if (!(maximumSensitivityRadPerSecond > 0) || Double.isInfinite(maximumSensitivityRadPerSecond)) {
            throw new IllegalArgumentException("maximum sensitivity frequency must be finite and > 0 rad/s (got "
                    + maximumSensitivityRadPerSecond + " rad/s)");
        }
        Objects.requireNonNull(gainMarginNote, "gainMarginNote");
        Objects.requireNonNull(phaseMarginNote, "phaseMarginNote");
        if (gainMargin.isPresent() == gainMarginNote.isPresent()) {
            throw new IllegalArgumentException("a gain margin " + gainMargin + " and a note why it is missing "
                    + gainMarginNote + ": give exactly one");
        }
        if (phaseMarginDegrees.isPresent() == phaseMarginNote.isPresent()) {
            throw new IllegalArgumentException("a phase margin " + phaseMarginDegrees + " and a note why it is missing "
                    + phaseMarginNote + ": give exactly one");
        }
        phaseCrossovers = List.copyOf(phaseCrossovers);
        gainCrossovers = List.copyOf(gainCrossovers);
    }

    /**
     * Figures with one crossing of each kind at most, as given (no lower gain margin; a missing
     * margin noted {@link MarginNote#NOT_IN_BAND}). For figures built by hand.
     */
    public LoopMargins(OptionalDouble gainMargin, OptionalDouble phaseCrossoverRadPerSecond,
            OptionalDouble phaseMarginDegrees, OptionalDouble crossoverRadPerSecond, OptionalDouble delayMarginSeconds,
            double maximumSensitivity, double maximumSensitivityRadPerSecond) {
        this(gainMargin, phaseCrossoverRadPerSecond, OptionalDouble.empty(), phaseMarginDegrees, crossoverRadPerSecond,
                delayMarginSeconds, maximumSensitivity, maximumSensitivityRadPerSecond,
                gainMargin.isPresent() ? Optional.empty() : Optional.of(MarginNote.NOT_IN_BAND),
                phaseMarginDegrees.isPresent() ? Optional.empty() : Optional.of(MarginNote.NOT_IN_BAND),
                List.of(), List.of());
    }

    /**
     * This analysis for a loop whose |L| vanishes at high frequency (a continuous loop with a proper
     * controller and a strictly proper process): there |S| = |1/(1 + L)| tends to 1, so Ms, the
     * supremum of |S|, is at least 1 even where no peak inside the band rises above it; it is then
     * read at {@code bandTopRadPerSecond}.
     */
    public LoopMargins withSensitivityAtLeastOne(double bandTopRadPerSecond) {
        if (maximumSensitivity >= 1) {
            return this;
        }
        return new LoopMargins(gainMargin, phaseCrossoverRadPerSecond, lowerGainMargin, phaseMarginDegrees,
                crossoverRadPerSecond, delayMarginSeconds, 1.0, bandTopRadPerSecond,
                gainMarginNote, phaseMarginNote, phaseCrossovers, gainCrossovers);
    }

    /** Why there is no delay margin: the same reason there is no phase margin. */
    public Optional<MarginNote> delayMarginNote() {
        return phaseMarginNote;
    }

    /**
     * The delay margin in scans of {@code scanSeconds}, for a sampled loop: {@code DM / h}. A
     * whole number k of extra scans of dead time multiplies {@code L(z)} by {@code z^-k}, which
     * is {@code e^(-i omega k h)} on the unit circle, so {@code PM / omega} is exact when it is whole and
     * an estimate between whole scans (Astrom and Wittenmark, Computer-Controlled Systems, 3rd
     * ed., 1997, ch. 2-3 - from memory); a check's sampled loops carry the exact margin instead.
     */
    public OptionalDouble delayMarginScans(double scanSeconds) {
        if (!(scanSeconds > 0) || Double.isInfinite(scanSeconds)) {
            throw new IllegalArgumentException("scan time must be finite and > 0 s (got " + scanSeconds + " s)");
        }
        return delayMarginSeconds.isPresent()
                ? OptionalDouble.of(delayMarginSeconds.getAsDouble() / scanSeconds) : OptionalDouble.empty();
    }

    /**
     * These figures with the delay margin replaced, for a loop whose delay margin is found by a
     * finer method than {@code PM / omega} (a sampled loop, whose process is sampled again at
     * each extra dead time); the per-crossover figures are kept as read.
     */
    public LoopMargins withDelayMarginSeconds(double seconds) {
        if (delayMarginSeconds.isEmpty()) {
            throw new IllegalStateException("a loop without a gain crossover has no delay margin to replace");
        }
        return new LoopMargins(gainMargin, phaseCrossoverRadPerSecond, lowerGainMargin, phaseMarginDegrees,
                crossoverRadPerSecond, OptionalDouble.of(seconds), maximumSensitivity, maximumSensitivityRadPerSecond,
                gainMarginNote, phaseMarginNote, phaseCrossovers, gainCrossovers);
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

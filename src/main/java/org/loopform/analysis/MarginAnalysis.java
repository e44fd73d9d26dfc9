package org.loopform.analysis;

import org.loopform.lti.FrequencyBand;

import java.util.Objects;

/**
 * Finds every gain crossover and phase crossover of a loop over a frequency band, and from them
 * the gain margins (upper and lower), the phase margin, the delay margin and the maximum
 * sensitivity. The open loop is sampled on a log-spaced base grid that {@link MarginSearch}
 * refines where the phase or {@code |L|} turn quickly (dead time far above the crossover, a
 * lightly damped resonance), so that the phase moves at most 22.5 degrees between neighbours and
 * is unwrapped continuously from the bottom of the band. A gain crossover is a sign change of
 * {@code |L| - 1}; a phase crossover is a pass of the unwrapped phase through -180 degrees +
 * k 360 degrees, and a band whose top lies on the negative real axis (a sampled loop at its
 * Nyquist frequency, z = -1) has one there. Each crossing is refined by Brent's root finder on
 * {@code |L|^2 - 1} or on the unwrapped phase, and the grid minimum of {@code |1 + L|} by Brent's
 * minimizer, each to a relative frequency accuracy better than
 * {@value #STATED_FREQUENCY_RELATIVE_ACCURACY}: R. P. Brent, Algorithms for Minimization
 * without Derivatives, Prentice-Hall, 1973, chapters 4 and 5, as implemented in Apache Commons
 * Math 3.6.1. Cost, measured: an ordinary loop (first order 1/(10 s + 1) with 1 s dead time,
 * ideal PI Kc 2, Ti 8 s) over the band a loop check gives it, 5e-4 to 25 rad/s, takes 402
 * evaluations of the loop; the fixed 160-point grid this replaced took 196 over its narrower
 * band, 1.25e-3 to 10 rad/s. The slope at each base point is 160 of the difference, the
 * dead-time phase up to 25 rad/s most of the rest.
 *
 * <p>The figures ({@link LoopMargins}): the gain margin is the smallest {@code 1/|L|} at or above
 * 1 over the phase crossovers, the lower gain margin the largest below 1; each phase margin is
 * wrapped into (-180, 180] degrees and the smallest reported; the delay margin is the smallest
 * {@code ((PM_j mod 360) in rad) / omega_j}. Definitions after Astrom and Murray, Feedback
 * Systems, 2008, ch. 9-10 (from memory for the sections).
 *
 * <p>Limits: a feature narrower than the base step whose phase and magnitude come back to the
 * same values on both sides of it (a nearly cancelling pole-zero pair) is not seen; the grid
 * stops growing at {@value MarginSearch#MAX_GRID_POINTS} points. Choose the band to span the
 * crossovers: {@link #reachingNegligibleGain} extends a continuous band's top until {@code |L|}
 * is negligible. Instances are immutable and may be shared between threads.
 */
public final class MarginAnalysis {

    /** Base grid points over the band unless told otherwise: about 25 per decade over six decades. */
    public static final int DEFAULT_GRID_POINTS = 160;
    /** Base grid density on wider bands. */
    public static final int DEFAULT_POINTS_PER_DECADE = 25;
    /**
     * {@code |L|} below which a continuous loop's response no longer matters: any phase
     * crossover beyond has a gain margin above 100, and {@code |1/(1 + L)|} there is within 1 %
     * of 1.
     */
    public static final double NEGLIGIBLE_LOOP_GAIN = 0.01;
    /** The band top grows at most this many doublings (a factor of about a million). */
    private static final int MAX_DOUBLINGS = 20;
    /** The accuracy promised for every refined frequency. */
    public static final double STATED_FREQUENCY_RELATIVE_ACCURACY = 1e-6;
    private static final int MIN_GRID_POINTS = 8;

    private final FrequencyBand band;
    private final double[] gridRadPerSecond;

    private MarginAnalysis(FrequencyBand band, double[] gridRadPerSecond) {
        this.band = band;
        this.gridRadPerSecond = gridRadPerSecond;
    }

    /**
     * An analysis over {@code band} with a base grid of {@link #DEFAULT_GRID_POINTS} points, or
     * {@link #DEFAULT_POINTS_PER_DECADE} per decade on a band wider than six decades.
     */
    public static MarginAnalysis over(FrequencyBand band) {
        Objects.requireNonNull(band, "band");
        double decades = Math.log10(band.highRadPerSecond() / band.lowRadPerSecond());
        int perDecade = (int) Math.ceil(decades * DEFAULT_POINTS_PER_DECADE) + 1;
        return over(band, Math.max(DEFAULT_GRID_POINTS, perDecade));
    }

    /**
     * {@code band} with its top raised, doubling, until {@code |L| < }{@link #NEGLIGIBLE_LOOP_GAIN}
     * there (at most about a million times higher). Meant for a continuous loop whose band
     * already starts above every corner of the loop, where {@code |L|} only falls further.
     */
    public static FrequencyBand reachingNegligibleGain(LoopResponse loop, FrequencyBand band) {
        Objects.requireNonNull(loop, "loop");
        Objects.requireNonNull(band, "band");
        double[] reIm = new double[2];
        double top = band.highRadPerSecond();
        for (int doublings = 0; doublings < MAX_DOUBLINGS; doublings++) {
            loop.at(top, reIm);
            if (Math.hypot(reIm[0], reIm[1]) < NEGLIGIBLE_LOOP_GAIN) {
                break;
            }
            top *= 2;
        }
        return FrequencyBand.of(band.lowRadPerSecond(), top);
    }

    /** An analysis over {@code band} with a base grid of {@code gridPoints} log-spaced points, ends included. */
    public static MarginAnalysis over(FrequencyBand band, int gridPoints) {
        Objects.requireNonNull(band, "band");
        if (gridPoints < MIN_GRID_POINTS) {
            throw new IllegalArgumentException(
                    "margin grid needs at least " + MIN_GRID_POINTS + " points (got " + gridPoints + ")");
        }
        double[] grid = new double[gridPoints];
        double logLow = Math.log(band.lowRadPerSecond());
        double logStep = (Math.log(band.highRadPerSecond()) - logLow) / (gridPoints - 1);
        for (int k = 0; k < gridPoints; k++) {
            grid[k] = Math.exp(logLow + k * logStep);
        }
        // exact ends, so a band ending at the Nyquist frequency ends there to the last bit
        grid[0] = band.lowRadPerSecond();
        grid[gridPoints - 1] = band.highRadPerSecond();
        return new MarginAnalysis(band, grid);
    }

    public FrequencyBand band() {
        return band;
    }

    public int gridPoints() {
        return gridRadPerSecond.length;
    }

    /** The margins of the loop whose open-loop response is {@code loop}. */
    public LoopMargins analyze(LoopResponse loop) {
        Objects.requireNonNull(loop, "loop");
        return new MarginSearch(loop, gridRadPerSecond).run();
    }
}

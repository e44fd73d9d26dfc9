package org.loopform.analysis;

import org.loopform.lti.FrequencyBand;

import java.util.Objects;

/**
 * Finds the gain margin, phase margin, delay margin and maximum sensitivity of a loop over a
 * fixed frequency band. The open loop is sampled on a coarse log-spaced grid; each sign change
 * of {@code |L| - 1} (gain crossover) and of {@code Im L} on the negative real axis (phase
 * crossover) is refined by Brent's root finder, and the grid minimum of {@code |1 + L|} is
 * refined by Brent's minimizer, each to a relative frequency accuracy better than
 * {@value #STATED_FREQUENCY_RELATIVE_ACCURACY}. Both are Brent's methods: R. P. Brent,
 * Algorithms for Minimization without Derivatives, Prentice-Hall, 1973, chapters 4 and 5, as
 * implemented in Apache Commons Math 3.6.1. A full analysis evaluates the loop about 270 times.
 *
 * <p>With several gain crossovers the reported phase margin is the smallest one (and the delay
 * margin the smallest {@code PM / omega}); with several phase crossovers the reported gain
 * margin is the smallest one. Phase is unwrapped continuously along the grid from the bottom
 * of the band, where it is taken in (-270, 90] degrees (the branch of a loop with positive
 * gain and up to two integrators), so dead time makes it run down without bound.
 *
 * <p>Limits: a crossing pair closer together than one grid step, or a phase step above 180
 * degrees between grid points (dead time far above the crossover), can be missed; choose the
 * band so that it spans the crossovers with room, and the grid dense enough for the loop.
 * Instances are immutable and may be shared between threads.
 */
public final class MarginAnalysis {

    /** Grid points over the band unless told otherwise: about 25 per decade over six decades. */
    public static final int DEFAULT_GRID_POINTS = 160;
    /** The accuracy promised for every refined frequency. */
    public static final double STATED_FREQUENCY_RELATIVE_ACCURACY = 1e-6;
    private static final int MIN_GRID_POINTS = 8;

    private final FrequencyBand band;
    private final double[] gridRadPerSecond;

    private MarginAnalysis(FrequencyBand band, double[] gridRadPerSecond) {
        this.band = band;
        this.gridRadPerSecond = gridRadPerSecond;
    }

    /** An analysis over {@code band} with {@link #DEFAULT_GRID_POINTS} grid points. */
    public static MarginAnalysis over(FrequencyBand band) {
        return over(band, DEFAULT_GRID_POINTS);
    }

    /** An analysis over {@code band} with {@code gridPoints} log-spaced grid points, ends included. */
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

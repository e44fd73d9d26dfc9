package org.loopform.analysis;

import java.util.OptionalDouble;
import org.apache.commons.math3.analysis.UnivariateFunction;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.univariate.BrentOptimizer;
import org.apache.commons.math3.optim.univariate.SearchInterval;
import org.apache.commons.math3.optim.univariate.UnivariateObjectiveFunction;
import org.apache.commons.math3.optim.univariate.UnivariatePointValuePair;

/**
 * One run of {@link MarginAnalysis} on one loop: the grid scan, the refinements and the
 * running extremes. Holds scratch arrays, so it is used once and by one thread.
 */
final class MarginSearch {

    /** Brent's tolerance is relative to the frequency; two decades inside the stated 1e-6. */
    private static final double ROOT_RELATIVE_ACCURACY = 1e-9;
    /** The minimizer cannot place a flat minimum closer than about sqrt(machine epsilon). */
    private static final double MINIMUM_RELATIVE_ACCURACY = 1e-8;
    /** Brent needs an absolute floor; this one never binds for frequencies in rad/s. */
    private static final double ABSOLUTE_FLOOR_RAD_PER_SECOND = 1e-300;
    /** Brent converges in a few dozen evaluations; this bound only stops a runaway. */
    private static final int MAX_EVALUATIONS = 200;
    private static final double TWO_PI = 2 * Math.PI;

    private final LoopResponse loop;
    private final double[] grid;
    private final double[] re;
    private final double[] im;
    private final double[] reIm = new double[2];
    private final BrentSolver solver = new BrentSolver(
            ROOT_RELATIVE_ACCURACY, ABSOLUTE_FLOOR_RAD_PER_SECOND, 0.0);
    private final UnivariateFunction magnitudeSquaredMinusOne = this::magnitudeSquaredMinusOne;
    private final UnivariateFunction imaginaryPart = this::imaginaryPart;

    private double smallestGainMargin = Double.POSITIVE_INFINITY;
    private double phaseCrossoverRadPerSecond;
    private double smallestPhaseMarginDegrees = Double.POSITIVE_INFINITY;
    private double crossoverRadPerSecond;
    private double smallestDelayMarginSeconds = Double.POSITIVE_INFINITY;
    private int clockwiseEncirclements;
    /** Smallest |1 + L|^2 met at a phase crossover, and the grid interval that brackets it. */
    private double crossingReturnDifferenceSquared = Double.POSITIVE_INFINITY;
    private double crossingRadPerSecond;
    private int crossingInterval;

    MarginSearch(LoopResponse loop, double[] grid) {
        this.loop = loop;
        this.grid = grid;
        this.re = new double[grid.length];
        this.im = new double[grid.length];
    }

    LoopMargins run() {
        int n = grid.length;
        for (int k = 0; k < n; k++) {
            loop.at(grid[k], reIm);
            re[k] = reIm[0];
            im[k] = reIm[1];
        }
        // atan2 gives (-180, 180]; a start in (90, 180] is read as (-270, -180]
        boolean startsBeyondMinus180 = re[0] < 0 && im[0] >= 0;
        double branchOffsetRadians = startsBeyondMinus180 ? -TWO_PI : 0.0;
        for (int k = 0; k < n - 1; k++) {
            if ((magnitudeSquared(k) < 1) != (magnitudeSquared(k + 1) < 1)) {
                gainCrossover(k, branchOffsetRadians);
            }
            boolean startsBelowAxis = im[k] < 0;
            // a sign change of Im L with Re L > 0 at both ends is a pass of the positive real axis
            if (startsBelowAxis != (im[k + 1] < 0) && (re[k] < 0 || re[k + 1] < 0)) {
                double omega = solver.solve(MAX_EVALUATIONS, imaginaryPart, grid[k], grid[k + 1]);
                loop.at(omega, reIm);
                if (reIm[0] < 0) {
                    // below to above the negative real axis: the phase falls through -180 (mod 360)
                    branchOffsetRadians += startsBelowAxis ? -TWO_PI : TWO_PI;
                    noteReturnDifference(omega, reIm[0], k);
                    phaseCrossover(omega, -reIm[0], startsBelowAxis);
                }
            }
        }
        return margins(startsBeyondMinus180 && magnitudeSquared(0) > 1 || magnitudeSquared(n - 1) >= 1);
    }

    private void gainCrossover(int k, double branchOffsetRadians) {
        double omega = solver.solve(MAX_EVALUATIONS, magnitudeSquaredMinusOne, grid[k], grid[k + 1]);
        loop.at(omega, reIm);
        double gridPhaseRadians = Math.atan2(im[k], re[k]);
        double stepRadians = Math.atan2(reIm[1], reIm[0]) - gridPhaseRadians;
        // the phase moves less than half a turn between a grid point and the crossover beside it
        if (stepRadians > Math.PI) {
            stepRadians -= TWO_PI;
        } else if (stepRadians <= -Math.PI) {
            stepRadians += TWO_PI;
        }
        double phaseRadians = gridPhaseRadians + branchOffsetRadians + stepRadians;
        double marginRadians = Math.PI + phaseRadians;
        double marginDegrees = Math.toDegrees(marginRadians);
        if (marginDegrees < smallestPhaseMarginDegrees) {
            smallestPhaseMarginDegrees = marginDegrees;
            crossoverRadPerSecond = omega;
        }
        smallestDelayMarginSeconds = Math.min(smallestDelayMarginSeconds, marginRadians / omega);
    }

    private void phaseCrossover(double omega, double magnitude, boolean clockwise) {
        double gainMargin = 1 / magnitude;
        if (gainMargin < smallestGainMargin) {
            smallestGainMargin = gainMargin;
            phaseCrossoverRadPerSecond = omega;
        }
        if (magnitude > 1) {
            // the plot crosses the negative real axis left of -1: half of an encirclement of -1,
            // the mirror image for negative frequencies gives the other half
            clockwiseEncirclements += clockwise ? 1 : -1;
        }
    }

    /**
     * Near a phase crossover {@code |1 + L| = 1 - |L|} dips: where dead time turns the phase
     * faster than the grid samples it, the dip there can be deeper than any grid point shows.
     */
    private void noteReturnDifference(double omega, double realPart, int interval) {
        double returnDifferenceSquared = (1 + realPart) * (1 + realPart);
        if (returnDifferenceSquared < crossingReturnDifferenceSquared) {
            crossingReturnDifferenceSquared = returnDifferenceSquared;
            crossingRadPerSecond = omega;
            crossingInterval = interval;
        }
    }

    private LoopMargins margins(boolean bandMissesPartOfPlot) {
        int best = 0;
        for (int k = 1; k < grid.length; k++) {
            if (returnDifferenceSquared(k) < returnDifferenceSquared(best)) {
                best = k;
            }
        }
        double peakRadPerSecond = grid[best];
        double smallestReturnDifferenceSquared = returnDifferenceSquared(best);
        int low = best - 1;
        int high = best + 1;
        if (crossingReturnDifferenceSquared < smallestReturnDifferenceSquared) {
            peakRadPerSecond = crossingRadPerSecond;
            smallestReturnDifferenceSquared = crossingReturnDifferenceSquared;
            low = crossingInterval - 1;
            high = crossingInterval + 2;
        }
        UnivariatePointValuePair refined = new BrentOptimizer(MINIMUM_RELATIVE_ACCURACY, ABSOLUTE_FLOOR_RAD_PER_SECOND)
                .optimize(new MaxEval(MAX_EVALUATIONS),
                        new UnivariateObjectiveFunction(this::returnDifferenceSquaredAt),
                        GoalType.MINIMIZE,
                        new SearchInterval(grid[Math.max(low, 0)], grid[Math.min(high, grid.length - 1)],
                                peakRadPerSecond));
        if (refined.getValue() < smallestReturnDifferenceSquared) {
            peakRadPerSecond = refined.getPoint();
            smallestReturnDifferenceSquared = refined.getValue();
        }
        ClosedLoopStability stability = bandMissesPartOfPlot
                ? ClosedLoopStability.UNDETERMINED
                : clockwiseEncirclements == 0 ? ClosedLoopStability.STABLE : ClosedLoopStability.UNSTABLE;
        boolean hasPhaseCrossover = smallestGainMargin < Double.POSITIVE_INFINITY;
        boolean hasGainCrossover = smallestPhaseMarginDegrees < Double.POSITIVE_INFINITY;
        return new LoopMargins(
                hasPhaseCrossover ? OptionalDouble.of(smallestGainMargin) : OptionalDouble.empty(),
                hasPhaseCrossover ? OptionalDouble.of(phaseCrossoverRadPerSecond) : OptionalDouble.empty(),
                hasGainCrossover ? OptionalDouble.of(smallestPhaseMarginDegrees) : OptionalDouble.empty(),
                hasGainCrossover ? OptionalDouble.of(crossoverRadPerSecond) : OptionalDouble.empty(),
                hasGainCrossover ? OptionalDouble.of(smallestDelayMarginSeconds) : OptionalDouble.empty(),
                1 / Math.sqrt(smallestReturnDifferenceSquared),
                peakRadPerSecond,
                stability);
    }

    private double magnitudeSquared(int k) {
        return re[k] * re[k] + im[k] * im[k];
    }

    private double returnDifferenceSquared(int k) {
        double real = 1 + re[k];
        return real * real + im[k] * im[k];
    }

    private double magnitudeSquaredMinusOne(double omegaRadPerSecond) {
        loop.at(omegaRadPerSecond, reIm);
        return reIm[0] * reIm[0] + reIm[1] * reIm[1] - 1;
    }

    private double imaginaryPart(double omegaRadPerSecond) {
        loop.at(omegaRadPerSecond, reIm);
        return reIm[1];
    }

    private double returnDifferenceSquaredAt(double omegaRadPerSecond) {
        loop.at(omegaRadPerSecond, reIm);
        double real = 1 + reIm[0];
        return real * real + reIm[1] * reIm[1];
    }
}

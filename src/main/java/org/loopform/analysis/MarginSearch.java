package org.loopform.analysis;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Optional;
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
 * One run of {@link MarginAnalysis} on one loop: the adaptive grid, the continuously unwrapped
 * phase, the crossings and their refinements, the running extremes. Holds scratch arrays, so it
 * is used once and by one thread.
 *
 * <p>The grid: the base points, each with its phase slope {@code d arg L / d omega} from a
 * close neighbour; an interval whose slope predicts more than {@link #MAX_PHASE_STEP_RADIANS}
 * of phase (dead time far above the crossover) is cut into equal pieces at once; then every
 * interval over which the phase turns by more than that, or {@code |L|} changes by more than a
 * factor {@link #MAX_MAGNITUDE_RATIO} (a lightly damped resonance), is bisected, again and
 * again, until it does not. So the phase moves less than half a turn between neighbours and
 * can be unwrapped without ambiguity, and a pair of crossings closer than the base step is
 * still bracketed.
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
    /** Most phase turn allowed between grid neighbours: 22.5 deg, well inside the half turn unwrapping needs. */
    static final double MAX_PHASE_STEP_RADIANS = Math.PI / 8;
    private static final double TAN_MAX_PHASE_STEP = Math.tan(MAX_PHASE_STEP_RADIANS);
    /** Most change of |L| allowed between grid neighbours, up or down. */
    static final double MAX_MAGNITUDE_RATIO = 2.0;
    /** Relative frequency step of the one-sided difference that gives the phase slope at a base point. */
    private static final double SLOPE_RELATIVE_STEP = 1e-6;
    /** Bisection stops here: two points this close are one point for any crossing we refine. */
    private static final double MIN_RELATIVE_WIDTH = 1e-10;
    /** Bound on the grid, so a loop with an enormous phase rate still finishes; far above any real need. */
    static final int MAX_GRID_POINTS = 400_000;
    /** A band end whose phase lies this close to -180 deg (mod 360) is on the negative real axis. */
    private static final double AXIS_PHASE_TOLERANCE_RADIANS = 1e-9;
    private static final double TWO_PI = 2 * Math.PI;

    private final LoopResponse loop;
    private final double[] base;
    private final double[] reIm = new double[2];
    private final BrentSolver solver = new BrentSolver(
            ROOT_RELATIVE_ACCURACY, ABSOLUTE_FLOOR_RAD_PER_SECOND, 0.0);
    private final UnivariateFunction magnitudeSquaredMinusOne = this::magnitudeSquaredMinusOne;
    private final UnivariateFunction phaseFromLevel = this::phaseFromLevel;

    private double[] w = new double[512];
    private double[] re = new double[512];
    private double[] im = new double[512];
    /** Continuously unwrapped phase, anchored at the bottom of the band. */
    private double[] phase;
    private int n;

    /** The crossing being refined: the unwrapped phase and value of L at its left grid point, and its level. */
    private double anchorPhase;
    private double anchorRe;
    private double anchorIm;
    private double levelRadians;

    private final List<PhaseCrossover> phaseCrossovers = new ArrayList<>();
    private final List<GainCrossover> gainCrossovers = new ArrayList<>();
    /** Smallest |1 + L|^2 met at a phase crossover, and the grid interval that brackets it. */
    private double crossingReturnDifferenceSquared = Double.POSITIVE_INFINITY;
    private double crossingRadPerSecond;
    private int crossingInterval;

    MarginSearch(LoopResponse loop, double[] base) {
        this.loop = loop;
        this.base = base;
    }

    LoopMargins run() {
        buildGrid();
        unwrap();
        int last = n - 1;
        // the top of the band on the negative real axis (a sampled loop at z = -1): a crossover there
        int topLevel = nearestLevel(phase[last]);
        boolean topOnAxis = Math.abs(phase[last] - level(topLevel)) < AXIS_PHASE_TOLERANCE_RADIANS
                && magnitudeSquared(last) > 0;
        if (topOnAxis) {
            phase[last] = level(topLevel);
        }
        for (int k = 0; k < last; k++) {
            if ((magnitudeSquared(k) < 1) != (magnitudeSquared(k + 1) < 1)) {
                gainCrossover(k);
            }
            int turnsBefore = turns(phase[k]);
            int turnsAfter = turns(phase[k + 1]);
            for (int level = Math.min(turnsBefore, turnsAfter) + 1; level <= Math.max(turnsBefore, turnsAfter); level++) {
                if (topOnAxis && k == last - 1 && level == topLevel) {
                    continue; // counted once, as the end point below
                }
                phaseCrossover(k, level);
            }
        }
        if (topOnAxis) {
            // its own mirror image: the plot passes the axis here once, and no encirclement is counted from it.
            // Its |1 + L| is the last grid point's, which the sensitivity peak's grid search already sees.
            double magnitude = Math.sqrt(magnitudeSquared(last));
            phaseCrossovers.add(new PhaseCrossover(w[last], 1 / magnitude));
        }
        return margins();
    }

    // ---- the grid ----

    private void buildGrid() {
        int count = base.length;
        double[] baseRe = new double[count];
        double[] baseIm = new double[count];
        double[] slope = new double[count];
        for (int k = 0; k < count; k++) {
            loop.at(base[k], reIm);
            baseRe[k] = reIm[0];
            baseIm[k] = reIm[1];
            double step = base[k] * SLOPE_RELATIVE_STEP;
            loop.at(base[k] - step, reIm);
            slope[k] = ArgumentWalk.turn(reIm[0], reIm[1], baseRe[k], baseIm[k]) / step;
        }
        append(base[0], baseRe[0], baseIm[0]);
        for (int k = 0; k < count - 1; k++) {
            double a = base[k];
            double b = base[k + 1];
            double predicted = Math.max(Math.abs(slope[k]), Math.abs(slope[k + 1])) * (b - a);
            long pieces = Double.isFinite(predicted) ? (long) Math.ceil(predicted / MAX_PHASE_STEP_RADIANS) : 1;
            pieces = Math.max(1, Math.min(pieces, MAX_GRID_POINTS - n));
            for (long j = 1; j < pieces; j++) {
                double x = a + (b - a) * j / pieces;
                loop.at(x, reIm);
                appendRefined(x, reIm[0], reIm[1]);
            }
            appendRefined(b, baseRe[k + 1], baseIm[k + 1]);
        }
    }

    /** Appends the point (x, L(x)), bisecting first between the last point and it while L turns quickly. */
    private void appendRefined(double x, double xRe, double xIm) {
        int last = n - 1;
        if (n < MAX_GRID_POINTS && x / w[last] - 1 > MIN_RELATIVE_WIDTH && turnsQuickly(last, xRe, xIm)) {
            double mid = Math.sqrt(w[last] * x);
            loop.at(mid, reIm);
            if (!Double.isFinite(reIm[0]) || !Double.isFinite(reIm[1])) {
                append(x, xRe, xIm); // the midpoint is a pole on the axis: no refinement resolves it
                return;
            }
            appendRefined(mid, reIm[0], reIm[1]);
            appendRefined(x, xRe, xIm);
        } else {
            append(x, xRe, xIm);
        }
    }

    private boolean turnsQuickly(int k, double xRe, double xIm) {
        double from = magnitudeSquared(k);
        double to = xRe * xRe + xIm * xIm;
        if (!Double.isFinite(from) || !Double.isFinite(to)) {
            return false; // a pole on the axis: no refinement resolves it
        }
        if (from == 0 || to == 0) {
            return true; // a zero of L: close in on it, the phase flips across it
        }
        double ratioSquared = to / from;
        if (ratioSquared > MAX_MAGNITUDE_RATIO * MAX_MAGNITUDE_RATIO
                || ratioSquared * MAX_MAGNITUDE_RATIO * MAX_MAGNITUDE_RATIO < 1) {
            return true;
        }
        // |arg(x / L_k)| > the step, without an arctangent: cos and sin of the turn are dot and cross
        double dot = re[k] * xRe + im[k] * xIm;
        double cross = re[k] * xIm - im[k] * xRe;
        return !(dot > 0 && Math.abs(cross) <= TAN_MAX_PHASE_STEP * dot);
    }

    private void append(double x, double xRe, double xIm) {
        if (!Double.isFinite(xRe) || !Double.isFinite(xIm)) {
            // a pole of L on the axis exactly at a grid frequency (an undamped mode): L has no value there,
            // and its neighbours on either side carry the walk past it
            return;
        }
        if (n == w.length) {
            int size = 2 * n;
            w = Arrays.copyOf(w, size);
            re = Arrays.copyOf(re, size);
            im = Arrays.copyOf(im, size);
        }
        w[n] = x;
        re[n] = xRe;
        im[n] = xIm;
        n++;
    }

    /**
     * Unwraps the phase along the grid. At the bottom it is taken in (-270, 90] degrees, the
     * branch of a loop with positive gain and up to two integrators; every margin below is read
     * modulo 360 degrees, so the branch names the turns but changes no figure.
     */
    private void unwrap() {
        phase = new double[n];
        double first = Math.atan2(im[0], re[0]);
        phase[0] = first > Math.PI / 2 ? first - TWO_PI : first;
        for (int k = 1; k < n; k++) {
            // the principal turn from point k - 1 to point k (one arctangent of a small angle)
            phase[k] = phase[k - 1] + ArgumentWalk.turn(re[k - 1], im[k - 1], re[k], im[k]);
        }
    }

    // ---- the crossings ----

    private void gainCrossover(int k) {
        double omega = solver.solve(MAX_EVALUATIONS, magnitudeSquaredMinusOne, w[k], w[k + 1]);
        loop.at(omega, reIm);
        double phaseRadians = phase[k] + ArgumentWalk.turn(re[k], im[k], reIm[0], reIm[1]);
        double marginDegrees = 180 + Math.toDegrees(phaseRadians);
        // in (-180, 180] even after rounding: with n = ceil(fl(fl(m - 180) / 360)), fl(m - 180) > 360 (n - 1),
        // so m - 180 > 360 (n - 1) (rounding is monotone and 360 (n - 1) is a double): m - 360 n > -180
        double wrappedDegrees = marginDegrees - 360 * Math.ceil((marginDegrees - 180) / 360);
        // the extra dead time turns this crossover clockwise by omega * tau until it reaches -1
        double turnToLimitDegrees = wrappedDegrees < 0 ? wrappedDegrees + 360 : wrappedDegrees;
        gainCrossovers.add(new GainCrossover(omega, wrappedDegrees, Math.toRadians(turnToLimitDegrees) / omega));
    }

    private void phaseCrossover(int k, int level) {
        anchorPhase = phase[k];
        anchorRe = re[k];
        anchorIm = im[k];
        levelRadians = level(level);
        double omega;
        if (phase[k] == levelRadians) {
            omega = w[k];
        } else if (phase[k + 1] == levelRadians) {
            omega = w[k + 1];
        } else {
            omega = solver.solve(MAX_EVALUATIONS, phaseFromLevel, w[k], w[k + 1]);
        }
        loop.at(omega, reIm);
        double magnitude = Math.hypot(reIm[0], reIm[1]);
        if (!(magnitude > 0) || Double.isInfinite(magnitude)) {
            return; // L vanishes or blows up here: no finite gain puts it on -1
        }
        double real = 1 + reIm[0];
        noteReturnDifference(omega, real * real + reIm[1] * reIm[1], k);
        phaseCrossovers.add(new PhaseCrossover(omega, 1 / magnitude));
    }

    /**
     * Near a phase crossover {@code |1 + L| = 1 - |L|} dips: where the phase turns faster than
     * the grid samples it, the dip there can be deeper than any grid point shows.
     */
    private void noteReturnDifference(double omega, double returnDifferenceSquared, int interval) {
        if (returnDifferenceSquared < crossingReturnDifferenceSquared) {
            crossingReturnDifferenceSquared = returnDifferenceSquared;
            crossingRadPerSecond = omega;
            crossingInterval = interval;
        }
    }

    // ---- the figures ----

    private LoopMargins margins() {
        double upper = Double.POSITIVE_INFINITY;
        double upperRadPerSecond = Double.NaN;
        double lower = 0;
        for (PhaseCrossover c : phaseCrossovers) {
            if (c.gainFactor() >= 1 && c.gainFactor() < upper) {
                upper = c.gainFactor();
                upperRadPerSecond = c.radPerSecond();
            } else if (c.gainFactor() < 1 && c.gainFactor() > lower) {
                lower = c.gainFactor();
            }
        }
        double smallestPhaseMargin = Double.POSITIVE_INFINITY;
        double crossover = Double.NaN;
        double smallestDelayMargin = Double.POSITIVE_INFINITY;
        for (GainCrossover c : gainCrossovers) {
            // the crossover nearest -1 sets the phase margin: the least phase change, lag or lead, that puts the
            // loop on -1. A crossover wrapped near -180 deg sits near +1 on a stable loop with several crossovers
            // and is far from instability; the smallest signed value would call it the worst.
            if (Math.abs(c.phaseMarginDegrees()) < Math.abs(smallestPhaseMargin)) {
                smallestPhaseMargin = c.phaseMarginDegrees();
                crossover = c.radPerSecond();
            }
            smallestDelayMargin = Math.min(smallestDelayMargin, c.delayMarginSeconds());
        }
        boolean hasGainMargin = upper < Double.POSITIVE_INFINITY;
        boolean hasPhaseMargin = !gainCrossovers.isEmpty();
        Optional<MarginNote> gainNote = hasGainMargin ? Optional.empty() : Optional.of(phaseCrossovers.isEmpty()
                ? MarginNote.PHASE_NEVER_REACHES_MINUS_180 : MarginNote.NO_UPPER_GAIN_LIMIT);
        Optional<MarginNote> phaseNote = hasPhaseMargin ? Optional.empty() : Optional.of(magnitudeSquared(0) < 1
                ? MarginNote.GAIN_STAYS_BELOW_ONE : MarginNote.GAIN_STAYS_ABOVE_ONE);
        double[] peak = sensitivityPeak();
        return new LoopMargins(
                hasGainMargin ? OptionalDouble.of(upper) : OptionalDouble.empty(),
                hasGainMargin ? OptionalDouble.of(upperRadPerSecond) : OptionalDouble.empty(),
                lower > 0 ? OptionalDouble.of(lower) : OptionalDouble.empty(),
                hasPhaseMargin ? OptionalDouble.of(smallestPhaseMargin) : OptionalDouble.empty(),
                hasPhaseMargin ? OptionalDouble.of(crossover) : OptionalDouble.empty(),
                hasPhaseMargin ? OptionalDouble.of(smallestDelayMargin) : OptionalDouble.empty(),
                peak[1], peak[0], gainNote, phaseNote, phaseCrossovers, gainCrossovers);
    }

    /** {omega, Ms}: the grid minimum of |1 + L| (or a deeper one met at a crossing), refined by Brent's minimizer. */
    private double[] sensitivityPeak() {
        int best = 0;
        for (int k = 1; k < n; k++) {
            if (returnDifferenceSquared(k) < returnDifferenceSquared(best)) {
                best = k;
            }
        }
        double peakRadPerSecond = w[best];
        double smallestReturnDifferenceSquared = returnDifferenceSquared(best);
        int low = best - 1;
        int high = best + 1;
        if (crossingReturnDifferenceSquared < smallestReturnDifferenceSquared) {
            peakRadPerSecond = crossingRadPerSecond;
            smallestReturnDifferenceSquared = crossingReturnDifferenceSquared;
            low = crossingInterval - 1;
            high = crossingInterval + 2;
        }
        double from = w[Math.max(low, 0)];
        double to = w[Math.min(high, n - 1)];
        if (to > from) {
            UnivariatePointValuePair refined = new BrentOptimizer(MINIMUM_RELATIVE_ACCURACY,
                    ABSOLUTE_FLOOR_RAD_PER_SECOND).optimize(new MaxEval(MAX_EVALUATIONS),
                    new UnivariateObjectiveFunction(this::returnDifferenceSquaredAt), GoalType.MINIMIZE,
                    new SearchInterval(from, to, Math.min(Math.max(peakRadPerSecond, from), to)));
            if (refined.getValue() < smallestReturnDifferenceSquared) {
                peakRadPerSecond = refined.getPoint();
                smallestReturnDifferenceSquared = refined.getValue();
            }
        }
        return new double[] {peakRadPerSecond, 1 / Math.sqrt(smallestReturnDifferenceSquared)};
    }

    // ---- small pieces ----

    /** The level -180 deg + level * 360 deg, in radians. */
    private static double level(int level) {
        return -Math.PI + TWO_PI * level;
    }

    /** How many levels -180 + 360 k lie at or below the phase: floor((phase + pi) / 2 pi). */
    private static int turns(double phaseRadians) {
        return (int) Math.floor((phaseRadians + Math.PI) / TWO_PI);
    }

    private static int nearestLevel(double phaseRadians) {
        return (int) Math.round((phaseRadians + Math.PI) / TWO_PI);
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

    /** The unwrapped phase, continued from the anchor grid point, less the level being crossed. */
    private double phaseFromLevel(double omegaRadPerSecond) {
        loop.at(omegaRadPerSecond, reIm);
        return anchorPhase + ArgumentWalk.turn(anchorRe, anchorIm, reIm[0], reIm[1]) - levelRadians;
    }

    private double returnDifferenceSquaredAt(double omegaRadPerSecond) {
        loop.at(omegaRadPerSecond, reIm);
        double real = 1 + reIm[0];
        return real * real + reIm[1] * reIm[1];
    }
}

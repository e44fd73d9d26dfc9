package org.loopform.analysis;

import java.util.Arrays;

/**
 * Follows {@code arg(1 + L)} continuously along a path through the plane of the loop variable (s or
 * z), the heart of the argument principle: the net change of the argument along a closed contour is
 * 2 pi times (zeros - poles) of {@code 1 + L} inside it (Astrom and Murray, Feedback Systems, 2008,
 * ch. 9, the Nyquist criterion; Churchill and Brown, Complex Variables and Applications, the argument
 * principle - from memory for the chapters).
 *
 * <p>The path is sampled at given points and refined by bisection until every step is safe to
 * add as a principal-value difference: the argument of {@code 1 + L}, the argument and log-magnitude
 * of the rational part R (L without its delay factor) and the phase of the delay factor each turn by
 * at most {@link #MAX_TURN} over the step. Where {@code |L|} stays below {@link #SMALL_LOOP} at both
 * ends and R changes little, {@code 1 + L} stays in a disk about 1 that does not hold the origin, so
 * the step cannot hide a turn and is taken as it is. Features narrower than any step (a pole close
 * to the path) must be seeded by the caller: the callers seed windows around every open-loop pole.
 * A step that cannot be resolved down to {@link #SMALLEST_STEP_RELATIVE} of its position marks the
 * walk {@link #unresolved()}: a closed-loop pole sits on the path.
 */
final class ArgumentWalk {

    /** The most any tracked angle may turn over one accepted step: far from the pi ambiguity. */
    static final double MAX_TURN = Math.PI / 8;
    /** Below this |L| at both ends of a step, 1 + L stays in a disk about 1 away from 0. */
    static final double SMALL_LOOP = 0.5;
    /** The most |R| may change over one step, as a natural logarithm (a factor of e^0.5 = 1.65). */
    static final double MAX_LOG_MAGNITUDE_STEP = 0.5;
    /** Bisection stops at this step relative to the position (about 2^-46): the pole is on the path. */
    static final double SMALLEST_STEP_RELATIVE = 1e-14;
    /** A hard cap on evaluations, far above what a resolvable loop needs. */
    static final int MAX_EVALUATIONS = 2_000_000;

    /** The loop along the path at parameter t. */
    interface Path {
        /** Writes {@code {Re L, Im L, Re R, Im R}} at parameter t into {@code out}. */
        void at(double t, double[] out);
    }

    private final Path path;
    private final double delayTurnPerUnit;
    private boolean unresolved;
    private int evaluations;
    /**
     * Signed crossings of the principal argument's branch cut over the walk ({@link #wrapsOfStep});
     * a double, so that an unresolved step's non-finite turn poisons the change as it used to.
     */
    private double wraps;
    /** Where along the path |1 + L| was smallest among the points evaluated, and that |1 + L|^2. */
    private double closestT = Double.NaN;
    private double closestReturnDifferenceSquared = Double.POSITIVE_INFINITY;

    /**
     * @param path the loop along the path
     * @param delayTurnPerUnit how fast the delay factor turns, radians per unit of t (the dead time in
     *     seconds for {@code t = omega}; the whole delay scans for {@code t = theta})
     */
    ArgumentWalk(Path path, double delayTurnPerUnit) {
        this.path = path;
        this.delayTurnPerUnit = delayTurnPerUnit;
    }

    /**
     * The net change of {@code arg(1 + L)}, radians, from the first to the last of the sorted,
     * distinct points {@code ts}, each interval refined as needed.
     *
     * <p>The change is the sum of every step's principal turn. It is added up without an arctangent
     * per step: the sum of principal turns telescopes to {@code Arg(end) - Arg(start)} plus 2 pi for
     * every step whose turn carries the argument across the branch cut of the principal argument
     * (the negative real axis), signed by the turn's direction (see {@link #wrapsOfStep}). Each
     * step's crossing is read from the signs of the imaginary parts and of the turn alone, so the
     * count is exact integer arithmetic and the only arctangents are the two at the ends.
     */
    double change(double[] ts) {
        double[] sorted = ts.clone();
        Arrays.sort(sorted);
        wraps = 0;
        double[] left = new double[4];
        evaluate(sorted[0], left);
        double[] first = left;
        for (int k = 1; k < sorted.length; k++) {
            if (!(sorted[k] > sorted[k - 1])) {
                continue;
            }
            double[] right = new double[4];
            evaluate(sorted[k], right);
            refine(sorted[k - 1], left, sorted[k], right, 0);
            left = right;
        }
        return principalArgumentOfReturnDifference(left) - principalArgumentOfReturnDifference(first)
                + 2 * Math.PI * wraps;
    }

    /** True when some step could not be resolved: 1 + L vanishes on (or within rounding of) the path. */
    boolean unresolved() {
        return unresolved;
    }

    int evaluations() {
        return evaluations;
    }

    /** The parameter of the evaluated point where |1 + L| was smallest: near the closest zero of 1 + L. */
    double closestT() {
        return closestT;
    }

    private void evaluate(double t, double[] out) {
        path.at(t, out);
        evaluations++;
        double re = 1 + out[0];
        double d2 = re * re + out[1] * out[1];
        if (d2 < closestReturnDifferenceSquared) {
            closestReturnDifferenceSquared = d2;
            closestT = t;
        }
    }

    /** The principal argument of 1 + L at a point, in (-pi, pi]. */
    static double principalArgumentOfReturnDifference(double[] v) {
        return principalArgument(v[1], 1 + v[0]);
    }

    private void refine(double a, double[] fa, double b, double[] fb, int depth) {
        if (acceptable(a, fa, b, fb)) {
            wraps += wrapsOfStep(1 + fa[0], fa[1], 1 + fb[0], fb[1]);
            return;
        }
        double scale = Math.max(Math.abs(a), Math.abs(b));
        if (b - a <= SMALLEST_STEP_RELATIVE * scale || evaluations >= MAX_EVALUATIONS || depth > 200) {
            double turn = turn(1 + fa[0], fa[1], 1 + fb[0], fb[1]);
            if (Math.abs(turn) > Math.PI / 2) {
                unresolved = true;
            }
            // an unresolved step: its principal turn, whatever it is, read against the two arguments
            double arguments = principalArgumentOfReturnDifference(fb) - principalArgumentOfReturnDifference(fa);
            wraps += (turn - arguments) / (2 * Math.PI);
            return;
        }
        // the geometric mean lies strictly inside whenever any double does (b > 1.5 a leaves it 18 % clear of
        // either end, far beyond the rounding of two square roots and a product); where none does, no mid helps
        // and the depth cap ends the step
        double mid = a > 0 && b > 1.5 * a ? Math.sqrt(a) * Math.sqrt(b) : 0.5 * (a + b);
        double[] fm = new double[4];
        evaluate(mid, fm);
        refine(a, fa, mid, fm, depth + 1);
        refine(mid, fm, b, fb, depth + 1);
    }

    /**
     * How many times the principal turn from a to b crosses the branch cut of the principal argument,
     * signed: +1 when a counter-clockwise turn goes from the upper half-plane (argument in (0, pi])
     * to the lower one (argument in (-pi, 0]), -1 when a clockwise turn goes from the lower to the
     * upper, 0 otherwise. Then {@code turn(a, b) = Arg(b) - Arg(a) + 2 pi wrapsOfStep(a, b)} for
     * nonzero a and b, with Arg the principal argument in (-pi, pi] (the negative real axis at +pi
     * whatever the sign of a zero imaginary part, {@link #principalArgument}) and the turn
     * {@code atan2(Im(b conj a), Re(b conj a))} in [-pi, pi].
     *
     * <p>Derivation: {@code Arg(a) + t} differs from {@code Arg(b)} by 2 pi k. For t in (0, pi] it lies
     * in (Arg(a), Arg(a) + pi]: when a is upper and b lower it lies in (0, 2 pi] while Arg(b) lies in
     * (-pi, 0], so k = 1; when a is lower it lies in (-pi, pi], so k = 0; when both are upper it lies
     * in (0, 2 pi] and Arg(b) in (0, pi], so k = 0. For t in [-pi, 0) the mirror holds, and t = 0
     * leaves Arg unchanged (common practice: a winding number counted by signed crossings of a ray).
     */
    static int wrapsOfStep(double ar, double ai, double br, double bi) {
        boolean upperA = upper(ai, ar);
        boolean upperB = upper(bi, br);
        if (upperA == upperB) {
            return 0;
        }
        double cross = bi * ar - br * ai;
        double dot = br * ar + bi * ai;
        if (upperA) {
            return positiveTurn(cross, dot) ? 1 : 0;
        }
        return negativeTurn(cross, dot) ? -1 : 0;
    }

    /** Whether the principal argument of x + i y lies in (0, pi]: the upper half-plane and the negative real axis. */
    private static boolean upper(double y, double x) {
        return y > 0 || (y == 0 && x < 0);
    }

    /** Whether {@code Math.atan2(y, x) > 0}, without the arctangent (signed zeros as atan2 reads them). */
    static boolean positiveTurn(double y, double x) {
        if (y > 0) {
            return true;
        }
        // atan2(+0, x) is +pi for x < 0 or x = -0, and +0 otherwise
        return y == 0 && !isNegativeZero(y) && (x < 0 || isNegativeZero(x));
    }

    /** Whether {@code Math.atan2(y, x) < 0}, without the arctangent (signed zeros as atan2 reads them). */
    static boolean negativeTurn(double y, double x) {
        if (y < 0) {
            return true;
        }
        // atan2(-0, x) is -pi for x < 0 or x = -0, and -0 otherwise
        return isNegativeZero(y) && (x < 0 || isNegativeZero(x));
    }

    private static boolean isNegativeZero(double v) {
        return Double.doubleToRawLongBits(v) == Long.MIN_VALUE;
    }

    /** The principal argument of x + i y in (-pi, pi]: a zero imaginary part counts as +0 ({@code -0.0 + 0.0 = +0.0}). */
    static double principalArgument(double y, double x) {
        return Math.atan2(y + 0.0, x);
    }

    /** tan of the largest accepted turn, and the squared bounds of the accepted magnitude ratio. */
    private static final double TAN_MAX_TURN = Math.tan(MAX_TURN);
    private static final double TAN_TWICE_MAX_TURN = Math.tan(2 * MAX_TURN);
    private static final double MAX_MAGNITUDE_RATIO_SQUARED = Math.exp(2 * MAX_LOG_MAGNITUDE_STEP);
    private static final double SMALL_LOOP_SQUARED = SMALL_LOOP * SMALL_LOOP;

    /**
     * Whether the step may be added as a principal difference; the tests compare tangents and squared
     * magnitudes rather than angles and logarithms (the same thresholds, and far cheaper).
     */
    private boolean acceptable(double a, double[] fa, double b, double[] fb) {
        double ra2 = fa[2] * fa[2] + fa[3] * fa[3];
        double rb2 = fb[2] * fb[2] + fb[3] * fb[3];
        double ratio = rb2 / ra2;
        boolean magnitudeSmooth = ratio <= MAX_MAGNITUDE_RATIO_SQUARED && ratio * MAX_MAGNITUDE_RATIO_SQUARED >= 1;
        if (!magnitudeSmooth) {
            return false;
        }
        double rDot = fa[2] * fb[2] + fa[3] * fb[3];
        double rCross = fa[2] * fb[3] - fa[3] * fb[2];
        double la2 = fa[0] * fa[0] + fa[1] * fa[1];
        double lb2 = fb[0] * fb[0] + fb[1] * fb[1];
        if (la2 < SMALL_LOOP_SQUARED && lb2 < SMALL_LOOP_SQUARED) {
            return rDot > 0 && Math.abs(rCross) <= TAN_TWICE_MAX_TURN * rDot;
        }
        if (!(rDot > 0 && Math.abs(rCross) <= TAN_MAX_TURN * rDot) || (b - a) * delayTurnPerUnit > MAX_TURN) {
            return false;
        }
        double ar = 1 + fa[0];
        double br = 1 + fb[0];
        double dot = ar * br + fa[1] * fb[1];
        double cross = ar * fb[1] - fa[1] * br;
        return dot > 0 && Math.abs(cross) <= TAN_MAX_TURN * dot;
    }

    /** The principal angle from (ar + i ai) to (br + i bi), in (-pi, pi]. */
    static double turn(double ar, double ai, double br, double bi) {
        // arg(b / a) = atan2(Im(b conj a), Re(b conj a))
        double cross = bi * ar - br * ai;
        double dot = br * ar + bi * ai;
        if (dot > 0 && Math.abs(cross) <= SMALL_TANGENT * dot) {
            return smallArctangent(cross / dot);
        }
        return Math.atan2(cross, dot);
    }

    /** Below this tangent (|angle| under 30 degrees) {@link #smallArctangent} replaces atan2. */
    static final double SMALL_TANGENT = 0.58;

    /**
     * arctan x for |x| at most {@link #SMALL_TANGENT}, to a few units in the last place: the half-angle
     * identity arctan x = 2 arctan(x / (1 + sqrt(1 + x^2))) brings |x| below 0.27, where the Taylor
     * series x - x^3/3 + x^5/5 - ... to x^29 leaves under 1e-17 (Abramowitz and Stegun, Handbook of
     * Mathematical Functions, 1964, 4.4.42 and 4.4.34 - from memory for the numbers). Nearly every
     * accepted step of a walk turns this little; the JNI call behind atan2 cost several times more.
     */
    static double smallArctangent(double x) {
        double t = x / (1 + Math.sqrt(1 + x * x));
        double t2 = t * t;
        double sum = ODD_RECIPROCALS[0];
        for (int k = 1; k < ODD_RECIPROCALS.length; k++) {
            sum = ODD_RECIPROCALS[k] - t2 * sum;
        }
        return 2 * t * sum;
    }

    /** 1/29, 1/27, ..., 1/3, 1: the series' coefficients, innermost first. */
    private static final double[] ODD_RECIPROCALS = new double[15];

    static {
        for (int k = 0; k < ODD_RECIPROCALS.length; k++) {
            ODD_RECIPROCALS[k] = 1.0 / (29 - 2 * k);
        }
    }
}

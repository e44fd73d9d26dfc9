package org.loopform.analysis;

import java.util.ArrayList;
import java.util.List;
import java.util.OptionalDouble;
import org.apache.commons.math3.analysis.solvers.LaguerreSolver;
import org.apache.commons.math3.complex.Complex;
import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

/**
 * The stability of a continuous loop {@code L(s) = R(s) e^(-s L)}, R rational (the controller's
 * feedback path times the process's rational part), decided exactly from its closed-loop poles:
 *
 * <ul>
 *   <li>without dead time, the roots of the characteristic polynomial {@code den R + num R};</li>
 *   <li>with dead time, by the Nyquist criterion: the number of closed-loop poles right of the line
 *       {@code Re s = sigma} is {@code Z = P - (1/pi) Delta arg(1 + L(sigma + i omega))}, omega
 *       from 0 to infinity, where P counts the open-loop poles right of the line (Astrom and
 *       Murray, Feedback Systems, 2008, section 9.2 - from memory for the section). The line
 *       passes a hair right of the imaginary axis ({@code sigma = +delta}), which indents it around
 *       integrators and other poles on the axis; a second count a hair left of it
 *       ({@code sigma = -delta}) finds poles on the axis, the marginal case. By conjugate symmetry
 *       the upper half of the contour gives half the turn; the closing arc at infinity adds
 *       nothing because L vanishes there.</li>
 *   <li>with dead time and a loop gain that does not fall off at high frequency (an unfiltered
 *       derivative on a first-order process), the neutral delay equation: its chain of roots lies
 *       at {@code Re s = ln|c| / L}, c the high-frequency loop gain, so |c| above 1 is unstable and
 *       |c| = 1 marginal (Hale and Verduyn Lunel, Introduction to Functional Differential Equations,
 *       1993, ch. 9 - from memory); a loop gain that grows is unstable.</li>
 * </ul>
 *
 * The path runs from omega = 0 to well past every corner of R, where |L| has fallen below 1/2
 * and keeps falling, through windows seeded around every open-loop pole and refined by
 * {@link ArgumentWalk}.
 */
public final class ContinuousStability {

    /** The line's offset from the imaginary axis, relative to the loop's slowest frequency scale. */
    static final double AXIS_OFFSET_RELATIVE = 1e-7;
    /** Roots of a delay-free loop within this relative distance of the axis count as on it. */
    static final double ROOT_AXIS_TOLERANCE = 1e-9;
    /** Log-spaced base points per decade along the path. */
    static final int POINTS_PER_DECADE = 10;
    /** A high-frequency loop gain within this of 1 is taken as 1: the neutral chain on the axis. */
    static final double HIGH_FREQUENCY_GAIN_TOLERANCE = 1e-12;
    private static final double[] WINDOW = {-8, -4, -2, -1, -0.5, -0.25, 0, 0.25, 0.5, 1, 2, 4, 8};

    private ContinuousStability() {
    }

    /**
     * The stability of {@code R(s) e^(-s deadTimeSeconds)} in negative feedback.
     *
     * @param rational R(s), the loop without its dead time
     * @param deadTimeSeconds the dead time, >= 0 s
     * @param slowestRadPerSecond the loop's slowest frequency of interest (e.g. a decade below its lowest
     *     corner), rad/s: it sets how close to the axis a pole counts as on it
     */
    public static LoopStability of(TransferFunction rational, double deadTimeSeconds, double slowestRadPerSecond) {
        if (!(deadTimeSeconds >= 0) || Double.isInfinite(deadTimeSeconds)) {
            throw new IllegalArgumentException("dead time must be finite and >= 0 s (got " + deadTimeSeconds + " s)");
        }
        if (!(slowestRadPerSecond > 0) || Double.isInfinite(slowestRadPerSecond)) {
            throw new IllegalArgumentException("slowest frequency must be finite and > 0 rad/s (got "
                    + slowestRadPerSecond + ")");
        }
        Polynomial num = rational.numerator();
        Polynomial den = rational.denominator();
        if (deadTimeSeconds == 0) {
            return delayFree(num, den, slowestRadPerSecond);
        }
        int relativeDegree = den.degree() - num.degree();
        if (relativeDegree < 0) {
            return new LoopStability(Stability.UNSTABLE, StabilityTest.HIGH_FREQUENCY_GAIN, Integer.MAX_VALUE,
                    OptionalDouble.empty(), "The loop gain grows without bound at high frequency behind a dead time:"
                    + " the closed loop has infinitely many unstable poles.");
        }
        if (relativeDegree == 0) {
            double c = Math.abs(num.coefficient(num.degree()) / den.coefficient(den.degree()));
            if (c > 1 + HIGH_FREQUENCY_GAIN_TOLERANCE) {
                return new LoopStability(Stability.UNSTABLE, StabilityTest.HIGH_FREQUENCY_GAIN, Integer.MAX_VALUE,
                        OptionalDouble.empty(), "The loop gain stays at " + String.format(java.util.Locale.ROOT,
                        "%.4g", c) + " (above 1) at high frequency behind a dead time: the closed loop has"
                        + " infinitely many unstable poles. Filter the derivative.");
            }
            if (c >= 1 - HIGH_FREQUENCY_GAIN_TOLERANCE) {
                return new LoopStability(Stability.MARGINAL, StabilityTest.HIGH_FREQUENCY_GAIN, 0,
                        OptionalDouble.empty(), "The loop gain stays at 1 at high frequency behind a dead time: a"
                        + " chain of closed-loop poles lies on the imaginary axis. Filter the derivative.");
            }
        }
        List<Complex> poles = polesOf(den);
        double delta = AXIS_OFFSET_RELATIVE * slowestRadPerSecond;
        Count right = count(num, den, poles, deadTimeSeconds, delta, slowestRadPerSecond);
        if (right.unstable() > 0) {
            return new LoopStability(Stability.UNSTABLE, StabilityTest.NYQUIST, right.unstable(), OptionalDouble.empty(),
                    right.unstable() == 1 ? "One closed-loop pole lies in the right half plane."
                            : right.unstable() + " closed-loop poles lie in the right half plane.");
        }
        Count left = count(num, den, poles, deadTimeSeconds, -delta, slowestRadPerSecond);
        if (right.unresolved() || left.unresolved() || left.unstable() > 0) {
            return new LoopStability(Stability.MARGINAL, StabilityTest.NYQUIST, 0, OptionalDouble.empty(),
                    "A closed-loop pole lies on the imaginary axis (within " + String.format(java.util.Locale.ROOT,
                    "%.2g", delta) + " rad/s): the loop neither settles nor runs away.");
        }
        return new LoopStability(Stability.STABLE, StabilityTest.NYQUIST, 0, OptionalDouble.empty(),
                "Every closed-loop pole lies in the left half plane.");
    }

    private record Count(int unstable, boolean unresolved) {
    }

    private static Count count(Polynomial num, Polynomial den, List<Complex> poles, double deadTime, double sigma,
                               double slowest) {
        int openLoopRight = 0;
        List<Double> points = new ArrayList<>();
        points.add(0.0);
        double top = slowest;
        for (Complex p : poles) {
            if (p.getReal() > sigma) {
                openLoopRight++;
            }
            double distance = Math.abs(p.getReal() - sigma);
            double foot = Math.abs(p.getImaginary());
            for (double k : WINDOW) {
                double w = foot + k * distance;
                if (w > 0) {
                    points.add(w);
                }
            }
            top = Math.max(top, p.abs());
        }
        top = Math.max(top, cauchyBound(num));
        top = Math.max(top, cauchyBound(den));
        top = Math.max(top, 1 / deadTime);
        double[] value = new double[4];
        double end = 10 * top;
        Path path = new Path(num, den, deadTime, sigma);
        // past every corner a strictly proper R falls monotonically: go on until |L| is small. A
        // biproper R keeps |L| near its high-frequency gain c < 1, a disk that holds no winding.
        for (int k = 0; k < 60 && num.degree() < den.degree(); k++) {
            path.at(end, value);
            if (Math.hypot(value[0], value[1]) < ArgumentWalk.SMALL_LOOP) {
                break;
            }
            end *= 2;
        }
        double low = Math.min(Math.abs(sigma) / 100, slowest / 100);
        int decades = (int) Math.ceil(Math.log10(end / low));
        for (int k = 0; k <= decades * POINTS_PER_DECADE; k++) {
            points.add(low * Math.pow(10, (double) k / POINTS_PER_DECADE));
        }
        double last = end;
        double[] ts = points.stream().mapToDouble(Double::doubleValue).filter(w -> w <= last).toArray();
        ts = java.util.Arrays.copyOf(ts, ts.length + 1);
        ts[ts.length - 1] = end;
        ArgumentWalk walk = new ArgumentWalk(path, deadTime);
        double change = walk.change(ts);
        path.at(end, value);
        // from the end to infinity 1 + L stays in a disk about 1 that holds no zero: it only returns
        // to its principal argument there
        change -= ArgumentWalk.principalArgumentOfReturnDifference(value);
        double turns = change / Math.PI;
        long whole = Math.round(turns);
        boolean unresolved = walk.unresolved() || Math.abs(turns - whole) > 0.25;
        return new Count((int) Math.max(0, openLoopRight - whole), unresolved);
    }

    /** All roots of a polynomial; exact zeros (trailing zero coefficients) are returned as exact zeros. */
    static List<Complex> polesOf(Polynomial p) {
        double[] a = p.ascending();
        int zeros = 0;
        while (zeros < a.length - 1 && a[zeros] == 0) {
            zeros++;
        }
        List<Complex> roots = new ArrayList<>();
        for (int k = 0; k < zeros; k++) {
            roots.add(Complex.ZERO);
        }
        double[] rest = java.util.Arrays.copyOfRange(a, zeros, a.length);
        int degree = rest.length - 1;
        if (degree == 1) {
            roots.add(new Complex(-rest[0] / rest[1], 0));
        } else if (degree >= 2) {
            for (Complex r : new LaguerreSolver(1e-15, 1e-15).solveAllComplex(rest, 0.0)) {
                roots.add(r);
            }
        }
        return roots;
    }

    /** Every root of p lies within 1 + max |a_k / a_n| (Cauchy's bound). */
    static double cauchyBound(Polynomial p) {
        int n = p.degree();
        if (n < 1) {
            return 0;
        }
        double lead = Math.abs(p.coefficient(n));
        double m = 0;
        for (int k = 0; k < n; k++) {
            m = Math.max(m, Math.abs(p.coefficient(k)) / lead);
        }
        return 1 + m;
    }

    private static LoopStability delayFree(Polynomial num, Polynomial den, double slowest) {
        Polynomial characteristic = den.plus(num);
        if (characteristic.degree() < 1) {
            return new LoopStability(Stability.STABLE, StabilityTest.POLYNOMIAL_ROOTS, 0, OptionalDouble.empty(),
                    "The closed loop has no poles.");
        }
        int unstable = 0;
        boolean onAxis = false;
        for (Complex r : polesOf(characteristic)) {
            double tolerance = ROOT_AXIS_TOLERANCE * Math.max(r.abs(), slowest);
            if (r.getReal() > tolerance) {
                unstable++;
            } else if (r.getReal() >= -tolerance) {
                onAxis = true;
            }
        }
        if (unstable > 0) {
            return new LoopStability(Stability.UNSTABLE, StabilityTest.POLYNOMIAL_ROOTS, unstable,
                    OptionalDouble.empty(), unstable == 1 ? "One closed-loop pole lies in the right half plane."
                    : unstable + " closed-loop poles lie in the right half plane.");
        }
        if (onAxis) {
            return new LoopStability(Stability.MARGINAL, StabilityTest.POLYNOMIAL_ROOTS, 0, OptionalDouble.empty(),
                    "A closed-loop pole lies on the imaginary axis: the loop neither settles nor runs away.");
        }
        return new LoopStability(Stability.STABLE, StabilityTest.POLYNOMIAL_ROOTS, 0, OptionalDouble.empty(),
                "Every closed-loop pole lies in the left half plane.");
    }

    /** L and R along {@code s = sigma + i omega}. */
    private static final class Path implements ArgumentWalk.Path {
        private final Polynomial num;
        private final Polynomial den;
        private final double deadTime;
        private final double sigma;
        private final double delayDecay;
        private final double[] n = new double[2];
        private final double[] d = new double[2];

        Path(Polynomial num, Polynomial den, double deadTime, double sigma) {
            this.num = num;
            this.den = den;
            this.deadTime = deadTime;
            this.sigma = sigma;
            this.delayDecay = Math.exp(-sigma * deadTime);
        }

        @Override
        public void at(double omega, double[] out) {
            num.valueAtComplex(sigma, omega, n);
            den.valueAtComplex(sigma, omega, d);
            double mag2 = d[0] * d[0] + d[1] * d[1];
            double rr = (n[0] * d[0] + n[1] * d[1]) / mag2;
            double ri = (n[1] * d[0] - n[0] * d[1]) / mag2;
            double lag = omega * deadTime;
            double cos = Math.cos(lag) * delayDecay;
            double sin = Math.sin(lag) * delayDecay;
            out[0] = rr * cos + ri * sin;
            out[1] = ri * cos - rr * sin;
            out[2] = rr;
            out[3] = ri;
        }
    }
}

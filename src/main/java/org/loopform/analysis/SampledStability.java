package org.loopform.analysis;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import org.apache.commons.math3.complex.Complex;

/**
 * The stability of a sampled loop from its closed-loop poles, the zeros of {@code 1 + L(z)} (with
 * any pole-zero pair the loop cancels, which the count keeps on both sides). The number of
 * closed-loop poles outside the circle {@code |z| = r} is {@code Z = P - N}, P the open-loop poles
 * outside it and N the turns of {@code 1 + L} around 0 as z goes once round the circle
 * counter-clockwise (the argument principle; Astrom and Wittenmark, Computer-Controlled Systems,
 * 3rd ed., 1997, ch. 3, the Nyquist criterion for sampled systems - from memory for the chapter). By
 * conjugate symmetry the upper half circle, theta from 0 to pi, gives half the turn. The loop is
 * stable when no pole lies outside {@code |z| = 1 + tolerance} nor inside the ring down to
 * {@code 1 - tolerance} (tolerance {@value #MARGINAL_TOLERANCE}: a pole there takes more than 10^8
 * scans to grow or decay by e), marginal when one lies in the ring, unstable otherwise. The largest
 * pole magnitude is found by Newton's method confirmed by the counts (bisection where Newton fails), to
 * {@value #RELATIVE_LOG_TOLERANCE} of
 * {@code |ln r|}.
 */
public final class SampledStability {

    static final double MARGINAL_TOLERANCE = 1e-8;
    static final double RELATIVE_LOG_TOLERANCE = 1e-6;
    /** Beyond e^40 the magnitude is reported at the bound. */
    static final double LARGEST_LOG_RADIUS = 40;
    /**
     * Below e^-25 (1.4e-11) the magnitude is reported at the bound. The loop is evaluated on circles
     * given by their offset from 1 ({@link SampledLoop#at}), and 1 + (e^x - 1) keeps the radius to
     * about 1.1e-16 absolute: at e^-25 that is 8e-6 of r, 3e-7 of |ln r|, within the stated accuracy;
     * further in the radius is lost to rounding (at e^-37 it is 0) and a count there means nothing.
     */
    static final double SMALLEST_LOG_RADIUS = -25;
    static final int BASE_POINTS = 16;
    /** A circle this close (relative) to an open-loop pole's radius is moved just outside it. */
    static final double POLE_CLEARANCE = 1e-9;
    static final int POINTS_PER_DECADE = 8;
    private static final double[] WINDOW = {-8, -4, -2, -1, -0.5, -0.25, 0, 0.25, 0.5, 1, 2, 4, 8};

    private SampledStability() {
    }

    public static LoopStability of(SampledLoop loop) {
        return decide(new Counter(loop));
    }

    /**
     * The circles walked to decide {@code loop} (for tests of the quick paths: a loop whose largest pole
     * Newton's method reaches is decided in four walks when stable - at 1 + and 1 - the tolerance and
     * either side of the pole - and in three when unstable with that pole within 1 % of the circle, where
     * Newton's travel outward is bounded; the bracketing search takes six to thirty).
     */
    static int circlesWalked(SampledLoop loop) {
        Counter counter = new Counter(loop);
        decide(counter);
        return counter.walks;
    }

    private static LoopStability decide(Counter counter) {
        int outside = counter.outside(MARGINAL_TOLERANCE);
        if (outside > 0) {
            double largest = Math.exp(largestLogRadius(counter, true));
            return new LoopStability(Stability.UNSTABLE, StabilityTest.SAMPLED_POLES, outside, OptionalDouble.of(largest),
                    (outside == 1 ? "One closed-loop pole lies" : outside + " closed-loop poles lie")
                            + " outside the unit circle (largest |z| = " + magnitude(largest) + "): the loop runs away.");
        }
        int ring = counter.outside(-MARGINAL_TOLERANCE);
        if (ring > 0 || counter.unresolved) {
            return new LoopStability(Stability.MARGINAL, StabilityTest.SAMPLED_POLES, 0, OptionalDouble.of(1.0),
                    "A closed-loop pole lies on the unit circle (within " + MARGINAL_TOLERANCE
                            + "): the loop neither settles nor runs away.");
        }
        double largest = Math.exp(largestLogRadius(counter, false));
        return new LoopStability(Stability.STABLE, StabilityTest.SAMPLED_POLES, 0, OptionalDouble.of(largest),
                "Every closed-loop pole lies inside the unit circle (largest |z| = " + magnitude(largest) + ").");
    }

    /**
     * The number of closed-loop poles outside the circle {@code |z| = 1 + radiusOffset} (the count the
     * verdict and the bisection use).
     */
    public static int polesOutside(SampledLoop loop, double radiusOffset) {
        return new Counter(loop).outside(radiusOffset);
    }

    private static String magnitude(double r) {
        return String.format(Locale.ROOT, "%.6g", r);
    }

    /**
     * ln r* of the largest closed-loop pole, r* = inf{r : no pole outside |z| = r}. The decades of
     * |ln r| are searched for a bracket [in, out] (a pole outside e^in, none outside e^out); then
     * Newton's method on {@code 1 + L(e^w) = 0} from the point of the circle e^in nearest a zero
     * proposes the pole, which is accepted only when the counts confirm it (no pole outside it, one
     * just inside it); otherwise, or when Newton fails, the bracket is bisected. The result is good to
     * {@value #RELATIVE_LOG_TOLERANCE} of |ln r*| (or 1e-12 absolute).
     */
    private static double largestLogRadius(Counter c, boolean outward) {
        double quick = fromUnitCircle(c, outward);
        if (!Double.isNaN(quick)) {
            return quick;
        }
        double in;
        double out;
        if (outward) {
            in = MARGINAL_TOLERANCE;
            out = 1e-3;
            while (out < LARGEST_LOG_RADIUS && c.outsideLog(out) > 0) {
                in = out;
                out *= 10;
            }
            if (out >= LARGEST_LOG_RADIUS) {
                if (c.outsideLog(LARGEST_LOG_RADIUS) > 0) {
                    return LARGEST_LOG_RADIUS;
                }
                out = LARGEST_LOG_RADIUS;
            }
        } else {
            out = -MARGINAL_TOLERANCE;
            in = -1e-3;
            while (in > SMALLEST_LOG_RADIUS && c.outsideLog(in) == 0) {
                out = in;
                in *= 10;
            }
            if (in <= SMALLEST_LOG_RADIUS) {
                if (c.outsideLog(SMALLEST_LOG_RADIUS) == 0) {
                    return SMALLEST_LOG_RADIUS;
                }
                in = SMALLEST_LOG_RADIUS;
            }
        }
        for (int step = 0; step < 200; step++) {
            double tolerance = Math.max(1e-12, RELATIVE_LOG_TOLERANCE * Math.min(Math.abs(in), Math.abs(out)));
            if (out - in <= tolerance) {
                break;
            }
            // the count at 'in' leaves the walk's point nearest a zero of 1 + L on that circle
            c.outsideLog(in);
            double proposal = newton(c.loop, in, c.closestTheta);
            if (proposal > in && proposal <= out) {
                double eps = Math.max(1e-12, 0.5 * tolerance);
                if (c.outsideLog(proposal + eps) == 0) {
                    if (c.outsideLog(proposal - eps) > 0) {
                        return proposal;
                    }
                    // no pole just inside it either: Newton found no zero, only narrow the bracket
                    out = proposal - eps > in ? proposal - eps : proposal + eps;
                    continue;
                }
                in = proposal + eps;
                continue;
            }
            double mid = 0.5 * (in + out);
            if (c.outsideLog(mid) > 0) {
                in = mid;
            } else {
                out = mid;
            }
        }
        return 0.5 * (in + out);
    }

    /**
     * The largest pole straight from the count just made at the unit circle ({@code outward}: at
     * {@code 1 + tolerance}, where poles lie outside; otherwise at {@code 1 - tolerance}, where none
     * does): Newton's method from that circle's point nearest a zero of 1 + L, accepted only when
     * the counts confirm it as the bracketing search would (no pole outside it, one just inside it).
     * Inside the circle, when that fails, more starts ({@link #fromSeveralStarts}). NaN when Newton
     * fails or the counts refuse it; then the bracketing search runs. Saves the search's six to
     * twenty-five counts on most loops.
     */
    private static double fromUnitCircle(Counter c, boolean outward) {
        double offset = outward ? MARGINAL_TOLERANCE : -MARGINAL_TOLERANCE;
        c.outside(offset);  // the count 'of' just made, remembered: sets the nearest point without a walk
        double start = Math.log1p(offset);
        double proposal = newton(c.loop, start, c.closestTheta);
        boolean side = outward ? proposal > start : proposal < start;
        if (side && proposal < LARGEST_LOG_RADIUS && proposal > SMALLEST_LOG_RADIUS) {
            double eps = 0.5 * Math.max(1e-12, RELATIVE_LOG_TOLERANCE * Math.abs(proposal));
            if (c.outsideLog(proposal + eps) == 0 && c.outsideLog(proposal - eps) > 0) {
                return proposal;
            }
        }
        return outward ? Double.NaN : fromSeveralStarts(c, start);
    }

    /** Newton's start next to an open-loop pole: this share of its ln r further out. */
    private static final double POLE_START_OFFSET = 1e-6;

    /** Newton's starts on the positive real axis, as ln r: where a slow real mode of the loop lies. */
    private static final double[] REAL_AXIS_STARTS = {-1e-4, -1e-3, -1e-2, -1e-1};

    /**
     * The largest pole of a loop with none outside the unit circle, when Newton's method from that
     * circle's nearest point did not give it: Newton's method from more starts, the largest zero it
     * finds accepted only when the counts confirm it, as there (no pole outside it, one just inside
     * it); NaN otherwise, and the bracketing search runs. The starts: the unit circle's nearest point
     * with no bound on the travel; points of the positive real axis (a slow real mode, the integral
     * action's); and each open-loop pole inside the circle, with Newton's method on
     * {@code (z - p)(1 + L(z))}, which has the zeros of {@code 1 + L} but not its pole at p: a
     * closed-loop pole next to an open-loop pole the controller's zero nearly cancels (a lag
     * tuned away) lies in a basin too narrow for Newton's method on {@code 1 + L} itself. The counts
     * make the answer what the bracketing search would certify; the starts only spare its counts.
     */
    private static double fromSeveralStarts(Counter c, double start) {
        double best = newton(c.loop, start, c.closestTheta, LARGEST_LOG_RADIUS, null);
        for (double x0 : REAL_AXIS_STARTS) {
            best = larger(best, newton(c.loop, x0, 0.0, LARGEST_LOG_RADIUS, null), start);
        }
        for (Complex p : c.poles) {
            double r = p.abs();
            if (r > 0 && r < 1) {
                // just off the pole, where (z - p)(1 + L) is finite
                best = larger(best, newton(c.loop, Math.log(r) * (1 - POLE_START_OFFSET),
                        Math.atan2(p.getImaginary(), p.getReal()), LARGEST_LOG_RADIUS, p), start);
            }
        }
        if (!(best < start) || !(best > SMALLEST_LOG_RADIUS)) {
            return Double.NaN;
        }
        double eps = 0.5 * Math.max(1e-12, RELATIVE_LOG_TOLERANCE * Math.abs(best));
        if (c.outsideLog(best + eps) == 0 && c.outsideLog(best - eps) > 0) {
            return best;
        }
        return Double.NaN;
    }

    /** The larger of two proposals that lie inside {@code start} (NaN for none). */
    static double larger(double best, double proposal, double start) {
        if (!(proposal < start)) {
            return best;
        }
        return best < start && best >= proposal ? best : proposal;
    }

    /**
     * Newton's method on {@code f(w) = 1 + L(e^w)}, w = ln r + i theta, from (x, theta); the derivative
     * by a central difference along x (f is analytic, so that is f'). Returns the real part of the zero
     * it converges to, or NaN when it does not converge.
     */
    static double newton(SampledLoop loop, double x, double theta) {
        return newton(loop, x, theta, 10 * Math.max(Math.abs(x), 1e-3), null);
    }

    /**
     * As {@link #newton(SampledLoop, double, double)}, giving up once x has travelled more than
     * {@code reach}; with {@code pole} given, on {@code (z - pole)(1 + L(z))} instead (the same
     * zeros, without the pole at {@code pole}).
     */
    static double newton(SampledLoop loop, double x, double theta, double reach, Complex pole) {
        double[] f = new double[4];
        double[] fp = new double[4];
        double[] fm = new double[4];
        double startX = x;
        for (int k = 0; k < 40; k++) {
            loop.at(Math.expm1(x), theta, f);
            double h = 1e-7 * Math.max(Math.abs(x), 1e-4);
            loop.at(Math.expm1(x + h), theta, fp);
            loop.at(Math.expm1(x - h), theta, fm);
            if (pole != null) {
                deflate(f, x, theta, pole);
                deflate(fp, x + h, theta, pole);
                deflate(fm, x - h, theta, pole);
            }
            double dRe = (fp[0] - fm[0]) / (2 * h);
            double dIm = (fp[1] - fm[1]) / (2 * h);
            double fRe = 1 + f[0];
            double fIm = f[1];
            double d2 = dRe * dRe + dIm * dIm;
            if (!(d2 > 0) || !Double.isFinite(d2)) {
                return Double.NaN;
            }
            double stepRe = (fRe * dRe + fIm * dIm) / d2;
            double stepIm = (fIm * dRe - fRe * dIm) / d2;
            x -= stepRe;
            theta -= stepIm;
            if (!Double.isFinite(x) || Math.abs(x - startX) > reach) {
                return Double.NaN;
            }
            if (Math.hypot(stepRe, stepIm) <= 1e-14 * Math.max(1, Math.abs(x)) + 1e-15) {
                return x;
            }
        }
        return Double.NaN;
    }

    /**
     * Replaces {@code L} in {@code out} (at z = e^(x + i theta)) by {@code L'} with
     * {@code 1 + L' = (z - pole)(1 + L)}, so that the Newton step reads the deflated function.
     */
    private static void deflate(double[] out, double x, double theta, Complex pole) {
        double r = Math.exp(x);
        double dr = r * Math.cos(theta) - pole.getReal();
        double di = r * Math.sin(theta) - pole.getImaginary();
        double fr = 1 + out[0];
        double fi = out[1];
        out[0] = dr * fr - di * fi - 1;
        out[1] = dr * fi + di * fr;
    }

    /** 10^(k / POINTS_PER_DECADE), from a table for the usual k (the same values Math.pow gives). */
    static double decadeStep(int k) {
        return k < DECADE_STEPS.length ? DECADE_STEPS[k] : Math.pow(10, (double) k / POINTS_PER_DECADE);
    }

    private static final double[] DECADE_STEPS = new double[POINTS_PER_DECADE * 40];

    static {
        for (int k = 0; k < DECADE_STEPS.length; k++) {
            DECADE_STEPS[k] = Math.pow(10, (double) k / POINTS_PER_DECADE);
        }
    }

    /** Counts closed-loop poles outside circles about 0. */
    private static final class Counter {
        private final SampledLoop loop;
        private final List<Complex> poles;
        private boolean unresolved;
        /** How many circles have been walked (a remembered count is not walked again). */
        private int walks;
        /** After a count: the angle on that circle where |1 + L| was smallest. */
        private double closestTheta;

        /** The last count's circle (offset), result and nearest point: a repeated count is not walked again. */
        private double lastOffset = Double.NaN;
        private int lastCount;
        private double lastClosestTheta;

        /** Closed-loop poles outside {@code |z| = e^logRadius}. */
        int outsideLog(double logRadius) {
            return outside(Math.expm1(logRadius));
        }

        /** Closed-loop poles outside {@code |z| = 1 + offset}; the last circle's count is remembered. */
        int outside(double offset) {
            if (offset == lastOffset) {
                closestTheta = lastClosestTheta;
                return lastCount;
            }
            int count = walkOutside(offset);
            lastOffset = offset;
            lastCount = count;
            lastClosestTheta = closestTheta;
            return count;
        }

        Counter(SampledLoop loop) {
            this.loop = loop;
            this.poles = List.copyOf(loop.openLoopPoles());
        }

        private int walkOutside(double offset) {
            walks++;
            // a circle through an open-loop pole has no winding number: step just outside the pole
            for (Complex p : poles) {
                double r = p.abs();
                if (Math.abs(r - (1 + offset)) <= POLE_CLEARANCE * r) {
                    offset += 2 * POLE_CLEARANCE * r;
                }
            }
            double radius = 1 + offset;
            int openLoopOutside = 0;
            double[] points = new double[2 + BASE_POINTS + WINDOW.length * poles.size() + 64];
            int size = 0;
            double finest = 1e-7;
            for (Complex p : poles) {
                double r = p.abs();
                if (r > radius) {
                    openLoopOutside++;
                }
                double width = Math.abs(r - radius) / radius;
                double angle = Math.abs(Math.atan2(p.getImaginary(), p.getReal()));
                for (double k : WINDOW) {
                    double t = angle + k * width;
                    if (t > 0 && t < Math.PI) {
                        points[size++] = t;
                        finest = Math.min(finest, t);
                    }
                }
            }
            points[size++] = 0.0;
            points[size++] = Math.PI;
            for (int k = 1; k < BASE_POINTS; k++) {
                points[size++] = Math.PI * k / BASE_POINTS;
            }
            int decades = (int) Math.ceil(Math.log10(Math.PI / finest));
            if (size + decades * POINTS_PER_DECADE > points.length) {
                points = java.util.Arrays.copyOf(points, size + decades * POINTS_PER_DECADE);
            }
            for (int k = 0; k < decades * POINTS_PER_DECADE; k++) {
                points[size++] = finest * decadeStep(k);
            }
            // every point lies in [0, pi] by construction but the log-spaced ones may pass pi
            int kept = 0;
            for (int k = 0; k < size; k++) {
                double t = points[k];
                if (t >= 0 && t <= Math.PI) {
                    points[kept++] = t;
                }
            }
            double[] ts = java.util.Arrays.copyOf(points, kept);
            final double circle = offset;
            ArgumentWalk walk = new ArgumentWalk((theta, out) -> loop.at(circle, theta, out), loop.delayScans());
            double turns = walk.change(ts) / Math.PI;
            closestTheta = walk.closestT();
            long whole = Math.round(turns);
            if (walk.unresolved() || Math.abs(turns - whole) > 0.25) {
                unresolved = true;
            }
            return (int) Math.max(0, openLoopOutside - whole);
        }
    }
}

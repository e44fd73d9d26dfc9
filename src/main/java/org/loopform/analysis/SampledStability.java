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
 * pole magnitude is found by bisection on the radius, to {@value #RELATIVE_LOG_TOLERANCE} of
 * {@code |ln r|}.
 */
public final class SampledStability {

    static final double MARGINAL_TOLERANCE = 1e-8;
    static final double RELATIVE_LOG_TOLERANCE = 1e-6;
    /** Beyond e^40 (or below e^-40) the magnitude is reported at the bound. */
    static final double LARGEST_LOG_RADIUS = 40;
    static final int BASE_POINTS = 16;
    /** A circle this close (relative) to an open-loop pole's radius is moved just outside it. */
    static final double POLE_CLEARANCE = 1e-9;
    static final int POINTS_PER_DECADE = 8;
    private static final double[] WINDOW = {-8, -4, -2, -1, -0.5, -0.25, 0, 0.25, 0.5, 1, 2, 4, 8};

    private SampledStability() {
    }

    public static LoopStability of(SampledLoop loop) {
        Counter counter = new Counter(loop);
        int outside = counter.outside(MARGINAL_TOLERANCE);
        if (outside > 0) {
            double largest = Math.exp(bisect(counter, true));
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
        double largest = Math.exp(-bisect(counter, false));
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
     * The log radius |ln r*| of the largest pole: for an unstable loop (outward) the smallest u > 0
     * with no pole outside e^u; for a stable one the smallest u > 0 with a pole outside e^-u.
     */
    private static double bisect(Counter c, boolean outward) {
        double lo = MARGINAL_TOLERANCE;
        double hi = 1e-3;
        while (hi < LARGEST_LOG_RADIUS && found(c, outward, hi)) {
            lo = hi;
            hi *= 10;
        }
        if (hi >= LARGEST_LOG_RADIUS && found(c, outward, LARGEST_LOG_RADIUS)) {
            return LARGEST_LOG_RADIUS;
        }
        hi = Math.min(hi, LARGEST_LOG_RADIUS);
        while (hi / lo > 1 + RELATIVE_LOG_TOLERANCE) {
            double mid = Math.sqrt(lo * hi);
            if (found(c, outward, mid)) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return Math.sqrt(lo * hi);
    }

    /**
     * Outward: true while some pole lies outside e^u (u below the largest log radius). Inward: true
     * while no pole lies outside e^-u (u below the distance of the largest pole from the circle).
     */
    private static boolean found(Counter c, boolean outward, double u) {
        return outward ? c.outside(Math.expm1(u)) > 0 : c.outside(Math.expm1(-u)) == 0;
    }

    /** Counts closed-loop poles outside circles about 0. */
    private static final class Counter {
        private final SampledLoop loop;
        private final List<Complex> poles;
        private boolean unresolved;

        Counter(SampledLoop loop) {
            this.loop = loop;
            this.poles = List.copyOf(loop.openLoopPoles());
        }

        /** Closed-loop poles outside {@code |z| = 1 + offset}. */
        int outside(double offset) {
            // a circle through an open-loop pole has no winding number: step just outside the pole
            for (Complex p : poles) {
                double r = p.abs();
                if (Math.abs(r - (1 + offset)) <= POLE_CLEARANCE * r) {
                    offset += 2 * POLE_CLEARANCE * r;
                }
            }
            double radius = 1 + offset;
            int openLoopOutside = 0;
            List<Double> points = new ArrayList<>();
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
                        points.add(t);
                        finest = Math.min(finest, t);
                    }
                }
            }
            points.add(0.0);
            points.add(Math.PI);
            for (int k = 1; k < BASE_POINTS; k++) {
                points.add(Math.PI * k / BASE_POINTS);
            }
            int decades = (int) Math.ceil(Math.log10(Math.PI / finest));
            for (int k = 0; k < decades * POINTS_PER_DECADE; k++) {
                points.add(finest * Math.pow(10, (double) k / POINTS_PER_DECADE));
            }
            double[] ts = points.stream().mapToDouble(Double::doubleValue).filter(t -> t >= 0 && t <= Math.PI)
                    .toArray();
            final double circle = offset;
            ArgumentWalk walk = new ArgumentWalk((theta, out) -> loop.at(circle, theta, out), loop.delayScans());
            double turns = walk.change(ts) / Math.PI;
            long whole = Math.round(turns);
            if (walk.unresolved() || Math.abs(turns - whole) > 0.25) {
                unresolved = true;
            }
            return (int) Math.max(0, openLoopOutside - whole);
        }
    }
}

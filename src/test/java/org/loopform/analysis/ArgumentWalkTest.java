package org.loopform.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;
import org.junit.jupiter.api.Test;

class ArgumentWalkTest {

    /**
     * The series arctangent against the JDK's arctangent (fdlibm, an implementation outside the
     * project) across its whole range: within 1e-15 relative, far below what a count needs.
     */
    @Test
    void smallArctangentAgreesWithTheLibraryArctangent() {
        for (int k = -1000; k <= 1000; k++) {
            double x = ArgumentWalk.SMALL_TANGENT * k / 1000.0;
            double expected = Math.atan(x);
            assertEquals(expected, ArgumentWalk.smallArctangent(x), 1e-15 * Math.abs(expected), "x = " + x);
        }
    }

    /** turn() is the principal angle from a to b, on both sides of the small-angle switch (common practice). */
    @Test
    void turnIsThePrincipalAngleBetweenTwoPoints() {
        for (double from = -3.1; from < 3.15; from += 0.37) {
            for (double by = -3.1; by < 3.15; by += 0.29) {
                double ar = 2 * Math.cos(from);
                double ai = 2 * Math.sin(from);
                double br = 0.5 * Math.cos(from + by);
                double bi = 0.5 * Math.sin(from + by);
                assertEquals(by, ArgumentWalk.turn(ar, ai, br, bi), 1e-14, "from " + from + " by " + by);
            }
        }
    }

    /**
     * The crossing count behind {@code change}: the principal turn from a to b equals
     * {@code Arg(b) - Arg(a) + 2 pi wraps}, with Arg and the turn both the JDK's atan2 (fdlibm, outside
     * the project; Arg with a zero imaginary part read as +0), for points all round the plane, on both
     * axes and with signed zeros (the identity
     * is derived in wrapsOfStep's Javadoc; common practice: a winding number counted by signed
     * crossings of a ray).
     */
    @Test
    void wrapsMakeThePrincipalTurnFromTheTwoArguments() {
        double[] special = {0.0, -0.0, 1.0, -1.0, 1e-150, -1e-150, 2.5, -2.5};
        for (double ar : special) {
            for (double ai : special) {
                for (double br : special) {
                    for (double bi : special) {
                        assertTurnIdentity(ar, ai, br, bi);
                    }
                }
            }
        }
        Random random = new Random(20261203L);
        for (int k = 0; k < 200_000; k++) {
            double ar = random.nextGaussian();
            double ai = random.nextGaussian();
            double br = random.nextGaussian();
            double bi = random.nextGaussian();
            if (k % 3 == 0) {
                // small turns, as the walk's accepted steps are, many of them across the negative real axis
                double angle = Math.PI + 0.2 * random.nextGaussian();
                double by = 0.3 * random.nextGaussian();
                ar = Math.cos(angle);
                ai = Math.sin(angle);
                br = 2 * Math.cos(angle + by);
                bi = 2 * Math.sin(angle + by);
            }
            assertTurnIdentity(ar, ai, br, bi);
        }
    }

    private static void assertTurnIdentity(double ar, double ai, double br, double bi) {
        if ((ar == 0 && ai == 0) || (br == 0 && bi == 0)) {
            return; // no argument at the origin: the walk marks such a step unresolved
        }
        double turn = Math.atan2(bi * ar - br * ai, br * ar + bi * ai);
        double expected = ArgumentWalk.principalArgument(bi, br) - ArgumentWalk.principalArgument(ai, ar);
        double got = turn - 2 * Math.PI * ArgumentWalk.wrapsOfStep(ar, ai, br, bi);
        assertEquals(expected, got, 1e-12, "from (" + ar + ", " + ai + ") to (" + br + ", " + bi + ")");
    }

    /**
     * The walk's net change round the unit circle counts the zeros inside it: for the polynomial
     * {@code p(z) = prod (z - z_k)} with chosen roots, {@code 1 + L = p} on {@code z = e^(i theta)}
     * turns by 2 pi times the number of roots with {@code |z_k| < 1} (the argument principle; Churchill
     * and Brown, Complex Variables and Applications - from memory for the edition). Roots are placed
     * as close as 2 % to the circle on both sides, up to 12 of them, so a missed or extra winding shows.
     */
    @Test
    void aWalkRoundTheUnitCircleCountsTheRootsInside() {
        Random random = new Random(7L);
        for (int trial = 0; trial < 300; trial++) {
            int n = 1 + random.nextInt(12);
            double[] re = new double[n];
            double[] im = new double[n];
            int inside = 0;
            for (int k = 0; k < n; k++) {
                double radius = random.nextBoolean() ? 0.98 - 0.9 * random.nextDouble() : 1.02 + 2 * random.nextDouble();
                double angle = 2 * Math.PI * random.nextDouble();
                re[k] = radius * Math.cos(angle);
                im[k] = radius * Math.sin(angle);
                inside += radius < 1 ? 1 : 0;
            }
            ArgumentWalk walk = new ArgumentWalk((theta, out) -> {
                double pr = 1;
                double pi = 0;
                for (int k = 0; k < n; k++) {
                    double fr = Math.cos(theta) - re[k];
                    double fi = Math.sin(theta) - im[k];
                    double r = pr * fr - pi * fi;
                    pi = pr * fi + pi * fr;
                    pr = r;
                }
                out[0] = pr - 1;
                out[1] = pi;
                out[2] = pr;
                out[3] = pi;
            }, 0.0);
            double[] ts = new double[1001];
            for (int k = 0; k < ts.length; k++) {
                ts[k] = 2 * Math.PI * k / (ts.length - 1);
            }
            assertEquals(2 * Math.PI * inside, walk.change(ts), 1e-9, "trial " + trial + ", " + n + " roots");
        }
    }
}

package org.loopform.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;

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
}

package org.loopform.scan;

import org.loopform.form.Discretization;

/**
 * How one scan's integral increment weighs this scan's and the last scan's error:
 * {@code I(k) = I(k-1) + ki h (current e(k) + previous e(k-1))}. Forward difference (1/s =
 * h/(z - 1)): (0, 1); backward difference (1/s = h z/(z - 1)): (1, 0); trapezoidal
 * (1/s = (h/2)(z + 1)/(z - 1)): (1/2, 1/2) (Wittenmark, Astrom and Arzen, "Computer Control: An
 * Overview", IFAC Professional Brief, 2002, Table 3).
 */
record IntegralRule(double current, double previous) {

    static IntegralRule of(Discretization method) {
        return switch (method) {
            case FORWARD -> new IntegralRule(0.0, 1.0);
            case BACKWARD -> new IntegralRule(1.0, 0.0);
            case TRAPEZOIDAL -> new IntegralRule(0.5, 0.5);
            case STEP_INVARIANT, RAMP_INVARIANT -> throw new IllegalArgumentException(
                    "integral discretization must be forward, backward or trapezoidal (got " + method + ")");
        };
    }

    /**
     * The unit integrator {@code h (current + previous z^-1) / (1 - z^-1)} at {@code z = e^(i theta)},
     * into {@code out} as {re, im}; theta = omega h, not a multiple of 2 pi.
     */
    void responseAt(double theta, double scanSeconds, double[] out) {
        double cos = Math.cos(theta);
        double sin = Math.sin(theta);
        double nr = scanSeconds * (current + previous * cos);
        double ni = -scanSeconds * previous * sin;
        double dr = 1 - cos;
        double di = sin;
        double mag2 = dr * dr + di * di;
        out[0] = (nr * dr + ni * di) / mag2;
        out[1] = (ni * dr - nr * di) / mag2;
    }
}

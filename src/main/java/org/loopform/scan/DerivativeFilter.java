package org.loopform.scan;

import org.loopform.form.Discretization;

/**
 * The discrete counterpart of the unit filtered derivative {@code s / (1 + Tf s)} at scan time h,
 * run as {@code D(k) = pole D(k-1) + gain (x(k) - x(k-1))} (Wittenmark, Astrom and Arzen,
 * "Computer Control: An Overview", IFAC Professional Brief, 2002, Table 3, with K Td taken out):
 *
 * <pre>
 *   forward (s = (z-1)/h):              pole = 1 - h/Tf,              gain = 1/Tf
 *   backward (s = (z-1)/(z h)):         pole = Tf/(Tf + h),           gain = 1/(Tf + h)
 *   trapezoidal (s = (2/h)(z-1)/(z+1)): pole = (2 Tf - h)/(2 Tf + h), gain = 2/(2 Tf + h)
 *   ramp invariant:                     pole = exp(-h/Tf),            gain = (1 - pole)/h
 *   step invariant:                     pole = exp(-h/Tf),            gain = 1/Tf
 * </pre>
 *
 * Ramp invariance (the brief's "ramp equivalence") gives the continuous response to a ramp in x at
 * every sample; step invariance (the zero-order-hold equivalent, {@code (1 - z^-1) Z{step response}},
 * the step response of {@code s/(1 + Tf s)} being {@code e^(-t/Tf)/Tf}) gives the continuous
 * response to a step (Astrom and Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 8 - from
 * memory).
 * Without a filter (Tf = 0) every method runs the backward difference (x(k) - x(k-1))/h, the
 * only causal unfiltered difference: forward would need the next sample, and the trapezoidal
 * rule would put the pole on z = -1, an undamped oscillation.
 *
 * @param pole the filter pole in z
 * @param gain the weight of the input difference, 1/s
 */
record DerivativeFilter(double pole, double gain) {

    DerivativeFilter {
        if (!Double.isFinite(pole) || !Double.isFinite(gain)) {
            throw new IllegalArgumentException("derivative filter needs a finite pole and gain (got pole " + pole
                    + ", gain " + gain + ")");
        }
    }

    static DerivativeFilter of(Discretization method, double filterSeconds, double scanSeconds) {
        double tf = filterSeconds;
        double h = scanSeconds;
        if (tf == 0) {
            return new DerivativeFilter(0.0, 1.0 / h);
        }
        return switch (method) {
            case FORWARD -> new DerivativeFilter(1 - h / tf, 1 / tf);
            case BACKWARD -> new DerivativeFilter(tf / (tf + h), 1 / (tf + h));
            case TRAPEZOIDAL -> new DerivativeFilter((2 * tf - h) / (2 * tf + h), 2 / (2 * tf + h));
            case RAMP_INVARIANT -> {
                double pole = Math.exp(-h / tf);
                yield new DerivativeFilter(pole, -Math.expm1(-h / tf) / h);
            }
            case STEP_INVARIANT -> new DerivativeFilter(Math.exp(-h / tf), 1 / tf);
        };
    }

    /**
     * {@code gain (1 - z^-1) / (1 - pole z^-1)} at {@code z = e^(i theta)}, written into {@code out}
     * as {re, im}; theta = omega h in radians.
     */
    void responseAt(double theta, double[] out) {
        double cos = Math.cos(theta);
        double sin = Math.sin(theta);
        // z^-1 = cos - i sin
        double nr = gain * (1 - cos);
        double ni = gain * sin;
        double dr = 1 - pole * cos;
        double di = pole * sin;
        double mag2 = dr * dr + di * di;
        out[0] = (nr * dr + ni * di) / mag2;
        out[1] = (ni * dr - nr * di) / mag2;
    }
}

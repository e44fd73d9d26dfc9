package org.loopform.law;

/**
 * The coefficients of the canonical two-degree-of-freedom PID law, SI seconds, normalized gain
 * (percent of output span per percent of PV span):
 *
 * <pre>
 *   C_y(s) = (d s + p + i / s) / (1 + tf s)      acts on the measurement y (feedback path)
 *   C_r(s) = (dr s + pr + i / s) / (1 + tf s)    acts on the setpoint r
 *   u = C_r(s) r - C_y(s) y
 * </pre>
 *
 * Every catalog structure (parallel, ideal, series), with the derivative filter on the derivative
 * term or on the measurement and with setpoint weights, writes a law of this family; see
 * {@code form.StructureLaw} for the maps. Integral action always acts on the error (the same
 * {@code i} in both paths), so a constant setpoint is reached without offset.
 *
 * @param p  proportional coefficient, %/%
 * @param i  integral coefficient, 1/s (0: no integral action)
 * @param d  derivative coefficient, s
 * @param tf filter time constant, s (0: no filter)
 * @param pr setpoint proportional coefficient, %/%
 * @param dr setpoint derivative coefficient, s
 */
public record PidTerms(double p, double i, double d, double tf, double pr, double dr) {

    public PidTerms {
        check("p", p);
        check("i", i);
        check("d", d);
        check("tf", tf);
        check("pr", pr);
        check("dr", dr);
        if (tf < 0) {
            throw new IllegalArgumentException("filter time constant tf must be >= 0 s (got " + tf + " s)");
        }
    }

    private static void check(String name, double v) {
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException("law coefficient " + name + " must be finite (got " + v + ")");
        }
    }

    public boolean hasIntegral() {
        return i != 0;
    }

    /** High-frequency gain of the feedback path, |C_y(i omega)| as omega grows: d/tf, infinite without a filter. */
    public double highFrequencyGain() {
        if (tf > 0) {
            return Math.abs(d) / tf + 0.0;
        }
        return d != 0 ? Double.POSITIVE_INFINITY : Math.abs(p);
    }
}

package org.loopform.scan;

import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;
import org.loopform.form.Structure;

/**
 * How a structure connects its actions, as the scan computes them. With {@code D[x]} the
 * discrete filtered derivative of x (unit {@code s/(1 + Tf s)}, see {@link DerivativeFilter}):
 *
 * <pre>
 *   r' = r + setpointLead D[r],   y' = y + measurementLead D[y]
 *   P  = kp (b r' - y'),   I integrates ki (r' - y'),   D = kd (cd D[r] - D[y])
 * </pre>
 *
 * Ideal or parallel with the filter on the derivative: leads 0, cd = c, so D acts on (c r - y)
 * through the filter. Filter on the measurement: y' = y - Tf D[y] is y through 1/(1 + Tf s) and
 * the derivative of y' is kd D[y], cd = 0. Series: y' = y + (Td - Tf) D[y] is the lead-lag
 * (1 + Td s)/(1 + Tf s) on y, applied to r too when c = 1, and no separate derivative term.
 * These are the laws of {@code form.StructureLaw} term by term.
 *
 * @param kp                  proportional gain, %/%
 * @param ki                  integral gain, 1/s (0: no integral action)
 * @param kd                  derivative gain, s
 * @param b                   setpoint weight on the proportional action
 * @param cd                  setpoint weight on the derivative term
 * @param setpointLeadSeconds lead on the setpoint, s
 * @param measurementLeadSeconds lead on the measurement, s (negative: the measurement filter)
 */
record ScanWiring(double kp, double ki, double kd, double b, double cd,
                  double setpointLeadSeconds, double measurementLeadSeconds) {

    static ScanWiring of(PidSetting s, FilterPlacement placement) {
        double tf = s.filterSeconds();
        switch (s.structure()) {
            case IDEAL, PARALLEL -> {
                boolean parallel = s.structure() == Structure.PARALLEL;
                double kp = s.gain();
                double ki = parallel ? s.integral() : (s.hasIntegral() ? s.gain() / s.integral() : 0.0);
                double kd = parallel ? s.derivative() : s.gain() * s.derivative();
                if (placement == FilterPlacement.DERIVATIVE) {
                    return new ScanWiring(kp, ki, kd, s.b(), s.c(), 0.0, 0.0);
                }
                return new ScanWiring(kp, ki, kd, s.b(), 0.0, 0.0, -tf);
            }
            case SERIES -> {
                double k = s.gain();
                double ki = s.hasIntegral() ? k / s.integral() : 0.0;
                double lead = s.derivative() - tf;
                return new ScanWiring(k, ki, 0.0, s.b(), 0.0, s.c() == 1.0 ? lead : 0.0, lead);
            }
            default -> throw new IllegalStateException("unknown structure " + s.structure());
        }
    }
}

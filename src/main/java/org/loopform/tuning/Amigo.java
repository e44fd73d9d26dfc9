package org.loopform.tuning;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.form.Structure;
import org.loopform.units.BadInput;

/**
 * AMIGO: Astrom &amp; Hagglund, "Revisiting the Ziegler-Nichols step response method for PID
 * control", J. Process Control 14 (2004) 635-650, for {@code Kp e^(-L s)/(T s + 1)}:
 * <pre>
 *   PI   K  = 0.15/Kp + (0.35 - L T/(L + T)^2) T/(Kp L),   Ti = 0.35 L + 13 L T^2/(T^2 + 12 L T + 7 L^2)
 *   PID  K  = (0.2 + 0.45 T/L)/Kp,   Ti = (0.4 L + 0.8 T) L/(L + 0.1 T),   Td = 0.5 L T/(0.3 L + T)
 * </pre>
 * For an integrating process {@code Kv e^(-L s)/s} (from memory): PI {@code K = 0.35/(Kv L)},
 * {@code Ti = 13.4 L}; PID {@code K = 0.45/(Kv L)}, {@code Ti = 8 L}, {@code Td = 0.5 L}. These are the
 * limits of the formulas above as T grows with {@code Kv = Kp/T} held, except that the exact PI
 * limit of Ti is {@code 13.35 L}: variant {@code limit} uses it, the default {@code paper} the
 * rounded 13.4 L. (Some printings give the integrating PID gain as 0.45/Kv, which is not
 * dimensionless; the limit 0.45/(Kv L) is used.) The published setpoint weights are not applied:
 * the tuning is the feedback law.
 */
final class Amigo {

    static final String PAPER = "paper";
    static final String LIMIT = "limit";

    private Amigo() {
    }

    static PublishedTuning of(ControllerType c, ReducedModel m, String variant) {
        TuningRules.needsDeadTime(Rule.AMIGO, m);
        String v = variant == null ? PAPER : variant;
        if (!v.equals(PAPER) && !v.equals(LIMIT)) {
            throw new BadInput("--variant: amigo takes paper (integrating PI Ti = 13.4 L) or limit (13.35 L, the"
                    + " limit of the FOPDT formula) (got '" + variant + "')");
        }
        double l = m.deadTimeSeconds();
        Map<String, Double> figures = new LinkedHashMap<>();
        if (m.integrating()) {
            double kv = m.gain();
            if (c == ControllerType.PI) {
                return new PublishedTuning(Rule.AMIGO, c, Structure.IDEAL, 0.35 / (kv * l),
                        (v.equals(PAPER) ? 13.4 : 13.35) * l, 0, m, figures,
                        List.of("Integrating process: AMIGO's integrating PI rule, Ti = " + (v.equals(PAPER)
                                ? "13.4 L (--variant limit gives 13.35 L)." : "13.35 L, the FOPDT formula's limit.")));
            }
            return new PublishedTuning(Rule.AMIGO, c, Structure.IDEAL, 0.45 / (kv * l), 8 * l, 0.5 * l, m, figures,
                    List.of("Integrating process: AMIGO's integrating PID rule."));
        }
        double kp = m.gain();
        double t = m.lagSeconds();
        figures.put("tau", l / (l + t));
        if (c == ControllerType.PI) {
            double k = 0.15 / kp + (0.35 - l * t / ((l + t) * (l + t))) * t / (kp * l);
            double ti = 0.35 * l + 13 * l * t * t / (t * t + 12 * l * t + 7 * l * l);
            return new PublishedTuning(Rule.AMIGO, c, Structure.IDEAL, k, ti, 0, m, figures, List.of());
        }
        double k = (0.2 + 0.45 * t / l) / kp;
        double ti = (0.4 * l + 0.8 * t) * l / (l + 0.1 * t);
        double td = 0.5 * l * t / (0.3 * l + t);
        return new PublishedTuning(Rule.AMIGO, c, Structure.IDEAL, k, ti, td, m, figures, List.of());
    }
}

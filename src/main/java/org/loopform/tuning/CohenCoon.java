package org.loopform.tuning;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.form.Structure;

/**
 * Cohen &amp; Coon, "Theoretical consideration of retarded control", Trans. ASME 75 (1953) 827-834,
 * for {@code K e^(-L s)/(T s + 1)}, {@code R = L / T}:
 * <pre>
 *   PI   Kc = (T / (K L)) (0.9 + R/12),    Ti = L (30 + 3R) / (9 + 20R)
 *   PID  Kc = (T / (K L)) (4/3 + R/4),     Ti = L (32 + 6R) / (13 + 8R),   Td = 4L / (11 + 2R)
 * </pre>
 * (One secondary table prints 1.1 + R/12 for the PI gain; 0.9 is the usual reading - from memory.)
 */
final class CohenCoon {

    private CohenCoon() {
    }

    static PublishedTuning of(ControllerType c, ReducedModel m) {
        TuningRules.needsSelfRegulating(Rule.COHEN_COON, m);
        TuningRules.needsDeadTime(Rule.COHEN_COON, m);
        double k = m.gain();
        double t = m.lagSeconds();
        double l = m.deadTimeSeconds();
        double r = l / t;
        Map<String, Double> figures = new LinkedHashMap<>();
        figures.put("r", r);
        if (c == ControllerType.PI) {
            return new PublishedTuning(Rule.COHEN_COON, c, Structure.IDEAL, t / (k * l) * (0.9 + r / 12),
                    l * (30 + 3 * r) / (9 + 20 * r), 0, m, figures, List.of());
        }
        return new PublishedTuning(Rule.COHEN_COON, c, Structure.IDEAL, t / (k * l) * (4.0 / 3 + r / 4),
                l * (32 + 6 * r) / (13 + 8 * r), 4 * l / (11 + 2 * r), m, figures, List.of());
    }
}

package org.loopform.tuning;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.form.Structure;
import org.loopform.units.BadInput;

/**
 * Ziegler &amp; Nichols, "Optimum settings for automatic controllers", Trans. ASME 64 (1942) 759-768.
 * <pre>
 *   step response, a = K L / T (for an integrating process a = Kv L):
 *     PI   Kc = 0.9 / a,  Ti = L / 0.3 = 3.33 L (the paper)  or  3 L (variant "textbook", many textbooks)
 *     PID  Kc = 1.2 / a,  Ti = 2 L,  Td = L / 2
 *   ultimate cycle (Ku, Tu):
 *     PI   Kc = 0.45 Ku,  Ti = Tu / 1.2
 *     PID  Kc = 0.6 Ku,   Ti = Tu / 2,  Td = Tu / 8
 * </pre>
 * Published here as the ideal (non-interacting) form, the usual textbook reading; the 1942
 * instruments were interacting, and read as a series form the PID would be another law (Astrom
 * &amp; Hagglund, PID Controllers, 2nd ed., ISA 1995, ch. 4 - from memory).
 */
final class ZieglerNichols {

    static final String TEXTBOOK = "textbook";
    static final String PAPER = "paper";

    private ZieglerNichols() {
    }

    static PublishedTuning step(ControllerType c, ReducedModel m, String variant) {
        double l = m.deadTimeSeconds();
        if (l <= 0) {
            throw new BadInput("--rule zn-step: needs a dead time > 0 s (a = K L / T is 0 without one); use simc or"
                    + " lambda");
        }
        String v = variant == null ? PAPER : variant;
        if (!v.equals(PAPER) && !v.equals(TEXTBOOK)) {
            throw new BadInput("--variant: zn-step takes paper (PI Ti = L/0.3, Ziegler & Nichols 1942) or textbook"
                    + " (PI Ti = 3 L) (got '" + variant + "')");
        }
        double a = m.integrating() ? m.gain() * l : m.gain() * l / m.lagSeconds();
        Map<String, Double> figures = new LinkedHashMap<>();
        figures.put("a", a);
        if (c == ControllerType.PI) {
            double ti = v.equals(PAPER) ? l / 0.3 : 3 * l;
            return new PublishedTuning(Rule.ZN_STEP, c, Structure.IDEAL, 0.9 / a, ti, 0, m, figures,
                    List.of("PI integral time " + (v.equals(PAPER) ? "L/0.3 as in the 1942 paper (--variant textbook"
                            + " gives 3 L)" : "3 L as in many textbooks (the 1942 paper has L/0.3)") + "."));
        }
        return new PublishedTuning(Rule.ZN_STEP, c, Structure.IDEAL, 1.2 / a, 2 * l, l / 2, m, figures, List.of());
    }

    static PublishedTuning ultimate(ControllerType c, double ku, double tuSeconds, ReducedModel m, List<String> notes) {
        Map<String, Double> figures = new LinkedHashMap<>();
        figures.put("ku", ku);
        figures.put("tu_s", tuSeconds);
        if (c == ControllerType.PI) {
            return new PublishedTuning(Rule.ZN_ULTIMATE, c, Structure.IDEAL, 0.45 * ku, tuSeconds / 1.2, 0, m,
                    figures, notes);
        }
        return new PublishedTuning(Rule.ZN_ULTIMATE, c, Structure.IDEAL, 0.6 * ku, tuSeconds / 2, tuSeconds / 8, m,
                figures, notes);
    }
}

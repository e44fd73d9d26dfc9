package org.loopform.tuning;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.form.Structure;
import org.loopform.units.Numbers;

/**
 * IMC-PID for {@code K e^(-L s)/(T s + 1)}: Rivera, Morari &amp; Skogestad, "Internal model control.
 * 4. PID controller design", Ind. Eng. Chem. Process Des. Dev. 25 (1986) 252-265, Table 1 (the
 * dead time by a first-order Pade approximation; from memory):
 * <pre>
 *   PID  K Kc = (2T + L) / (2 (lambda + L)),   Ti = T + L/2,   Td = T L / (2T + L)    (lambda/L > 0.8)
 *   PI   K Kc = (2T + L) / (2 lambda),          Ti = T + L/2                          (lambda/L > 1.7)
 * </pre>
 * The default lambda is the paper's suggested lower bound, {@code max(0.8 L, 0.2 T)} for the PID and
 * {@code max(1.7 L, 0.2 T)} for the PI (from memory): tight settings; a larger {@code --lambda} is slower
 * and more robust.
 */
final class Imc {

    private Imc() {
    }

    static PublishedTuning of(ControllerType c, ReducedModel m, Double lambdaSeconds) {
        TuningRules.needsSelfRegulating(Rule.IMC, m);
        double k = m.gain();
        double t = m.lagSeconds();
        double l = m.deadTimeSeconds();
        List<String> notes = new ArrayList<>();
        double lam;
        if (lambdaSeconds != null) {
            lam = lambdaSeconds;
        } else {
            lam = Math.max((c == ControllerType.PID ? 0.8 : 1.7) * l, 0.2 * t);
            notes.add("lambda = " + Numbers.significant(lam, 4) + " s, the lower bound Rivera, Morari & Skogestad"
                    + " suggest; give --lambda for a slower, more robust loop.");
        }
        Map<String, Double> figures = new LinkedHashMap<>();
        figures.put("lambda_s", lam);
        if (c == ControllerType.PI) {
            return new PublishedTuning(Rule.IMC, c, Structure.IDEAL, (2 * t + l) / (2 * k * lam), t + l / 2, 0, m,
                    figures, notes);
        }
        return new PublishedTuning(Rule.IMC, c, Structure.IDEAL, (2 * t + l) / (2 * k * (lam + l)), t + l / 2,
                t * l / (2 * t + l), m, figures, notes);
    }
}

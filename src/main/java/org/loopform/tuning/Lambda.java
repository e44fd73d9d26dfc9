package org.loopform.tuning;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.form.Structure;
import org.loopform.units.BadInput;
import org.loopform.units.Numbers;

/**
 * Lambda tuning (Astrom &amp; Hagglund, Advanced PID Control, ISA 2006, ch. 7; formulas from memory),
 * the closed-loop time constant {@code lambda} chosen by the user:
 * <pre>
 *   FOPDT K e^(-L s)/(T s + 1):   PI   Kc = T / (K (lambda + L)),   Ti = T
 *                                 PID  Kc = (T + L/2) / (K (lambda + L/2)),  Ti = T + L/2,  Td = T L / (L + 2T)
 *   integrating Kv e^(-L s)/s:    PI   Kc = (2 lambda + L) / (Kv (lambda + L)^2),   Ti = 2 lambda + L
 * </pre>
 * Default lambda = T, the closed loop as fast as the open loop (common practice); an integrating
 * process has no such default and needs {@code --lambda}.
 */
final class Lambda {

    private Lambda() {
    }

    static PublishedTuning of(ControllerType c, ReducedModel m, Double lambdaSeconds) {
        List<String> notes = new ArrayList<>();
        Map<String, Double> figures = new LinkedHashMap<>();
        double l = m.deadTimeSeconds();
        if (m.integrating()) {
            if (lambdaSeconds == null) {
                throw new BadInput("--lambda: required for an integrating process (there is no open-loop time"
                        + " constant to default to); give the closed-loop time constant, e.g. --lambda 60s");
            }
            if (c == ControllerType.PID) {
                throw new BadInput("--controller: lambda tuning is given here for an integrating process as PI only;"
                        + " use --controller pi, or --rule simc or amigo for a PID");
            }
            double lam = lambdaSeconds;
            figures.put("lambda_s", lam);
            return new PublishedTuning(Rule.LAMBDA, c, Structure.IDEAL,
                    (2 * lam + l) / (m.gain() * (lam + l) * (lam + l)), 2 * lam + l, 0, m, figures, notes);
        }
        double t = m.lagSeconds();
        double lam = lambdaSeconds != null ? lambdaSeconds : t;
        if (lambdaSeconds == null) {
            notes.add("lambda = T (" + Numbers.significant(t, 4) + " s), the closed loop as fast as the open loop"
                    + " (common practice); give --lambda for another speed.");
        }
        figures.put("lambda_s", lam);
        if (c == ControllerType.PI) {
            return new PublishedTuning(Rule.LAMBDA, c, Structure.IDEAL, t / (m.gain() * (lam + l)), t, 0, m, figures,
                    notes);
        }
        return new PublishedTuning(Rule.LAMBDA, c, Structure.IDEAL, (t + l / 2) / (m.gain() * (lam + l / 2)), t + l / 2,
                t * l / (l + 2 * t), m, figures, notes);
    }
}

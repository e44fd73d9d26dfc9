package org.loopform.tuning;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.form.Structure;
import org.loopform.units.BadInput;

/**
 * SIMC: Skogestad, "Simple analytic rules for model reduction and PID controller tuning", J.
 * Process Control 13 (2003) 291-309, Table 3, for the half-rule model
 * {@code k e^(-theta s)/((tau1 s + 1)(tau2 s + 1))} or {@code k' e^(-theta s)/(s (tau2 s + 1))}:
 * <pre>
 *   Kc = tau1 / (k (tau_c + theta)),   tauI = min(tau1, 4 (tau_c + theta)),   tauD = tau2
 *   integrating:  Kc = 1 / (k' (tau_c + theta)),   tauI = 4 (tau_c + theta),   tauD = tau2
 * </pre>
 * in the series (interacting) form; tight control takes {@code tau_c = theta} (the default). A PI
 * reads the first-order half-rule model, a PID the second-order one.
 */
final class Simc {

    private Simc() {
    }

    static PublishedTuning of(ControllerType c, org.loopform.process.ProcessModel p, Double tauCSeconds) {
        ReducedModel m = c == ControllerType.PI ? HalfRule.firstOrder(p) : HalfRule.secondOrder(p);
        double theta = m.deadTimeSeconds();
        List<String> notes = new ArrayList<>();
        double tauC;
        if (tauCSeconds != null) {
            tauC = tauCSeconds;
        } else {
            if (theta <= 0) {
                throw new BadInput("--tau-c: required when the model has no dead time (SIMC's default tau_c is the"
                        + " dead time); give the closed-loop time constant, e.g. --tau-c 10s");
            }
            tauC = theta;
            notes.add("tau_c = theta (" + org.loopform.units.Numbers.significant(theta, 4) + " s), SIMC's tight"
                    + " setting; a larger --tau-c gives a slower, more robust loop.");
        }
        if (tauC + theta <= 0) {
            throw new BadInput("--tau-c: must be > 0 s when the model has no dead time (got 0 s)");
        }
        double td = m.secondLagSeconds();
        if (c == ControllerType.PID && td == 0) {
            notes.add("The model has no second lag, so SIMC's derivative time tau2 is 0: the PID is a PI (Skogestad"
                    + " 2003 recommends PI for first-order processes).");
        }
        Map<String, Double> figures = new LinkedHashMap<>();
        figures.put("tau_c_s", tauC);
        double kc;
        double ti;
        if (m.integrating()) {
            kc = 1 / (m.gain() * (tauC + theta));
            ti = 4 * (tauC + theta);
        } else {
            kc = m.lagSeconds() / (m.gain() * (tauC + theta));
            ti = Math.min(m.lagSeconds(), 4 * (tauC + theta));
        }
        return new PublishedTuning(Rule.SIMC, c, Structure.SERIES, kc, ti, c == ControllerType.PID ? td : 0, m,
                figures, notes);
    }
}

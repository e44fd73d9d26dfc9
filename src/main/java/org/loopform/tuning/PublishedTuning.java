package org.loopform.tuning;

import java.util.List;
import java.util.Map;
import org.loopform.form.Structure;

/**
 * A tuning as a rule publishes it: gain (%/%, signed: positive for a process whose PV rises with the
 * output), integral and derivative times in seconds, in the structure the rule was published in
 * (ideal or series, no derivative filter), with the rule's own figures and notes.
 *
 * @param rule the rule
 * @param controller PI or PID (a PID whose rule gives no derivative has {@code derivativeTimeSeconds = 0})
 * @param structure {@link Structure#IDEAL} or {@link Structure#SERIES}
 * @param gain Kc, %/%, finite and non-zero
 * @param integralTimeSeconds Ti, seconds, > 0
 * @param derivativeTimeSeconds Td, seconds, >= 0
 * @param model the low-order model the rule read (null when it read only an ultimate cycle)
 * @param figures the rule's own figures by key (ku, tu_s, tau_c_s, lambda_s, a...), in the units their keys name
 * @param notes what was chosen or assumed, one sentence each
 */
public record PublishedTuning(Rule rule, ControllerType controller, Structure structure, double gain,
                              double integralTimeSeconds, double derivativeTimeSeconds, ReducedModel model,
                              Map<String, Double> figures, List<String> notes) {

    public PublishedTuning {
        if (structure == Structure.PARALLEL) {
            throw new IllegalArgumentException("rules publish ideal or series tunings");
        }
        if (!Double.isFinite(gain) || gain == 0) {
            throw new IllegalArgumentException("gain must be finite and non-zero (got " + gain + ")");
        }
        if (!(integralTimeSeconds > 0) || !Double.isFinite(integralTimeSeconds)) {
            throw new IllegalArgumentException("integral time must be finite and > 0 s (got " + integralTimeSeconds + ")");
        }
        if (!(derivativeTimeSeconds >= 0) || !Double.isFinite(derivativeTimeSeconds)) {
            throw new IllegalArgumentException("derivative time must be finite and >= 0 s (got "
                    + derivativeTimeSeconds + ")");
        }
        figures = java.util.Collections.unmodifiableMap(new java.util.LinkedHashMap<>(figures));
        notes = List.copyOf(notes);
    }
}

package org.loopform.tuning;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.units.BadInput;
import org.loopform.units.Span;

/**
 * A fitted model's 95 % confidence box: its kind ({@code fopdt}, {@code sopdt}, {@code integrating}) and, per
 * parameter, the interval the fit gave ({@code gain} in %/% or, integrating, %/s per %; {@code time_constant},
 * {@code time_constant_2} and {@code dead_time} in s). {@link RobustCheck} evaluates a tuning at its corners.
 */
public record ConfidenceBox(String model, Map<String, Span> intervals) {

    /** The parameters each model needs an interval for, in the order corners are enumerated. */
    static List<String> parameters(String model) {
        return switch (model) {
            case "fopdt" -> List.of("gain", "time_constant", "dead_time");
            case "sopdt" -> List.of("gain", "time_constant", "time_constant_2", "dead_time");
            case "integrating" -> List.of("gain", "dead_time");
            default -> throw new BadInput("intervals: the model '" + model + "' has no confidence box (fopdt, sopdt or"
                    + " integrating)");
        };
    }

    public ConfidenceBox {
        if (model == null || intervals == null) {
            throw new IllegalArgumentException("a confidence box needs its model and intervals");
        }
        for (String key : parameters(model)) {
            Span s = intervals.get(key);
            if (s == null) {
                throw new BadInput("intervals." + key + ": missing (the fit did not determine it); --robust needs an"
                        + " interval for every parameter of a " + model + " model: refit with a longer or less noisy"
                        + " record, or drop --robust");
            }
            if (!key.equals("gain") && s.low() < 0) {
                throw new BadInput("intervals." + key + ": a time must be >= 0 s (got " + s + ")");
            }
            if (key.equals("gain") && s.low() < 0 != s.high() < 0) {
                throw new BadInput("intervals.gain: spans zero (" + s + "); the fit cannot tell the process's"
                        + " direction, and no tuning can be checked over it: refit with a larger step");
            }
        }
        intervals = Collections.unmodifiableMap(new LinkedHashMap<>(intervals));
    }
}

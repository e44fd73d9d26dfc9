package org.loopform.findings;

import java.util.Collection;

/**
 * One thing that will behave differently, or breaks a rule: its topic and severity, the figure
 * measured and the threshold it was held against (both in {@code unit}; null where a figure does
 * not exist), where the threshold comes from, and a plain-words message.
 */
public record Finding(Topic topic, Severity severity, Double figure, Double threshold, String unit,
                      String source, String message) {

    public Finding {
        if (topic == null || severity == null || message == null || message.isBlank()) {
            throw new IllegalArgumentException("a finding needs a topic, a severity and a message");
        }
        if (figure != null && !Double.isFinite(figure) || threshold != null && !Double.isFinite(threshold)) {
            throw new IllegalArgumentException("finding figures must be finite or absent (got " + figure + ", "
                    + threshold + ")");
        }
        unit = unit == null ? "" : unit;
        source = source == null ? "" : source;
    }

    /** The worst severity among {@code findings}; INFO when there are none. */
    public static Severity worst(Collection<Finding> findings) {
        Severity w = Severity.INFO;
        for (Finding f : findings) {
            if (f.severity().compareTo(w) > 0) {
                w = f.severity();
            }
        }
        return w;
    }
}

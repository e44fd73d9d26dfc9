package org.loopform.findings;

import java.util.Locale;
import java.util.Optional;

/** How much a finding matters: information, a warning to review, or a failure to fix before use. */
public enum Severity {
    INFO, WARN, FAIL;

    public String id() {
        return name().toLowerCase(Locale.ROOT);
    }

    public boolean atLeast(Severity other) {
        return compareTo(other) >= 0;
    }

    public static Optional<Severity> parse(String text) {
        for (Severity s : values()) {
            if (s.id().equals(text.trim().toLowerCase(Locale.ROOT))) {
                return Optional.of(s);
            }
        }
        return Optional.empty();
    }
}

package org.loopform.form;

import java.util.Locale;
import java.util.Optional;

/**
 * Controller action (common practice): reverse action lowers the output when the PV rises, which
 * is the negative-feedback case for a process whose PV rises with output; direct action raises it.
 */
public enum Action {
    REVERSE,
    DIRECT;

    public String id() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** The sign the canonical law's gain takes: +1 reverse, -1 direct. */
    public double sign() {
        return this == REVERSE ? 1.0 : -1.0;
    }

    static Action ofSign(double gain) {
        return gain < 0 ? DIRECT : REVERSE;
    }

    public static Optional<Action> parse(String text) {
        return switch (text.trim().toLowerCase(Locale.ROOT)) {
            case "reverse", "rev", "r" -> Optional.of(REVERSE);
            case "direct", "dir", "d" -> Optional.of(DIRECT);
            default -> Optional.empty();
        };
    }
}

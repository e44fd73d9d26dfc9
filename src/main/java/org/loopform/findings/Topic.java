package org.loopform.findings;

import java.util.Locale;

/**
 * What a finding is about; the JSON name is the lower-case constant name. {@code RESPONSE}: the
 * target's step responses are worse than the design's (overshoot, settling, IAE, load peak).
 */
public enum Topic {
    REALIZABILITY, FILTER, SAMPLING, DERIVATIVE, DISCRETIZATION, ROUNDING, LIMITS, ROBUSTNESS, RESPONSE, WINDUP, UNITS;

    public String id() {
        return name().toLowerCase(Locale.ROOT);
    }
}

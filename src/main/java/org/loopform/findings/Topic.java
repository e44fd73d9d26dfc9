package org.loopform.findings;

import java.util.Locale;

/** What a finding is about; the JSON name is the lower-case constant name. */
public enum Topic {
    REALIZABILITY, FILTER, SAMPLING, DERIVATIVE, DISCRETIZATION, ROUNDING, LIMITS, ROBUSTNESS, WINDUP, UNITS;

    public String id() {
        return name().toLowerCase(Locale.ROOT);
    }
}

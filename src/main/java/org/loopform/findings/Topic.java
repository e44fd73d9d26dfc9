package org.loopform.findings;

import java.util.Locale;

/**
 * What a finding is about; the JSON name is the lower-case constant name. {@code RESPONSE}: the
 * target's step responses are worse than the design's (overshoot, settling, IAE, load peak).
 */
public enum Topic {
    REALIZABILITY, FILTER, SAMPLING, DERIVATIVE, DISCRETIZATION, ROUNDING, LIMITS, ROBUSTNESS, RESPONSE, WINDUP, UNITS,
    /** The controller's direction (direct or reverse acting) against the process's. */
    ACTION,
    /** Closed-loop stability, decided from the closed-loop poles. */
    STABILITY,
    /** A controller run open loop on a logged record: as-found agreement, its explanation, the as-left preview. */
    REPLAY;

    public String id() {
        return name().toLowerCase(Locale.ROOT);
    }
}

package org.loopform.form;

/** How the target stops integral windup when the output is at a limit. */
public enum AntiWindup {
    /** Conditional integration: the integral stops while the output is clamped. */
    CLAMPING,
    /** Back-calculation: the integral is driven back by (u - v) / Tt with tracking time Tt. */
    BACK_CALCULATION,
    /** None: the integral runs on (a velocity algorithm clamps its output, which limits windup by itself). */
    NONE
}

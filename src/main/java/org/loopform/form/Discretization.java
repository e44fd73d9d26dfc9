package org.loopform.form;

/**
 * How a target turns an integral or a derivative into a difference equation at scan time h
 * (Wittenmark, Astrom and Arzen, "Computer Control: An Overview", IFAC Professional Brief, 2002, Table 3).
 */
public enum Discretization {
    /** Forward difference (Euler): s = (z - 1) / h. */
    FORWARD,
    /** Backward difference: s = (z - 1) / (z h). */
    BACKWARD,
    /** Trapezoidal (Tustin): s = (2 / h) (z - 1) / (z + 1). */
    TRAPEZOIDAL,
    /** Step (ramp) invariant: the filter pole maps to exp(-h / Tf). */
    STEP_INVARIANT
}

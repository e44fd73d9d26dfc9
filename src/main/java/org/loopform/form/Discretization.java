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
    /**
     * Ramp invariant ("ramp equivalence" in the brief's Table 3): the filter pole maps to exp(-h / Tf) and a
     * ramp in the input gives the continuous response at every sample. Derivative only.
     */
    RAMP_INVARIANT,
    /**
     * Step invariant (zero-order-hold equivalent): the filter pole maps to exp(-h / Tf) and a step in the
     * input gives the continuous response at every sample. Derivative only.
     */
    STEP_INVARIANT
}

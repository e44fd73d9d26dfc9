package org.loopform.form;

/** How a form writes its derivative (rate) action. */
public enum DerivativeWriting {
    /** Derivative time Td (ideal and series forms, parameter {@code td}). */
    TIME,
    /** Derivative gain kd, in time units (parallel forms only, parameter {@code kd}). */
    GAIN,
    /** Derivative gain per scan, kd divided by the scan time h (parallel forms only, parameter {@code kd}). */
    PER_SCAN
}

package org.loopform.form;

/** How a form writes its integral (reset) action. */
public enum IntegralWriting {
    /** Integral time Ti, time per repeat (parameter {@code ti}). For parallel forms ki = 1/ti. */
    TIME,
    /** Reset rate, repeats per unit time = 1/Ti (parameter {@code reset}). For parallel forms ki = reset. */
    RATE,
    /** Integral gain ki per unit time (parallel forms only, parameter {@code ki}). */
    GAIN,
    /** Integral gain per scan, ki times the scan time h (parallel forms only, parameter {@code ki}). */
    PER_SCAN
}

package org.loopform.form;

/** How a PID algorithm combines its three actions. */
public enum Structure {
    /** Independent gains: kp + ki/s + kd s. */
    PARALLEL,
    /** Ideal (standard, non-interacting): Kc (1 + 1/(Ti s) + Td s). */
    IDEAL,
    /** Series (interacting): Kc' (1 + 1/(Ti' s)) (1 + Td' s). */
    SERIES;

    public String id() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }
}

package org.loopform.form;

/** How a form writes the controller's action (the sign of its gain). */
public enum SignConvention {
    /** A signed gain: positive is reverse action (output falls as PV rises), negative is direct. */
    SIGNED,
    /** A positive gain with a separate action setting, reverse or direct. */
    ACTION
}

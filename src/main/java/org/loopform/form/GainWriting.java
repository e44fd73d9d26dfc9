package org.loopform.form;

/** How a form writes its proportional action. */
public enum GainWriting {
    /** A gain, output change per error change. */
    GAIN,
    /** Proportional band in percent, PB = 100 / Kc with Kc in %/% (common practice). */
    BAND
}

package org.loopform.form;

/** Whether a form's gains act on percent of span or on engineering units. */
public enum GainBasis {
    /** Percent of output span per percent of PV span. */
    PERCENT,
    /** Output engineering units per PV engineering unit; needs both ranges to convert. */
    ENGINEERING
}

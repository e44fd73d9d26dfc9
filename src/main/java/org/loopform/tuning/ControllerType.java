package org.loopform.tuning;

import java.util.Locale;

/** The controller a rule is asked for: PI or PID. */
public enum ControllerType {
    PI, PID;

    public String id() {
        return name().toLowerCase(Locale.ROOT);
    }
}

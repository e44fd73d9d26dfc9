package org.loopform.check;

import java.util.Locale;

/** A loop's verdict: the worst of its findings (info counts as pass). */
public enum Verdict {
    PASS, WARN, FAIL;

    public String id() {
        return name().toLowerCase(Locale.ROOT);
    }
}

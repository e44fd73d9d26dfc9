package org.loopform.replay;

/** What an alternative reading of the loop list changes, in the order alternatives are tried and ties ranked. */
public enum ExplanationKind {
    /** A value read in the other time unit, a rate for a time, a band for a gain. */
    UNITS,
    /** The opposite action (direct for reverse). */
    ACTION,
    /** The derivative filter missing, or present where the list has none. */
    FILTER,
    /** Another scan time. */
    SCAN,
    /** The same numbers in another catalog form (structure, units, algorithm). */
    FORM,
    /** Two of the above at once (a time in the other unit and the opposite action, say). */
    COMBINED;

    public String id() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }
}

package org.loopform.analysis;

/**
 * Why a margin does not exist, in words for the report: a margin is absent only where the
 * crossing it is read at truly does not occur, and the reader is told which.
 */
public enum MarginNote {
    /** No phase crossover: the gain could grow without bound before the plot reached -1. */
    PHASE_NEVER_REACHES_MINUS_180("the phase never reaches -180 deg"),
    /**
     * Phase crossovers exist, but at every one {@code |L| >= 1}: raising the gain moves no
     * crossing onto -1, so there is no upper limit (a lower one may exist).
     */
    NO_UPPER_GAIN_LIMIT("|L| > 1 at every -180 deg crossing"),
    /** No gain crossover because {@code |L| < 1} over the whole response. */
    GAIN_STAYS_BELOW_ONE("|L| never reaches 1"),
    /** No gain crossover because {@code |L| > 1} over the whole band analysed (a sampled loop: up to pi/h). */
    GAIN_STAYS_ABOVE_ONE("|L| stays above 1"),
    /** The figure was built without a full search (for example by hand); nothing more is known. */
    NOT_IN_BAND("not found in the band analysed");

    private final String text;

    MarginNote(String text) {
        this.text = text;
    }

    /** The reason in words, to follow "none" in a report: {@code none (the phase never reaches -180 deg)}. */
    public String text() {
        return text;
    }

    /** A snake_case id for JSON. */
    public String id() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }
}

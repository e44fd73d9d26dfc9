package org.loopform.analysis;

/**
 * Whether a closed loop is stable, decided from its closed-loop poles (never from margins alone).
 */
public enum Stability {
    /** Every closed-loop pole lies strictly inside the stability region. */
    STABLE,
    /**
     * A closed-loop pole lies on the stability boundary, within the tolerance the test states:
     * the loop neither settles nor runs away (an undamped oscillation or a drift).
     */
    MARGINAL,
    /** At least one closed-loop pole lies outside the stability region: the loop runs away. */
    UNSTABLE;

    /** The lower-case word used in JSON and text. */
    public String word() {
        return name().toLowerCase(java.util.Locale.ROOT);
    }
}

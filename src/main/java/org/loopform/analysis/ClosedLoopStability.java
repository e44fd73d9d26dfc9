package org.loopform.analysis;

/**
 * What the Nyquist plot over the analysed band says about closed-loop stability, for an open
 * loop with no poles in the right half plane. Each pass of the plot across the negative real
 * axis left of -1 is half an encirclement (its mirror image at negative frequencies gives the
 * other half); the closed loop is stable when they cancel. Nyquist criterion after Astrom and
 * Murray, Feedback Systems, 2008, section 9.2 (from memory for the section number).
 */
public enum ClosedLoopStability {
    /** The plot does not encircle -1. */
    STABLE,
    /** The plot encircles -1: the closed loop has poles in the right half plane. */
    UNSTABLE,
    /**
     * The band does not hold the whole plot: {@code |L| >= 1} at the top of the band, or the
     * plot starts with {@code |L| > 1} beyond -180 degrees at its bottom.
     */
    UNDETERMINED
}

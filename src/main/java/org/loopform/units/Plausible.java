package org.loopform.units;

/**
 * Physical plausibility limits on the numbers a user writes: beyond them the arithmetic of a loop
 * check (sampling, frequency grids, simulation horizons) loses its meaning long before it
 * overflows, so such values are bad input, reported with the user's key, rather than NaN found
 * deep inside. The limits are wide on purpose (common practice, chosen here; see README "Limits"):
 * <ul>
 *   <li>times (integral, derivative and filter times, scan times, process time constants, lags and
 *       dead times): {@value #MIN_SECONDS} s to {@value #MAX_SECONDS} s (a microsecond to about
 *       116 days); a time that may be zero (derivative, filter, dead time) may also be exactly 0;</li>
 *   <li>gains (controller gain in %/%, process gain): magnitude {@value #MIN_GAIN} to
 *       {@value #MAX_GAIN}.</li>
 * </ul>
 */
public final class Plausible {

    /** The shortest time accepted, s: a microsecond, below any controller's scan. */
    public static final double MIN_SECONDS = 1e-6;
    /** The longest time accepted, s: about 116 days, beyond any process's time constant or delay. */
    public static final double MAX_SECONDS = 1e7;
    /** The smallest gain magnitude accepted. */
    public static final double MIN_GAIN = 1e-9;
    /** The largest gain magnitude accepted. */
    public static final double MAX_GAIN = 1e9;

    private Plausible() {
    }

    /** Whether {@code seconds} is a time within the limits. */
    public static boolean time(double seconds) {
        return seconds >= MIN_SECONDS && seconds <= MAX_SECONDS;
    }

    /** Whether {@code seconds} is 0 or a time within the limits. */
    public static boolean timeOrZero(double seconds) {
        return seconds == 0 || time(seconds);
    }

    /** Whether {@code gain}'s magnitude is within the limits. */
    public static boolean gain(double gain) {
        double m = Math.abs(gain);
        return m >= MIN_GAIN && m <= MAX_GAIN;
    }

    /** "within 1e-06 s to 1e+07 s (a microsecond to about 116 days)". */
    public static String timeRange() {
        return "within 1e-6 s to 1e7 s (a microsecond to about 116 days)";
    }

    /** "within 1e-9 to 1e9 in magnitude". */
    public static String gainRange() {
        return "within 1e-9 to 1e9 in magnitude";
    }
}

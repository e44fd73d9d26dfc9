package org.loopform.units;

import java.util.Locale;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * A number as a person typed it, with the unit text that followed it, if any:
 * {@code 30s}, {@code 0.5 min}, {@code 2/min}, {@code 40 %}, {@code 1.2}.
 * The unit is kept as written (trimmed, lower case); what it means depends on the parameter.
 */
public record Measure(double value, String unit) {

    private static final Pattern NUMBER_THEN_UNIT =
            Pattern.compile("^\\s*([-+]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][-+]?\\d+)?)\\s*(.*?)\\s*$");

    public Measure {
        if (!Double.isFinite(value)) {
            throw new UnitException("value must be a finite number (got " + value + ")");
        }
        unit = unit == null ? "" : unit.trim().toLowerCase(Locale.ROOT);
    }

    public boolean hasUnit() {
        return !unit.isEmpty();
    }

    /**
     * Reads {@code text}; throws {@link UnitException} naming what was expected when it does not
     * start with a number.
     */
    public static Measure parse(String text) {
        Matcher m = NUMBER_THEN_UNIT.matcher(text == null ? "" : text);
        if (!m.matches()) {
            throw new UnitException("expected a number with an optional unit, such as 30s, 0.5 min, 2/min or 40% (got '"
                    + text + "')");
        }
        return new Measure(Double.parseDouble(m.group(1)), m.group(2));
    }

    /**
     * Reads a duration such as {@code 0.5 s}, {@code 250ms}, {@code 2 min}; a bare number is taken in
     * {@code defaultUnit}. Returns seconds.
     */
    public static double parseSeconds(String text, TimeUnit defaultUnit) {
        Measure m = parse(text);
        if (!m.hasUnit()) {
            return defaultUnit.toSeconds(m.value());
        }
        if (m.unit().equals("ms")) {
            return m.value() / 1000.0;
        }
        return TimeUnit.parse(m.unit())
                .map(u -> u.toSeconds(m.value()))
                .orElseThrow(() -> new UnitException("unknown time unit '" + m.unit()
                        + "' in '" + text.trim() + "'; use ms, s, min or h"));
    }

    /**
     * Reads a duration that must be positive, such as a scan time: as {@link #parseSeconds} with
     * bare numbers in seconds, and an error saying so when it is zero or negative or beyond the
     * {@link Plausible} time limits.
     */
    public static double parsePositiveSeconds(String text) {
        double s = parseSeconds(text, TimeUnit.SECONDS);
        if (!(s > 0)) {
            throw new UnitException("a duration must be > 0 s (got '" + text.trim() + "')");
        }
        if (!Plausible.time(s)) {
            throw new UnitException("a duration must lie " + Plausible.timeRange() + " (got '" + text.trim()
                    + "'); check the value and its unit");
        }
        return s;
    }

    /** Prints the measure as it was written, e.g. {@code 30 s}. */
    @Override
    public String toString() {
        return hasUnit() ? value + " " + unit : Double.toString(value);
    }
}

package org.loopform.units;

/**
 * A measurement or output range in engineering units, {@code low..high}. The span (high - low)
 * turns engineering-unit gains into percent-of-span gains.
 */
public record Span(double low, double high) {

    public Span {
        if (!Double.isFinite(low) || !Double.isFinite(high)) {
            throw new UnitException("range ends must be finite numbers (got " + low + ".." + high + ")");
        }
        if (high <= low) {
            throw new UnitException("range must have high > low (got " + low + ".." + high
                    + "); write it as LOW..HIGH, for example 0..150");
        }
    }

    public double width() {
        return high - low;
    }

    /** Reads {@code LO..HI}, for example {@code 0..150} or {@code -50..50}. */
    public static Span parse(String text) {
        String t = text == null ? "" : text.trim();
        int dots = t.indexOf("..", t.startsWith("-") ? 1 : 0);
        if (dots <= 0) {
            throw new UnitException("expected a range LOW..HIGH such as 0..150 (got '" + text + "')");
        }
        try {
            return new Span(Double.parseDouble(t.substring(0, dots).trim()),
                    Double.parseDouble(t.substring(dots + 2).trim()));
        } catch (NumberFormatException e) {
            throw new UnitException("expected a range LOW..HIGH such as 0..150 (got '" + text + "')");
        }
    }

    @Override
    public String toString() {
        return Numbers.plain(low) + ".." + Numbers.plain(high);
    }
}

package org.loopform.units;

import java.util.Locale;
import java.util.Optional;

/** A unit of time as controllers write it, with its length in seconds. */
public enum TimeUnit {
    SECONDS("s", 1.0),
    MINUTES("min", 60.0),
    HOURS("h", 3600.0);

    private final String symbol;
    private final double seconds;

    TimeUnit(String symbol, double seconds) {
        this.symbol = symbol;
        this.seconds = seconds;
    }

    /** The symbol loopform prints: {@code s}, {@code min} or {@code h}. */
    public String symbol() {
        return symbol;
    }

    /** Length of one of this unit in seconds. */
    public double seconds() {
        return seconds;
    }

    public double toSeconds(double amount) {
        return amount * seconds;
    }

    public double fromSeconds(double amountSeconds) {
        return amountSeconds / seconds;
    }

    /** Reads a unit symbol or word ({@code s}, {@code sec}, {@code seconds}, {@code min}, {@code minutes}, {@code h}, {@code hr}, {@code hours}). */
    public static Optional<TimeUnit> parse(String text) {
        String t = text.trim().toLowerCase(Locale.ROOT);
        return switch (t) {
            case "s", "sec", "secs", "second", "seconds" -> Optional.of(SECONDS);
            case "min", "mins", "minute", "minutes", "m" -> Optional.of(MINUTES);
            case "h", "hr", "hrs", "hour", "hours" -> Optional.of(HOURS);
            default -> Optional.empty();
        };
    }
}

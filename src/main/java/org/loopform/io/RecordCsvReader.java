package org.loopform.io;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.LocalDateTime;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.loopform.identify.PlantRecord;
import org.loopform.units.Span;

/**
 * Reads a logged record from CSV: a header row naming the columns, one sample a row. The time column
 * holds seconds (any origin) or ISO-8601 timestamps ({@code 2024-05-01T10:00:00}, with or without an
 * offset; without one they are read as UTC, which only their differences use); numbers are read in the
 * unit given (seconds unless told otherwise). The output and PV are put in percent of the spans given,
 * {@code 100 (x - low) / (high - low)}; both spans are required (a record already in percent of span is
 * read over {@code 0..100}), so that no scaling is ever assumed.
 */
public final class RecordCsvReader {

    private RecordCsvReader() {
    }

    /**
     * The record read, and how its time column was read.
     *
     * @param record the samples, in seconds and percent of span
     * @param timestamps true when the time column held ISO-8601 timestamps, false when it held numbers
     * @param timeUnit the unit the numbers were read in (seconds when the column held timestamps)
     */
    public record Reading(PlantRecord record, boolean timestamps, org.loopform.units.TimeUnit timeUnit) {

        /** How the time column was read, in words: "ISO-8601 timestamps" or "numbers in s". */
        public String timeReadAs() {
            return timestamps ? "ISO-8601 timestamps" : "numbers in " + timeUnit.symbol();
        }
    }

    public static PlantRecord read(Path file, String name, String timeColumn, String outputColumn, String pvColumn,
                                   Span outRange, Span pvRange) {
        return read(file, name, timeColumn, outputColumn, pvColumn, outRange, pvRange, null).record();
    }

    /**
     * Reads {@code file}; {@code timeUnit} is the unit of a numeric time column (null: seconds); a time column
     * of timestamps with a unit given is refused (timestamps carry their own).
     */
    public static Reading read(Path file, String name, String timeColumn, String outputColumn, String pvColumn,
                               Span outRange, Span pvRange, org.loopform.units.TimeUnit timeUnit) {
        return read(() -> TextInput.open(file, name), name, timeColumn, outputColumn, pvColumn, outRange, pvRange,
                timeUnit);
    }

    /** As {@link #read(Path, String, String, String, String, Span, Span)}, from a stream (a record bundled in the jar). */
    public static PlantRecord read(java.io.InputStream stream, String name, String timeColumn, String outputColumn,
                                   String pvColumn, Span outRange, Span pvRange) {
        return read(() -> new Utf8Reader(stream, name), name, timeColumn, outputColumn, pvColumn, outRange, pvRange,
                null).record();
    }

    private static Reading read(java.util.function.Supplier<Utf8Reader> open, String name, String timeColumn,
                                String outputColumn, String pvColumn, Span outRange, Span pvRange,
                                org.loopform.units.TimeUnit timeUnit) {
        if (outRange == null || pvRange == null) {
            throw new IllegalArgumentException("a record is read over both spans (0..100 when already in percent)");
        }
        double unitSeconds = timeUnit == null ? 1.0 : timeUnit.seconds();
        Boolean timestamps = null;
        List<Double> t = new ArrayList<>();
        List<Double> u = new ArrayList<>();
        List<Double> y = new ArrayList<>();
        try (Utf8Reader raw = open.get(); BufferedReader in = new BufferedReader(raw, 1 << 16)) {
            String first = in.readLine();
            if (first != null && first.startsWith("\uFEFF")) {
                first = first.substring(1);
            }
            if (first == null || first.isBlank()) {
                throw new InputException(name + ":1: the first line must be a header naming the columns, such as"
                        + " time,output,pv");
            }
            char separator = LoopCsvReader.separator(first);
            CSVFormat cells = CSVFormat.DEFAULT.builder().setDelimiter(separator).setTrim(true).build();
            String[] names;
            try (CSVParser hp = cells.parse(new java.io.StringReader(first))) {
                names = hp.getRecords().get(0).values();
            }
            CSVParser p = cells.builder().setHeader(names).setIgnoreEmptyLines(true).build().parse(in);
            Map<String, Integer> header = p.getHeaderMap();
            String tc = column(header, timeColumn, "--time", name);
            String uc = column(header, outputColumn, "--output", name);
            String yc = column(header, pvColumn, "--pv", name);
            Instant origin = null;
            for (CSVRecord rec : p) {
                long line = rec.getRecordNumber() + 1;
                if (!rec.isConsistent()) {
                    throw new InputException(name + ":" + line + ": the row has " + rec.size() + " cells and the"
                            + " header " + header.size() + "; give every row the header's columns");
                }
                String ts = rec.get(tc);
                double seconds;
                Double number = parseNumber(ts);
                if (number != null) {
                    if (Boolean.TRUE.equals(timestamps)) {
                        throw new InputException(name + ":" + line + ": " + tc + ": a number among ISO-8601"
                                + " timestamps (got '" + ts + "'); write every time the same way");
                    }
                    timestamps = false;
                    seconds = number * unitSeconds;
                } else {
                    Instant at = instant(ts);
                    if (at == null) {
                        throw new InputException(name + ":" + line + ": " + tc + ": must be a number (seconds, or the"
                                + " unit of --time-unit) or an ISO-8601 timestamp such as 2024-05-01T10:00:00 (got '"
                                + ts + "')");
                    }
                    if (Boolean.FALSE.equals(timestamps)) {
                        throw new InputException(name + ":" + line + ": " + tc + ": an ISO-8601 timestamp among"
                                + " numbers (got '" + ts + "'); write every time the same way");
                    }
                    if (timeUnit != null) {
                        throw new InputException(name + ":" + line + ": " + tc + ": holds ISO-8601 timestamps, which"
                                + " carry their own unit; leave --time-unit out");
                    }
                    timestamps = true;
                    origin = origin == null ? at : origin;
                    seconds = java.time.Duration.between(origin, at).toNanos() / 1e9;
                }
                double out = number(rec.get(uc), name, line, uc);
                double pv = number(rec.get(yc), name, line, yc);
                if (!t.isEmpty() && !(seconds > t.get(t.size() - 1))) {
                    throw new InputException(name + ":" + line + ": " + tc + ": times must increase (got " + ts
                            + " after the previous row); sort the record by time and remove repeated rows");
                }
                t.add(seconds);
                u.add(100 * (out - outRange.low()) / outRange.width());
                y.add(100 * (pv - pvRange.low()) / pvRange.width());
            }
        } catch (NotUtf8Exception e) {
            throw e.toInput();
        } catch (IOException | java.io.UncheckedIOException e) {
            throw new InputException(name + ": cannot be read (" + e.getMessage() + "); check the path");
        } catch (IllegalArgumentException | IllegalStateException e) {
            throw new InputException(name + ": is not a CSV file with a header row (" + e.getMessage() + ")");
        }
        if (t.size() < 3) {
            throw new InputException(name + ": needs at least 3 samples (got " + t.size() + ")");
        }
        double t0 = t.get(0);
        double[] ta = new double[t.size()];
        double[] ua = new double[t.size()];
        double[] ya = new double[t.size()];
        for (int k = 0; k < ta.length; k++) {
            ta[k] = t.get(k) - t0;
            ua[k] = u.get(k);
            ya[k] = y.get(k);
        }
        return new Reading(new PlantRecord(ta, ua, ya), Boolean.TRUE.equals(timestamps),
                timeUnit == null ? org.loopform.units.TimeUnit.SECONDS : timeUnit);
    }

    private static Double parseNumber(String text) {
        try {
            double v = Double.parseDouble(text);
            return Double.isFinite(v) ? v : null;
        } catch (NumberFormatException e) {
            return null;
        }
    }

    private static String column(Map<String, Integer> header, String wanted, String option, String name) {
        for (String h : header.keySet()) {
            if (h.trim().equalsIgnoreCase(wanted.trim())) {
                return h;
            }
        }
        throw new InputException(name + ":1: " + option + ": no column '" + wanted + "' (the header has "
                + String.join(", ", header.keySet()) + "); name the column with " + option);
    }

    private static double number(String cell, String name, long line, String column) {
        try {
            double v = Double.parseDouble(cell);
            if (Double.isFinite(v)) {
                return v;
            }
        } catch (NumberFormatException e) {
            // reported below
        }
        throw new InputException(name + ":" + line + ": " + column + ": must be a number with a decimal point (got '"
                + cell + "'); " + (cell.matches("[-+]?\\d+,\\d+") ? "write the decimal separator as a point"
                : "fill the gap or remove the row"));
    }

    private static Instant instant(String text) {
        try {
            return OffsetDateTime.parse(text).toInstant();
        } catch (DateTimeParseException e) {
            try {
                return LocalDateTime.parse(text.replace(' ', 'T')).toInstant(ZoneOffset.UTC);
            } catch (DateTimeParseException e2) {
                return null;
            }
        }
    }

    /**
     * The time unit a column's name suggests, from its words ({@code time_min}, {@code t [h]}, {@code Hours},
     * {@code elapsed_ms}): "s", "min", "h" or "ms"; empty when it names none.
     */
    public static java.util.Optional<String> unitSuggestedBy(String column) {
        String spaced = column.replaceAll("([a-z])([A-Z])", "$1 $2");
        for (String word : lower(spaced).split("[^a-z]+")) {
            switch (word) {
                case "s", "sec", "secs", "second", "seconds" -> {
                    return java.util.Optional.of("s");
                }
                case "min", "mins", "minute", "minutes" -> {
                    return java.util.Optional.of("min");
                }
                case "h", "hr", "hrs", "hour", "hours" -> {
                    return java.util.Optional.of("h");
                }
                case "ms", "msec", "millis", "milliseconds" -> {
                    return java.util.Optional.of("ms");
                }
                default -> {
                    // not a unit
                }
            }
        }
        return java.util.Optional.empty();
    }

    static String lower(String s) {
        return s.toLowerCase(Locale.ROOT);
    }
}

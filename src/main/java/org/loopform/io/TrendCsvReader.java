package org.loopform.io;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.time.LocalDateTime;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Pattern;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.loopform.replay.Mode;
import org.loopform.replay.ModeTrack;
import org.loopform.replay.Signal;
import org.loopform.replay.Trend;

/**
 * Reads a logged record (historian export) as CSV: a header, then one row per logged instant. The
 * time column holds seconds (any origin) or ISO-8601 timestamps ({@code 2024-03-01T08:00:00},
 * a space for the {@code T}, fractions of a second, an optional {@code Z} or offset, taken to UTC);
 * setpoint, PV and output hold numbers in the loop's engineering units. An empty cell means the
 * signal was not logged at that instant (compressed or per-tag exports): each signal keeps its own
 * points. The mode column holds {@code auto}, {@code manual} or {@code cascade} (also {@code a},
 * {@code man}, {@code cas}...); the tracking column {@code 1/0}, {@code on/off}, {@code true/false}
 * or {@code yes/no}. Separator, byte-order mark and quoting as for loop lists. Nothing is guessed:
 * a decimal comma, a time that does not increase, an unknown mode stop the file with its line.
 */
public final class TrendCsvReader {

    /** The problems a refused record lists at most: the first ones show what is wrong. */
    private static final int MAX_PROBLEMS = 20;
    private static final Pattern DECIMAL_COMMA = Pattern.compile("^[-+]?\\d+,\\d+$");

    private final String name;
    private final TrendColumns columns;
    private final Map<String, Integer> index = new HashMap<>();
    /** The header's cells, blank ones included: every row has as many. */
    private int headerCells;
    private final List<String> problems = new ArrayList<>();

    private TrendCsvReader(String name, TrendColumns columns) {
        this.name = name;
        this.columns = columns;
    }

    /** The record in {@code path}, shown as {@code shownName} in messages. */
    public static Trend read(Path path, String shownName, TrendColumns columns) {
        try (Utf8Reader in = TextInput.open(path, shownName)) {
            return new TrendCsvReader(shownName, columns).parse(new BufferedReader(in, 1 << 16));
        } catch (NotUtf8Exception e) {
            throw e.toInput();
        } catch (IOException | UncheckedIOException e) {
            throw new InputException(shownName + ": cannot be read (" + e.getMessage() + ")");
        }
    }

    /** The record in {@code text} (tests). */
    public static Trend parse(String text, String shownName, TrendColumns columns) {
        try {
            return new TrendCsvReader(shownName, columns).parse(new BufferedReader(new java.io.StringReader(text)));
        } catch (IOException e) {
            throw new InputException(shownName + ": cannot be read (" + e.getMessage() + ")");
        }
    }

    private Trend parse(BufferedReader br) throws IOException {
        String header = br.readLine();
        if (header != null && header.startsWith("\uFEFF")) {
            header = header.substring(1);
        }
        if (header == null || header.isBlank()) {
            throw new InputException(name + ":1: the first line must be a header naming the columns, such as"
                    + " time,setpoint,pv,output,mode");
        }
        char separator = LoopCsvReader.separator(header);
        CSVFormat format = CSVFormat.RFC4180.builder().setDelimiter(separator).setTrim(true).get();
        readHeader(header, format);
        require(columns.time(), "--time");
        require(columns.setpoint(), "--setpoint");
        require(columns.pv(), "--pv");
        require(columns.output(), "--output");
        if (!problems.isEmpty()) {
            throw new InputException(problems);
        }
        int time = index.get(key(columns.time()));
        int sp = index.get(key(columns.setpoint()));
        int pv = index.get(key(columns.pv()));
        int out = index.get(key(columns.output()));
        Integer mode = index.get(key(columns.mode()));
        Integer tracking = index.get(key(columns.tracking()));
        Series s = new Series();
        Series p = new Series();
        Series o = new Series();
        List<Double> modeTimes = new ArrayList<>();
        List<Mode> modes = new ArrayList<>();
        Boolean timestamps = null;
        LocalDateTime origin = null;
        double previous = Double.NEGATIVE_INFINITY;
        try (CSVParser parser = CSVParser.parse(br, format)) {
            for (CSVRecord r : parser) {
                long line = r.getRecordNumber() + 1;
                if (r.size() == 1 && r.get(0).isEmpty()) {
                    continue; // a blank line
                }
                if (r.size() != headerCells) {
                    problems.add(name + ":" + line + ": the row has " + r.size() + " cells, the header " + headerCells
                            + "; check for a decimal comma or a missing separator");
                    continue;
                }
                String tc = r.get(time);
                if (tc.isEmpty()) {
                    problems.add(name + ":" + line + ": " + columns.time() + ": every row needs a time");
                    continue;
                }
                double seconds;
                Double plain = number(tc);
                if (timestamps == null) {
                    timestamps = plain == null;
                }
                if (!timestamps) {
                    if (plain == null) {
                        problems.add(name + ":" + line + ": " + columns.time() + ": expected seconds like the rows"
                                + " above (got '" + tc + "'); give every time as seconds or every time as a timestamp");
                        continue;
                    }
                    seconds = plain;
                } else {
                    LocalDateTime at = timestamp(tc);
                    if (at == null) {
                        problems.add(name + ":" + line + ": " + columns.time() + ": expected a timestamp such as"
                                + " 2024-03-01T08:00:00 or seconds (got '" + tc + "')");
                        continue;
                    }
                    if (origin == null) {
                        origin = at;
                    }
                    seconds = java.time.Duration.between(origin, at).toNanos() / 1e9;
                }
                if (!(seconds > previous)) {
                    problems.add(name + ":" + line + ": " + columns.time() + ": times must increase (got " + tc
                            + " after the row above); sort the record by time and drop repeated rows");
                    continue;
                }
                previous = seconds;
                value(r, sp, columns.setpoint(), line, seconds, s);
                value(r, pv, columns.pv(), line, seconds, p);
                value(r, out, columns.output(), line, seconds, o);
                Mode m = mode == null ? null : mode(r.get(mode), line);
                Boolean tracked = tracking == null ? null : tracking(r.get(tracking), line);
                if (m != null || tracked != null) {
                    Mode last = modes.isEmpty() ? Mode.AUTOMATIC : modes.get(modes.size() - 1);
                    Mode now = Boolean.TRUE.equals(tracked) ? Mode.TRACKING : m != null ? m
                            : last == Mode.TRACKING ? Mode.AUTOMATIC : last;
                    modeTimes.add(seconds);
                    modes.add(now);
                }
            }
        } catch (UncheckedIOException e) {
            throw new InputException(name + ": a quote is not closed (" + e.getMessage() + "); close it or remove it");
        }
        for (Series x : List.of(s, p, o)) {
            if (x.times.size() < 2 && problems.isEmpty()) {
                String col = x == s ? columns.setpoint() : x == p ? columns.pv() : columns.output();
                problems.add(name + ": " + col + ": needs at least two logged values (got " + x.times.size() + ")");
            }
        }
        if (!problems.isEmpty()) {
            throw new InputException(problems.subList(0, Math.min(problems.size(), MAX_PROBLEMS)));
        }
        ModeTrack track = modes.isEmpty() ? null : new ModeTrack(toArray(modeTimes), modes);
        return new Trend(s.signal(columns.setpoint()), p.signal(columns.pv()), o.signal(columns.output()), track,
                origin);
    }

    private void readHeader(String header, CSVFormat format) {
        try (CSVParser hp = CSVParser.parse(header, format)) {
            int k = 0;
            for (String h : hp.iterator().next()) {
                Integer first = index.putIfAbsent(key(h), k);
                if (first != null && !h.isBlank()) {
                    problems.add(name + ":1: " + h + ": columns " + (first + 1) + " and " + (k + 1) + " have the same"
                            + " name; rename one of them");
                }
                k++;
            }
            headerCells = k;
        } catch (IOException | UncheckedIOException e) {
            throw new InputException(name + ":1: the header's quotes are not closed; write the column names without"
                    + " quotes");
        }
    }

    /** Notes a problem when the header has no column {@code column} (named with {@code option}). */
    private void require(String column, String option) {
        if (!index.containsKey(key(column))) {
            problems.add(name + ":1: " + column + ": no such column (the header has " + String.join(", ",
                    index.keySet().stream().sorted().toList()) + "); name the column with " + option + " NAME");
        }
    }

    private void value(CSVRecord r, int column, String columnName, long line, double seconds, Series into) {
        String c = r.get(column);
        if (c.isEmpty()) {
            return;
        }
        Double v = number(c);
        if (v == null) {
            problems.add(name + ":" + line + ": " + columnName + ": expected a number (got '" + c + "')"
                    + (DECIMAL_COMMA.matcher(c).matches() ? "; write the decimal separator as a point" : ""));
            return;
        }
        into.add(seconds, v);
    }

    private Mode mode(String text, long line) {
        String t = text.trim().toLowerCase(Locale.ROOT);
        return switch (t) {
            case "" -> null;
            case "auto", "automatic", "a", "aut" -> Mode.AUTOMATIC;
            case "manual", "man", "m" -> Mode.MANUAL;
            case "cascade", "cas", "c", "remote", "rsp" -> Mode.CASCADE;
            default -> {
                problems.add(name + ":" + line + ": " + columns.mode() + ": expected auto, manual or cascade (got '"
                        + text + "')");
                yield null;
            }
        };
    }

    private Boolean tracking(String text, long line) {
        String t = text.trim().toLowerCase(Locale.ROOT);
        return switch (t) {
            case "" -> null;
            case "1", "on", "true", "yes" -> true;
            case "0", "off", "false", "no" -> false;
            default -> {
                problems.add(name + ":" + line + ": " + columns.tracking() + ": expected on or off (1 or 0) (got '"
                        + text + "')");
                yield null;
            }
        };
    }

    private static Double number(String text) {
        try {
            double v = Double.parseDouble(text.trim());
            return Double.isFinite(v) ? v : null;
        } catch (NumberFormatException e) {
            return null;
        }
    }

    /** An ISO-8601 local or zoned date-time (a space may replace the T), zoned ones taken to UTC; null otherwise. */
    static LocalDateTime timestamp(String text) {
        String t = text.trim().replace(' ', 'T');
        try {
            return LocalDateTime.parse(t);
        } catch (DateTimeParseException e) {
            try {
                return OffsetDateTime.parse(t).withOffsetSameInstant(ZoneOffset.UTC).toLocalDateTime();
            } catch (DateTimeParseException e2) {
                return null;
            }
        }
    }

    private static String key(String column) {
        return column.trim().toLowerCase(Locale.ROOT);
    }

    private static double[] toArray(List<Double> xs) {
        double[] a = new double[xs.size()];
        for (int k = 0; k < a.length; k++) {
            a[k] = xs.get(k);
        }
        return a;
    }

    /** One signal's points as read. */
    private static final class Series {
        final List<Double> times = new ArrayList<>();
        final List<Double> values = new ArrayList<>();

        void add(double t, double v) {
            times.add(t);
            values.add(v);
        }

        Signal signal(String name) {
            return new Signal(name, toArray(times), toArray(values));
        }
    }
}

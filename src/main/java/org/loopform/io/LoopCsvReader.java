package org.loopform.io;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.Reader;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.NoSuchElementException;
import java.util.Set;
import java.util.function.LongSupplier;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;

/**
 * Reads a loop list as CSV, one loop a row, streaming and reading its input once (a pipe works
 * like a file): the header names the columns (snake_case, any order): {@code tag}, {@code form},
 * the parameter columns, {@code scan}, {@code pv_range}, {@code output_range}, optional process
 * columns and optional {@code target_form}, {@code target_scan}. Empty cells are absent; a cell may
 * carry a unit ({@code 30s}). A UTF-8 byte-order mark is skipped, quoting follows RFC 4180, and the
 * separator is the one of {@code ,} {@code ;} or tab that the header uses most.
 *
 * <p>Nothing is guessed: a row whose cell count differs from the header's, a decimal comma in a
 * number, or a value under a column without a name is a bad row that says so; a header that names
 * a column twice, an unclosed quote and bytes that are not UTF-8 stop the file with the line.
 * A bad row becomes a {@link LoopRow} with its problems; a repeated tag is a problem of the later row.
 */
public final class LoopCsvReader implements Iterator<LoopRow>, AutoCloseable {

    static final Set<String> PARAMETERS = Set.of("kc", "pb", "kp", "ti", "reset", "ki", "td", "kd", "n", "tf", "b",
            "c", "action");
    static final Set<String> PROCESS = Set.of("model", "process_gain", "time_constant", "time_constant_2",
            "dead_time", "lag", "process_gain_units");
    static final Set<String> OTHER = Set.of("tag", "form", "scan", "pv_range", "output_range", "target_form",
            "target_scan", RuleCells.RULE, RuleCells.CONTROLLER, RuleCells.TAU_C, RuleCells.LAMBDA);
    /** Columns that hold numbers (with an optional unit), where a decimal comma is a problem. */
    static final Set<String> NUMERIC = Set.of("kc", "pb", "kp", "ti", "reset", "ki", "td", "kd", "n", "tf", "b", "c",
            "scan", "target_scan", "pv_range", "output_range", "process_gain", "time_constant", "time_constant_2",
            "dead_time", "lag");
    private static final char[] SEPARATORS = {',', ';', '\t'};

    private final String name;
    private final CSVParser parser;
    private final Iterator<CSVRecord> records;
    private final LongSupplier bytesRead;
    /** The header's column names, lower case; an empty name is a column without a name. */
    private final List<String> columns;
    private final char separator;
    private final LoopListRows rows;
    private CSVRecord pending;
    private long pendingLine;
    private int index;

    private LoopCsvReader(Reader in, LongSupplier bytesRead, String name, Path folder, LoopDefaults defaults)
            throws IOException {
        this.name = name;
        this.bytesRead = bytesRead;
        BufferedReader br = new BufferedReader(in, 1 << 16);
        String header = br.readLine();
        if (header != null && header.startsWith("\uFEFF")) {
            header = header.substring(1);
        }
        if (header == null || header.isBlank()) {
            throw new InputException(name + ":1: " + (header == null ? "the file is empty" : "the first line is blank")
                    + "; the first line must be a header such as tag,form,kc,ti,td,scan");
        }
        this.separator = separator(header);
        CSVFormat format = CSVFormat.RFC4180.builder().setDelimiter(separator).setIgnoreEmptyLines(false)
                .setTrim(true).get();
        this.columns = header(header, format);
        this.rows = new LoopListRows(name, folder, defaults, columns, k -> String.valueOf(k + 1));
        // the header line is consumed: the parser's line 1 is the file's line 2
        this.parser = CSVParser.parse(br, format);
        this.records = parser.iterator();
    }

    private List<String> header(String line, CSVFormat format) {
        List<String> raw = new ArrayList<>();
        try (CSVParser p = CSVParser.parse(line, format)) {
            for (CSVRecord r : p) {
                r.forEach(raw::add);
                break;
            }
        } catch (IOException | UncheckedIOException e) {
            throw new InputException(name + ":1: the header's quotes are not closed; write the column names"
                    + " without quotes, such as tag,form,kc,ti,td");
        }
        return LoopListRows.header(raw, name + ":1", k -> name + ":1", k -> String.valueOf(k + 1));
    }

    /** The separator the header uses most, outside quotes: ',' unless ';' or tab is more frequent. */
    static char separator(String header) {
        int[] counts = new int[SEPARATORS.length];
        boolean quoted = false;
        for (int k = 0; k < header.length(); k++) {
            char ch = header.charAt(k);
            if (ch == '"') {
                quoted = !quoted;
            }
            for (int s = 0; !quoted && s < SEPARATORS.length; s++) {
                if (ch == SEPARATORS[s]) {
                    counts[s]++;
                }
            }
        }
        int best = 0;
        for (int s = 1; s < SEPARATORS.length; s++) {
            if (counts[s] > counts[best]) {
                best = s;
            }
        }
        return SEPARATORS[best];
    }

    /** Opens {@code path}, once; file-level problems (no file, a folder, bad header) are thrown at once. */
    public static LoopCsvReader open(Path path, String shownName, LoopDefaults defaults) {
        WorkbookBytes.refuseWorkbookAsCsv(path, shownName);
        Path folder = path.toAbsolutePath().getParent();
        return over(TextInput.open(path, shownName), shownName, folder, defaults);
    }

    /**
     * Reads CSV bytes from a stream once, as strict UTF-8 (bundled examples, pipes); forms given by
     * path are resolved against {@code folder}. The stream is closed when its header cannot be read.
     */
    public static LoopCsvReader of(InputStream stream, String shownName, Path folder, LoopDefaults defaults) {
        return over(new Utf8Reader(stream, shownName), shownName, folder, defaults);
    }

    /** A reader of {@code in} from its header on; {@code in} is closed when the header cannot be read. */
    private static LoopCsvReader over(Utf8Reader in, String shownName, Path folder, LoopDefaults defaults) {
        boolean opened = false;
        try {
            LoopCsvReader reader = new LoopCsvReader(in, in::bytesRead, shownName, folder, defaults);
            opened = true;
            return reader;
        } catch (NotUtf8Exception e) {
            throw e.toInput();
        } catch (IOException e) {
            throw TextInput.unreadable(e, shownName);
        } finally {
            if (!opened) {
                LoopFields.closeQuietly(in);
            }
        }
    }

    /** Reads CSV text (tests, bundled examples); forms given by path are resolved against {@code folder}. */
    public static LoopCsvReader of(Reader in, String shownName, Path folder, LoopDefaults defaults) {
        try {
            return new LoopCsvReader(in, () -> -1, shownName, folder, defaults);
        } catch (IOException e) {
            throw new InputException(shownName + ": cannot be read (" + e.getMessage() + ")");
        }
    }

    /** Bytes read from the file so far (for progress), or -1 when the source does not count them. */
    public long bytesRead() {
        return bytesRead.getAsLong();
    }

    @Override
    public boolean hasNext() {
        while (pending == null) {
            long before = parser.getCurrentLineNumber();
            try {
                if (!records.hasNext()) {
                    return false;
                }
                CSVRecord r = records.next();
                if (!(r.size() == 1 && r.get(0).isBlank())) {
                    pending = r;
                    pendingLine = before + 2;
                }
            } catch (UncheckedIOException | IllegalStateException e) {
                throw notCsv(e, before + 2);
            }
        }
        return true;
    }

    private InputException notCsv(RuntimeException e, long line) {
        Throwable c = e.getCause();
        if (c instanceof NotUtf8Exception n) {
            return n.toInput();
        }
        String m = messages(e);
        String where = name + ":" + line + ": ";
        if (m.contains("EOF reached before encapsulated token finished")) {
            return new InputException(where + "a quote (\") opens a cell on this line and is never closed, so the"
                    + " rest of the file would be one cell; close the quote, and double any quote inside a quoted"
                    + " cell (\"\")");
        }
        if (m.contains("between encapsulated token and delimiter")) {
            return new InputException(where + "text follows a closing quote (\") before the next separator; a"
                    + " quoted cell must end at its closing quote: double a quote inside a quoted cell (\"\"), or"
                    + " do not quote the cell");
        }
        if (c instanceof IOException io && !(c.getClass().getName().startsWith("org.apache.commons.csv"))) {
            return TextInput.unreadable(io, name);
        }
        return new InputException(where + "not valid CSV near this line; check its quotes and separators");
    }

    /** The messages of {@code e} and of its causes, one a line (the parser's wording is in the cause). */
    private static String messages(Throwable e) {
        StringBuilder all = new StringBuilder();
        for (Throwable t = e; t != null; t = t.getCause()) {
            all.append(t.getMessage()).append('\n');
        }
        return all.toString();
    }

    @Override
    public LoopRow next() {
        if (!hasNext()) {
            throw new NoSuchElementException();
        }
        CSVRecord rec = pending;
        pending = null;
        int i = index++;
        String where = name + ":" + pendingLine;
        String tag = rows.tag(rec.toList());
        if (rec.size() != columns.size()) {
            return LoopRow.bad(i, tag, where, List.of(cellCount(where, rec)));
        }
        long line = pendingLine;
        return rows.row(i, rec.toList(), where, k -> where, (int) Math.min(Integer.MAX_VALUE, line),
                previous -> name + ":" + previous, List.of());
    }

    /** "14 cells, the header has 13", with the likely cause. */
    private String cellCount(String where, CSVRecord rec) {
        int cells = rec.size();
        String s = where + ": " + cells + (cells == 1 ? " cell" : " cells") + ", the header has " + columns.size();
        if (cells > columns.size()) {
            return s + (separator == ','
                    ? "; a decimal comma in a comma-separated file (1,5 for 1.5)? Write decimals with a point, and"
                    + " quote any cell that holds a comma (\"A,B\"); the row is not read, as its values may have shifted"
                    : "; a separator ('" + shown(separator) + "') inside a cell? Quote such cells; the row is not read,"
                    + " as its values may have shifted");
        }
        for (char other : SEPARATORS) {
            if (other != separator && rec.stream().anyMatch(v -> v.indexOf(other) >= 0)) {
                return s + "; the row seems separated by '" + shown(other) + "' but the header by '" + shown(separator)
                        + "'; use one separator in the whole file";
            }
        }
        return s + "; a missing cell? Every row needs a cell for every column: leave a cell empty, but keep its"
                + " separator";
    }

    private static String shown(char separator) {
        return separator == '\t' ? "tab" : String.valueOf(separator);
    }

    @Override
    public void close() {
        try {
            parser.close();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}

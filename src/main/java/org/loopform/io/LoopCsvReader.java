package org.loopform.io;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.PushbackReader;
import java.io.Reader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.NoSuchElementException;
import java.util.Set;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;
import org.loopform.audit.LoopSpec;
import org.loopform.form.FormDefinition;
import org.loopform.process.ProcessModel;
import org.loopform.units.BadInput;
import org.loopform.units.Measure;
import org.loopform.units.Span;
import org.loopform.units.UnitException;

/**
 * Reads a loop list as CSV, one loop a row, streaming: the header names the columns (snake_case,
 * any order): {@code tag}, {@code form}, the parameter columns, {@code scan}, {@code pv_range},
 * {@code output_range}, optional process columns and optional {@code target_form},
 * {@code target_scan}. Empty cells are absent; a cell may carry a unit ({@code 30s}). A UTF-8
 * byte-order mark is skipped, quoting follows RFC 4180, and a header with more semicolons than
 * commas makes {@code ;} the separator. A bad row becomes a {@link LoopRow} with its problems;
 * a repeated tag is a problem of the later row.
 */
public final class LoopCsvReader implements Iterator<LoopRow>, AutoCloseable {

    static final Set<String> PARAMETERS = Set.of("kc", "pb", "kp", "ti", "reset", "ki", "td", "kd", "n", "tf", "b",
            "c", "action");
    static final Set<String> PROCESS = Set.of("model", "process_gain", "time_constant", "time_constant_2",
            "dead_time", "lag", "process_gain_units");
    static final Set<String> OTHER = Set.of("tag", "form", "scan", "pv_range", "output_range", "target_form",
            "target_scan");

    private final String name;
    private final Path folder;
    private final CSVParser parser;
    private final Iterator<CSVRecord> records;
    private final LoopDefaults defaults;
    private final Map<String, String> firstSeen = new HashMap<>();
    private final Map<String, FormDefinition> forms = new HashMap<>();
    private int index;

    private LoopCsvReader(Reader in, String name, Path folder, LoopDefaults defaults) throws IOException {
        this.name = name;
        this.folder = folder;
        this.defaults = defaults;
        PushbackReader pr = new PushbackReader(new BufferedReader(in), 1);
        int first = pr.read();
        if (first != '\uFEFF' && first != -1) {
            pr.unread(first);
        }
        BufferedReader br = new BufferedReader(pr);
        br.mark(1 << 16);
        String header = br.readLine();
        br.reset();
        if (header == null || header.isBlank()) {
            throw new InputException(name + ":1: the file is empty; the first line must be a header such as "
                    + "tag,form,kc,ti,td,scan");
        }
        char sep = count(header, ';') > count(header, ',') ? ';' : ',';
        CSVFormat format = CSVFormat.RFC4180.builder().setDelimiter(sep).setHeader().setSkipHeaderRecord(true)
                .setIgnoreEmptyLines(true).setTrim(true).get();
        this.parser = CSVParser.parse(br, format);
        List<String> problems = new ArrayList<>();
        for (String h : parser.getHeaderNames()) {
            String k = h.trim().toLowerCase(java.util.Locale.ROOT);
            if (!PARAMETERS.contains(k) && !PROCESS.contains(k) && !OTHER.contains(k)) {
                problems.add(name + ":1: " + h + ": unknown column; columns are tag, form, the parameters ("
                        + String.join(", ", PARAMETERS.stream().sorted().toList()) + "), scan, pv_range, output_range,"
                        + " process columns (" + String.join(", ", PROCESS.stream().sorted().toList())
                        + "), target_form, target_scan");
            }
        }
        for (String need : List.of("tag", "form")) {
            if (parser.getHeaderNames().stream().noneMatch(h -> h.trim().equalsIgnoreCase(need))) {
                problems.add(name + ":1: " + need + ": required column is missing from the header");
            }
        }
        if (!problems.isEmpty()) {
            parser.close();
            throw new InputException(problems);
        }
        this.records = parser.iterator();
    }

    private static int count(String s, char c) {
        int n = 0;
        for (int k = 0; k < s.length(); k++) {
            if (s.charAt(k) == c) {
                n++;
            }
        }
        return n;
    }

    /** Opens {@code path}; file-level problems (no file, bad header) are thrown at once. */
    public static LoopCsvReader open(Path path, String shownName, LoopDefaults defaults) {
        try {
            Path abs = path.toAbsolutePath();
            return new LoopCsvReader(Files.newBufferedReader(path, StandardCharsets.UTF_8), shownName,
                    abs.getParent(), defaults);
        } catch (NoSuchFileException e) {
            throw new InputException(shownName + ": no such file; check the path");
        } catch (IOException e) {
            throw new InputException(shownName + ": cannot be read (" + e.getMessage() + ")");
        }
    }

    /** Reads CSV text (tests, bundled examples); forms given by path are resolved against {@code folder}. */
    public static LoopCsvReader of(Reader in, String shownName, Path folder, LoopDefaults defaults) {
        try {
            return new LoopCsvReader(in, shownName, folder, defaults);
        } catch (IOException e) {
            throw new InputException(shownName + ": cannot be read (" + e.getMessage() + ")");
        }
    }

    @Override
    public boolean hasNext() {
        try {
            return records.hasNext();
        } catch (UncheckedIOException | IllegalStateException e) {
            throw new InputException(name + ": not valid CSV: " + e.getMessage());
        }
    }

    @Override
    public LoopRow next() {
        if (!hasNext()) {
            throw new NoSuchElementException();
        }
        CSVRecord rec = records.next();
        int i = index++;
        // the parser has read this record (and no further) here: its line is the current line
        String where = name + ":" + parser.getCurrentLineNumber();
        Map<String, String> cells = new LinkedHashMap<>();
        rec.toMap().forEach((k, v) -> {
            if (v != null && !v.isBlank()) {
                cells.put(k.trim().toLowerCase(java.util.Locale.ROOT), v.trim());
            }
        });
        String tag = cells.getOrDefault("tag", "");
        try {
            LoopSpec spec = row(cells, where);
            String previous = firstSeen.putIfAbsent(spec.tag(), where);
            if (previous != null) {
                return LoopRow.bad(i, tag, where, List.of(where + ": tag: duplicate tag " + tag + " (first at "
                        + previous + "); every loop needs its own tag"));
            }
            return LoopRow.of(i, defaults.apply(spec));
        } catch (BadInput e) {
            // only bad input becomes a bad row; anything else is a bug of loopform and stops the run
            return LoopRow.bad(i, tag, where, e.problems().stream()
                    .map(m -> m.startsWith(name + ":") ? m : where + ": " + m).toList());
        }
    }

    private LoopSpec row(Map<String, String> c, String where) {
        String tag = c.get("tag");
        if (tag == null) {
            throw new InputException(where + ": tag: required; every loop needs a tag");
        }
        String formId = c.get("form");
        if (formId == null) {
            throw new InputException(where + ": form: required; the source form (a catalog id or a form file)");
        }
        FormDefinition from = form(formId, where, "form");
        FormDefinition to = null;
        if (defaults.targetForm() == null && c.containsKey("target_form")) {
            to = form(c.get("target_form"), where, "target_form");
        } else if (defaults.targetForm() == null) {
            throw new InputException(where + ": target_form: required (or give --to FORM for all loops)");
        }
        Map<String, String> tuning = new LinkedHashMap<>();
        for (String p : PARAMETERS) {
            if (c.containsKey(p)) {
                tuning.put(p, c.get(p));
            }
        }
        // parameters in the column order of the file, as a person reads them
        Map<String, String> ordered = new LinkedHashMap<>();
        c.keySet().stream().filter(tuning::containsKey).forEach(k -> ordered.put(k, tuning.get(k)));
        Span pv = span(c, "pv_range", where);
        Span out = span(c, "output_range", where);
        Double scan = c.containsKey("scan") ? Double.valueOf(seconds(c.get("scan"), where, "scan")) : null;
        Double targetScan = c.containsKey("target_scan") ? Double.valueOf(seconds(c.get("target_scan"), where,
                "target_scan")) : scan;
        ProcessModel process = null;
        if (c.containsKey("model")) {
            Map<String, String> pm = new LinkedHashMap<>();
            pm.put("model", c.get("model"));
            copy(c, pm, "process_gain", "gain");
            copy(c, pm, "process_gain_units", "gain_units");
            copy(c, pm, "time_constant", "time_constant");
            copy(c, pm, "time_constant_2", "time_constant_2");
            copy(c, pm, "dead_time", "dead_time");
            copy(c, pm, "lag", "lag");
            process = ProcessReader.read(pm, pv, out, key -> where + ": " + (key.equals("gain") ? "process_gain"
                    : key.equals("gain_units") ? "process_gain_units" : key) + ": ");
        }
        FormDefinition target = to != null ? to : defaults.targetForm();
        return new LoopSpec(tag, process, from, ordered, scan, target, targetScan, pv, out, where);
    }

    private static void copy(Map<String, String> from, Map<String, String> to, String key, String as) {
        if (from.containsKey(key)) {
            to.put(as, from.get(key));
        }
    }

    private FormDefinition form(String idOrPath, String where, String column) {
        FormDefinition f = forms.get(idOrPath);
        if (f != null) {
            return f;
        }
        try {
            String p = idOrPath;
            if (CatalogLoader.bundled().find(p).isEmpty() && folder != null && !Path.of(p).isAbsolute()
                    && Files.isRegularFile(folder.resolve(p))) {
                p = folder.resolve(p).toString();
            }
            f = CatalogLoader.resolve(p, column);
        } catch (InputException e) {
            throw new InputException(where + ": " + e.getMessage());
        }
        forms.put(idOrPath, f);
        return f;
    }

    private static Span span(Map<String, String> c, String key, String where) {
        if (!c.containsKey(key)) {
            return null;
        }
        try {
            return Span.parse(c.get(key));
        } catch (UnitException e) {
            throw new InputException(where + ": " + key + ": " + e.getMessage());
        }
    }

    private static double seconds(String text, String where, String key) {
        try {
            return Measure.parsePositiveSeconds(text);
        } catch (UnitException e) {
            throw new InputException(where + ": " + key + ": " + e.getMessage());
        }
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

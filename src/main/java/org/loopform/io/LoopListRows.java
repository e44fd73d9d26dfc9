package org.loopform.io;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.function.Function;
import java.util.function.IntFunction;
import java.util.regex.Pattern;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;
import org.loopform.check.LoopSpec;
import org.loopform.form.FormDefinition;
import org.loopform.process.ProcessModel;
import org.loopform.tuning.PublishedTuning;
import org.loopform.units.BadInput;
import org.loopform.units.Span;

/**
 * The columns and rows of a tabular loop list, whatever file holds the table (a CSV file, a sheet of
 * an xlsx workbook): one header naming the columns (snake_case, any order, any case), then one loop
 * a row, each cell as text (empty cells absent, a unit may follow a number: {@code 30s}). Both
 * readers hand their cells here, so the columns, the units and every check are the same, and only
 * the position in a message differs ({@code loops.csv:7}, {@code loops.xlsx:Loops!C7}).
 */
final class LoopListRows {

    private static final Pattern DECIMAL_COMMA = Pattern.compile("\\d,\\d");

    private final String name;
    private final Path folder;
    private final LoopDefaults defaults;
    /** The header's column names, lower case; an empty name is a column without a name. */
    private final List<String> columns;
    private final TagIndex firstSeen = new TagIndex();
    private final Map<String, FormDefinition> forms = new HashMap<>();
    /** How the user counts columns: 1, 2... in CSV; A, B... in a sheet. */
    private final IntFunction<String> columnLabel;

    LoopListRows(String name, Path folder, LoopDefaults defaults, List<String> columns,
                 IntFunction<String> columnLabel) {
        this.name = name;
        this.folder = folder;
        this.defaults = defaults;
        this.columns = List.copyOf(columns);
        this.columnLabel = columnLabel;
    }

    List<String> columns() {
        return columns;
    }

    /**
     * The column names of a header row, lower case (an empty one is a column without a name), or
     * every problem of the header at once: a name given twice, an unknown name, {@code tag} or
     * {@code form} missing. {@code at} gives the position of column k (from 0) for a message,
     * {@code label} how the user counts columns (1, 2... in CSV; A, B... in a sheet).
     */
    static List<String> header(List<String> raw, String headerWhere, IntFunction<String> at,
                               IntFunction<String> label) {
        List<String> cols = new ArrayList<>();
        List<String> problems = new ArrayList<>();
        Map<String, Integer> firstColumn = new HashMap<>();
        for (int k = 0; k < raw.size(); k++) {
            String h = raw.get(k).trim();
            String key = h.toLowerCase(Locale.ROOT);
            cols.add(key);
            if (key.isEmpty()) {
                continue; // a column without a name: allowed while its cells stay empty
            }
            Integer first = firstColumn.putIfAbsent(key, k);
            if (first != null) {
                problems.add(at.apply(k) + ": " + key + ": columns " + label.apply(first) + " and " + label.apply(k)
                        + " are both named '" + h + "'; keep one of them (loopform does not choose between two values)");
            } else if (!LoopCsvReader.PARAMETERS.contains(key) && !LoopCsvReader.PROCESS.contains(key)
                    && !LoopCsvReader.OTHER.contains(key)) {
                problems.add(at.apply(k) + ": " + h + ": unknown column" + (raw.size() == 1 ? " (the header has a"
                        + " single column: separate column names with ',' or ';')" : "") + "; columns are tag, form,"
                        + " the parameters (" + String.join(", ", LoopCsvReader.PARAMETERS.stream().sorted().toList())
                        + "), scan, pv_range, output_range, process columns (" + String.join(", ",
                        LoopCsvReader.PROCESS.stream().sorted().toList()) + "), target_form, target_scan, and for"
                        + " a new loop tuned by rule: rule, controller, tau_c, lambda");
            }
        }
        if (!firstColumn.containsKey("tag")) {
            problems.add(headerWhere + ": tag: required column is missing from the header");
        }
        if (!firstColumn.containsKey("form") && !firstColumn.containsKey(RuleCells.RULE)) {
            problems.add(headerWhere + ": form: required column is missing from the header (a list of new loops tuned"
                    + " by rule may give a rule column instead)");
        }
        if (!problems.isEmpty()) {
            throw new InputException(problems);
        }
        return List.copyOf(cols);
    }

    /** The trimmed text of the tag cell of a row whose cells are {@code values} (empty when there is none). */
    String tag(List<String> values) {
        int tagColumn = columns.indexOf("tag");
        return tagColumn < values.size() ? values.get(tagColumn).trim() : "";
    }

    /**
     * One row: {@code values} are its cells as text by column (as many as the header has, or fewer:
     * the rest are empty; a cell past the header's columns is a value under a column without a name),
     * {@code where} the row's position, {@code at} the position of its cell in column k,
     * {@code position} the row's number (line or sheet row) and {@code firstAt} the position of an
     * earlier row of the same number, for a repeated tag. {@code cellProblems} are problems the
     * reader found in the cells themselves; any problem makes the row a bad row.
     */
    LoopRow row(int index, List<String> values, String where, IntFunction<String> at, int position,
                IntFunction<String> firstAt, List<String> cellProblems) {
        String tag = tag(values);
        Map<String, String> cells = new LinkedHashMap<>();
        List<String> problems = new ArrayList<>(cellProblems);
        for (int k = 0; k < values.size(); k++) {
            String key = k < columns.size() ? columns.get(k) : "";
            String v = values.get(k).trim();
            if (v.isEmpty()) {
                continue;
            }
            if (key.isEmpty()) {
                problems.add(at.apply(k) + ": column " + columnLabel.apply(k) + " has no name in the header, but this row has"
                        + " a value there ('" + v + "'); name the column, or empty its cells");
            } else if (LoopCsvReader.NUMERIC.contains(key) && DECIMAL_COMMA.matcher(v).find()) {
                problems.add(at.apply(k) + ": " + key + ": '" + v + "' has a comma in a number; write decimals with a"
                        + " point (1.5, not 1,5) and no thousands separators (loopform does not guess which was meant)");
            } else {
                cells.put(key, v);
            }
        }
        if (!problems.isEmpty()) {
            return LoopRow.bad(index, tag, where, problems);
        }
        Function<String, String> cellAt = key -> {
            int k = columns.indexOf(key);
            return k < 0 ? where : at.apply(k);
        };
        try {
            Read read = spec(cells, where, cellAt);
            LoopSpec spec = read.spec();
            int previous = firstSeen.putIfAbsent(spec.tag(), position);
            if (previous >= 0) {
                return LoopRow.bad(index, tag, where, List.of(cellAt.apply("tag") + ": tag: duplicate tag " + tag
                        + " (first at " + firstAt.apply(previous) + "); every loop needs its own tag"));
            }
            return read.byRule() == null ? LoopRow.of(index, defaults.apply(spec))
                    : LoopRow.byRule(index, defaults.apply(spec), read.byRule());
        } catch (BadInput e) {
            // only bad input becomes a bad row; anything else is a bug of loopform and stops the run
            return LoopRow.bad(index, tag, where, e.problems().stream()
                    .map(m -> m.startsWith(name + ":") ? m : where + ": " + m).toList());
        }
    }

    /** A row read: its loop, and the rule's tuning when the row names a rule (else null). */
    private record Read(LoopSpec spec, PublishedTuning byRule) {
    }

    private Read spec(Map<String, String> c, String where, Function<String, String> at) {
        String tag = c.get("tag");
        if (tag == null) {
            throw new InputException(at.apply("tag") + ": tag: required; every loop needs a tag");
        }
        boolean byRule = RuleCells.any(c.keySet());
        String formId = c.get("form");
        if (formId == null && !byRule) {
            throw new InputException(at.apply("form") + ": form: required; the source form (a catalog id or a form"
                    + " file), or for a new loop a rule (" + org.loopform.tuning.Rule.ids() + ") with its process model");
        }
        FormDefinition from = byRule ? null : form(formId, at.apply("form"), "form");
        FormDefinition to = null;
        if (defaults.targetForm() == null && c.containsKey("target_form")) {
            to = form(c.get("target_form"), at.apply("target_form"), "target_form");
        } else if (defaults.targetForm() == null) {
            throw new InputException(where + ": target_form: required (or give --to FORM for all loops)");
        }
        Map<String, String> tuning = new LinkedHashMap<>();
        for (String p : LoopCsvReader.PARAMETERS) {
            if (c.containsKey(p)) {
                tuning.put(p, c.get(p));
            }
        }
        // parameters in the column order of the file, as a person reads them
        Map<String, String> ordered = new LinkedHashMap<>();
        c.keySet().stream().filter(tuning::containsKey).forEach(k -> ordered.put(k, tuning.get(k)));
        Span pv = span(c, "pv_range", at);
        Span out = span(c, "output_range", at);
        Double scan = c.containsKey("scan") ? Double.valueOf(seconds(c.get("scan"), at, "scan")) : null;
        Double targetScan = c.containsKey("target_scan") ? Double.valueOf(seconds(c.get("target_scan"), at,
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
            process = ProcessReader.read(pm, pv, out, key -> {
                String column = key.equals("gain") ? "process_gain" : key.equals("gain_units") ? "process_gain_units"
                        : key;
                return at.apply(column) + ": " + column + ": ";
            });
        }
        FormDefinition target = to != null ? to : defaults.targetForm();
        if (byRule) {
            Map<String, String> ruleCells = new LinkedHashMap<>();
            RuleCells.KEYS.stream().filter(c::containsKey).forEach(k -> ruleCells.put(k, c.get(k)));
            PublishedTuning t = RuleCells.tuning(ruleCells, ordered.keySet(), formId != null, process,
                    key -> at.apply(key) + ": " + key + ": ", "form", "the model columns model, process_gain,"
                            + " time_constant and dead_time");
            // a new loop has no old controller: scan, if given, is the new controller's scan
            return new Read(new LoopSpec(tag, process, PublishedForm.form(t, RuleCells.RULE), PublishedForm.values(t),
                    null, target, targetScan, pv, out, where), t);
        }
        Map<String, String> cells = new LinkedHashMap<>();
        ordered.keySet().forEach(k -> cells.put(k, at.apply(k)));
        return new Read(new LoopSpec(tag, process, from, ordered, scan, target, targetScan, pv, out, where, cells),
                null);
    }

    private static void copy(Map<String, String> from, Map<String, String> to, String key, String as) {
        if (from.containsKey(key)) {
            to.put(as, from.get(key));
        }
    }

    private FormDefinition form(String idOrPath, String cellWhere, String column) {
        FormDefinition f = forms.get(idOrPath);
        if (f != null) {
            return f;
        }
        try {
            f = LoopFields.form(idOrPath, folder, column);
        } catch (InputException e) {
            throw new InputException(cellWhere + ": " + e.getMessage());
        }
        forms.put(idOrPath, f);
        return f;
    }

    private static Span span(Map<String, String> c, String key, Function<String, String> at) {
        return c.containsKey(key) ? LoopFields.span(c.get(key), at.apply(key) + ": " + key + ": ") : null;
    }

    private static double seconds(String text, Function<String, String> at, String key) {
        return LoopFields.positiveSeconds(text, at.apply(key) + ": " + key + ": ");
    }
}

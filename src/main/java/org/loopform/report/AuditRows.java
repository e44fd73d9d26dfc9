package org.loopform.report;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.stream.Collectors;
import org.loopform.analysis.LoopMargins;
import org.loopform.audit.AuditSummary;
import org.loopform.audit.InputFile;
import org.loopform.check.CheckResult;
import org.loopform.audit.LoopOutcome;
import org.loopform.check.Verdict;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.form.Conversion;
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormUnits;
import org.loopform.form.WrittenTuning;
import org.loopform.tuning.PublishedTuning;
import org.loopform.units.Numbers;

/** An audit's per-loop rows (loops.csv, entry-sheet.csv, loops.json) and its summary JSON. */
public final class AuditRows {
    private AuditRows() {
    }

    /** loops.csv's columns before the first edition's figures. */
    private static final List<String> HEAD_COLUMNS = List.of("tag", "verdict", "where", "source_form", "source_values",
            "target_form", "scan_s", "exact", "converted", "entered", "deviation_gain_db", "deviation_phase_deg");
    /** loops.csv's columns between the first edition's figures and those added since. */
    private static final List<String> CHECK_COLUMNS = List.of("mismatch_gain_db", "mismatch_phase_deg", "fails",
            "warns", "findings");
    /** loops.csv's columns after the figures. */
    private static final List<String> TAIL_COLUMNS = List.of("design_margin_notes", "target_margin_notes",
            "tuning_rule", "tuning_rule_source", "problems");

    /**
     * loops.csv columns; figures ({@link LoopFigure}) carry their unit in the column name. The
     * first edition's figures come before the finding counts, those added since after them.
     */
    public static final List<String> LOOP_COLUMNS = concat(HEAD_COLUMNS,
            LoopFigure.csvColumns(LoopFigure.csvFigures(false)), CHECK_COLUMNS,
            LoopFigure.csvColumns(LoopFigure.csvFigures(true)), TAIL_COLUMNS);

    @SafeVarargs
    private static List<String> concat(List<String>... parts) {
        List<String> all = new ArrayList<>();
        for (List<String> p : parts) {
            all.addAll(p);
        }
        return List.copyOf(all);
    }

    /**
     * Entry-sheet columns (entry-sheet.csv and .xlsx): one row per value to type in. The first five
     * are the new value as before; then the old (as-found) value it replaces with its unit, the
     * verdict, a do-not-enter flag, a note, and three columns left blank for the commissioning team:
     * the value actually entered (as-left), by whom and on which date. Every row of a loop whose
     * verdict is fail is flagged do-not-enter, its note naming why ({@link EntryNotes}); a value the
     * target refuses keeps its own note and an empty value.
     */
    public static final List<String> ENTRY_COLUMNS = List.of("tag", "target_form", "parameter", "value", "unit",
            "verdict", "note", "old_form", "old_parameter", "old_value", "old_unit", "do_not_enter", "as_left",
            "entered_by", "entered_on");

    private static final java.util.regex.Pattern VALUE_WITH_UNIT =
            java.util.regex.Pattern.compile("\\s*([+-]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?)\\s*(\\S.*)?");

    private static String num(double v) {
        return Double.isFinite(v) ? Numbers.significant(v, 6) : "";
    }

    /** The source values as the user wrote them, each bare number followed by the source form's unit. */
    static String values(Map<String, String> given, FormDefinition from) {
        return given.entrySet().stream().map(e -> e.getKey() + "=" + FormUnits.asWritten(from, e.getKey(), e.getValue()))
                .collect(Collectors.joining("; "));
    }

    static String written(WrittenTuning t, Conversion c, boolean entered) {
        List<String> parts = new ArrayList<>();
        t.values().forEach((k, v) -> parts.add(k + "=" + (FormCodec.isFilterOff(k, v) ? FormCodec.OFF
                : entered && c.to().limit(k).resolution() != null ? Numbers.plain(v) : Numbers.significant(v, 6))
                + " " + FormUnits.of(c.to(), k) + (entered && c.refusal(k) != null ? " (do not enter)" : "")));
        if (t.action() != null) {
            parts.add("action=" + t.action().id());
        }
        return String.join("; ", parts);
    }

    public static List<String> loopRow(LoopOutcome o) {
        List<String> r = new ArrayList<>();
        if (!o.ok()) {
            r.add(o.row().tag());
            r.add("bad_input");
            r.add(o.row().where());
            while (r.size() < LOOP_COLUMNS.size() - 1) {
                r.add("");
            }
            r.add(String.join(" | ", o.problems()));
            return spreadsheetRow(r);
        }
        CheckResult c = o.result();
        Conversion v = c.conversion();
        r.add(c.loop().tag());
        r.add(c.verdict().id());
        r.add(c.loop().where());
        PublishedTuning rule = o.row().ruleTuning();
        r.add(v.from().id());
        // a new loop tuned by rule: its source values are the rule's, as published, with their units
        r.add(rule == null ? values(c.loop().tuning(), v.from()) : RuleTuningText.values(rule));
        r.add(v.to().id());
        r.add(Numbers.plain(c.scanSeconds()));
        r.add(Boolean.toString(v.exact()));
        r.add(written(v.parameters(), v, false));
        r.add(written(v.entered(), v, true));
        r.add(num(v.deviation().gainDb()));
        r.add(num(v.deviation().phaseDegrees()));
        boolean p = c.hasProcess();
        Optional<LoopSide> design = p ? Optional.of(LoopSide.design(c)) : Optional.empty();
        Optional<LoopSide> target = p ? Optional.of(LoopSide.target(c)) : Optional.empty();
        r.addAll(LoopFigure.csvCells(LoopFigure.csvFigures(false), design, target));
        r.add(num(c.mismatch().gainDb()));
        r.add(num(c.mismatch().phaseDegrees()));
        r.add(Long.toString(c.findings().stream().filter(f -> f.severity() == Severity.FAIL).count()));
        r.add(Long.toString(c.findings().stream().filter(f -> f.severity() == Severity.WARN).count()));
        r.add(c.findings().stream().filter(f -> f.severity() != Severity.INFO)
                .map(f -> f.topic().id() + " (" + f.severity().id() + ")").collect(Collectors.joining("; ")));
        r.addAll(LoopFigure.csvCells(LoopFigure.csvFigures(true), design, target));
        r.add(design.map(AuditRows::notes).orElse(""));
        r.add(target.map(AuditRows::notes).orElse(""));
        r.add(rule == null ? "" : RuleTuningText.title(rule));
        r.add(rule == null ? "" : rule.rule().source());
        r.add("");
        return spreadsheetRow(r);
    }

    /**
     * Why margins are blank in a row: "gain margin: the phase never reaches -180 deg; ...", or for a
     * loop that is not stable "loop unstable: margins, Ms and responses left out"; empty when none is.
     */
    private static String notes(LoopSide side) {
        if (!side.stability().isStable()) {
            return "loop " + side.stability().verdict().word() + ": margins, Ms and responses left out";
        }
        LoopMargins m = side.margins();
        List<String> parts = new ArrayList<>();
        m.gainMarginNote().ifPresent(n -> parts.add("gain margin: " + n.text()));
        m.phaseMarginNote().ifPresent(n -> parts.add("phase and delay margins: " + n.text()));
        return String.join("; ", parts);
    }

    /** The entry-sheet rows of {@code o}, made safe for a CSV opened in a spreadsheet. */
    public static List<List<String>> entryRows(LoopOutcome o) {
        return entryCells(o).stream().map(AuditRows::spreadsheetRow).toList();
    }

    /**
     * The entry-sheet rows of {@code o} as plain cells (for a workbook, whose text cells are never
     * formulas): new value and unit, the old value it replaces and its unit, the flags, and blank
     * as-left, entered-by and date cells.
     */
    public static List<List<String>> entryCells(LoopOutcome o) {
        List<List<String>> rows = new ArrayList<>();
        if (!o.ok()) {
            return rows;
        }
        CheckResult c = o.result();
        Conversion v = c.conversion();
        Map<String, String> old = c.loop().tuning();
        Map<String, String> oldFor = new java.util.HashMap<>();
        List<String> targetNames = new ArrayList<>(v.entered().values().keySet());
        for (TuningRows.Row row : TuningRows.pair(new ArrayList<>(old.keySet()), targetNames)) {
            if (row.target() != null && row.source() != null) {
                oldFor.put(row.target(), row.source());
            }
        }
        // a value the target refuses is never listed as if it could be typed in
        PublishedTuning rule = o.row().ruleTuning();
        // a new loop has no as-found value: its old_* cells hold the rule's published values, and the note says so
        String oldForm = rule == null ? v.from().id() : "rule " + RuleTuningText.title(rule) + " (" + v.from().id() + ")";
        String ruleNote = rule == null ? "" : "new loop, no as-found value: old_* are rule " + RuleTuningText.title(rule)
                + "'s values as published (" + rule.rule().source() + ")";
        // a loop that fails is never entered: every one of its rows carries the flag and says why
        boolean loopFails = c.verdict() == Verdict.FAIL;
        String failNote = loopFails ? EntryNotes.loopFails(c.findings()) : "";
        v.entered().values().forEach((k, x) -> {
            String src = oldFor.get(k);
            String[] oldValue = src == null ? new String[] {"", ""} : rule != null
                    ? RuleTuningText.valueAndUnit(rule, src) : valueAndUnit(old.get(src), v, src);
            boolean refused = v.refusal(k) != null;
            String note = EntryNotes.join(refused ? "do not enter: " + v.refusal(k) : failNote, ruleNote);
            rows.add(List.of(c.loop().tag(), v.to().id(), k, refused ? "" : FormCodec.show(v.to(), k, x, 6),
                    FormUnits.of(v.to(), k), c.verdict().id(), note,
                    oldForm, src == null ? "" : src, oldValue[0], oldValue[1], refused || loopFails ? "yes" : "",
                    "", "", ""));
        });
        if (v.entered().action() != null) {
            String oldAction = old.getOrDefault("action", "");
            rows.add(List.of(c.loop().tag(), v.to().id(), "action", v.entered().action().id(), "", c.verdict().id(),
                    EntryNotes.join(failNote, ruleNote), oldForm, oldAction.isEmpty() ? "" : "action",
                    oldAction.trim(), "", loopFails ? "yes" : "", "", "", ""));
        }
        return rows;
    }

    /** An old value as written, split into number and unit: {@code "30 s"} -> 30, s; a bare number takes its form's unit. */
    private static String[] valueAndUnit(String text, Conversion v, String name) {
        java.util.regex.Matcher m = VALUE_WITH_UNIT.matcher(text);
        if (m.matches()) {
            return new String[] {m.group(1), m.group(2) != null ? m.group(2).trim() : FormUnits.of(v.from(), name)};
        }
        return new String[] {text.trim(), ""};
    }

    /**
     * Plain decimal numbers, which a spreadsheet reads as numbers and never as formulas, so they
     * keep their sign ({@code -1.5}, {@code +2e-3}).
     */
    private static final java.util.regex.Pattern PLAIN_NUMBER =
            java.util.regex.Pattern.compile("[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?");

    /**
     * {@code cell} made safe for a spreadsheet: a cell beginning with {@code =}, {@code +}, {@code -},
     * {@code @}, a tab, a carriage return or a NUL is a formula to Excel, LibreOffice Calc and Google
     * Sheets, so it gets a leading single quote, which they read as "text" (OWASP, "CSV Injection",
     * owasp.org/www-community/attacks/CSV_Injection; OWASP ASVS 5.0, requirement 1.2.10), unless it is a
     * plain number such as {@code -1.5}, which stays a number. CSV quoting itself is the printer's.
     */
    public static String spreadsheetCell(String cell) {
        if (cell == null || cell.isEmpty() || "=+-@\t\r\0".indexOf(cell.charAt(0)) < 0
                || PLAIN_NUMBER.matcher(cell).matches()) {
            return cell;
        }
        return "'" + cell;
    }

    private static List<String> spreadsheetRow(List<String> row) {
        return row.stream().map(AuditRows::spreadsheetCell).toList();
    }

    public static ObjectNode loopJson(LoopOutcome o) {
        if (o.ok()) {
            ObjectNode n = CheckReport.node(o.result());
            n.put("where", o.result().loop().where());
            if (o.row().tunedByRule()) {
                n.set("tuning_rule", RuleTuningText.json(o.row().ruleTuning()));
            }
            Json.tidied(n);
            return n;
        }
        ObjectNode n = Json.object();
        n.put("tag", o.row().tag());
        n.put("verdict", "bad_input");
        n.put("where", o.row().where());
        ArrayNode a = n.putArray("problems");
        o.problems().forEach(a::add);
        return n;
    }

    /** The audit's summary as printed by {@code audit --format json}: the summary, and {@code out} when a folder was written. */
    public static String summaryJsonText(AuditSummary s, String folder) {
        ObjectNode n = summaryJson(s);
        if (folder != null) {
            n.put("out", folder);
        }
        return Json.write(n);
    }

    /**
     * loops.json's {@code signoff}: the names, change and revision given (empty strings where the
     * printed report leaves a line to sign).
     */
    public static ObjectNode signOffJson(AuditInfo info) {
        ObjectNode n = Json.object();
        n.put("prepared_by", info.signOff().preparedBy());
        n.put("checked_by", info.signOff().checkedBy());
        n.put("approved_by", info.signOff().approvedBy());
        n.put("change", info.signOff().change());
        n.put("revision", info.signOff().revision());
        return n;
    }

    /**
     * loops.json's {@code provenance}: loopform's version, when the audit ran (ISO 8601 with zone),
     * the loop list, every input file with its SHA-256, the inputs' fingerprint, and the policy in force.
     */
    public static ObjectNode provenanceJson(AuditInfo info) {
        ObjectNode n = Json.object();
        n.put("loopform_version", info.version());
        n.put("written_at", info.generatedAt());
        n.put("loop_list", info.input());
        n.put("settings", info.settings());
        ArrayNode files = n.putArray("inputs");
        for (InputFile f : info.inputs()) {
            ObjectNode fn = files.addObject();
            fn.put("role", f.role());
            fn.put("file", f.name());
            fn.put("sha256", f.sha256());
        }
        n.put("input_fingerprint", info.fingerprint());
        ObjectNode policy = n.putObject("policy");
        info.policy().asMap().forEach(policy::put);
        return n;
    }

    public static ObjectNode summaryJson(AuditSummary s) {
        ObjectNode n = Json.object();
        n.put("loops", s.loops());
        n.put("checked", s.checked());
        n.put("bad_rows", s.badRowCount());
        n.put("exact_conversions", s.exactConversions());
        n.put("without_process_model", s.withoutProcess());
        n.put("pass_without_process_model", s.passWithoutProcess());
        ObjectNode v = n.putObject("verdicts");
        for (Verdict x : Verdict.values()) {
            v.put(x.id(), s.count(x));
        }
        ObjectNode topics = n.putObject("topics");
        s.byTopic().forEach((t, counts) -> {
            ObjectNode tn = topics.putObject(t.id());
            for (Severity sev : Severity.values()) {
                tn.put(sev.id(), counts[sev.ordinal()]);
            }
        });
        ArrayNode w = n.putArray("worst");
        for (AuditSummary.Worst x : s.worst()) {
            ObjectNode wn = w.addObject();
            wn.put("tag", x.tag());
            wn.put("verdict", x.verdict().id());
            wn.put("fails", x.fails());
            wn.put("warns", x.warns());
            wn.put("headline", x.headline());
        }
        if (s.replay() != null) {
            n.set("replay", AuditReplayRows.summaryJson(s.replay()));
        }
        ArrayNode as = n.putArray("assumptions");
        s.assumptions().forEach((a, count) -> {
            ObjectNode an = as.addObject();
            an.put("assumption", a);
            an.put("loops", count);
        });
        ArrayNode b = n.putArray("bad_row_problems");
        s.badRows().forEach(b::add);
        n.put("bad_row_problems_not_listed", s.badRowProblemCount() - s.badRows().size());
        return n;
    }

    /** What a pass means for the loops without a process model, for the summaries. */
    public static String noProcessSentence(AuditSummary s) {
        int n = s.withoutProcess();
        return n + (n == 1 ? " loop has" : " loops have") + " no process model: only the conversion, the new controller"
                + " as it will run and the sampling rules were checked, not stability, margins or responses ("
                + s.passWithoutProcess() + " of them pass on that alone).";
    }

    /**
     * The stdout summary: counts, the worst loops, bad rows. {@code outFolder} is the folder written,
     * or null when nothing was (no {@code --out}, or no loop could be checked): the text then points
     * to {@code --out DIR} rather than to files that do not exist.
     */
    public static String summaryText(AuditSummary s, String outFolder) {
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder();
        sb.append("Audit of ").append(s.loops()).append(s.loops() == 1 ? " loop: " : " loops: ").append(s.count(Verdict.PASS)).append(" pass, ")
                .append(s.count(Verdict.WARN)).append(" warn, ").append(s.count(Verdict.FAIL)).append(" fail, ")
                .append(s.badRowCount()).append(" bad rows; ").append(s.exactConversions()).append(" of ")
                .append(s.checked()).append(" conversions exact.").append(nl);
        if (s.withoutProcess() > 0) {
            sb.append(noProcessSentence(s)).append(nl);
        }
        Map<Topic, int[]> topics = s.byTopic();
        if (!topics.isEmpty()) {
            sb.append(nl);
            TextTable t = new TextTable("topic", "fail", "warn", "info");
            topics.forEach((k, c) -> t.row(k.id(), Integer.toString(c[Severity.FAIL.ordinal()]),
                    Integer.toString(c[Severity.WARN.ordinal()]), Integer.toString(c[Severity.INFO.ordinal()])));
            sb.append(t.render(2));
        }
        if (!s.worst().isEmpty()) {
            sb.append(nl).append("Loops needing attention, worst first:").append(nl);
            TextTable t = new TextTable("tag", "verdict", "fails", "warns", "worst finding");
            int shown = 0;
            for (AuditSummary.Worst w : s.worst()) {
                if (shown == 12) {
                    break;
                }
                shown++;
                String h = w.headline().length() > 90 ? w.headline().substring(0, 87) + "..." : w.headline();
                t.row(w.tag(), w.verdict().id(), Integer.toString(w.fails()), Integer.toString(w.warns()), h);
            }
            sb.append(t.render(2));
            int notPassing = s.count(Verdict.FAIL) + s.count(Verdict.WARN);
            if (notPassing > shown) {
                sb.append("  ... and ").append(notPassing - shown).append(" more that warn or fail; ")
                        .append(outFolder != null ? "every loop is in loops.csv in " + outFolder
                                : "give --out DIR to have every loop written to loops.csv and the report").append(nl);
            }
        }
        if (!s.assumptions().isEmpty()) {
            sb.append(nl).append("Assumed where the loop list did not say:").append(nl);
            s.assumptions().forEach((a, n) -> sb.append("  ").append(n).append(n == 1 ? " loop: " : " loops: ")
                    .append(a).append(nl));
        }
        if (s.replay() != null) {
            sb.append(AuditReplayRows.summaryText(s.replay()));
        }
        if (!s.badRows().isEmpty()) {
            sb.append(nl).append("Bad rows (not checked):").append(nl);
            s.badRows().stream().limit(20).forEach(p -> sb.append("  ").append(p).append(nl));
            if (s.badRowProblemCount() > 20) {
                sb.append("  ... and ").append(s.badRowProblemCount() - 20).append(" more; ")
                        .append(outFolder != null ? "every bad row is in loops.csv in " + outFolder
                                : "stderr shows the first 100; with --out DIR, loops.csv lists every bad row once at"
                                + " least one loop is checked").append(nl);
            }
        }
        sb.append(nl).append(Cautions.SHORT).append(nl);
        if (outFolder != null) {
            sb.append(nl).append("Written to ").append(outFolder).append(nl);
        }
        return sb.toString();
    }

}

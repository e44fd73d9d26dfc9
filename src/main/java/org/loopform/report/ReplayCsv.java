package org.loopform.report;

import java.io.IOException;
import java.io.StringWriter;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVPrinter;
import org.loopform.replay.Agreement;
import org.loopform.replay.Explanation;
import org.loopform.replay.ReplayResult;
import org.loopform.units.Numbers;

/**
 * A list replay's per-loop CSV summary ({@code replay --out DIR} writes it as {@code replay.csv}): one row a
 * loop, the differences in % of output span, the as-found verdict, the best explanation when the record
 * does not reproduce the list and another reading explains it better, the as-left differences and the
 * loop's verdict; a loop without a record gets a row that says so. Cells a spreadsheet would read as a formula get a leading {@code '}.
 */
public final class ReplayCsv {

    /** The header, snake_case, each figure's unit in its name. */
    public static final List<String> COLUMNS = List.of("tag", "verdict", "as_found", "as_found_rms_pct",
            "as_found_max_pct", "as_found_max_at_s", "as_found_correlation", "best_explanation",
            "best_explanation_rms_pct", "as_left_rms_pct", "as_left_max_pct", "as_left_max_at_s",
            "as_left_correlation", "source_form", "source_tuning", "target_form", "target_entered", "target_scan_s");

    private ReplayCsv() {
    }

    /** The CSV text (RFC 4180, header first) for {@code results} in their order, then the tags without a record. */
    public static String csv(List<ReplayResult> results, List<String> missing) {
        return csv(results, missing, List.of());
    }

    /** As {@link #csv(List, List)}, then the new loops tuned by rule whose record was not used. */
    public static String csv(List<ReplayResult> results, List<String> missing, List<String> notUsed) {
        StringWriter out = new StringWriter();
        try (CSVPrinter p = new CSVPrinter(out, CSVFormat.RFC4180.builder()
                .setHeader(COLUMNS.toArray(String[]::new)).get())) {
            for (ReplayResult r : results) {
                p.printRecord(row(r));
            }
            for (String tag : missing) {
                p.printRecord(note(tag, "no record"));
            }
            for (String tag : notUsed) {
                p.printRecord(note(tag, "record not used (new loop tuned by rule)"));
            }
        } catch (IOException e) {
            throw new IllegalStateException("writing to memory cannot fail", e);
        }
        return out.toString();
    }

    /** A row of a loop not replayed: its tag and why, in the verdict column. */
    private static List<String> note(String tag, String why) {
        List<String> row = new ArrayList<>();
        row.add(AuditRows.spreadsheetCell(tag));
        row.add(why);
        while (row.size() < COLUMNS.size()) {
            row.add("");
        }
        return row;
    }

    static List<String> row(ReplayResult r) {
        List<String> row = new ArrayList<>();
        row.add(AuditRows.spreadsheetCell(r.tag()));
        row.add(r.verdict().id());
        row.add(asFound(r));
        figures(row, r.asFound());
        // the best explanation when it explains the record better than the list (as audit --records gives it)
        Explanation best = AuditReplayRows.bestExplanation(r);
        row.add(best == null ? "" : AuditRows.spreadsheetCell(best.description()));
        row.add(best == null ? "" : num(best.agreement().rmsPercent()));
        figures(row, r.asLeft());
        row.add(AuditRows.spreadsheetCell(r.sourceFormId()));
        row.add(AuditRows.spreadsheetCell(ReplayReport.tuning(r.sourceTuning())));
        row.add(AuditRows.spreadsheetCell(r.targetFormId()));
        row.add(AuditRows.spreadsheetCell(ReplayReport.tuning(r.enteredTuning())));
        row.add(num(r.targetScanSeconds()));
        return row;
    }

    /** reproduced, not_confirmed or refuted (as in the JSON's {@code as_found_verdict}); none without automatic scans. */
    static String asFound(ReplayResult r) {
        return r.asFoundVerdict().id();
    }

    private static void figures(List<String> row, Agreement a) {
        row.add(a == null ? "" : num(a.rmsPercent()));
        row.add(a == null ? "" : num(a.maxPercent()));
        row.add(a == null ? "" : num(a.maxAtSeconds()));
        row.add(a == null || a.correlation() == null ? "" : num(a.correlation()));
    }

    private static String num(double v) {
        return Numbers.significant(v, 6);
    }
}

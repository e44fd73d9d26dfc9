package org.loopform.report;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.ArrayList;
import java.util.List;
import org.loopform.audit.LoopOutcome;
import org.loopform.audit.ReplayEvidence;
import org.loopform.audit.ReplaySummary;
import org.loopform.replay.Agreement;
import org.loopform.replay.Explanation;
import org.loopform.replay.ReplayResult;
import org.loopform.units.Numbers;

/**
 * The replay evidence of an audit given records ({@code audit --records}): the columns it adds to
 * loops.csv (figures in % of the output span, times in s, named with their unit), the
 * {@code replay} key of each loop in loops.json, and the summary's {@code replay} key and lines.
 */
public final class AuditReplayRows {

    private AuditReplayRows() {
    }

    /** Columns added to loops.csv, after the audit's own. */
    public static final List<String> COLUMNS = List.of("replay_record", "replay_as_found", "replay_as_found_rms_pct",
            "replay_as_found_max_pct", "replay_as_found_correlation", "replay_best_explanation",
            "replay_best_explanation_rms_pct", "replay_as_left_rms_pct", "replay_as_left_max_pct",
            "replay_as_left_max_at_s", "replay_problems");

    /** loops.csv's columns for an audit with ({@code records}) or without records. */
    public static List<String> loopColumns(boolean records) {
        if (!records) {
            return AuditRows.LOOP_COLUMNS;
        }
        List<String> all = new ArrayList<>(AuditRows.LOOP_COLUMNS);
        all.addAll(COLUMNS);
        return List.copyOf(all);
    }

    /** {@code replay_as_found} and JSON {@code as_found_verdict} of a loop whose record could not be read. */
    static final String BAD_INPUT = "bad_input";

    /** {@code replay_record}: found (replayed), none, unreadable, or not_used (a new loop tuned by rule). */
    static String recordWord(ReplayEvidence e) {
        return switch (e.status()) {
            case REPLAYED -> "found";
            case NO_RECORD -> "none";
            case UNREADABLE -> "unreadable";
            case NOT_USED -> "not_used";
        };
    }

    /** Why a new loop's record is not used, in words. */
    static final String NOT_USED_WHY = "a new loop tuned by rule has no old controller to validate, so its record"
            + " was not replayed (no as-found validation, no as-left preview)";

    /** The as-found verdict in words: reproduced, not_confirmed, refuted, or none (nothing in automatic). */
    public static String asFoundWord(ReplayResult r) {
        return r.asFoundVerdict().id();
    }

    /** The best explanation when the listed controller is not reproduced and one does better; else null. */
    public static Explanation bestExplanation(ReplayResult r) {
        if (r.asFound() == null || r.asFoundVerdict() == org.loopform.replay.AsFoundVerdict.REPRODUCED
                || r.explanations().isEmpty()) {
            return null;
        }
        Explanation best = r.explanations().get(0);
        return best.agreement().rmsPercent() < r.asFound().rmsPercent() ? best : null;
    }

    /** {@code o}'s replay cells (spreadsheet-safe), empty for a bad row. */
    public static List<String> cells(LoopOutcome o) {
        List<String> c = new ArrayList<>();
        ReplayEvidence e = o.replay();
        if (e == null) {
            while (c.size() < COLUMNS.size()) {
                c.add("");
            }
            return c;
        }
        c.add(recordWord(e));
        ReplayResult r = e.result();
        if (r == null) {
            // an unreadable record: the replay part of the loop is bad input, as a bad row is
            c.add(e.status() == ReplayEvidence.Status.UNREADABLE ? BAD_INPUT : "");
            while (c.size() < COLUMNS.size() - 1) {
                c.add("");
            }
            c.add(String.join(" | ", e.problems()));
            return c.stream().map(AuditRows::spreadsheetCell).toList();
        }
        Agreement f = r.asFound();
        c.add(asFoundWord(r));
        c.add(f == null ? "" : num(f.rmsPercent()));
        c.add(f == null ? "" : num(f.maxPercent()));
        c.add(f == null || f.correlation() == null ? "" : num(f.correlation()));
        Explanation best = bestExplanation(r);
        c.add(best == null ? "" : best.description());
        c.add(best == null ? "" : num(best.agreement().rmsPercent()));
        Agreement l = r.asLeft();
        c.add(l == null ? "" : num(l.rmsPercent()));
        c.add(l == null ? "" : num(l.maxPercent()));
        c.add(l == null ? "" : num(l.maxAtSeconds()));
        c.add("");
        return c.stream().map(AuditRows::spreadsheetCell).toList();
    }

    /** loops.json's {@code replay} for one loop: null without a record, else the record's status and the replay. */
    public static ObjectNode json(ReplayEvidence e) {
        if (e == null || e.status() == ReplayEvidence.Status.NO_RECORD) {
            return null;
        }
        if (e.status() == ReplayEvidence.Status.UNREADABLE) {
            ObjectNode n = Json.object();
            n.put("record", "unreadable");
            n.put("as_found_verdict", BAD_INPUT);
            ArrayNode p = n.putArray("problems");
            e.problems().forEach(p::add);
            return n;
        }
        if (e.status() == ReplayEvidence.Status.NOT_USED) {
            ObjectNode n = Json.object();
            n.put("record", "not_used");
            n.put("reason", NOT_USED_WHY);
            return n;
        }
        ObjectNode n = Json.object();
        n.put("record", "found");
        n.put("as_found_verdict", asFoundWord(e.result()));
        n.setAll(ReplayReport.jsonNode(e.result()));
        n.remove("tag");
        n.remove("findings"); // the replay's findings are the loop's, listed with its others
        return n;
    }

    /** The summary's {@code replay} key: counts, the first tags without a record, unreadable records' problems. */
    public static ObjectNode summaryJson(ReplaySummary s) {
        ObjectNode n = Json.object();
        n.put("records", s.recordsName());
        n.put("replayed", s.replayed());
        n.put("reproduced", s.reproduced());
        n.put("not_confirmed", s.notConfirmed());
        n.put("quiet_records", s.quiet());
        n.put("refuted", s.refuted());
        n.put("nothing_in_automatic", s.notCompared());
        n.put("explained_by_alternative", s.explainedByAlternative());
        n.put("without_record", s.withoutRecord());
        ArrayNode t = n.putArray("without_record_tags");
        s.withoutRecordTags().forEach(t::add);
        n.put("not_used", s.notUsed());
        ArrayNode nu = n.putArray("not_used_tags");
        s.notUsedTags().forEach(nu::add);
        n.put("unreadable", s.unreadable());
        ArrayNode p = n.putArray("problems");
        s.problems().forEach(p::add);
        ArrayNode u = n.putArray("records_without_loop");
        s.unmatchedRecords().forEach(u::add);
        return n;
    }

    /** The summary's replay lines, for the text output. */
    public static String summaryText(ReplaySummary s) {
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder();
        sb.append(nl).append("Replay of the records in ").append(s.recordsName()).append(": ").append(replayedWords(s))
                .append('.').append(nl);
        sb.append("  ").append(withoutRecordWords(s)).append(nl);
        if (s.notUsed() > 0) {
            sb.append("  ").append(notUsedWords(s)).append(nl);
        }
        if (!s.unmatchedRecords().isEmpty()) {
            sb.append("  ").append(withoutLoopWords(s)).append(nl);
        }
        if (s.unreadable() > 0) {
            sb.append("  ").append(plural(s.unreadable(), "record", "records"))
                    .append(" could not be read or replayed (the loop warns; the audit exits 2):").append(nl);
            s.problems().forEach(p -> sb.append("    ").append(p).append(nl));
            if (s.problemCount() > s.problems().size()) {
                sb.append("    ... and ").append(s.problemCount() - s.problems().size()).append(" more").append(nl);
            }
        }
        return sb.toString();
    }

    /** "no loop replayed", or "N loop(s) replayed (counts)" with the explained ones. */
    static String replayedWords(ReplaySummary s) {
        if (s.replayed() == 0) {
            return "no loop replayed";
        }
        return plural(s.replayed(), "loop", "loops") + " replayed (" + s.reproduced() + " reproduced, "
                + s.notConfirmed() + " not confirmed" + (s.quiet() > 0 ? " (" + s.quiet() + " on "
                + (s.quiet() == 1 ? "a record" : "records") + " too quiet to tell controllers apart)" : "") + ", "
                + s.refuted() + " refuted" + (s.notCompared() > 0 ? ", " + s.notCompared() + " with nothing in automatic"
                : "") + ")" + (s.explainedByAlternative() > 0 ? "; " + s.explainedByAlternative()
                + " explained better by another reading" : "");
    }

    /** {@code n} and the singular or plural noun. */
    static String plural(long n, String one, String many) {
        return n + " " + (n == 1 ? one : many);
    }

    /** The one sentence on loops without a record. */
    static String withoutRecordWords(ReplaySummary s) {
        if (s.withoutRecord() == 0) {
            return s.unreadable() == 0 && s.notUsed() == 0 ? "Every loop has a record."
                    : "Every loop has a record, but not every record was replayed (below).";
        }
        String tags = String.join(", ", s.withoutRecordTags())
                + (s.withoutRecord() > s.withoutRecordTags().size()
                ? " and " + (s.withoutRecord() - s.withoutRecordTags().size()) + " more" : "");
        return s.withoutRecord() + (s.withoutRecord() == 1 ? " loop has" : " loops have") + " no record (no TAG.csv"
                + " in " + s.recordsName() + "), so no replay evidence: " + tags + ".";
    }

    /** The one sentence on new loops tuned by rule whose record was not used (empty when none). */
    static String notUsedWords(ReplaySummary s) {
        if (s.notUsed() == 0) {
            return "";
        }
        String tags = String.join(", ", s.notUsedTags()) + (s.notUsed() > s.notUsedTags().size()
                ? " and " + (s.notUsed() - s.notUsedTags().size()) + " more" : "");
        return (s.notUsed() == 1 ? "1 new loop has a record that was not used: "
                : s.notUsed() + " new loops have records that were not used: ") + tags + "; " + NOT_USED_WHY + ".";
    }

    /**
     * The one sentence on records that match no loop of the list (empty when every record matched):
     * they were not replayed, most often because the file's name is not its loop's tag.
     */
    public static String withoutLoopWords(ReplaySummary s) {
        List<String> u = s.unmatchedRecords();
        if (u.isEmpty()) {
            return "";
        }
        return u.size() + (u.size() == 1 ? " record matches" : " records match") + " no loop of the list, so "
                + (u.size() == 1 ? "it was" : "they were") + " not replayed: " + String.join(", ", u)
                + "; name each record TAG.csv after its loop's tag, or take it out of " + s.recordsName() + ".";
    }

    private static String num(double v) {
        return Double.isFinite(v) ? Numbers.significant(v, 6) : "";
    }
}

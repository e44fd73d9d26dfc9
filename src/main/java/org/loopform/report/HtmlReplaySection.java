package org.loopform.report;

import java.io.IOException;
import java.io.Writer;
import org.loopform.audit.ReplayEvidence;
import org.loopform.audit.ReplaySummary;
import org.loopform.replay.Agreement;
import org.loopform.replay.Explanation;
import org.loopform.replay.ReplayResult;
import org.loopform.units.Numbers;

/**
 * The replay evidence in the audit report ({@code audit --records}): per loop with a record, the
 * as-found and as-left figures with their units, the best explanations when the log disagrees, the
 * open-loop caveat in plain words and a plot of the logged output, the old controller's replay and
 * the target's; a record that could not be read, with its problems; and in the summary one block
 * with the counts and the loops without a record, named once.
 */
final class HtmlReplaySection {

    /** Explanations shown per loop. */
    static final int EXPLANATIONS_SHOWN = 3;

    static final String CAVEAT = "This replay is open loop: both controllers were fed the setpoint and PV the plant"
            + " logged. Under the new controller's output the PV would have moved differently, so the as-left"
            + " difference shows where the two controllers part on the plant's own signals, not how the loop will"
            + " respond; judge the response from the loop's check (with a process model) or from a trial with the"
            + " operator.";

    private HtmlReplaySection() {
    }

    /**
     * One loop's replay block, with its plot if {@code withPlot} (the report's plotted loops are
     * capped, {@code io.AuditOutput.PLOTTED_LOOPS}); nothing when the audit had no records or the
     * loop has none.
     */
    static void write(Writer w, ReplayEvidence e, boolean withPlot) throws IOException {
        if (e == null || e.status() == ReplayEvidence.Status.NO_RECORD) {
            return;
        }
        StringBuilder sb = new StringBuilder("<div class=\"replay\"><h3>Replay of the logged record</h3>\n");
        if (e.status() == ReplayEvidence.Status.UNREADABLE) {
            sb.append("<p><b>The record could not be read or replayed</b>, so this loop has no replay evidence"
                    + " (the loop warns, and the audit exits 2):</p>\n"
                    + "<ul class=\"problems\">\n");
            e.problems().forEach(p -> sb.append("<li>").append(Html.esc(p)).append("</li>\n"));
            w.write(sb.append("</ul></div>\n").toString());
            return;
        }
        if (e.status() == ReplayEvidence.Status.NOT_USED) {
            w.write(sb.append("<p>Record not used: ").append(Html.esc(AuditReplayRows.NOT_USED_WHY))
                    .append(".</p></div>\n").toString());
            return;
        }
        ReplayResult r = e.result();
        sb.append("<p>").append(Numbers.significant(r.recordSeconds(), 6)).append(" s of record")
                .append(r.origin() == null ? "" : " from " + Html.esc(r.origin().toString()))
                .append("; old controller as listed: ").append(Html.esc(r.sourceFormId() + " "
                        + ReplayReport.tuning(r.sourceTuning()))).append(" at a ")
                .append(Numbers.significant(r.sourceScanSeconds(), 4)).append(" s scan; target as entered: ")
                .append(Html.esc(r.targetFormId() + " " + ReplayReport.tuning(r.enteredTuning()))).append(" at a ")
                .append(Numbers.significant(r.targetScanSeconds(), 4)).append(" s scan. <b>As found: ")
                .append(verdictWords(r)).append(".</b></p>\n");
        sb.append("<table class=\"figures replay-figures\"><caption>Output differences, % of output span</caption>\n"
                + "<thead><tr><th>compared</th><th class=\"num\">RMS (%)</th><th class=\"num\">largest (%)</th>"
                + "<th class=\"num\">at (s)</th><th class=\"num\">correlation</th><th class=\"num\">scans</th></tr>"
                + "</thead><tbody>\n");
        row(sb, "as found: old controller as listed vs logged output", r.asFound());
        Explanation best = AuditReplayRows.bestExplanation(r);
        if (best != null) {
            int shown = 0;
            for (Explanation x : r.explanations()) {
                if (shown++ == EXPLANATIONS_SHOWN || !(x.agreement().rmsPercent() < r.asFound().rmsPercent())) {
                    break;
                }
                row(sb, "explanation " + shown + " (" + x.kind().id() + "): " + x.description() + " vs logged output",
                        x.agreement());
            }
        }
        row(sb, "as left: target vs old controller", r.asLeft());
        row(sb, "as left: target vs logged output", r.asLeftVsLog());
        sb.append("</tbody></table>\n");
        if (best != null) {
            sb.append("<p>Best of ").append(r.alternativesTried()).append(" readings tried: <b>")
                    .append(Html.esc(best.description())).append("</b> (").append(Html.esc(best.formId() + " "
                            + ReplayReport.tuning(best.tuning()))).append(", scan ")
                    .append(Numbers.significant(best.scanSeconds(), 4)).append(" s). If it is right, correct the loop"
                            + " list and audit again.</p>\n");
        }
        if (r.fittedTuning() != null) {
            sb.append(fitted(r.fittedTuning()));
        }
        sb.append("<p class=\"note\">").append(Html.esc(CAVEAT)).append(" Read: ").append(Html.esc(r.resampling()))
                .append(".</p>\n");
        if (withPlot) {
            sb.append("<figure>").append(ReplayPlot.svg(r, SvgPlot.Size.COMPACT)).append("</figure>\n");
        } else {
            sb.append("<p class=\"note\">Plot left out: the report draws plots for its first loops that warn, fail or"
                    + " have a record only, so that it stays light; replay this loop alone with"
                    + " <code>loopform replay RECORD --loop LOOP.yaml --plot FILE.svg</code>.</p>\n");
        }
        sb.append("</div>\n");
        w.write(sb.toString());
    }

    /** The old tuning fitted to the log ({@code --fit-tuning}): each value with its 95 % interval and unit. */
    private static String fitted(org.loopform.replay.FittedTuning f) {
        StringBuilder sb = new StringBuilder("<table class=\"figures replay-fit\"><caption>Old controller fitted to the"
                + " log (least squares, ").append(Html.esc(f.formId())).append(", scan ")
                .append(Numbers.significant(f.scanSeconds(), 4)).append(" s, from ").append(Html.esc(f.start()))
                .append(")</caption>\n<thead><tr><th>parameter</th><th class=\"num\">value</th>"
                        + "<th class=\"num\">95 % interval</th><th>unit</th></tr></thead><tbody>\n");
        for (org.loopform.replay.FittedTuning.Value v : f.values()) {
            sb.append("<tr><th>").append(Html.esc(v.name())).append("</th><td class=\"num\">")
                    .append(Numbers.significant(v.value(), 6)).append("</td><td class=\"num\">")
                    .append(Numbers.significant(v.low(), 6)).append(" .. ").append(Numbers.significant(v.high(), 6))
                    .append("</td><td class=\"unit\">").append(Html.esc(v.unit())).append("</td></tr>\n");
        }
        sb.append("</tbody></table>\n<p>Fitted controller vs logged output: ")
                .append(Html.esc(ReplayReport.figures(f.agreement()))).append(". The intervals hold only if the form,"
                        + " scan, filter and action are the ones the controller ran.</p>\n");
        return sb.toString();
    }

    private static String verdictWords(ReplayResult r) {
        return switch (AuditReplayRows.asFoundWord(r)) {
            case "reproduced" -> "the listed old controller reproduces the logged output";
            case "not_confirmed" -> r.quietRecord() ? "the record does not confirm the listed old controller: "
                    + ReplayReport.QUIET + " (any controller at rest matches it)"
                    : "the record does not confirm the listed old controller";
            case "refuted" -> "the record refutes the listed old controller";
            default -> "nothing in automatic to compare";
        };
    }

    private static void row(StringBuilder sb, String what, Agreement a) {
        sb.append("<tr><th>").append(Html.esc(what)).append("</th>");
        if (a == null) {
            sb.append("<td colspan=\"5\">none (no scan in automatic to compare)</td></tr>\n");
            return;
        }
        sb.append("<td class=\"num\">").append(Html.fig(a.rmsPercent(), 3)).append("</td><td class=\"num\">")
                .append(Html.fig(a.maxPercent(), 3)).append("</td><td class=\"num\">")
                .append(Html.fig(a.maxAtSeconds(), 6)).append("</td><td class=\"num\">")
                .append(a.correlation() == null ? "none" : Html.fig(a.correlation(), 4)).append("</td><td class=\"num\">")
                .append(a.comparedScans()).append("</td></tr>\n");
    }

    /** The summary's replay block: counts, the loops without a record named once, unreadable records. */
    static void writeSummary(Writer w, ReplaySummary s) throws IOException {
        if (s == null) {
            return;
        }
        StringBuilder sb = new StringBuilder("<section id=\"replay-summary\"><h2>Replay of logged records</h2>\n<p>");
        sb.append("Records from ").append(Html.esc(s.recordsName())).append(": ");
        if (s.replayed() == 0) {
            sb.append("no loop replayed");
        } else {
            sb.append(AuditReplayRows.plural(s.replayed(), "loop", "loops")).append(" replayed; the listed old controller ")
                    .append("reproduces the log for ").append(s.reproduced()).append(", is not confirmed for ")
                    .append(s.notConfirmed()).append(s.quiet() > 0 ? " (" + s.quiet() + " on "
                            + (s.quiet() == 1 ? "a record" : "records") + " too quiet to tell controllers apart)" : "")
                    .append(" and refuted for ").append(s.refuted())
                    .append(s.notCompared() > 0 ? "; " + s.notCompared() + " had nothing in automatic to compare" : "")
                    .append(s.explainedByAlternative() > 0 ? "; for " + s.explainedByAlternative()
                            + " another reading of the list explains the log better (see the loop)" : "");
        }
        sb.append(".</p>\n<p>").append(Html.esc(AuditReplayRows.withoutRecordWords(s))).append("</p>\n");
        if (s.notUsed() > 0) {
            sb.append("<p class=\"not-used\">").append(Html.esc(AuditReplayRows.notUsedWords(s))).append("</p>\n");
        }
        if (!s.unmatchedRecords().isEmpty()) {
            sb.append("<p class=\"unmatched\">").append(Html.esc(AuditReplayRows.withoutLoopWords(s))).append("</p>\n");
        }
        if (s.unreadable() > 0) {
            sb.append("<p>").append(AuditReplayRows.plural(s.unreadable(), "record", "records"))
                    .append(s.unreadable() == 1 ? " could not be read or replayed (its loop was still checked, and"
                            + " warns):</p>\n" : " could not be read or replayed (their loops were still checked, and"
                            + " warn):</p>\n").append("<ul class=\"badrows\">\n");
            s.problems().forEach(p -> sb.append("<li>").append(Html.esc(p)).append("</li>\n"));
            if (s.problemCount() > s.problems().size()) {
                sb.append("<li>... and ").append(s.problemCount() - s.problems().size()).append(" more</li>\n");
            }
            sb.append("</ul>\n");
        }
        sb.append("<p class=\"note\">").append(Html.esc(CAVEAT)).append("</p>\n</section>\n");
        w.write(sb.toString());
    }
}

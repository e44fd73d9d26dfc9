package org.loopform.report;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import java.util.Map;
import org.loopform.replay.Agreement;
import org.loopform.replay.AsFoundVerdict;
import org.loopform.replay.Explanation;
import org.loopform.replay.FittedTuning;
import org.loopform.replay.ReplayResult;
import org.loopform.units.Numbers;

/** A replay in words (text) and in JSON, for one loop or a list. */
public final class ReplayReport {

    static final String OPEN_LOOP = "Open loop: both controllers read the logged setpoint and PV. Under the new"
            + " output the PV would have moved differently, so the differences show where the controllers part on"
            + " the plant's own signals, not how the loop will respond.";

    /** Why a quiet record's match confirms nothing, in words. */
    static final String QUIET = "the logged output hardly moves, so the record cannot tell controllers apart";

    private ReplayReport() {
    }

    public static String text(ReplayResult r) {
        StringBuilder sb = new StringBuilder();
        String nl = System.lineSeparator();
        sb.append("Replay of ").append(r.tag()).append(" over ").append(Numbers.significant(r.recordSeconds(), 6))
                .append(" s of record").append(r.origin() == null ? "" : " from " + r.origin()).append(nl);
        sb.append("  Read: ").append(r.resampling()).append('.').append(nl);
        sb.append("  Old controller as listed: ").append(r.sourceFormId()).append(' ').append(tuning(r.sourceTuning()))
                .append(", scan ").append(Numbers.significant(r.sourceScanSeconds(), 4)).append(" s").append(nl);
        sb.append("  Target as entered:        ").append(r.targetFormId()).append(' ').append(tuning(r.enteredTuning()))
                .append(", scan ").append(Numbers.significant(r.targetScanSeconds(), 4)).append(" s").append(nl);
        sb.append("  As found (old controller vs logged output): ").append(figures(r.asFound())).append(" -> ")
                .append(r.asFoundVerdict().words()).append(r.quietRecord() && r.asFound() != null
                        && r.asFoundVerdict() != AsFoundVerdict.REFUTED ? " (" + QUIET + ")" : "").append(nl);
        if (!r.explanations().isEmpty() && r.asFoundVerdict() != AsFoundVerdict.REPRODUCED
                && (!r.quietRecord() || AuditReplayRows.bestExplanation(r) != null)) {
            sb.append("  Best explanations of ").append(r.alternativesTried()).append(" readings tried:").append(nl);
            for (Explanation e : r.explanations()) {
                sb.append("    ").append(e.kind().id()).append(": ").append(e.description()).append(" [")
                        .append(e.formId()).append(' ').append(tuning(e.tuning())).append(", scan ")
                        .append(Numbers.significant(e.scanSeconds(), 4)).append(" s]: ").append(figures(e.agreement()))
                        .append(nl);
            }
        }
        sb.append("  As left (target vs old controller): ").append(figures(r.asLeft())).append(nl);
        sb.append("  As left (target vs logged output):  ").append(figures(r.asLeftVsLog())).append(nl);
        sb.append("  ").append(OPEN_LOOP).append(nl);
        if (r.fittedTuning() != null) {
            sb.append(fittedText(r.fittedTuning(), nl));
        }
        if (!r.assumptions().isEmpty()) {
            sb.append("Assumed:").append(nl);
            r.assumptions().forEach(a -> sb.append("  ").append(a).append(nl));
        }
        sb.append(FindingText.render(r.findings()));
        sb.append("Verdict: ").append(r.verdict().id()).append(nl);
        return sb.toString();
    }

    /** Several loops: each in full, then one line a loop. */
    public static String text(List<ReplayResult> results, List<String> missing) {
        return text(results, missing, List.of());
    }

    /**
     * Several loops, and the tags of new loops tuned by rule whose record was not used
     * ({@code notUsed}: no old controller ran that it could validate).
     */
    public static String text(List<ReplayResult> results, List<String> missing, List<String> notUsed) {
        StringBuilder sb = new StringBuilder();
        String nl = System.lineSeparator();
        for (ReplayResult r : results) {
            sb.append(text(r)).append(nl);
        }
        sb.append("Summary (RMS and largest difference, % of output span):").append(nl);
        for (ReplayResult r : results) {
            sb.append("  ").append(r.tag()).append(": as found ").append(short_(r.asFound())).append(", as left ")
                    .append(short_(r.asLeft())).append(", verdict ").append(r.verdict().id()).append(nl);
        }
        for (String m : missing) {
            sb.append("  ").append(m).append(": no record, not replayed").append(nl);
        }
        for (String m : notUsed) {
            sb.append("  ").append(m).append(": record not used: ").append(AuditReplayRows.NOT_USED_WHY).append(nl);
        }
        return sb.toString();
    }

    /** The fitted values with their 95 % intervals and units, and how closely they reproduce the log. */
    static String fittedText(FittedTuning f, String nl) {
        StringBuilder sb = new StringBuilder();
        sb.append("  Old controller fitted to the log (least squares, ").append(f.formId()).append(", scan ")
                .append(Numbers.significant(f.scanSeconds(), 4)).append(" s, from ").append(f.start()).append("):")
                .append(nl);
        for (FittedTuning.Value v : f.values()) {
            sb.append("    ").append(v.name()).append(" = ").append(Numbers.significant(v.value(), 6)).append(' ')
                    .append(v.unit()).append(" (95 % interval ").append(Numbers.significant(v.low(), 6)).append(" .. ")
                    .append(Numbers.significant(v.high(), 6)).append(' ').append(v.unit()).append(')').append(nl);
        }
        sb.append("    fitted controller vs logged output: ").append(figures(f.agreement())).append(nl);
        sb.append("    The intervals hold only if the form, scan, filter and action are the ones the controller ran;"
                + " they come from the fit's Jacobian").append(f.residualCorrelation() > 0
                ? ", widened for residuals correlated from scan to scan (lag-one correlation "
                + Numbers.significant(f.residualCorrelation(), 2) + ")" : "").append('.').append(nl);
        return sb.toString();
    }

    static String figures(Agreement a) {
        if (a == null) {
            return "none (no scan in automatic)";
        }
        return "RMS " + Numbers.significant(a.rmsPercent(), 3) + " %, max " + Numbers.significant(a.maxPercent(), 3)
                + " % at " + Numbers.significant(a.maxAtSeconds(), 6) + " s, correlation "
                + (a.correlation() == null ? "none" : Numbers.significant(a.correlation(), 4)) + " ("
                + a.comparedScans() + " scans)";
    }

    private static String short_(Agreement a) {
        return a == null ? "none" : "RMS " + Numbers.significant(a.rmsPercent(), 3) + " %, max "
                + Numbers.significant(a.maxPercent(), 3) + " %";
    }

    static String tuning(Map<String, String> m) {
        StringBuilder sb = new StringBuilder();
        m.forEach((k, v) -> sb.append(sb.length() == 0 ? "" : " ").append(k).append('=').append(shown(v)));
        return sb.toString();
    }

    private static String shown(String v) {
        try {
            return Numbers.significant(Double.parseDouble(v), 6);
        } catch (NumberFormatException e) {
            return v;
        }
    }

    public static ObjectNode jsonNode(ReplayResult r) {
        ObjectNode n = Json.object();
        n.put("tag", r.tag());
        n.put("verdict", r.verdict().id());
        n.put("record_seconds", r.recordSeconds());
        n.put("record_start", r.origin() == null ? null : r.origin().toString());
        n.put("resampling", r.resampling());
        ObjectNode src = n.putObject("source");
        src.put("form", r.sourceFormId());
        r.sourceTuning().forEach(src.putObject("tuning")::put);
        src.put("scan_s", r.sourceScanSeconds());
        ObjectNode tgt = n.putObject("target");
        tgt.put("form", r.targetFormId());
        r.enteredTuning().forEach(tgt.putObject("entered")::put);
        tgt.put("scan_s", r.targetScanSeconds());
        n.set("as_found", agreement(r.asFound()));
        n.put("as_found_verdict", r.asFoundVerdict().id());
        n.put("quiet_record", r.quietRecord());
        n.put("alternatives_tried", r.alternativesTried());
        ArrayNode ex = n.putArray("explanations");
        for (Explanation e : r.explanations()) {
            ObjectNode x = ex.addObject();
            x.put("kind", e.kind().id());
            x.put("description", e.description());
            x.put("form", e.formId());
            e.tuning().forEach(x.putObject("tuning")::put);
            x.put("scan_s", e.scanSeconds());
            x.set("agreement", agreement(e.agreement()));
        }
        n.set("as_left", agreement(r.asLeft()));
        n.set("as_left_vs_log", agreement(r.asLeftVsLog()));
        n.put("open_loop", OPEN_LOOP);
        n.set("fitted_tuning", fittedJson(r.fittedTuning()));
        ArrayNode as = n.putArray("assumptions");
        r.assumptions().forEach(as::add);
        n.set("findings", Json.findings(r.findings()));
        return n;
    }

    public static String json(ReplayResult r) {
        return Json.write(jsonNode(r));
    }

    public static String json(List<ReplayResult> results, List<String> missing) {
        return json(results, missing, List.of());
    }

    /** As {@link #json(List, List)}, with {@code not_used}: new loops tuned by rule whose record was not used. */
    public static String json(List<ReplayResult> results, List<String> missing, List<String> notUsed) {
        ObjectNode n = Json.object();
        ArrayNode loops = n.putArray("loops");
        results.forEach(r -> loops.add(jsonNode(r)));
        ArrayNode m = n.putArray("without_record");
        missing.forEach(m::add);
        ArrayNode u = n.putArray("not_used");
        notUsed.forEach(u::add);
        return Json.write(n);
    }

    private static ObjectNode fittedJson(FittedTuning f) {
        if (f == null) {
            return null;
        }
        ObjectNode n = Json.object();
        n.put("form", f.formId());
        n.put("scan_s", f.scanSeconds());
        n.put("start", f.start());
        f.tuning().forEach(n.putObject("tuning")::put);
        ArrayNode vs = n.putArray("values");
        for (FittedTuning.Value v : f.values()) {
            ObjectNode x = vs.addObject();
            x.put("name", v.name());
            x.put("value", v.value());
            x.put("low_95", v.low());
            x.put("high_95", v.high());
            x.put("unit", v.unit());
        }
        n.set("agreement", agreement(f.agreement()));
        n.put("residual_lag1_correlation", f.residualCorrelation());
        n.put("iterations", f.iterations());
        return n;
    }

    private static ObjectNode agreement(Agreement a) {
        if (a == null) {
            return null;
        }
        ObjectNode n = Json.object();
        n.put("rms_pct", a.rmsPercent());
        n.put("max_pct", a.maxPercent());
        n.put("max_at_s", a.maxAtSeconds());
        Json.putNumber(n, "correlation", a.correlation());
        n.put("compared_scans", a.comparedScans());
        n.put("logged_spread_pct", a.referenceSpreadPercent());
        return n;
    }
}

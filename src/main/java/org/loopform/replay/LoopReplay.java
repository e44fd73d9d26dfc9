package org.loopform.replay;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.loopform.check.LoopSpec;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.form.Conversion;
import org.loopform.form.Converter;
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormException;
import org.loopform.form.PidSetting;
import org.loopform.form.WritingContext;
import org.loopform.scan.ScanController;
import org.loopform.units.Numbers;
import org.loopform.units.Span;

/**
 * Replays one loop's record: the old controller as listed (form, tuning, scan) and the target as
 * it will be entered (converted, rounded, its algorithm, scan, limits and anti-windup), each run
 * open loop on the logged setpoint and PV ({@link ReplayRun}); the old one is compared with the
 * logged output (as found), alternative readings of the list are tried when it disagrees
 * ({@link CandidateSearch}), and the target is compared with the old one (as left).
 */
public final class LoopReplay {

    /** Explanations kept in a result, best first. */
    public static final int EXPLANATIONS_KEPT = 5;

    /** The method the record is read at the scan instants by, as every report states it. */
    public static final String RESAMPLING = "setpoint, PV and output read at each scan instant by linear"
            + " interpolation between logged points (the reconstruction historian compression is built for); the"
            + " mode by sample and hold of the last logged mode";

    private static final Span PERCENT = new Span(0, 100);

    private LoopReplay() {
    }

    public static ReplayResult run(LoopSpec loop, Trend trend, List<FormDefinition> catalog, CheckPolicy policy) {
        return run(loop, trend, catalog, policy, false);
    }

    /**
     * As {@link #run(LoopSpec, Trend, List, CheckPolicy)}, and with {@code fitTuning} the old
     * controller's gain, integral and derivative values fitted to the log ({@link TuningFit}), from
     * the listed values and, when it reproduces the log better in the listed form and scan, from the
     * best explanation too; the fit that reproduces the log more closely is kept.
     */
    public static ReplayResult run(LoopSpec loop, Trend trend, List<FormDefinition> catalog, CheckPolicy policy,
                                   boolean fitTuning) {
        List<String> assumptions = new ArrayList<>();
        Span pvRange = loop.pvRange();
        Span outRange = loop.outputRange();
        if (pvRange == null || outRange == null) {
            assumptions.add("The loop has no " + (pvRange == null && outRange == null ? "PV or output range"
                    : pvRange == null ? "PV range" : "output range") + "; the record's values were read as percent"
                    + " of span (0..100).");
            pvRange = pvRange == null ? PERCENT : pvRange;
            outRange = outRange == null ? PERCENT : outRange;
        }
        double sourceScan;
        if (loop.sourceScanSeconds() != null) {
            sourceScan = loop.sourceScanSeconds();
        } else {
            sourceScan = trend.output().medianIntervalSeconds();
            assumptions.add("The loop gives no scan for the old controller (tuning.scan); its output's logging"
                    + " interval, " + Numbers.significant(sourceScan, 4) + " s, was taken as the scan.");
        }
        double targetScan;
        if (loop.targetScanSeconds() != null) {
            targetScan = loop.targetScanSeconds();
        } else {
            targetScan = sourceScan;
            assumptions.add("The loop gives no target scan; the old controller's, " + Numbers.significant(sourceScan, 4)
                    + " s, was taken.");
        }
        WritingContext sourceCtx = new WritingContext(loop.pvRange(), loop.outputRange(), sourceScan);
        WritingContext targetCtx = new WritingContext(loop.pvRange(), loop.outputRange(), targetScan);
        Conversion conversion;
        try {
            conversion = Converter.convertBetween(loop.sourceForm(), loop.tuning(), sourceCtx, loop.targetForm(),
                    targetCtx);
        } catch (FormException e) {
            throw new FormException(loop.whereOf(e.getMessage()) + ": loop " + loop.tag() + ": tuning: "
                    + e.getMessage());
        }
        assumptions.addAll(conversion.assumptions());
        PidSetting entered = enteredSetting(conversion, loop.targetForm(), targetCtx);

        ScanSeries atSource = ScanSeries.of(trend, sourceScan, pvRange, outRange);
        ReplayRun sourceRun = run(loop.sourceForm(), conversion.sourceSetting(), atSource);
        Agreement asFound = Agreement.of(sourceRun.output(), atSource.output, sourceRun.compared(), atSource::timeSeconds);

        ScanSeries atTarget = Math.abs(targetScan - sourceScan) <= 1e-12 * sourceScan ? atSource
                : ScanSeries.of(trend, targetScan, pvRange, outRange);
        ReplayRun targetRun = run(loop.targetForm(), entered, atTarget);
        Agreement asLeft = held(atTarget, targetRun, atSource, sourceRun);
        Agreement asLeftVsLog = Agreement.of(targetRun.output(), atTarget.output, targetRun.compared(),
                atTarget::timeSeconds);

        List<Finding> findings = new ArrayList<>(org.loopform.findings.ConversionRules.findings(conversion, policy));
        addIfAny(findings, ReplayRules.outsideRange("PV", trend.pv().shareOutside(pvRange.low(), pvRange.high()),
                pvRange.toString()));
        addIfAny(findings, ReplayRules.outsideRange("output", trend.output().shareOutside(outRange.low(),
                outRange.high()), outRange.toString()));
        double finest = Math.min(sourceScan, targetScan);
        addIfAny(findings, coarsest(trend, finest, policy));

        List<Explanation> ranked = List.of();
        int tried = 0;
        Severity asFoundSeverity = Severity.WARN;
        boolean quiet = false;
        if (asFound == null) {
            findings.add(new Finding(org.loopform.findings.Topic.REPLAY, Severity.WARN, null, null, "",
                    ReplayRules.SOURCE, "The record holds no scan in automatic after the warm-up: nothing the old"
                    + " controller computed can be compared. Replay a period in automatic or cascade."));
        } else {
            List<Candidate> candidates = CandidateSearch.alternatives(loop.sourceForm(), loop.tuning(), sourceCtx,
                    sourceScan, catalog);
            Map<Double, ScanSeries> series = new HashMap<>();
            series.put(atSource.scanSeconds, atSource);
            ranked = explain(candidates, trend, pvRange, outRange, series);
            tried = ranked.size();
            if (ReplayRules.asFound(asFound, policy) != Severity.INFO
                    && (ranked.isEmpty() || ReplayRules.asFound(ranked.get(0).agreement(), policy) != Severity.INFO)) {
                // no single reading reproduces the log: try two mistakes at once
                List<Candidate> pairs = CandidateSearch.pairs(CandidateSearch.listed(loop.sourceForm(), loop.tuning(),
                        sourceCtx, sourceScan), candidates, sourceCtx);
                List<Explanation> all = new ArrayList<>(ranked);
                List<Explanation> paired = explain(pairs, trend, pvRange, outRange, series);
                all.addAll(paired);
                all.sort(Comparator.comparingDouble(e -> e.agreement().rmsPercent()));
                ranked = all;
                tried += paired.size();
            }
            Severity matched = ReplayRules.asFound(asFound, policy);
            boolean outdone = ReplayRules.outdone(asFound, ranked, policy);
            Finding still = ReplayRules.movement(asFound, policy);
            quiet = still != null;
            // a match within the thresholds confirms the list only on a record that moves and that no
            // other reading explains clearly better; otherwise the list is not confirmed
            asFoundSeverity = matched == Severity.INFO && (outdone || quiet) ? Severity.WARN : matched;
            if (sourceRun.ranAway()) {
                // a controller whose output stops being a number cannot be the one that wrote the log
                asFoundSeverity = Severity.FAIL;
            }
            String source = loop.sourceForm().id() + " " + tuningText(loop.tuning()) + ", scan "
                    + Numbers.significant(sourceScan, 4) + " s";
            findings.add(ReplayRules.asFoundFinding(source, asFound, asFoundSeverity, outdone,
                    quiet && matched == Severity.INFO, policy));
            addIfAny(findings, still);
            if (asFoundSeverity == Severity.INFO) {
                findings.addAll(ReplayRules.ambiguity(ranked, policy));
            } else if (!(quiet && matched == Severity.INFO && !outdone)) {
                // on a quiet record every reading at rest matches as well: the movement finding says so
                findings.add(ReplayRules.explanation(ranked, tried, asFound, policy));
            }
        }
        if (sourceRun.ranAway()) {
            findings.add(ReplayRules.runaway("The old controller as listed", atSource.timeSeconds(sourceRun.runawayScan())
                    - atSource.timeSeconds(0), Severity.FAIL));
        }
        if (targetRun.ranAway()) {
            findings.add(ReplayRules.runaway("The new controller as entered", atTarget.timeSeconds(targetRun.runawayScan())
                    - atTarget.timeSeconds(0), Severity.FAIL));
        }
        if (asLeft != null) {
            findings.add(ReplayRules.asLeft(asLeft, asFoundSeverity == Severity.INFO ? null : asFoundSeverity == Severity.FAIL
                    || !quiet ? ReplayRules.AsLeftBasis.NOT_REPRODUCED : ReplayRules.AsLeftBasis.QUIET, policy));
        }
        FittedTuning fitted = null;
        if (fitTuning && asFound != null) {
            fitted = TuningFit.fit(loop.sourceForm(), loop.tuning(), "the listed values", sourceCtx, atSource);
            if (!ranked.isEmpty()) {
                Explanation e = ranked.get(0);
                if (e.formId().equals(loop.sourceForm().id()) && e.scanSeconds() == sourceScan
                        && e.agreement().rmsPercent() < asFound.rmsPercent()) {
                    // the best explanation may hold a filter or action the listed values lack: fit from both
                    FittedTuning other = TuningFit.fit(loop.sourceForm(), e.tuning(), "the best explanation ("
                            + e.description() + ")", sourceCtx, atSource);
                    if (other != null && (fitted == null
                            || other.agreement().rmsPercent() < fitted.agreement().rmsPercent())) {
                        fitted = other;
                    }
                }
            }
        }
        return new ReplayResult(loop.tag(), loop.sourceForm().id(), loop.tuning(), sourceScan, loop.targetForm().id(),
                FormCodec.asText(conversion.entered()), targetScan, RESAMPLING, assumptions, trend.origin(),
                trend.endSeconds() - trend.startSeconds(), asFound, asFoundSeverity, quiet,
                ranked.subList(0, Math.min(EXPLANATIONS_KEPT, ranked.size())), tried, asLeft, asLeftVsLog, findings,
                new ReplayTrace(atSource, sourceRun, atTarget, targetRun), fitted);
    }

    static ReplayRun run(FormDefinition form, PidSetting setting, ScanSeries s) {
        ScanController c = ScanController.of(form, setting, s.scanSeconds);
        int warmup = ReplayRun.warmupScans(setting.filterSeconds(), s.scanSeconds, s.size());
        return ReplayRun.of(c, s, warmup, form.algorithm().outputLowPercent(), form.algorithm().outputHighPercent());
    }

    /** Each candidate run on the record at its scan, ranked by RMS difference from the logged output (stable). */
    private static List<Explanation> explain(List<Candidate> candidates, Trend trend, Span pvRange, Span outRange,
                                             Map<Double, ScanSeries> series) {
        List<Explanation> out = new ArrayList<>();
        for (Candidate c : candidates) {
            long scans = ScanSeries.scansIn(trend, c.scanSeconds());
            if (scans < 20 || scans > ScanSeries.MAX_SCANS) {
                continue; // too few scans to judge, or more than memory allows: not a reading this record can test
            }
            ScanSeries s = series.computeIfAbsent(c.scanSeconds(), h -> ScanSeries.of(trend, h, pvRange, outRange));
            ReplayRun r;
            try {
                r = run(c.form(), c.setting(), s);
            } catch (IllegalArgumentException e) {
                continue; // a scan the candidate's algorithm cannot run (an unstable filter pole, say)
            }
            if (r.ranAway()) {
                continue; // a controller that runs away on the record is not what ran there
            }
            Agreement a = Agreement.of(r.output(), s.output, r.compared(), s::timeSeconds);
            if (a != null) {
                out.add(new Explanation(c.kind(), c.description(), c.form().id(), c.tuning(), c.scanSeconds(), a));
            }
        }
        out.sort(Comparator.comparingDouble(e -> e.agreement().rmsPercent()));
        return out;
    }

    /** The worse of the PV's and the output's logging interval against the scan, as a finding or null. */
    private static Finding coarsest(Trend trend, double scanSeconds, CheckPolicy policy) {
        double pv = trend.pv().medianIntervalSeconds();
        double out = trend.output().medianIntervalSeconds();
        return pv >= out ? ReplayRules.coarseLog(pv, scanSeconds, "the PV", policy)
                : ReplayRules.coarseLog(out, scanSeconds, "the output", policy);
    }

    /**
     * Two runs at different scans compared as the outputs are held between scans: on the finer of
     * the two grids, each run's output is the one written at its last scan at or before that instant.
     */
    static Agreement held(ScanSeries a, ReplayRun ra, ScanSeries b, ReplayRun rb) {
        ScanSeries fine = a.scanSeconds <= b.scanSeconds ? a : b;
        int n = fine.size();
        double[] x = new double[n];
        double[] y = new double[n];
        boolean[] both = new boolean[n];
        for (int k = 0; k < n; k++) {
            double t = fine.timeSeconds(k);
            int ia = heldIndex(a, t);
            int ib = heldIndex(b, t);
            if (ia < 0 || ib < 0) {
                continue;
            }
            x[k] = ra.output()[ia];
            y[k] = rb.output()[ib];
            both[k] = ra.compared()[ia] && rb.compared()[ib];
        }
        return Agreement.of(x, y, both, fine::timeSeconds);
    }

    private static int heldIndex(ScanSeries s, double t) {
        int k = (int) Math.floor((t - s.startSeconds) / s.scanSeconds + 1e-9);
        return k >= 0 && k < s.size() ? k : -1;
    }

    private static void addIfAny(List<Finding> findings, Finding f) {
        if (f != null) {
            findings.add(f);
        }
    }

    static String tuningText(Map<String, String> tuning) {
        StringBuilder sb = new StringBuilder();
        tuning.forEach((k, v) -> sb.append(sb.length() == 0 ? "" : " ").append(k).append('=').append(shown(v)));
        return sb.toString();
    }

    /** A written value as findings show it: a number to six significant digits, other text as written. */
    private static String shown(String v) {
        try {
            return Numbers.significant(Double.parseDouble(v.trim()), 6);
        } catch (NumberFormatException e) {
            return v;
        }
    }

    /** The entered (rounded) values read back as the target runs them. */
    private static PidSetting enteredSetting(Conversion c, FormDefinition target, WritingContext ctx) {
        try {
            return FormCodec.decode(target, FormCodec.asText(c.entered()), ctx, "target");
        } catch (FormException e) {
            return c.targetSetting(); // the conversion already reported that rounding breaks the tuning
        }
    }
}

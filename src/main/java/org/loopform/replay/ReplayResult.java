package org.loopform.replay;

import java.time.LocalDateTime;
import java.util.List;
import java.util.Map;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;

/**
 * One loop's replay: the source controller as listed and the target as it will be entered, each
 * run open loop on the record's logged setpoint and PV.
 *
 * @param tag               the loop's tag
 * @param sourceFormId      the old controller's form as listed
 * @param sourceTuning      its values as listed
 * @param sourceScanSeconds the scan it was replayed at, s
 * @param targetFormId      the target form
 * @param enteredTuning     the converted values rounded as the target stores them
 * @param targetScanSeconds the target's scan, s
 * @param resampling        how the record was read at the scan instants, in words
 * @param assumptions       what was assumed for want of a value, in words
 * @param origin            the record's first timestamp, or null when it gave seconds
 * @param recordSeconds     the span where setpoint, PV and output are all logged, s
 * @param asFound           the source replay against the logged output (null: nothing in automatic to compare)
 * @param asFoundSeverity   the as-found finding's severity: info (reproduced), warn (not confirmed), fail (refuted)
 * @param quietRecord       the logged output hardly moves in automatic ({@code replay_movement_warn_pct}): the
 *                          record cannot tell controllers apart, so a match confirms nothing
 * @param explanations      the best alternative readings, best first
 * @param alternativesTried how many alternative readings were run
 * @param asLeft            the target replay against the source replay (null: nothing to compare)
 * @param asLeftVsLog       the target replay against the logged output
 * @param findings          the replay's findings (topic replay), with the conversion's
 * @param trace             the outputs over time, for plots
 * @param fittedTuning      the old controller's values fitted to the log (null: not asked for, or nothing to fit)
 */
public record ReplayResult(String tag, String sourceFormId, Map<String, String> sourceTuning, double sourceScanSeconds,
                           String targetFormId, Map<String, String> enteredTuning, double targetScanSeconds,
                           String resampling, List<String> assumptions, LocalDateTime origin, double recordSeconds,
                           Agreement asFound, Severity asFoundSeverity, boolean quietRecord,
                           List<Explanation> explanations,
                           int alternativesTried, Agreement asLeft, Agreement asLeftVsLog, List<Finding> findings,
                           ReplayTrace trace, FittedTuning fittedTuning) {

    public ReplayResult {
        sourceTuning = java.util.Collections.unmodifiableMap(new java.util.LinkedHashMap<>(sourceTuning));
        enteredTuning = java.util.Collections.unmodifiableMap(new java.util.LinkedHashMap<>(enteredTuning));
        assumptions = List.copyOf(assumptions);
        explanations = List.copyOf(explanations);
        findings = List.copyOf(findings);
    }

    /**
     * What the record says of the old controller as listed: none without a scan in automatic, else
     * from the as-found severity (a quiet record's match is already a warning, so never reproduced).
     */
    public AsFoundVerdict asFoundVerdict() {
        if (asFound == null) {
            return AsFoundVerdict.NONE;
        }
        return switch (asFoundSeverity) {
            case INFO -> AsFoundVerdict.REPRODUCED;
            case WARN -> AsFoundVerdict.NOT_CONFIRMED;
            case FAIL -> AsFoundVerdict.REFUTED;
        };
    }

    /** The worst finding's severity. */
    public Severity verdict() {
        return Finding.worst(findings);
    }
}

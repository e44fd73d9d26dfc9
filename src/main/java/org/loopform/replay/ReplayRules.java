package org.loopform.replay;

import java.util.ArrayList;
import java.util.List;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.CheckRules;
import org.loopform.findings.Finding;
import org.loopform.findings.PolicyKey;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.units.Numbers;

/**
 * Turns a replay's figures into findings (topic {@code replay}), each held against its policy key
 * ({@code replay_*}, loopform policy, common practice: a controller re-run on its own logged inputs
 * reproduces its logged output to the log's resolution, so a difference of a few tenths of a
 * percent of span is rounding and timing, and one of several percent is another controller).
 */
final class ReplayRules {

    static final String SOURCE = CheckRules.REPLAY_POLICY;

    private ReplayRules() {
    }

    /** The as-found verdict: fail beyond a fail threshold, warn beyond a warn threshold, else info. */
    static Severity asFound(Agreement a, CheckPolicy p) {
        if (a.rmsPercent() > p.get(PolicyKey.REPLAY_RMS_FAIL_PCT)
                || a.correlation() != null && a.correlation() < p.get(PolicyKey.REPLAY_CORRELATION_FAIL)) {
            return Severity.FAIL;
        }
        if (a.rmsPercent() > p.get(PolicyKey.REPLAY_RMS_WARN_PCT) || a.maxPercent() > p.get(PolicyKey.REPLAY_MAX_WARN_PCT)
                || a.correlation() != null && a.correlation() < p.get(PolicyKey.REPLAY_CORRELATION_WARN)) {
            return Severity.WARN;
        }
        return Severity.INFO;
    }

    /**
     * An alternative reading reproduces the log this many times better (RMS) than the listed one: the
     * listed one then does not pass, however small its own difference (loopform policy: a difference
     * within the thresholds can still be another controller on a quiet record, and a reading that
     * explains the record twice as well is evidence against the list).
     */
    static final double BETTER_FACTOR = 0.5;
    /** Below this share of {@code replay_rms_warn_pct} the listed controller's difference is the log's rounding. */
    static final double ROUNDING_SHARE = 0.1;

    /** True when {@code best} explains the record clearly better than the listed controller's {@code listed}. */
    static boolean outdone(Agreement listed, List<Explanation> ranked, CheckPolicy p) {
        return !ranked.isEmpty() && listed.rmsPercent() > ROUNDING_SHARE * p.get(PolicyKey.REPLAY_RMS_WARN_PCT)
                && ranked.get(0).agreement().rmsPercent() < BETTER_FACTOR * listed.rmsPercent();
    }

    /**
     * The as-found finding. {@code quiet}: the listed controller matches within the thresholds, but
     * the logged output hardly moves, so the record cannot tell it from any other controller at rest
     * and confirms nothing (severity warn, verdict not confirmed).
     */
    static Finding asFoundFinding(String source, Agreement a, Severity s, boolean outdone, boolean quiet,
                                  CheckPolicy p) {
        String figures = figures(a);
        String message = switch (s) {
            case INFO -> "As found: the listed controller (" + source + ") reproduces the logged output: " + figures
                    + ".";
            case WARN -> outdone ? "As found: the listed controller (" + source + ") is close to the logged output ("
                    + figures + "), but another reading explains the record at least twice as well (below); the"
                    + " record does not confirm the list."
                    : quiet ? "As found: not confirmed. The listed controller (" + source + ") matches the logged"
                    + " output (" + figures + "), but the output hardly moves, so any controller at rest would match"
                    + " it as well: this record confirms neither the listed controller nor any other."
                    : "As found: the listed controller (" + source + ") only partly reproduces the logged output: "
                    + figures + ". Review the explanations tried below before relying on the listed tuning.";
            case FAIL -> "As found: the record refutes the listed controller (" + source + "): " + figures + ". The"
                    + " converted tuning rests on values the old controller did not run; see the explanations"
                    + " below, correct the loop list and replay again.";
        };
        double threshold = s == Severity.FAIL ? p.get(PolicyKey.REPLAY_RMS_FAIL_PCT) : p.get(PolicyKey.REPLAY_RMS_WARN_PCT);
        return new Finding(Topic.REPLAY, s, a.rmsPercent(), threshold, "% of span", SOURCE, message);
    }

    static String figures(Agreement a) {
        return "RMS difference " + small(a.rmsPercent()) + " % of span, largest " + small(a.maxPercent()) + " %"
                + (a.maxPercent() < NOISE_PERCENT ? "" : " at " + Numbers.significant(a.maxAtSeconds(), 6) + " s")
                + ", correlation " + (a.correlation() == null ? "none (an output does not move)"
                : Numbers.significant(a.correlation(), 4)) + ", over " + a.comparedScans() + " scans in automatic";
    }

    /** What the search found: the best alternative, and whether it reproduces the log. */
    static Finding explanation(List<Explanation> ranked, int tried, Agreement listed, CheckPolicy p) {
        if (ranked.isEmpty() || !(ranked.get(0).agreement().rmsPercent() < listed.rmsPercent())) {
            return new Finding(Topic.REPLAY, Severity.WARN, null, null, "", SOURCE, "None of the " + tried
                    + " alternative readings tried (units, action, filter, scan, other catalog forms, and pairs of them) reproduces the"
                    + " log better than the listed controller. Check the record itself: its columns, the loop's"
                    + " ranges, the time base, and whether the controller was in automatic.");
        }
        Explanation best = ranked.get(0);
        Severity bestSeverity = asFound(best.agreement(), p);
        String how = bestSeverity == Severity.INFO ? "reproduces the log" : "comes closest to the log without"
                + " reproducing it";
        return new Finding(Topic.REPLAY, Severity.WARN, best.agreement().rmsPercent(),
                p.get(PolicyKey.REPLAY_RMS_WARN_PCT), "% of span", SOURCE, "Best explanation of " + tried + " tried: "
                + best.description() + " " + how + " (" + figures(best.agreement()) + "). If it is right, correct"
                + " the loop list and convert again.");
    }

    /**
     * Alternatives that reproduce the log as well as the listed controller: the record cannot tell
     * them apart. A units or action alternative is a warning (the mistakes the replay exists to
     * catch); others are information.
     */
    static List<Finding> ambiguity(List<Explanation> ranked, CheckPolicy p) {
        List<Finding> out = new ArrayList<>();
        List<String> material = new ArrayList<>();
        List<String> minor = new ArrayList<>();
        for (Explanation e : ranked) {
            if (asFound(e.agreement(), p) == Severity.INFO) {
                (e.kind() == ExplanationKind.UNITS || e.kind() == ExplanationKind.ACTION ? material : minor)
                        .add(e.description() + " (RMS " + Numbers.significant(e.agreement().rmsPercent(), 3) + " %)");
            }
        }
        if (!material.isEmpty()) {
            out.add(new Finding(Topic.REPLAY, Severity.WARN, null, null, "", SOURCE, "The record cannot tell the"
                    + " listed controller from: " + String.join("; ", material) + ". Replay a record with more"
                    + " movement (setpoint changes, disturbances) before trusting the listed units or action."));
        }
        if (!minor.isEmpty()) {
            out.add(new Finding(Topic.REPLAY, Severity.INFO, null, null, "", SOURCE, "These readings reproduce the"
                    + " log as well: " + String.join("; ", minor) + "; on this record they make no difference."));
        }
        return out;
    }

    static Finding movement(Agreement a, CheckPolicy p) {
        double limit = p.get(PolicyKey.REPLAY_MOVEMENT_WARN_PCT);
        if (a.referenceSpreadPercent() >= limit) {
            return null;
        }
        return new Finding(Topic.REPLAY, Severity.WARN, a.referenceSpreadPercent(), limit, "% of span", SOURCE,
                "The logged output hardly moves in automatic (standard deviation "
                        + small(a.referenceSpreadPercent()) + " % of span): any controller at rest"
                        + " reproduces it, so this record cannot confirm the listed one. Replay a period with"
                        + " setpoint changes or disturbances.");
    }

    static Finding coarseLog(double intervalSeconds, double scanSeconds, String signal, CheckPolicy p) {
        double scans = intervalSeconds / scanSeconds;
        double limit = p.get(PolicyKey.REPLAY_LOG_INTERVAL_WARN_SCANS);
        if (scans <= limit) {
            return null;
        }
        return new Finding(Topic.REPLAY, Severity.WARN, scans, limit, "scans", SOURCE, "The record is coarse for the"
                + " scan: " + signal + " was logged every " + Numbers.significant(intervalSeconds, 3) + " s (median),"
                + " " + Numbers.significant(scans, 3) + " scans of " + Numbers.significant(scanSeconds, 3) + " s;"
                + " between logged points the replay reads a straight line, so moves between them (noise, fast"
                + " changes) are not what the controller saw. Expect larger differences; export the record"
                + " uncompressed, at the scan rate, if the historian can.");
    }

    static Finding outsideRange(String signal, double share, String range) {
        if (share <= 0.01) {
            return null;
        }
        return new Finding(Topic.REPLAY, Severity.WARN, 100 * share, 1.0, "% of points", SOURCE,
                Numbers.significant(100 * share, 3) + " % of the logged " + signal + " lies outside the loop's range "
                        + range + "; check the column chosen and the loop's ranges.");
    }

    /** Why the as-left comparison rests on an old controller the record did not confirm. */
    enum AsLeftBasis {
        /** The listed old controller does not reproduce the log. */
        NOT_REPRODUCED,
        /** The record is too quiet to confirm the listed old controller. */
        QUIET
    }

    /**
     * A controller whose output stops being a number on the record, {@code afterSeconds} from its start: its own
     * arithmetic overflowed, which only an unstable element of the controller does on bounded signals (a
     * forward-difference derivative filter with h > 2 Tf: Wittenmark, Astrom and Arzen, Computer Control: An
     * Overview, IFAC Professional Brief, 2002, Table 3). The comparisons stop there.
     */
    static Finding runaway(String which, double afterSeconds, Severity s) {
        return new Finding(Topic.REPLAY, s, afterSeconds, null, "s", "Wittenmark, Astrom & Arzen, Computer Control:"
                + " An Overview, IFAC 2002, Table 3 (forward-difference filter pole 1 - h/Tf)", which + " runs away on this record: "
                + Numbers.significant(afterSeconds, 4) + " s into it its output is no longer a number (its own"
                + " arithmetic overflowed; on bounded signals only an unstable element of the controller does that, such"
                + " as a forward-difference derivative filter with a scan above twice its filter time). The comparisons"
                + " stop there." + (which.startsWith("The new") ? " Do not deploy it at this scan."
                : " It cannot be the controller that wrote this log: check the listed form, values and scan."));
    }

    /** The as-left finding; {@code unconfirmed} is null when the record reproduced the old controller. */
    static Finding asLeft(Agreement a, AsLeftBasis unconfirmed, CheckPolicy p) {
        double warn = p.get(PolicyKey.REPLAY_AS_LEFT_RMS_WARN_PCT);
        double fail = p.get(PolicyKey.REPLAY_AS_LEFT_RMS_FAIL_PCT);
        Severity s = a.rmsPercent() > fail ? Severity.FAIL : a.rmsPercent() > warn ? Severity.WARN : Severity.INFO;
        String base = "As left (open loop): on the logged setpoint and PV the target's output would differ from the"
                + " old controller's by " + figures(a).replace("correlation", "correlation with it") + ".";
        String validated = unconfirmed == null ? "" : unconfirmed == AsLeftBasis.QUIET ? " The record is too quiet to"
                + " confirm the old controller as listed, so this compares with an old controller the record does not"
                + " confirm." : " The old controller as listed does not reproduce the log, so this compares with an old"
                + " controller that did not run.";
        String caution = " This is open loop: under the new output the PV would have moved differently, so the"
                + " difference shows where the controllers part, not the loop's new response; a growing difference"
                + " (integral action) would be corrected by the loop, a difference on every PV move (gain, derivative)"
                + " is what the process will feel.";
        return new Finding(Topic.REPLAY, s, a.rmsPercent(), s == Severity.FAIL ? fail : warn, "% of span", SOURCE,
                base + validated + caution);
    }

    /** Below this a figure in % of span is rounding noise and prints as 0 (a constant record gives 1e-13). */
    static final double NOISE_PERCENT = 1e-9;

    /** A figure in % of span to three significant digits, rounding noise as 0. */
    static String small(double percent) {
        return Math.abs(percent) < NOISE_PERCENT ? "0" : Numbers.significant(percent, 3);
    }
}

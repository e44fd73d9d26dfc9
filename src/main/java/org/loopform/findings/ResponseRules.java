package org.loopform.findings;

import java.util.ArrayList;
import java.util.List;
import org.loopform.analysis.StepMetrics;
import org.loopform.units.Numbers;

/**
 * The rules that hold the target loop's step responses to the design loop's: a finding of topic
 * {@link Topic#RESPONSE} (severity warn) when the target's setpoint overshoot, setpoint settling
 * time, setpoint or load IAE, or load peak deviation is worse than the design's by more than the
 * policy allows. Where a rule has an absolute part, both parts must be exceeded, so that a tiny
 * figure that triples (overshoot 0.1 % to 0.3 % of the step) is not flagged while a real change
 * (1 % to 3.8 %) is:
 * <pre>
 *   overshoot:  t > d (1 + overshoot_rise_warn)  and  t - d > overshoot_rise_warn_pct        (% of step)
 *   settling:   t > d (1 + settling_rise_warn)   and  t - d > settling_rise_warn_scans x h    (s);
 *               or the target does not settle in the run where the design does
 *   IAE:        t > d (1 + iae_rise_warn)                                                   (setpoint, load)
 *   load peak:  t > d (1 + load_peak_rise_warn)  and  t - d > load_peak_rise_warn_pct % of the load step
 * </pre>
 * with d the design's figure and t the target's. Thresholds are loopform policy (common practice).
 * Unstable loops are not compared: their responses are held only by the output limits.
 */
public final class ResponseRules {

    private ResponseRules() {
    }

    /**
     * The two loops' figures for the same steps: {@code scanSeconds} is the target's scan,
     * {@code runSeconds} the simulated time, {@code loadStepPercent} the load step used.
     */
    public record Inputs(boolean bothStable, StepMetrics designSetpoint,
                         StepMetrics targetSetpoint, StepMetrics designLoad, StepMetrics targetLoad, double scanSeconds,
                         double runSeconds, double loadStepPercent) {
    }

    public static List<Finding> evaluate(Inputs in, CheckPolicy p) {
        List<Finding> out = new ArrayList<>();
        if (!in.bothStable()) {
            // a loop that is not stable has no response to compare (the stability rule fails it)
            return out;
        }
        overshoot(in, p, out);
        settling(in, p, out);
        iae(in.designSetpoint(), in.targetSetpoint(), "setpoint step", "the as-left loop follows the setpoint less"
                + " closely", p, out);
        iae(in.designLoad(), in.targetLoad(), "load step", "the as-left loop rejects the load less well", p, out);
        loadPeak(in, p, out);
        return out;
    }

    private static String percent(double fraction) {
        return Numbers.significant(100 * fraction, 3) + " %";
    }

    /** "33 % more" (or "longer"), or "up from 0" when the design's figure is 0. */
    private static String rise(double target, double design, String word) {
        return design > 0 ? percent(target / design - 1) + " " + word : "up from 0";
    }

    private static void overshoot(Inputs in, CheckPolicy p, List<Finding> out) {
        if (in.designSetpoint().overshootPercent().isEmpty() || in.targetSetpoint().overshootPercent().isEmpty()) {
            return;
        }
        double d = in.designSetpoint().overshootPercent().getAsDouble();
        double t = in.targetSetpoint().overshootPercent().getAsDouble();
        double rel = p.get(PolicyKey.OVERSHOOT_RISE_WARN);
        double abs = p.get(PolicyKey.OVERSHOOT_RISE_WARN_PCT);
        if (t > d * (1 + rel) && t - d > abs) {
            out.add(new Finding(Topic.RESPONSE, Severity.WARN, t, Math.max(d * (1 + rel), d + abs), "% of step",
                    PolicyKey.OVERSHOOT_RISE_WARN.source(), "The setpoint step overshoots more: "
                    + Numbers.significant(d, 3) + " % of the step as found, " + Numbers.significant(t, 3)
                    + " % as left (the policy flags more than " + percent(rel) + " and "
                    + Numbers.plain(abs) + " points of the step above the as-found)."));
        }
    }

    private static void settling(Inputs in, CheckPolicy p, List<Finding> out) {
        if (in.designSetpoint().settlingTimeSeconds().isEmpty()) {
            return; // the design does not settle in the run either: nothing to hold the target to
        }
        double d = in.designSetpoint().settlingTimeSeconds().getAsDouble();
        double rel = p.get(PolicyKey.SETTLING_RISE_WARN);
        double absSeconds = p.get(PolicyKey.SETTLING_RISE_WARN_SCANS) * in.scanSeconds();
        String band = Numbers.plain(StepMetrics.SETTLING_BAND_PERCENT_OF_STEP) + " %";
        if (in.targetSetpoint().settlingTimeSeconds().isEmpty()) {
            out.add(new Finding(Topic.RESPONSE, Severity.WARN, null, d * (1 + rel), "s",
                    PolicyKey.SETTLING_RISE_WARN.source(), "The as-left loop does not settle within " + band
                    + " of the setpoint step in the " + Numbers.significant(in.runSeconds(), 4) + " s simulated,"
                    + " where the as-found loop settles in " + Numbers.significant(d, 4) + " s."));
            return;
        }
        double t = in.targetSetpoint().settlingTimeSeconds().getAsDouble();
        if (t > d * (1 + rel) && t - d > absSeconds) {
            out.add(new Finding(Topic.RESPONSE, Severity.WARN, t, Math.max(d * (1 + rel), d + absSeconds), "s",
                    PolicyKey.SETTLING_RISE_WARN.source(), "The setpoint step settles more slowly: within " + band
                    + " of the step after " + Numbers.significant(d, 4) + " s as found, "
                    + Numbers.significant(t, 4) + " s as left (" + rise(t, d, "longer") + ")."));
        }
    }

    private static void iae(StepMetrics design, StepMetrics target, String what, String meaning, CheckPolicy p,
                            List<Finding> out) {
        double d = design.integralAbsoluteErrorPercentSeconds();
        double t = target.integralAbsoluteErrorPercentSeconds();
        double rel = p.get(PolicyKey.IAE_RISE_WARN);
        if (t > d * (1 + rel)) {
            out.add(new Finding(Topic.RESPONSE, Severity.WARN, t, d * (1 + rel), "%*s", PolicyKey.IAE_RISE_WARN.source(),
                    "The " + what + "'s integrated absolute error (IAE) rises from " + Numbers.significant(d, 4)
                    + " %*s as found to " + Numbers.significant(t, 4) + " %*s as left ("
                    + rise(t, d, "more") + "): " + meaning + "."));
        }
    }

    private static void loadPeak(Inputs in, CheckPolicy p, List<Finding> out) {
        double d = in.designLoad().peakDeviationPercent();
        double t = in.targetLoad().peakDeviationPercent();
        double rel = p.get(PolicyKey.LOAD_PEAK_RISE_WARN);
        double abs = p.get(PolicyKey.LOAD_PEAK_RISE_WARN_PCT) / 100 * Math.abs(in.loadStepPercent());
        if (t > d * (1 + rel) && t - d > abs) {
            out.add(new Finding(Topic.RESPONSE, Severity.WARN, t, Math.max(d * (1 + rel), d + abs), "%",
                    PolicyKey.LOAD_PEAK_RISE_WARN.source(), "The load step pushes the PV further from its setpoint: a"
                    + " peak deviation of " + Numbers.significant(d, 3) + " % of span as found, "
                    + Numbers.significant(t, 3) + " % as left (" + rise(t, d, "more") + ")."));
        }
    }
}

package org.loopform.identify;

import java.util.ArrayList;
import java.util.List;
import org.loopform.findings.Severity;
import org.loopform.units.Numbers;

/**
 * Models from an open-loop record with one or several output steps or a pulse: the record is
 * screened (steps, baseline, noise, length, saturation), Smith's and Sundaresan-Krishnaswamy's
 * graphical estimates are read from the first step, and FOPDT, SOPDT and integrating models are
 * fitted ({@link StepFitter}) starting from them. The recommendation takes the lowest Akaike
 * criterion, but a more complex model must lower it by {@link #AIC_MARGIN} to be preferred.
 */
public final class StepIdentification {

    /** An output change below this (% of span) is not a step. */
    static final double STEP_PERCENT = 0.2;
    /** A response below this many noise deviations cannot be fitted; below {@link #SMALL_STEP_RATIO}, warn. */
    static final double HIDDEN_RATIO = 3.0;
    static final double SMALL_STEP_RATIO = 10.0;
    /** A baseline drifting by more than this share of the response (or 3 noise deviations) is not steady. */
    static final double DRIFT_SHARE = 0.1;
    /** AIC lower by this before a more complex model is preferred (Burnham &amp; Anderson 2002, from memory: 2). */
    static final double AIC_MARGIN = 2.0;
    /** A fit explaining less than this share of the variance is not a model of the record. */
    static final double MIN_R2 = 0.5;

    private StepIdentification() {
    }

    /**
     * Identifies {@code r}; with {@code checkLimits} (the record was put in percent of spans that are known)
     * samples at the spans' ends are saturation and samples beyond them a wrong span (findings).
     */
    public static StepTestResult identify(PlantRecord r, boolean checkLimits) {
        List<DataFinding> findings = new ArrayList<>();
        int n = r.size();
        int firstStep = -1;
        for (int k = 1; k < n; k++) {
            if (Math.abs(r.output(k) - r.output(0)) > STEP_PERCENT) {
                firstStep = k;
                break;
            }
        }
        if (firstStep < 0) {
            findings.add(new DataFinding("no-step", Severity.FAIL, "The output never moves by more than "
                    + STEP_PERCENT + " % of its span, so the record shows no response to fit; record a test with an"
                    + " output step (or pulse) of a few percent."));
            return new StepTestResult(findings, List.of(), List.of(), null, "no step in the output", Double.NaN, 0);
        }
        double tStep = r.time(firstStep);
        // the output held after the first step until it moves again: the first step's size
        int stepEnd = n;
        for (int k = firstStep + 1; k < n; k++) {
            if (Math.abs(r.output(k) - r.output(firstStep)) > STEP_PERCENT) {
                stepEnd = k;
                break;
            }
        }
        double du = r.output(firstStep) - r.output(0);
        double noise = noise(r, firstStep);
        double baseline = mean(r, 0, firstStep);
        if (firstStep < 5) {
            findings.add(new DataFinding("unsteady-baseline", Severity.WARN, "Only " + firstStep + " sample(s) before"
                    + " the first step: the baseline cannot be judged steady; record a minute or more of steady"
                    + " operation before stepping."));
        }
        // the response of the first step's segment
        int tail = Math.max(firstStep + 1, stepEnd - Math.max(3, (stepEnd - firstStep) / 10));
        double settled = mean(r, tail, stepEnd);
        double dy = settled - baseline;
        if (firstStep >= 5) {
            double drift = drift(r, 0, firstStep);
            if (Math.abs(drift) > Math.max(3 * noise, DRIFT_SHARE * Math.abs(dy))) {
                findings.add(new DataFinding("unsteady-baseline", Severity.WARN, "The PV drifts by "
                        + Numbers.significant(drift, 3) + " % of span over the " + Numbers.significant(tStep - r.time(0),
                        3) + " s before the step (noise " + Numbers.significant(noise, 3) + " %): the baseline is not"
                        + " steady, and the fit reads the drift as response; wait for steady operation and repeat."));
            }
        }
        double maxDy = 0;
        for (int k = firstStep; k < n; k++) {
            maxDy = Math.max(maxDy, Math.abs(r.pv(k) - baseline));
        }
        double responseToNoise = noise > 0 ? maxDy / noise : Double.POSITIVE_INFINITY;
        if (responseToNoise < HIDDEN_RATIO) {
            findings.add(new DataFinding("noise", Severity.FAIL, "The PV moves by at most "
                    + Numbers.significant(maxDy, 3) + " % of span after the step, within " + HIDDEN_RATIO
                    + " noise deviations (" + Numbers.significant(noise, 3) + " %): the noise hides the response;"
                    + " step the output further, or filter or average the record."));
        } else if (responseToNoise < SMALL_STEP_RATIO) {
            findings.add(new DataFinding("small-step", Severity.WARN, "The response (" + Numbers.significant(maxDy, 3)
                    + " % of span) is only " + Numbers.significant(responseToNoise, 3) + " noise deviations: the"
                    + " intervals are wide; a larger step (" + SMALL_STEP_RATIO + " deviations or more) would fix the"
                    + " model better."));
        }
        if (checkLimits) {
            saturation(r, findings);
        }
        List<GraphicalEstimate> estimates = estimates(r, firstStep, stepEnd, baseline, dy, du);
        if (Finding_worst(findings) == Severity.FAIL) {
            return new StepTestResult(findings, estimates, List.of(), null, "the record cannot support a model", noise,
                    du);
        }
        double after = r.time(n - 1) - tStep;
        double gain = dy / du;
        double t0 = after / 5;
        double l0 = Math.min(after / 10, 0);
        if (!estimates.isEmpty()) {
            t0 = Math.max(estimates.get(0).timeConstantSeconds(), after / 200);
            l0 = estimates.get(0).deadTimeSeconds();
            gain = estimates.get(0).gain();
        }
        double maxDead = after / 2;
        List<ModelFit> fits = new ArrayList<>();
        fits.add(new StepFitter(r, ModelKind.FOPDT).fit(gain, t0, 0, baseline, maxDead));
        fits.add(new StepFitter(r, ModelKind.SOPDT).fit(gain, 0.7 * t0, 0.3 * t0, baseline, maxDead));
        double slope = endSlope(r);
        double kv = slope / (r.output(n - 1) - r.output(0) == 0 ? du : r.output(n - 1) - r.output(0));
        if (!Double.isFinite(kv) || kv == 0) {
            kv = gain / Math.max(t0, 1e-9);
        }
        fits.add(new StepFitter(r, ModelKind.IPDT).fit(kv, 0, 0, baseline, maxDead));
        ModelFit best = null;
        for (ModelFit f : fits) {
            double penalty = f.kind() == ModelKind.SOPDT ? AIC_MARGIN : 0;
            if (best == null || f.aic() + penalty < best.aic() + (best.kind() == ModelKind.SOPDT ? AIC_MARGIN : 0)) {
                best = f;
            }
        }
        String reason = reason(best, fits);
        if (best.rSquared() < MIN_R2) {
            findings.add(new DataFinding("noise", Severity.FAIL, "The best model explains only "
                    + Numbers.significant(100 * best.rSquared(), 3) + " % of the PV's variance (R^2 "
                    + Numbers.significant(best.rSquared(), 3) + "): noise or disturbances hide the response; no model"
                    + " is recommended. Repeat the test with a larger step in calm operation."));
            return new StepTestResult(findings, estimates, fits, null, "no model explains the record (R^2 below "
                    + MIN_R2 + ")", noise, du);
        }
        if (best.kind() != ModelKind.IPDT) {
            double needed = best.deadTimeSeconds() + 3 * (best.lagSeconds()
                    + (best.kind() == ModelKind.SOPDT ? best.secondLagSeconds() : 0));
            double segment = (stepEnd < n ? r.time(stepEnd) : r.time(n - 1)) - tStep;
            if (segment < needed) {
                findings.add(new DataFinding("too-short", Severity.WARN, "The response was recorded for "
                        + Numbers.significant(segment, 3) + " s after the step, less than the dead time plus three time"
                        + " constants (" + Numbers.significant(needed, 3) + " s): the gain and time constant are"
                        + " extrapolated; record until the PV settles."));
            }
        }
        findings.sort((a, b) -> b.severity().compareTo(a.severity()));
        return new StepTestResult(findings, estimates, fits, best.kind(), reason, noise, du);
    }

    private static Severity Finding_worst(List<DataFinding> f) {
        Severity w = Severity.INFO;
        for (DataFinding d : f) {
            if (d.severity().compareTo(w) > 0) {
                w = d.severity();
            }
        }
        return w;
    }

    private static String reason(ModelFit best, List<ModelFit> fits) {
        StringBuilder sb = new StringBuilder(best.kind().title() + ": lowest Akaike criterion (AIC "
                + Numbers.significant(best.aic(), 5) + ")");
        if (best.kind() != ModelKind.SOPDT) {
            sb.append("; a second-order model must lower it by ").append(Numbers.plain(AIC_MARGIN))
                    .append(" to be preferred");
        }
        sb.append(", RMS error ").append(Numbers.significant(best.rmsErrorPercent(), 3)).append(" % of span, R^2 ")
                .append(Numbers.significant(best.rSquared(), 4));
        return sb.toString();
    }

    static double mean(PlantRecord r, int from, int to) {
        double s = 0;
        int c = 0;
        for (int k = from; k < Math.min(to, r.size()); k++) {
            s += r.pv(k);
            c++;
        }
        return c == 0 ? r.pv(0) : s / c;
    }

    /** PV change over [from, to) by a straight line fitted to it. */
    static double drift(PlantRecord r, int from, int to) {
        double mt = 0;
        double my = 0;
        int c = to - from;
        for (int k = from; k < to; k++) {
            mt += r.time(k) / c;
            my += r.pv(k) / c;
        }
        double sxy = 0;
        double sxx = 0;
        for (int k = from; k < to; k++) {
            sxy += (r.time(k) - mt) * (r.pv(k) - my);
            sxx += (r.time(k) - mt) * (r.time(k) - mt);
        }
        return sxx > 0 ? sxy / sxx * (r.time(to - 1) - r.time(from)) : 0;
    }

    /**
     * The PV noise's standard deviation: from the baseline's residual about its line when there are 10 or
     * more samples before the step, else from successive differences over the whole record ({@code
     * std(diff)/sqrt 2}, which a smooth response barely raises).
     */
    static double noise(PlantRecord r, int firstStep) {
        if (firstStep >= 10) {
            double mt = 0;
            double my = 0;
            for (int k = 0; k < firstStep; k++) {
                mt += r.time(k) / firstStep;
                my += r.pv(k) / firstStep;
            }
            double sxy = 0;
            double sxx = 0;
            for (int k = 0; k < firstStep; k++) {
                sxy += (r.time(k) - mt) * (r.pv(k) - my);
                sxx += (r.time(k) - mt) * (r.time(k) - mt);
            }
            double b = sxx > 0 ? sxy / sxx : 0;
            double s = 0;
            for (int k = 0; k < firstStep; k++) {
                double e = r.pv(k) - my - b * (r.time(k) - mt);
                s += e * e;
            }
            return Math.sqrt(s / (firstStep - 2));
        }
        double s = 0;
        for (int k = 1; k < r.size(); k++) {
            double d = r.pv(k) - r.pv(k - 1);
            s += d * d;
        }
        return Math.sqrt(s / (r.size() - 1) / 2);
    }

    private static double endSlope(PlantRecord r) {
        int n = r.size();
        int from = n - Math.max(3, n / 4);
        double d = drift(r, from, n);
        double span = r.time(n - 1) - r.time(from);
        return span > 0 ? d / span : 0;
    }

    private static void saturation(PlantRecord r, List<DataFinding> findings) {
        outsideSpan(r, findings);
        int outAtLimit = 0;
        int pvAtLimit = 0;
        for (int k = 0; k < r.size(); k++) {
            if (r.output(k) == 0 || r.output(k) == 100) {
                outAtLimit++;
            }
            if (r.pv(k) == 0 || r.pv(k) == 100) {
                pvAtLimit++;
            }
        }
        if (outAtLimit > 0) {
            findings.add(new DataFinding("saturation", Severity.WARN, outAtLimit + " sample(s) of the output sit at 0 %"
                    + " or 100 % of its range: the valve may not have done what the output says; keep the test inside"
                    + " the range."));
        }
        if (pvAtLimit > 0) {
            findings.add(new DataFinding("saturation", Severity.FAIL, pvAtLimit + " sample(s) of the PV sit at the end"
                    + " of its range: the transmitter clipped the response, and a fit would read the clipping as"
                    + " dynamics; repeat the test with a smaller step or check the PV range."));
        }
    }

    /**
     * Samples outside 0..100 % of their span: a controller output cannot leave its range and a PV beyond its
     * span is beyond what the transmitter reports, so the span given (or the record's units) is wrong, and the
     * gain in %/% with it (loopform policy: fail, since a wrong gain gives a wrong tuning a false pass).
     */
    static void outsideSpan(PlantRecord r, List<DataFinding> findings) {
        outside(findings, "output", r.outputs());
        outside(findings, "PV", r.pvs());
    }

    private static void outside(List<DataFinding> findings, String what, double[] percent) {
        int count = 0;
        double low = Double.POSITIVE_INFINITY;
        double high = Double.NEGATIVE_INFINITY;
        for (double x : percent) {
            low = Math.min(low, x);
            high = Math.max(high, x);
            if (x < 0 || x > 100) {
                count++;
            }
        }
        if (count > 0) {
            findings.add(new DataFinding("outside-span", Severity.FAIL, count + " sample(s) of the " + what
                    + " lie outside its span (the " + what + " runs from " + Numbers.significant(low, 4) + " % to "
                    + Numbers.significant(high, 4) + " % of span): the span given is not the " + what + "'s, or the"
                    + " record is not in the span's units, and every gain read from it would be off by the same"
                    + " factor; give the " + what + "'s span in the record's units."));
        }
    }

    /** Smith's and Sundaresan-Krishnaswamy's estimates from the first step's segment, when its crossings are found. */
    private static List<GraphicalEstimate> estimates(PlantRecord r, int firstStep, int stepEnd, double baseline,
                                                     double dy, double du) {
        if (dy == 0 || du == 0) {
            return List.of();
        }
        double t0 = r.time(firstStep - 1) + 0; // the output changed between samples firstStep-1 and firstStep
        t0 = r.time(firstStep);
        double[] fractions = {0.283, 0.632, 0.353, 0.853};
        double[] times = new double[4];
        for (int f = 0; f < 4; f++) {
            times[f] = Double.NaN;
            double level = baseline + fractions[f] * dy;
            for (int k = firstStep; k < stepEnd; k++) {
                boolean crossed = dy > 0 ? r.pv(k) >= level : r.pv(k) <= level;
                if (crossed) {
                    double prevT = r.time(k - 1);
                    double prevY = r.pv(k - 1);
                    double frac = (level - prevY) / (r.pv(k) - prevY);
                    times[f] = Math.max(0, prevT + Math.min(1, Math.max(0, frac)) * (r.time(k) - prevT) - t0);
                    break;
                }
            }
        }
        List<GraphicalEstimate> out = new ArrayList<>();
        double k = dy / du;
        if (Double.isFinite(times[0]) && Double.isFinite(times[1]) && times[1] > times[0]) {
            out.add(GraphicalEstimate.smith(k, times[0], times[1]));
        }
        if (Double.isFinite(times[2]) && Double.isFinite(times[3]) && times[3] > times[2]) {
            out.add(GraphicalEstimate.sundaresanKrishnaswamy(k, times[2], times[3]));
        }
        return out;
    }
}

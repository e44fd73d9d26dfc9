package org.loopform.findings;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import org.loopform.analysis.LoopMargins;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.AntiWindup;
import org.loopform.form.Discretization;
import org.loopform.form.FormDefinition;
import org.loopform.law.LawDeviation;
import org.loopform.scan.ScanFacts;
import org.loopform.units.Numbers;

/**
 * The deployment checker's rules: each turns one figure of the target loop into a finding with
 * its threshold (from {@link CheckPolicy}) and the threshold's source.
 */
public final class CheckRules {

    static final String WITTENMARK_2002 = "Wittenmark, Astrom & Arzen, Computer Control: An Overview, IFAC 2002, Table 3";
    /**
     * The sampling rules of thumb (h wc, N h / Td): common practice; a search of public pages and
     * documentation did not turn up a published table to cite for the figures (docs/references.md).
     */
    static final String SAMPLING_PRACTICE = "common practice (rule of thumb for sampled PID)";
    static final String MS_SOURCE = "Astrom & Hagglund 1995, as cited in Octave control package docs: Ms 1.3 to 2";
    static final String COMMON = "common practice";
    /** Where the replay thresholds come from. */
    public static final String REPLAY_POLICY = "loopform policy (common practice): a controller re-run on its own"
            + " inputs reproduces its logged output to the log's resolution";
    /**
     * The margins Ms guarantees, derived: the Nyquist curve keeps |1 + L| >= 1/Ms, so at the phase
     * crossover (L = -1/GM) 1 - 1/GM >= 1/Ms, and at the gain crossover (|L| = 1)
     * |1 + L| = 2 sin(PM/2) >= 1/Ms.
     */
    static final String MS_BOUNDS = "derived from |1 + L| >= 1/Ms at the crossovers:"
            + " GM >= Ms/(Ms-1), PM >= 2 arcsin(1/(2 Ms))";

    private CheckRules() {
    }

    /**
     * What the rules look at. The loops' margins are there only with a process model (absent without
     * one); {@code mismatch} is the controller as run against its own continuous law, absent where
     * it was not computed; {@code sourceMismatch} the same for the old controller at its own scan
     * (absent for a continuous design, and where the new controller's departure is within the policy,
     * the only case the rule reads it), so that a condition it already had is said so.
     */
    public record Inputs(FormDefinition targetForm, double scanSeconds, ScanFacts facts,
                         Optional<LoopMargins> designLoop, Optional<LoopMargins> targetLoop,
                         Optional<LawDeviation> mismatch, double mismatchBandHighRadPerSecond,
                         boolean targetStable, Optional<ScanFacts> sourceFacts,
                         Optional<LawDeviation> sourceMismatch) {

        public Inputs {
            Objects.requireNonNull(targetForm, "targetForm");
            Objects.requireNonNull(facts, "facts");
            Objects.requireNonNull(designLoop, "designLoop (Optional.empty() without a process model)");
            Objects.requireNonNull(targetLoop, "targetLoop (Optional.empty() without a process model)");
            Objects.requireNonNull(mismatch, "mismatch (Optional.empty() when not computed)");
            Objects.requireNonNull(sourceFacts, "sourceFacts (Optional.empty() for a continuous design)");
            Objects.requireNonNull(sourceMismatch, "sourceMismatch (Optional.empty() for a continuous design)");
        }

        /**
         * Inputs from plain figures, without the old controller's scan facts (a continuous design, or
         * none to compare): a null margins or mismatch reads as absent.
         */
        public Inputs(FormDefinition targetForm, double scanSeconds, ScanFacts facts, LoopMargins designLoop,
                      LoopMargins targetLoop, LawDeviation mismatch, double mismatchBandHighRadPerSecond,
                      boolean targetStable) {
            this(targetForm, scanSeconds, facts, Optional.ofNullable(designLoop), Optional.ofNullable(targetLoop),
                    Optional.ofNullable(mismatch), mismatchBandHighRadPerSecond, targetStable, Optional.empty(),
                    Optional.empty());
        }

        /** The loop whose crossover the sampling rules read: the target's, else the design's; absent without a process. */
        Optional<LoopMargins> loopSeen() {
            return targetLoop.or(() -> designLoop);
        }
    }

    /** A condition the old controller already had is not made worse unless its figure grows by more than this share. */
    static final double NOT_WORSE_SHARE = 0.1;

    /**
     * The words and severity of a finding when the old controller (a sampled source) had the same
     * condition: info when the migration does not make it worse (its figure grows by at most
     * {@link #NOT_WORSE_SHARE}), otherwise the severity stands and the text says the old figure.
     */
    private static Finding againstSource(Finding f, double sourceFigure, double sourceScanSeconds, String what) {
        String old = " The old controller had the same condition (" + what + " = " + Numbers.significant(sourceFigure, 3)
                + " at its " + Numbers.plain(sourceScanSeconds) + " s scan)";
        if (f.figure() != null && f.figure() <= sourceFigure * (1 + NOT_WORSE_SHARE)) {
            return new Finding(f.topic(), Severity.INFO, f.figure(), f.threshold(), f.unit(), f.source(),
                    f.message() + old + ": the migration does not make it worse.");
        }
        return new Finding(f.topic(), f.severity(), f.figure(), f.threshold(), f.unit(), f.source(),
                f.message() + old + ": the migration makes it worse.");
    }

    public static List<Finding> evaluate(Inputs in, CheckPolicy policy) {
        List<Finding> out = new ArrayList<>();
        scanAllowed(in, out);
        sampling(in, policy, out);
        integralWithoutProcess(in, out);
        derivative(in, policy, out);
        discretization(in, policy, out);
        robustness(in, policy, out);
        windup(in, out);
        return out;
    }

    private static void scanAllowed(Inputs in, List<Finding> out) {
        if (!in.targetForm().algorithm().allowsScan(in.scanSeconds())) {
            out.add(new Finding(Topic.SAMPLING, Severity.FAIL, in.scanSeconds(), null, "s", "target form " + in.targetForm().id(),
                    "Scan time " + Numbers.plain(in.scanSeconds()) + " s is not one that " + in.targetForm().id()
                            + " allows; pick one of its scan times (loopform forms show " + in.targetForm().id() + ")."));
        }
    }

    private static void sampling(Inputs in, CheckPolicy p, List<Finding> out) {
        Optional<LoopMargins> m = in.loopSeen();
        if (m.isEmpty() || m.get().crossoverRadPerSecond().isEmpty()) {
            return;
        }
        double wc = m.get().crossoverRadPerSecond().getAsDouble();
        double hwc = in.scanSeconds() * wc;
        double lostDeg = Math.toDegrees(hwc / 2);
        Severity s = hwc > p.samplingFail() ? Severity.FAIL : hwc > p.samplingWarn() ? Severity.WARN : null;
        if (s != null) {
            out.add(new Finding(Topic.SAMPLING, s, hwc, s == Severity.FAIL ? p.samplingFail() : p.samplingWarn(), "rad",
                    SAMPLING_PRACTICE, "The scan is slow for this loop: scan time times crossover is "
                    + Numbers.significant(hwc, 3) + " rad (crossover " + Numbers.significant(wc, 3) + " rad/s); the hold"
                    + " alone, a delay of about h/2, costs " + Numbers.significant(lostDeg, 3) + " deg of phase at"
                    + " crossover. Use a scan of at most " + Numbers.significant(p.samplingWarn() / wc, 3) + " s"
                    + allowedAdvice(in, p.samplingWarn() / wc) + "."));
        }
    }

    /** The integral time below which, in scans, an integral is flagged when no process model shows the loop. */
    static final double INTEGRAL_SCANS_WARN = 1.0;

    /**
     * Without a process model there is no crossover for the sampling rule to read, and a loop list
     * whose integral times were typed in the wrong unit (minutes read as seconds) would pass on its
     * conversion alone. An integral time shorter than the scan is flagged: each scan the integral adds
     * h / Ti times the proportional action, and the law's integral corner 1/Ti lies above what the scan
     * resolves (common practice: an integral time of several scans at least).
     */
    private static void integralWithoutProcess(Inputs in, List<Finding> out) {
        if (in.loopSeen().isPresent()) {
            return; // the margins and the sampling rule judge the loop itself
        }
        double ratio = in.facts().integralStepRatio();
        if (!(ratio > INTEGRAL_SCANS_WARN)) {
            return;
        }
        Finding f = new Finding(Topic.SAMPLING, Severity.WARN, ratio, INTEGRAL_SCANS_WARN, "ratio", SAMPLING_PRACTICE,
                "The integral time (Ti = " + Numbers.significant(in.facts().integralTimeSeconds(), 3) + " s, in the"
                + " ideal form's terms) is shorter than the scan (" + Numbers.plain(in.scanSeconds()) + " s): each scan"
                + " the integral adds h / Ti = " + Numbers.significant(ratio, 3) + " times the proportional action, so"
                + " the controller at this scan is not the law the tuning states. Check the integral's unit first (a"
                + " time in minutes read as seconds, a rate read as a time); give the loop a process model to have its"
                + " stability checked.");
        Optional<ScanFacts> old = in.sourceFacts().filter(s -> s.integralStepRatio() > INTEGRAL_SCANS_WARN);
        out.add(old.isPresent() ? againstSource(f, old.get().integralStepRatio(), old.get().scanSeconds(), "h / Ti")
                : f);
    }

    /** ", for example 0.5 s, the longest this form allows below it" where the form lists its scans. */
    private static String allowedAdvice(Inputs in, double maxSeconds) {
        double best = 0;
        for (double h : in.targetForm().algorithm().allowedScansSeconds()) {
            if (h <= maxSeconds && h > best) {
                best = h;
            }
        }
        return best > 0 ? " (" + Numbers.plain(best) + " s is the longest " + in.targetForm().id() + " allows below it)"
                : "";
    }

    private static void derivative(Inputs in, CheckPolicy p, List<Finding> out) {
        ScanFacts f = in.facts();
        if (!f.hasDerivative()) {
            return;
        }
        if (f.filterSeconds() > 0 && f.nhOverTd() > p.derivativeNhTdWarn()) {
            // the rule is about resolving the filter; it matters to the loop only when the filter
            // corner is near the crossover (within a decade), where the derivative does its work
            Optional<LoopMargins> lm = in.loopSeen();
            double corner = 1 / f.filterSeconds();
            boolean shorterThanScan = f.nhOverTd() > 1;
            boolean matters = shorterThanScan || lm.isEmpty() || lm.get().crossoverRadPerSecond().isEmpty()
                    || corner < 10 * lm.get().crossoverRadPerSecond().getAsDouble();
            Finding coarse = new Finding(Topic.DERIVATIVE, matters ? Severity.WARN : Severity.INFO, f.nhOverTd(),
                    p.derivativeNhTdWarn(), "ratio", SAMPLING_PRACTICE, "The scan is coarse for the derivative filter:"
                    + " N h / Td = " + Numbers.significant(f.nhOverTd(), 3) + ", so the filter time constant Td/N = "
                    + Numbers.significant(f.filterSeconds(), 3) + " s spans less than " + Numbers.significant(
                    1 / f.nhOverTd(), 2) + " scans and the sampled derivative departs from the continuous one near and above"
                    + " its corner (" + Numbers.significant(corner, 3) + " rad/s). " + (shorterThanScan
                    ? "The filter is shorter than one scan: the derivative acts as one-scan spikes. Scan faster, or"
                    + " expect less derivative action than the tuning asks for." : matters
                    ? "That is close enough to the loop's crossover to change what the derivative does: scan faster,"
                    + " or expect less derivative action than the tuning asks for."
                    : "The corner lies more than a decade above the loop's crossover, so the loop hardly notices."));
            Optional<ScanFacts> old = in.sourceFacts().filter(s -> s.hasDerivative() && s.filterSeconds() > 0
                    && s.nhOverTd() > p.derivativeNhTdWarn());
            out.add(old.isPresent() ? againstSource(coarse, old.get().nhOverTd(), old.get().scanSeconds(), "N h / Td")
                    : coarse);
        } else if (f.filterSeconds() == 0 && in.scanSeconds() > f.derivativeTimeSeconds()) {
            Finding spikes = new Finding(Topic.DERIVATIVE, Severity.WARN, in.scanSeconds() / f.derivativeTimeSeconds(),
                    1.0, "ratio", COMMON, "The scan time is longer than the derivative time, so the unfiltered derivative"
                    + " acts as one-scan spikes.");
            Optional<ScanFacts> old = in.sourceFacts().filter(s -> s.hasDerivative() && s.filterSeconds() == 0
                    && s.scanSeconds() > s.derivativeTimeSeconds());
            out.add(old.isPresent() ? againstSource(spikes, old.get().scanSeconds() / old.get().derivativeTimeSeconds(),
                    old.get().scanSeconds(), "h / Td") : spikes);
        }
        Optional<LoopMargins> m = in.loopSeen();
        if (m.isPresent() && m.get().crossoverRadPerSecond().isPresent()) {
            double wc = m.get().crossoverRadPerSecond().getAsDouble();
            if (wc < Math.PI / in.scanSeconds()) {
                double cont = f.continuousPhaseLeadDegrees(wc);
                double kept = f.phaseLeadDegrees(wc);
                double fraction = cont > 1e-9 ? kept / cont : 1.0;
                if (cont > 1.0 && fraction < p.derivativeLeadKeptWarn()) {
                    out.add(new Finding(Topic.DERIVATIVE, Severity.WARN, fraction, p.derivativeLeadKeptWarn(),
                            "fraction", COMMON, "At crossover (" + Numbers.significant(wc, 3) + " rad/s) the sampled"
                            + " derivative keeps " + Numbers.significant(kept, 3) + " deg of the "
                            + Numbers.significant(cont, 3) + " deg of phase lead the continuous derivative gives."));
                }
            }
        }
    }

    private static void discretization(Inputs in, CheckPolicy p, List<Finding> out) {
        ScanFacts f = in.facts();
        if (f.hasDerivative() && f.unstable()) {
            out.add(new Finding(Topic.DISCRETIZATION, Severity.FAIL, in.scanSeconds() / f.filterSeconds(), 2.0, "ratio",
                    WITTENMARK_2002, "The forward-difference derivative is unstable at this scan: h / Tf = "
                    + Numbers.significant(in.scanSeconds() / f.filterSeconds(), 3) + " > 2, filter pole "
                    + Numbers.significant(f.filterPole(), 3) + " outside the unit circle."));
        } else if (f.hasDerivative() && f.rings()) {
            // the pole turns negative at h / Tf = 2 for trapezoidal (2Tf - h)/(2Tf + h), at 1 for forward 1 - h/Tf
            double ringsAbove = f.method() == Discretization.FORWARD ? 1.0 : 2.0;
            out.add(new Finding(Topic.DISCRETIZATION, Severity.WARN, in.scanSeconds() / f.filterSeconds(), ringsAbove,
                    "ratio", WITTENMARK_2002, "The " + f.method().name().toLowerCase(java.util.Locale.ROOT).replace('_', '-')
                    + " derivative rings at this scan: h / Tf = "
                    + Numbers.significant(in.scanSeconds() / f.filterSeconds(), 3) + " > " + Numbers.plain(ringsAbove)
                    + " puts the filter pole at " + Numbers.significant(f.filterPole(), 3) + " (negative), so the"
                    + " derivative term alternates in sign every scan."));
        }
        if (in.mismatch().isEmpty()) {
            return;
        }
        LawDeviation d = in.mismatch().get();
        if ((d.gainDb() > p.mismatchWarnDb() || d.phaseDegrees() > p.mismatchWarnDegrees())) {
            Finding departs = new Finding(Topic.DISCRETIZATION, Severity.WARN, d.gainDb(), p.mismatchWarnDb(), "dB", COMMON,
                    "At this scan the new controller as it will run departs from its own continuous law by up to "
                    + Numbers.significant(d.gainDb(), 3) + " dB and " + Numbers.significant(d.phaseDegrees(), 3)
                    + " deg over its band (to " + Numbers.significant(in.mismatchBandHighRadPerSecond(), 3)
                    + " rad/s, at most the Nyquist frequency).");
            // the old controller, run at its own scan, departed from its own law too: said so, and info
            // unless the migration makes it worse (in gain and in phase)
            Optional<LawDeviation> old = in.sourceMismatch().filter(o -> o.gainDb() > p.mismatchWarnDb()
                    || o.phaseDegrees() > p.mismatchWarnDegrees());
            if (old.isPresent() && in.sourceFacts().isPresent()) {
                LawDeviation o = old.get();
                String was = " The old controller had the same condition (up to " + Numbers.significant(o.gainDb(), 3)
                        + " dB and " + Numbers.significant(o.phaseDegrees(), 3) + " deg at its "
                        + Numbers.plain(in.sourceFacts().get().scanSeconds()) + " s scan)";
                boolean worse = d.gainDb() > o.gainDb() * (1 + NOT_WORSE_SHARE)
                        || d.phaseDegrees() > o.phaseDegrees() * (1 + NOT_WORSE_SHARE);
                departs = new Finding(departs.topic(), worse ? departs.severity() : Severity.INFO, departs.figure(),
                        departs.threshold(), departs.unit(), departs.source(), departs.message() + was + (worse ? ": the migration makes it worse."
                        : ": the migration does not make it worse."));
            }
            out.add(departs);
        }
    }

    private static void robustness(Inputs in, CheckPolicy p, List<Finding> out) {
        if (in.targetLoop().isEmpty()) {
            return;
        }
        LoopMargins t = in.targetLoop().get();
        if (!in.targetStable()) {
            // StabilityRule fails it from the closed-loop poles, whatever the policy; its margins describe
            // nothing to hold against thresholds
            return;
        }
        double ms = t.maximumSensitivity();
        Severity msSeverity = ms > p.msFail() ? Severity.FAIL : ms > p.msWarn() ? Severity.WARN : null;
        if (msSeverity != null) {
            boolean fail = msSeverity == Severity.FAIL;
            out.add(new Finding(Topic.ROBUSTNESS, msSeverity, ms, fail ? p.msFail() : p.msWarn(), "ratio",
                    fail ? PolicyKey.MS_FAIL.source() : MS_SOURCE, "The as-left loop's maximum sensitivity Ms is "
                    + Numbers.significant(ms, 3) + ", above " + Numbers.plain(fail ? p.msFail() : p.msWarn())
                    + (fail ? " (the fail threshold)" : "") + ": it amplifies disturbances near "
                    + Numbers.significant(t.maximumSensitivityRadPerSecond(), 3) + " rad/s and "
                    + (fail ? "is at the edge of instability; do not deploy this tuning: retune or scan faster."
                    : "is close to instability.")));
        }
        Optional<LoopMargins> design = in.designLoop();
        if (design.isPresent() && ms > design.get().maximumSensitivity() * (1 + p.msIncreaseWarn())) {
            LoopMargins d = design.get();
            double rise = ms / d.maximumSensitivity() - 1;
            out.add(new Finding(Topic.ROBUSTNESS, Severity.WARN, 100 * rise, 100 * p.msIncreaseWarn(), "%", COMMON,
                    "Robustness is lost in the migration: Ms rises from " + Numbers.significant(d.maximumSensitivity(), 3)
                            + " (as-found) to " + Numbers.significant(ms, 3) + " (as-left)."));
        }
        if (t.phaseMarginDegrees().isPresent()) {
            double pm = t.phaseMarginDegrees().getAsDouble();
            boolean fail = pm < p.phaseMarginFailDegrees();
            if (fail || pm < p.phaseMarginWarnDegrees()) {
                double limit = fail ? p.phaseMarginFailDegrees() : p.phaseMarginWarnDegrees();
                out.add(new Finding(Topic.ROBUSTNESS, fail ? Severity.FAIL : Severity.WARN, pm, limit, "deg",
                        (fail ? PolicyKey.PHASE_MARGIN_FAIL_DEG : PolicyKey.PHASE_MARGIN_WARN_DEG).source(),
                        "The as-left loop's phase margin is " + Numbers.significant(pm, 3) + " deg, below "
                        + Numbers.plain(limit) + " deg" + (pm < 0 ? beyondMinus180(pm) : fail ? " (the fail threshold):"
                        + " it will ring badly and is at the edge of instability; do not deploy this tuning: retune or"
                        + " scan faster." : ".")));
            }
        }
        if (t.gainMargin().isPresent()) {
            double gm = t.gainMargin().getAsDouble();
            boolean fail = gm < p.gainMarginFail();
            if (fail || gm < p.gainMarginWarn()) {
                double limit = fail ? p.gainMarginFail() : p.gainMarginWarn();
                out.add(new Finding(Topic.ROBUSTNESS, fail ? Severity.FAIL : Severity.WARN, gm, limit, "ratio",
                        (fail ? PolicyKey.GAIN_MARGIN_FAIL : PolicyKey.GAIN_MARGIN_WARN).source(),
                        "The as-left loop's gain margin is " + Numbers.significant(gm, 3) + ", below "
                        + Numbers.plain(limit) + (fail ? " (the fail threshold): a process gain " + Numbers.significant(
                        100 * (gm - 1), 2) + " % higher than modelled makes it unstable; do not deploy this tuning:"
                        + " retune or scan faster." : ".")));
            }
        }
        lowerGainMargin(t, p, out);
        delayMargin(in, t, p, out);
    }

    /**
     * A conditionally stable target loop: the gain may shrink only by its lower gain margin before the
     * loop goes unstable. Held against the same thresholds as the gain margin, read as the factor
     * 1 / lower gain margin (a gain that may halve passes a warn threshold of 2).
     */
    private static void lowerGainMargin(LoopMargins t, CheckPolicy p, List<Finding> out) {
        if (t.lowerGainMargin().isEmpty()) {
            return;
        }
        double lower = t.lowerGainMargin().getAsDouble();
        double factor = 1 / lower;
        boolean fail = factor < p.gainMarginFail();
        if (!fail && factor >= p.gainMarginWarn()) {
            return;
        }
        double limit = fail ? p.gainMarginFail() : p.gainMarginWarn();
        out.add(new Finding(Topic.ROBUSTNESS, fail ? Severity.FAIL : Severity.WARN, lower, 1 / limit, "ratio",
                (fail ? PolicyKey.GAIN_MARGIN_FAIL : PolicyKey.GAIN_MARGIN_WARN).source(),
                "The as-left loop is conditionally stable: a loop gain " + Numbers.significant(100 * (1 - lower), 2)
                        + " % lower than modelled (lower gain margin " + Numbers.significant(lower, 3)
                        + ") makes it unstable, where the policy asks for room to shrink by a factor of "
                        + Numbers.plain(limit) + (fail ? " (the fail threshold); do not deploy this tuning: retune"
                        + " so that lowering the gain cannot destabilize the loop." : ".")));
    }

    /** The delay margin in target scans: how many scans of added latency the loop stands. */
    private static void delayMargin(Inputs in, LoopMargins t, CheckPolicy p, List<Finding> out) {
        if (t.delayMarginSeconds().isEmpty()) {
            return;
        }
        double dmSeconds = t.delayMarginSeconds().getAsDouble();
        double scans = dmSeconds / in.scanSeconds();
        boolean fail = scans < p.delayMarginFailScans();
        if (fail || scans < p.delayMarginWarnScans()) {
            double limit = fail ? p.delayMarginFailScans() : p.delayMarginWarnScans();
            out.add(new Finding(Topic.ROBUSTNESS, fail ? Severity.FAIL : Severity.WARN, scans, limit, "scans",
                    (fail ? PolicyKey.DELAY_MARGIN_FAIL_SCANS : PolicyKey.DELAY_MARGIN_WARN_SCANS).source(),
                    "The as-left loop's delay margin is " + Numbers.significant(dmSeconds, 3) + " s, "
                    + Numbers.significant(scans, 3) + " scans of " + Numbers.plain(in.scanSeconds()) + " s, below "
                    + Numbers.plain(limit) + " scans" + (fail ? " (the fail threshold): one scan of added latency (a"
                    + " late input or output update) makes it unstable; do not deploy this tuning: retune or scan"
                    + " faster." : ": a little added latency (late input or output updates) would bring it close to"
                    + " instability.")));
        }
    }

    private static void windup(Inputs in, List<Finding> out) {
        var a = in.targetForm().algorithm();
        if (a.kind() == AlgorithmKind.POSITIONAL && a.antiWindup() == AntiWindup.NONE) {
            out.add(new Finding(Topic.WINDUP, Severity.WARN, null, null, "", COMMON, "The new form " + in.targetForm().id()
                    + " runs a positional algorithm without anti-windup: after the output saturates, the integral keeps"
                    + " growing and the loop overshoots when it comes off the limit."));
        }
    }

    /**
     * The words for a stable loop whose gain crossover nearest -1 lies beyond -180 deg: its Nyquist plot
     * passes -1 on the far side there and the loop is stable only because another crossing makes up the
     * count (Nyquist criterion, Astrom and Murray, Feedback Systems, 2008, ch. 9 - from memory).
     */
    private static String beyondMinus180(double pm) {
        return " (the fail threshold): at its gain crossover nearest -1 the phase is " + Numbers.significant(-pm, 3)
                + " deg beyond -180 deg, so the loop is stable only because another crossing of its frequency"
                + " response makes up for it; a little phase lead there, or a small change in the process, makes it"
                + " unstable; do not deploy this tuning: retune or scan faster.";
    }
}

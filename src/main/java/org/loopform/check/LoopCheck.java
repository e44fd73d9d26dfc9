package org.loopform.check;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.loopform.analysis.ControllerMismatch;
import org.loopform.analysis.LoopMargins;
import org.loopform.findings.ActionRule;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.CheckRules;
import org.loopform.findings.ConversionRules;
import org.loopform.findings.Finding;
import org.loopform.findings.ResponseRules;
import org.loopform.findings.Severity;
import org.loopform.findings.StabilityRule;
import org.loopform.findings.Topic;
import org.loopform.form.Conversion;
import org.loopform.form.Converter;
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormException;
import org.loopform.form.PidSetting;
import org.loopform.form.WritingContext;
import org.loopform.law.ControlLaw;
import org.loopform.law.LawDeviation;
import org.loopform.law.TuningBand;
import org.loopform.lti.FrequencyBand;
import org.loopform.process.ProcessModel;
import org.loopform.scan.PulseLaw;
import org.loopform.scan.ScanFacts;
import org.loopform.simulate.StepTest;
import org.loopform.units.Numbers;

/**
 * Checks one loop's deployment: converts its tuning to the target form, rounds it as the target
 * stores it, and compares the design loop ({@link DesignLoop}: the source law, continuous, or the
 * source's own algorithm at its own scan) with the target loop ({@link TargetLoop}: the target's
 * algorithm at the target scan, the process sampled exactly) in the frequency and time domains
 * ({@link LoopComparison}); then applies the rules. This is the package's entry:
 * {@link #run(LoopSpec, CheckPolicy)} returns a {@link CheckResult}.
 */
public final class LoopCheck {

    /** Horizon in units of 1/crossover: a well-damped loop settles within about 5 to 10 / crossover. */
    static final double HORIZON_CROSSOVERS = 30.0;
    /** The controller comparison reaches this many times the crossover, where a model gives one. */
    static final double MISMATCH_CROSSOVERS = 10.0;
    /** Most target-loop steps simulated; a longer horizon is cut. */
    static final int MAX_TARGET_STEPS = 200_000;

    private LoopCheck() {
    }

    /** Checks {@code loop} against {@code policy}. */
    public static CheckResult run(LoopSpec loop, CheckPolicy policy) {
        return run(loop, policy, Double.NaN);
    }

    /**
     * As {@link #run(LoopSpec, CheckPolicy)}, the step tests run over {@code horizonSeconds}
     * (still cut at {@link #MAX_TARGET_STEPS} target scans) instead of the horizon the margins
     * give; NaN picks that one. For benchmarks, which need a fixed response length.
     */
    static CheckResult run(LoopSpec loop, CheckPolicy policy, double horizonSeconds) {
        double h = targetScan(loop);
        FormDefinition target = loop.targetForm();
        WritingContext ctx = new WritingContext(loop.pvRange(), loop.outputRange(), h);
        Conversion conversion = convert(loop, ctx, h);
        PidSetting entered = enteredSetting(conversion, target, ctx);
        ControlLaw designLaw = conversion.sourceLaw();
        PulseLaw targetPulse = PulseLaw.of(entered, target.filter().placement(), target.algorithm(), h);
        FrequencyBand lawBand = TuningBand.implied(designLaw.terms(), h);

        List<Finding> findings = new ArrayList<>(ConversionRules.findings(conversion, policy));
        if (!loop.hasProcess()) {
            findings.add(StabilityRule.notJudged());
        }
        Optional<Compared> compared = loop.hasProcess()
                ? Optional.of(compare(loop, conversion, entered, targetPulse, lawBand, horizonSeconds, findings,
                        SampledDelayMargin.exactBelowScans(policy)))
                : Optional.empty();
        Optional<LoopComparison> comparison = compared.map(Compared::comparison);
        FrequencyBand mismatchBand = mismatchBand(lawBand, designLaw, h,
                comparison.map(c -> c.design().margins()));
        // what the loop sees: the design law against the controller as run, feedback path
        LawDeviation mismatch = ControllerMismatch.over(designLaw, targetPulse, mismatchBand, true);
        // what the scan alone changes: the target's own continuous law against its discrete run
        LawDeviation discretization = ControllerMismatch.over(conversion.enteredLaw(), targetPulse, mismatchBand);
        ControllerMismatch.Curve curve = ControllerMismatch.curve(designLaw, targetPulse, lawBand, 120);
        findings.addAll(CheckRules.evaluate(new CheckRules.Inputs(target, h,
                ScanFacts.of(entered, target.algorithm().derivative(), h),
                comparison.map(c -> c.design().margins()), comparison.map(c -> c.target().margins()),
                Optional.of(discretization),
                mismatchBand.highRadPerSecond(), comparison.map(c -> c.target().stability().isStable()).orElse(true),
                sourceFacts(loop, conversion), departs(discretization, policy)
                        ? sourceDiscretization(loop, conversion, mismatchBand) : Optional.empty()), policy));
        compared.ifPresent(c -> {
            findings.addAll(c.stepFindings());
            findings.addAll(responseFindings(c.comparison(), h, policy));
        });
        comparison.flatMap(c -> noIntegralNote(c, conversion)).ifPresent(findings::add);
        return new CheckResult(loop, h, conversion, comparison, mismatch, curve, findings);
    }

    /** A comparison and the findings of its step choice (what the output limits did to the steps). */
    private record Compared(LoopComparison comparison, List<Finding> stepFindings) {
    }

    private static double targetScan(LoopSpec loop) {
        if (loop.targetScanSeconds() == null) {
            throw new FormException(loop.where() + ": target.scan: required; give the new controller's scan time:"
                    + " 'scan: 0.5 s' under target in a loop file, a target_scan (or scan) column in a CSV list, or"
                    + " --scan for every loop");
        }
        return loop.targetScanSeconds();
    }

    /**
     * Whether the new controller as run departs from its own law enough for the discretization rule to
     * speak; only then does it read the old controller's own departure (computed for that alone).
     */
    private static boolean departs(LawDeviation discretization, CheckPolicy policy) {
        return discretization.gainDb() > policy.mismatchWarnDb()
                || discretization.phaseDegrees() > policy.mismatchWarnDegrees();
    }

    /**
     * What its own scan did to the old controller: its continuous law against its discrete run, over
     * the band the new one is judged on, cut at the old scan's Nyquist frequency; empty for a
     * continuous design.
     */
    private static Optional<LawDeviation> sourceDiscretization(LoopSpec loop, Conversion conversion,
                                                               FrequencyBand band) {
        Double scan = loop.sourceScanSeconds();
        if (scan == null) {
            return Optional.empty();
        }
        FormDefinition from = loop.sourceForm();
        PulseLaw old = PulseLaw.of(conversion.sourceSetting(), from.filter().placement(), from.algorithm(), scan);
        double top = Math.min(band.highRadPerSecond(), Math.PI / scan);
        double low = Math.min(band.lowRadPerSecond(), top / 100);
        return Optional.of(ControllerMismatch.over(conversion.sourceLaw(), old, new FrequencyBand(low, top)));
    }

    /** The old controller's scan facts when the design loop runs it at its own scan; empty for a continuous design. */
    private static Optional<ScanFacts> sourceFacts(LoopSpec loop, Conversion conversion) {
        Double scan = loop.sourceScanSeconds();
        return scan == null ? Optional.empty()
                : Optional.of(ScanFacts.of(conversion.sourceSetting(), loop.sourceForm().algorithm().derivative(), scan));
    }

    /**
     * The tuning converted to the target. Where the target cannot hold the law exactly and the process is
     * known, the nearest fit is weighted where this loop lives: a decade below to three times above the
     * design loop's crossover (the source law with the process, continuous), rather than around the law's
     * own corners, and within it by the design loop's |S T| ({@link #loopEmphasis}).
     */
    private static Conversion convert(LoopSpec loop, WritingContext ctx, double h) {
        try {
            WritingContext sourceCtx = new WritingContext(loop.pvRange(), loop.outputRange(),
                    loop.sourceScanSeconds() != null ? loop.sourceScanSeconds() : h);
            Conversion c = Converter.convertBetween(loop.sourceForm(), loop.tuning(), sourceCtx, loop.targetForm(), ctx);
            if (c.exact() || !loop.hasProcess()) {
                return c;
            }
            Optional<FrequencyBand> lives = aroundCrossover(c.sourceLaw(), loop.process(), h);
            return lives.isEmpty() ? c : Converter.convertBetween(loop.sourceForm(), loop.tuning(), sourceCtx,
                    loop.targetForm(), ctx, lives.get(), loopEmphasis(c.sourceLaw(), loop.process()));
        } catch (FormException e) {
            throw new FormException(loop.whereOf(e.getMessage()) + ": loop " + loop.tag() + ": tuning: "
                    + e.getMessage());
        }
    }

    /**
     * The weight the process gives each frequency in the nearest fit: |S T| = |L| / |1 + L|^2 of the
     * continuous design loop L = C_y P. To first order a relative error e of the controller changes the
     * sensitivity S by -T e and the complementary sensitivity T by S e (relative; Astrom and Murray,
     * Feedback Systems, 2008, ch. 12 - from memory), so |S T| is where an error of the controller moves
     * the loop most: it peaks around the crossover and falls off on both sides. Capped where
     * |1 + L| nears 0 (a loop at its stability limit).
     */
    static java.util.function.DoubleUnaryOperator loopEmphasis(ControlLaw law, ProcessModel p) {
        return omega -> {
            double[] c = new double[2];
            double[] g = new double[2];
            law.feedbackAt(omega, c);
            p.responseAt(omega, g);
            double re = c[0] * g[0] - c[1] * g[1];
            double im = c[0] * g[1] + c[1] * g[0];
            double loopGain = Math.hypot(re, im);
            double returnDifference = Math.hypot(1 + re, im);
            return loopGain / Math.max(returnDifference * returnDifference, EMPHASIS_FLOOR);
        };
    }

    /** |1 + L|^2 below this reads as this: the weight of a frequency where the loop is marginal stays finite. */
    private static final double EMPHASIS_FLOOR = 1e-6;

    /** From a decade below to three times the continuous design loop's crossover; empty without one. */
    static Optional<FrequencyBand> aroundCrossover(ControlLaw law, ProcessModel p, double h) {
        FrequencyBand lawBand = TuningBand.implied(law.terms(), h);
        double low = LoopBand.bandBottom(lawBand, p);
        FrequencyBand band = FrequencyBand.of(low, Math.max(LoopBand.continuousTop(law, p), 10 * low));
        java.util.OptionalDouble wc = org.loopform.analysis.MarginAnalysis.over(band)
                .analyze(LoopBand.continuousLoop(law, p)).crossoverRadPerSecond();
        if (wc.isEmpty()) {
            return Optional.empty();
        }
        double top = Math.min(3 * wc.getAsDouble(), Math.PI / h);
        double bottom = wc.getAsDouble() / 10;
        return top > bottom ? Optional.of(FrequencyBand.of(bottom, top)) : Optional.empty();
    }

    /**
     * The design and target loops with the process evaluated side by side; adds the action and
     * stability findings to {@code findings} (they come before the margin rules').
     */
    private static Compared compare(LoopSpec loop, Conversion conversion, PidSetting entered, PulseLaw targetPulse,
                                    FrequencyBand lawBand, double horizonSeconds, List<Finding> findings,
                                    double exactDelayMarginBelowScans) {
        ProcessModel p = loop.process();
        ControlLaw designLaw = conversion.sourceLaw();
        double h = loop.targetScanSeconds();
        double low = LoopBand.belowLowestCrossover(LoopBand.bandBottom(lawBand, p), LoopBand.continuousLoop(designLaw, p),
                p.integrators() + (designLaw.terms().hasIntegral() ? 1 : 0));
        DesignLoop design = DesignLoop.of(loop, conversion, p, low, exactDelayMarginBelowScans);
        TargetLoop target = TargetLoop.of(loop.targetForm(), entered, targetPulse, h, p, low, exactDelayMarginBelowScans);
        ActionRule.check(designLaw.terms(), p.lowFrequencyGain(), p.integrators()).ifPresent(findings::add);
        findings.addAll(StabilityRule.evaluate(design.stability(), target.stability()));

        double horizon = Double.isNaN(horizonSeconds)
                ? horizon(design.margins(), target.margins(), designLaw, p) : horizonSeconds;
        horizon = Math.min(horizon, MAX_TARGET_STEPS * h);
        TargetLoop.Evaluated t = target.evaluate(StepTest.standard(horizon,
                loop.targetForm().algorithm().outputLowPercent(), loop.targetForm().algorithm().outputHighPercent()));
        StepTest steps = t.choice().steps();
        DesignLoop.Evaluated d = design.evaluate(steps, horizon);
        return new Compared(new LoopComparison(d.evaluation(), t.evaluation(), steps, d.referenceStepSeconds(),
                d.referenceErrorPercent()), t.choice().findings());
    }

    private static List<Finding> responseFindings(LoopComparison c, double h, CheckPolicy policy) {
        var targetSetpoint = c.target().run().setpoint();
        return ResponseRules.evaluate(new ResponseRules.Inputs(c.bothStable(), c.design().setpoint(),
                c.target().setpoint(), c.design().load(), c.target().load(), h,
                targetSetpoint.timeSeconds(targetSetpoint.size() - 1), c.steps().loadStepPercent()), policy);
    }

    /** Without integral action the IAE grows with the simulated time: said once, as info. */
    private static Optional<Finding> noIntegralNote(LoopComparison c, Conversion conversion) {
        if (conversion.enteredLaw().terms().i() != 0) {
            return Optional.empty();
        }
        var run = c.target().run().setpoint();
        double simulatedSeconds = run.timeSeconds(run.size() - 1);
        return Optional.of(new Finding(Topic.ROBUSTNESS, Severity.INFO, simulatedSeconds, null, "s",
                "common practice", "The controller has no integral action, so the loop holds a steady offset after a"
                + " step: its IAE grows with the simulated time (" + Numbers.significant(simulatedSeconds, 4)
                + " s here) and compares only between as-found and as-left, not with other loops."));
    }

    /**
     * Where the controllers are compared: from the tuning's lowest corner up to its derivative filter
     * corner (the highest corner without a filter), cut at the Nyquist frequency and, with a model,
     * at ten times the crossover; above that the loop no longer follows the controller.
     */
    private static FrequencyBand mismatchBand(FrequencyBand lawBand, ControlLaw law, double h,
                                              Optional<LoopMargins> design) {
        double top = law.terms().tf() > 0 ? 1.0 / law.terms().tf() : lawBand.highRadPerSecond();
        top = Math.min(top, Math.PI / h);
        if (design.isPresent() && design.get().crossoverRadPerSecond().isPresent()) {
            top = Math.min(top, MISMATCH_CROSSOVERS * design.get().crossoverRadPerSecond().getAsDouble());
        }
        double low = Math.min(lawBand.lowRadPerSecond(), top / 100);
        return new FrequencyBand(low, top);
    }

    private static PidSetting enteredSetting(Conversion c, FormDefinition target, WritingContext ctx) {
        try {
            return FormCodec.decode(target, FormCodec.asText(c.entered()), ctx, "target");
        } catch (FormException e) {
            return c.targetSetting(); // the conversion already reported that rounding breaks the tuning
        }
    }

    private static double horizon(LoopMargins design, LoopMargins target, ControlLaw law, ProcessModel p) {
        double wc = design.crossoverRadPerSecond().orElse(target.crossoverRadPerSecond().orElse(Double.NaN));
        if (Double.isFinite(wc) && wc > 0) {
            return Math.max(HORIZON_CROSSOVERS / wc, 5 * p.deadTimeSeconds());
        }
        double ti = law.terms().i() != 0 ? Math.abs(law.terms().p() / law.terms().i()) : 0;
        return 20 * Math.max(ti, p.deadTimeSeconds() + 1.0);
    }
}

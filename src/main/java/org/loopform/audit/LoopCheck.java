package org.loopform.audit;

import java.util.ArrayList;
import java.util.List;
import org.loopform.analysis.ContinuousStability;
import org.loopform.analysis.ControllerMismatch;
import org.loopform.analysis.LoopStability;
import org.loopform.analysis.SampledStability;
import org.loopform.findings.ActionRule;
import org.loopform.findings.StabilityRule;
import org.loopform.law.TuningBand;
import org.loopform.lti.FrequencyBand;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.LoopResponse;
import org.loopform.analysis.MarginAnalysis;
import org.loopform.analysis.StepMetrics;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.CheckRules;
import org.loopform.findings.ConversionRules;
import org.loopform.findings.Finding;
import org.loopform.findings.ResponseRules;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.AntiWindup;
import org.loopform.form.Conversion;
import org.loopform.form.Converter;
import org.loopform.form.DiscreteAlgorithm;
import org.loopform.form.Discretization;
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormException;
import org.loopform.form.PidSetting;
import org.loopform.form.WritingContext;
import org.loopform.law.ControlLaw;
import org.loopform.law.LawDeviation;
import org.loopform.lti.SampledStateSpace;
import org.loopform.lti.TransferFunction;
import org.loopform.process.ProcessModel;
import org.loopform.scan.PulseLaw;
import org.loopform.scan.ScanController;
import org.loopform.scan.ScanFacts;
import org.loopform.simulate.ClosedLoopRun;
import org.loopform.simulate.LoopSimulator;
import org.loopform.simulate.Richardson;
import org.loopform.simulate.StepTest;

/**
 * Checks one loop's deployment: converts its tuning to the target form, rounds it as the target
 * stores it, and compares the design loop (the source law, continuous, or the source's own
 * algorithm at its own scan) with the target loop (the target's algorithm at the target scan,
 * the process sampled exactly) in the frequency and time domains; then applies the rules.
 */
public final class LoopCheck {

    /** Steps of the design loop's fine reference run over the horizon (a second run takes half as many). */
    static final int REFERENCE_STEPS = 2000;
    /** Horizon in units of 1/crossover: a well-damped loop settles within about 5 to 10 / crossover. */
    static final double HORIZON_CROSSOVERS = 30.0;
    /** The controller comparison reaches this many times the crossover, where a model gives one. */
    static final double MISMATCH_CROSSOVERS = 10.0;
    /** Most target-loop steps simulated; a longer horizon is cut. */
    static final int MAX_TARGET_STEPS = 200_000;

    private LoopCheck() {
    }

    public static CheckResult run(LoopSpec loop, CheckPolicy policy) {
        return run(loop, policy, Double.NaN);
    }

    /**
     * As {@link #run(LoopSpec, CheckPolicy)}, the step tests run over {@code horizonSeconds}
     * (still cut at {@link #MAX_TARGET_STEPS} target scans) instead of the horizon the margins
     * give; NaN picks that one. For benchmarks, which need a fixed response length.
     */
    static CheckResult run(LoopSpec loop, CheckPolicy policy, double horizonSeconds) {
        if (loop.targetScanSeconds() == null) {
            throw new FormException(loop.where() + ": target.scan: required; give the target's scan time, e.g."
                    + " 'scan: 0.5 s' (or --scan)");
        }
        double h = loop.targetScanSeconds();
        FormDefinition target = loop.targetForm();
        WritingContext ctx = new WritingContext(loop.pvRange(), loop.outputRange(), h);
        Conversion conversion;
        try {
            WritingContext sourceCtx = new WritingContext(loop.pvRange(), loop.outputRange(),
                    loop.sourceScanSeconds() != null ? loop.sourceScanSeconds() : h);
            conversion = Converter.convertBetween(loop.sourceForm(), loop.tuning(), sourceCtx, target, ctx);
        } catch (FormException e) {
            throw new FormException(loop.where() + ": loop " + loop.tag() + ": tuning: " + e.getMessage());
        }
        PidSetting entered = enteredSetting(conversion, target, ctx);
        ControlLaw designLaw = conversion.sourceLaw();
        PulseLaw targetPulse = PulseLaw.of(entered, target.filter().placement(), target.algorithm(), h);
        ScanFacts facts = ScanFacts.of(entered, target.algorithm().derivative(), h);

        FrequencyBand lawBand = TuningBand.implied(designLaw.terms(), h);

        List<Finding> findings = new ArrayList<>(ConversionRules.findings(conversion, policy));
        LoopMargins designMargins = null;
        LoopMargins targetMargins = null;
        StepMetrics ds = null;
        StepMetrics dl = null;
        StepMetrics ts = null;
        StepMetrics tl = null;
        ClosedLoopRun designRun = null;
        ClosedLoopRun targetRun = null;
        LoopStability designStability = null;
        LoopStability targetStability = null;
        double refStep = 0;
        double refError = 0;
        StepTest steps = null;
        List<Finding> stepFindings = List.of();
        if (loop.hasProcess()) {
            ProcessModel p = loop.process();
            double low = belowLowestCrossover(bandBottom(lawBand, p), continuousLoop(designLaw, p),
                    p.integrators() + (designLaw.terms().hasIntegral() ? 1 : 0));
            Double sourceScan = loop.sourceScanSeconds();
            if (sourceScan != null) {
                PidSetting src = conversion.sourceSetting();
                PulseLaw sourcePulse = PulseLaw.of(src, loop.sourceForm().filter().placement(),
                        loop.sourceForm().algorithm(), sourceScan);
                SampledStateSpace sampled = p.sampled(sourceScan);
                designMargins = MarginAnalysis.over(FrequencyBand.belowNyquist(Math.min(low, 0.1 / sourceScan),
                        sourceScan)).analyze(sampledLoop(sourcePulse, sampled));
            } else {
                LoopResponse design = continuousLoop(designLaw, p);
                FrequencyBand band = MarginAnalysis.reachingNegligibleGain(design,
                        FrequencyBand.of(low, Math.max(continuousTop(designLaw, p), 10 * low)));
                designMargins = MarginAnalysis.over(band).analyze(design);
                TransferFunction rational = designLaw.feedback().times(p.rationalPart());
                if (rational.denominator().degree() > rational.numerator().degree()) {
                    designMargins = designMargins.withSensitivityAtLeastOne(band.highRadPerSecond());
                }
            }
            SampledStateSpace sampledTarget = p.sampled(h);
            targetMargins = MarginAnalysis.over(FrequencyBand.belowNyquist(Math.min(low, 0.1 / h), h))
                    .analyze(sampledLoop(targetPulse, sampledTarget));
            // stability from the closed-loop poles, never from the margins alone
            targetStability = SampledStability.of(new SampledOpenLoop(targetPulse, sampledTarget));
            designStability = sourceScan != null
                    ? SampledStability.of(new SampledOpenLoop(sourcePulseOf(loop, conversion, sourceScan), p.sampled(sourceScan)))
                    : ContinuousStability.of(designLaw.feedback().times(p.rationalPart()), p.deadTimeSeconds(), low);
            ActionRule.check(designLaw.terms(), p.lowFrequencyGain(), p.integrators() > 0).ifPresent(findings::add);
            findings.addAll(StabilityRule.evaluate(designStability, targetStability));

            double horizon = Double.isNaN(horizonSeconds)
                    ? horizon(designMargins, targetMargins, designLaw, p) : horizonSeconds;
            horizon = Math.min(horizon, MAX_TARGET_STEPS * h);
            StepTest test = StepTest.standard(horizon);
            // sampled loops are judged on the continuous PV between scans, not only at the scan instants
            StepChoice choice = StepChoice.run(test, target, entered, h, sampledTarget, p.rationalPart(),
                    p.deadTimeSeconds(), targetStability.isStable());
            targetRun = choice.targetRun();
            steps = choice.steps();
            stepFindings = choice.findings();
            test = steps;
            if (sourceScan != null) {
                designRun = LoopSimulator.runBetweenScans(ScanController.of(loop.sourceForm(),
                        conversion.sourceSetting(), sourceScan), p.rationalPart(), p.deadTimeSeconds(), sourceScan, test);
                refStep = sourceScan;
            } else {
                refStep = referenceStep(horizon, conversion.sourceSetting(), p);
                PidSetting src = conversion.sourceSetting();
                if (src.filterSeconds() == 0 && src.derivative() != 0) {
                    // an unfiltered derivative cannot be simulated as such: filter it at the reference step
                    src = src.withFilterSeconds(refStep);
                }
                DiscreteAlgorithm reference = referenceAlgorithm(loop.sourceForm().algorithm());
                var placement = loop.sourceForm().filter().placement();
                ClosedLoopRun fine = LoopSimulator.run(ScanController.limited(src, placement, reference, refStep),
                        p.sampled(refStep), test);
                ClosedLoopRun coarse = LoopSimulator.run(ScanController.limited(src, placement, reference,
                        2 * refStep), p.sampled(2 * refStep), test);
                Richardson.Result extrapolated = Richardson.extrapolate(fine, coarse);
                designRun = extrapolated.run();
                refError = extrapolated.fineErrorPercent();
            }
            double sp = test.operatingPvPercent() + test.setpointStepPercent();
            ds = StepMetrics.ofSetpointStep(designRun.setpoint(), test.operatingPvPercent(), sp);
            dl = StepMetrics.ofLoadStep(designRun.load(), test.operatingPvPercent(), 0.02 * test.loadStepPercent());
            ts = StepMetrics.ofSetpointStep(targetRun.setpoint(), test.operatingPvPercent(), sp);
            tl = StepMetrics.ofLoadStep(targetRun.load(), test.operatingPvPercent(), 0.02 * test.loadStepPercent());
        }
        FrequencyBand mismatchBand = mismatchBand(lawBand, designLaw, h, designMargins);
        // what the loop sees: the design law against the controller as run, feedback path
        LawDeviation mismatch = ControllerMismatch.over(designLaw, targetPulse, mismatchBand, true);
        // what the scan alone changes: the target's own continuous law against its discrete run
        LawDeviation discretization = ControllerMismatch.over(conversion.enteredLaw(), targetPulse, mismatchBand);
        ControllerMismatch.Curve curve = ControllerMismatch.curve(designLaw, targetPulse, lawBand, 120);
        findings.addAll(CheckRules.evaluate(new CheckRules.Inputs(target, h, facts, designMargins, targetMargins,
                discretization, mismatchBand.highRadPerSecond(), targetStability == null || targetStability.isStable()),
                policy));
        findings.addAll(stepFindings);
        if (targetRun != null) {
            findings.addAll(ResponseRules.evaluate(new ResponseRules.Inputs(designStability.isStable() && targetStability.isStable(), ds, ts, dl, tl,
                    h, targetRun.setpoint().timeSeconds(targetRun.setpoint().size() - 1), steps.loadStepPercent()),
                    policy));
        }
        if (targetRun != null && conversion.enteredLaw().terms().i() == 0) {
            double simulatedSeconds = targetRun.setpoint().timeSeconds(targetRun.setpoint().size() - 1);
            findings.add(new Finding(org.loopform.findings.Topic.ROBUSTNESS, org.loopform.findings.Severity.INFO,
                    simulatedSeconds, null, "s", "common practice", "The controller has no integral action, so the loop"
                    + " holds a steady offset after a step: its IAE grows with the simulated time ("
                    + org.loopform.units.Numbers.significant(simulatedSeconds, 4) + " s here) and compares only between"
                    + " design and target, not with other loops."));
        }
        return new CheckResult(loop, h, conversion, designMargins, targetMargins, ds, dl, ts, tl, designRun, targetRun,
                mismatch, curve, refStep, refError, findings, steps, designStability, targetStability);
    }

    /**
     * Where the controllers are compared: from the tuning's lowest corner up to its derivative filter
     * corner (the highest corner without a filter), cut at the Nyquist frequency and, with a model,
     * at ten times the crossover; above that the loop no longer follows the controller.
     */
    private static FrequencyBand mismatchBand(FrequencyBand lawBand, ControlLaw law,
                                                               double h, LoopMargins design) {
        double top = law.terms().tf() > 0 ? 1.0 / law.terms().tf() : lawBand.highRadPerSecond();
        top = Math.min(top, Math.PI / h);
        if (design != null && design.crossoverRadPerSecond().isPresent()) {
            top = Math.min(top, MISMATCH_CROSSOVERS * design.crossoverRadPerSecond().getAsDouble());
        }
        double low = Math.min(lawBand.lowRadPerSecond(), top / 100);
        return new FrequencyBand(low, top);
    }

    private static PulseLaw sourcePulseOf(LoopSpec loop, Conversion conversion, double sourceScan) {
        return PulseLaw.of(conversion.sourceSetting(), loop.sourceForm().filter().placement(),
                loop.sourceForm().algorithm(), sourceScan);
    }

    private static PidSetting enteredSetting(Conversion c, FormDefinition target, WritingContext ctx) {
        try {
            return FormCodec.decode(target, FormCodec.asText(c.entered()), ctx, "target");
        } catch (FormException e) {
            return c.targetSetting(); // the conversion already reported that rounding breaks the tuning
        }
    }

    /** The design loop runs the law on a fine step, trapezoidal integral and ramp-invariant filter, with clamping. */
    private static DiscreteAlgorithm referenceAlgorithm(DiscreteAlgorithm source) {
        return new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.TRAPEZOIDAL, Discretization.RAMP_INVARIANT,
                AntiWindup.CLAMPING, 0.0, source.outputLowPercent(), source.outputHighPercent(), List.of(), 0.0,
                Double.MAX_VALUE);
    }

    private static double referenceStep(double horizon, PidSetting s, ProcessModel p) {
        double step = horizon / REFERENCE_STEPS;
        if (s.filterSeconds() > 0) {
            // the coarse run (2 steps) still resolves the filter: a step-invariant pole of exp(-1)
            step = Math.min(step, s.filterSeconds() / 2);
        }
        // no rule for the dead time: the sampling is exact for any dead time, whole scans or not
        return Math.max(step, horizon / (4.0 * MAX_TARGET_STEPS));
    }

    private static double horizon(LoopMargins design, LoopMargins target, ControlLaw law, ProcessModel p) {
        double wc = design.crossoverRadPerSecond().orElse(target.crossoverRadPerSecond().orElse(Double.NaN));
        if (Double.isFinite(wc) && wc > 0) {
            return Math.max(HORIZON_CROSSOVERS / wc, 5 * p.deadTimeSeconds());
        }
        double ti = law.terms().i() != 0 ? Math.abs(law.terms().p() / law.terms().i()) : 0;
        return 20 * Math.max(ti, p.deadTimeSeconds() + 1.0);
    }

    /**
     * Bottom of the band, design and target alike: a decade below the band the tuning implies
     * (two below its lowest corner) and two decades below the process's lowest nonzero corner,
     * so an integrating or conditionally stable loop's phase has settled on its low-frequency
     * branch there and no crossing lies below.
     */
    static double bandBottom(FrequencyBand lawBand, ProcessModel p) {
        double low = lawBand.lowRadPerSecond() / 10;
        var rational = p.rationalPart();
        low = Math.min(low, lowestCorner(rational.numerator()) / 100);
        low = Math.min(low, lowestCorner(rational.denominator()) / 100);
        return low;
    }

    /**
     * A bottom low enough that no gain crossover lies below it: with q integrators in the loop |L| grows
     * as 1/omega^q below every corner, so where |L| is still below {@link #LOW_END_LOOP_GAIN} at the
     * bottom, the bottom is moved down until it would be (|L| omega^q is constant down there).
     */
    static double belowLowestCrossover(double low, LoopResponse loop, int integrators) {
        if (integrators <= 0) {
            return low;
        }
        double[] l = new double[2];
        loop.at(low, l);
        double magnitude = Math.hypot(l[0], l[1]);
        if (magnitude >= LOW_END_LOOP_GAIN || !(magnitude > 0)) {
            return low;
        }
        return low * Math.pow(magnitude / LOW_END_LOOP_GAIN, 1.0 / integrators);
    }

    /** |L| at the bottom of the band, well above 1 so that every gain crossover lies above it. */
    static final double LOW_END_LOOP_GAIN = 10;

    /**
     * Top of the continuous band before it is raised to where |L| is negligible: a decade above
     * the band the tuning implies (so past the derivative filter corner 1/Tf) and a decade above
     * the process's highest corner and 1/L with dead time L. The margin search's grid follows the
     * dead-time phase however fast it turns, so the top is not cut for it.
     */
    static double continuousTop(ControlLaw law, ProcessModel p) {
        double high = TuningBand.implied(law.terms(), 0).highRadPerSecond() * 10;
        var rational = p.rationalPart();
        high = Math.max(high, 10 * highestCorner(rational.numerator()));
        high = Math.max(high, 10 * highestCorner(rational.denominator()));
        if (p.deadTimeSeconds() > 0) {
            high = Math.max(high, 10 / p.deadTimeSeconds());
        }
        return high;
    }

    /**
     * An upper bound on the magnitudes of the roots of {@code a}, Fujiwara's bound
     * {@code 2 max_i |a_(n-i) / a_n|^(1/i)} (M. Fujiwara, Tohoku Math. J. 10, 1916 - from memory;
     * at most twice the largest root for a polynomial with real negative roots). 0 for a constant.
     */
    static double highestCorner(org.loopform.lti.Polynomial a) {
        int n = a.degree();
        double bound = 0;
        for (int i = 1; i <= n; i++) {
            bound = Math.max(bound, Math.pow(Math.abs(a.coefficient(n - i) / a.coefficient(n)), 1.0 / i));
        }
        return 2 * bound;
    }

    /**
     * A lower bound on the magnitudes of the nonzero roots of {@code a}: Fujiwara's bound applied
     * to the reversed polynomial, its roots' reciprocals. Infinity when {@code a} has no nonzero root.
     */
    static double lowestCorner(org.loopform.lti.Polynomial a) {
        int n = a.degree();
        int m = 0;
        while (m < n && a.coefficient(m) == 0) {
            m++; // roots at the origin (integrators) have no corner
        }
        double bound = 0;
        for (int i = 1; i <= n - m; i++) {
            bound = Math.max(bound, Math.pow(Math.abs(a.coefficient(m + i) / a.coefficient(m)), 1.0 / i));
        }
        return bound > 0 ? 1 / (2 * bound) : Double.POSITIVE_INFINITY;
    }

    private static LoopResponse continuousLoop(ControlLaw law, ProcessModel p) {
        double[] c = new double[2];
        double[] g = new double[2];
        return (w, out) -> {
            law.feedbackAt(w, c);
            p.responseAt(w, g);
            out[0] = c[0] * g[0] - c[1] * g[1];
            out[1] = c[0] * g[1] + c[1] * g[0];
        };
    }

    private static LoopResponse sampledLoop(PulseLaw controller, SampledStateSpace p) {
        double[] c = new double[2];
        double[] g = new double[2];
        SampledStateSpace.Workspace work = p.newWorkspace();
        return (w, out) -> {
            controller.feedbackAt(w, c);
            p.responseAt(w, work, g);
            out[0] = c[0] * g[0] - c[1] * g[1];
            out[1] = c[0] * g[1] + c[1] * g[0];
        };
    }
}

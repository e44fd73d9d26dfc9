package org.loopform.audit;

import java.util.ArrayList;
import java.util.List;
import org.loopform.analysis.ControllerMismatch;
import org.loopform.law.TuningBand;
import org.loopform.lti.FrequencyBand;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.LoopResponse;
import org.loopform.analysis.MarginAnalysis;
import org.loopform.analysis.StepMetrics;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.CheckRules;
import org.loopform.findings.Finding;
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

        List<Finding> findings = new ArrayList<>(conversion.findings());
        LoopMargins designMargins = null;
        LoopMargins targetMargins = null;
        StepMetrics ds = null;
        StepMetrics dl = null;
        StepMetrics ts = null;
        StepMetrics tl = null;
        ClosedLoopRun designRun = null;
        ClosedLoopRun targetRun = null;
        double refStep = 0;
        double refError = 0;
        if (loop.hasProcess()) {
            ProcessModel p = loop.process();
            double low = lawBand.lowRadPerSecond() / 10;
            double high = continuousTop(designLaw, p);
            Double sourceScan = loop.sourceScanSeconds();
            if (sourceScan != null) {
                PidSetting src = conversion.sourceSetting();
                PulseLaw sourcePulse = PulseLaw.of(src, loop.sourceForm().filter().placement(),
                        loop.sourceForm().algorithm(), sourceScan);
                SampledStateSpace sampled = p.sampled(sourceScan);
                designMargins = MarginAnalysis.over(FrequencyBand.belowNyquist(Math.min(low, 0.1 / sourceScan),
                        sourceScan)).analyze(sampledLoop(sourcePulse, sampled));
            } else {
                designMargins = MarginAnalysis.over(FrequencyBand.of(low, high)).analyze(continuousLoop(designLaw, p));
            }
            SampledStateSpace sampledTarget = p.sampled(h);
            targetMargins = MarginAnalysis.over(FrequencyBand.belowNyquist(Math.min(low, 0.1 / h), h))
                    .analyze(sampledLoop(targetPulse, sampledTarget));

            double horizon = Double.isNaN(horizonSeconds)
                    ? horizon(designMargins, targetMargins, designLaw, p) : horizonSeconds;
            horizon = Math.min(horizon, MAX_TARGET_STEPS * h);
            StepTest test = StepTest.standard(horizon);
            if (targetMargins.stability() == org.loopform.analysis.ClosedLoopStability.UNDETERMINED
                    && LoopSimulator.runsAway(ScanController.unlimited(entered, target.filter().placement(),
                    target.algorithm(), h), sampledTarget, test)) {
                targetMargins = withStability(targetMargins, org.loopform.analysis.ClosedLoopStability.UNSTABLE);
            }
            // sampled loops are judged on the continuous PV between scans, not only at the scan instants
            targetRun = LoopSimulator.runBetweenScans(ScanController.of(target, entered, h), p.rationalPart(),
                    p.deadTimeSeconds(), h, test);
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
                discretization, mismatchBand.highRadPerSecond()), policy));
        if (targetRun != null && conversion.enteredLaw().terms().i() == 0) {
            double simulatedSeconds = targetRun.setpoint().timeSeconds(targetRun.setpoint().size() - 1);
            findings.add(new Finding(org.loopform.findings.Topic.ROBUSTNESS, org.loopform.findings.Severity.INFO,
                    simulatedSeconds, null, "s", "common practice", "The controller has no integral action, so the loop"
                    + " holds a steady offset after a step: its IAE grows with the simulated time ("
                    + org.loopform.units.Numbers.significant(simulatedSeconds, 4) + " s here) and compares only between"
                    + " design and target, not with other loops."));
        }
        return new CheckResult(loop, h, conversion, designMargins, targetMargins, ds, dl, ts, tl, designRun, targetRun,
                mismatch, curve, refStep, refError, findings);
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

    private static LoopMargins withStability(LoopMargins m, org.loopform.analysis.ClosedLoopStability s) {
        return new LoopMargins(m.gainMargin(), m.phaseCrossoverRadPerSecond(), m.phaseMarginDegrees(),
                m.crossoverRadPerSecond(), m.delayMarginSeconds(), m.maximumSensitivity(),
                m.maximumSensitivityRadPerSecond(), s);
    }

    private static PidSetting enteredSetting(Conversion c, FormDefinition target, WritingContext ctx) {
        try {
            return FormCodec.decode(target, FormCodec.asText(c.entered()), ctx, "target");
        } catch (FormException e) {
            return c.targetSetting(); // the conversion already reported that rounding breaks the tuning
        }
    }

    /** The design loop runs the law on a fine step, trapezoidal integral and step-invariant filter, with clamping. */
    private static DiscreteAlgorithm referenceAlgorithm(DiscreteAlgorithm source) {
        return new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.TRAPEZOIDAL, Discretization.STEP_INVARIANT,
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
     * Top of the continuous band: a decade above the law's corners and above the process's own
     * time scale (its dead time, and the sum of its pole magnitudes, den[n-1]/den[n] in ascending
     * powers), and no more than 20/L with dead time L (the phase then turns too fast for the grid).
     */
    private static double continuousTop(ControlLaw law, ProcessModel p) {
        double high = TuningBand.implied(law.terms(), 0).highRadPerSecond() * 10;
        var den = p.rationalPart().denominator();
        int n = den.degree();
        if (n >= 1 && den.coefficient(n) != 0) {
            high = Math.max(high, 10 * Math.abs(den.coefficient(n - 1) / den.coefficient(n)));
        }
        if (p.deadTimeSeconds() > 0) {
            high = Math.max(high, 10 / p.deadTimeSeconds());
            high = Math.min(high, 20 / p.deadTimeSeconds());
        }
        return high;
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

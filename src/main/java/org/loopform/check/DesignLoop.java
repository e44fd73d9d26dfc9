package org.loopform.check;

import java.util.List;
import org.loopform.analysis.ContinuousStability;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.LoopResponse;
import org.loopform.analysis.LoopStability;
import org.loopform.analysis.MarginAnalysis;
import org.loopform.analysis.SampledStability;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.AntiWindup;
import org.loopform.form.Conversion;
import org.loopform.form.DiscreteAlgorithm;
import org.loopform.form.Discretization;
import org.loopform.form.PidSetting;
import org.loopform.law.ControlLaw;
import org.loopform.lti.FrequencyBand;
import org.loopform.lti.SampledStateSpace;
import org.loopform.lti.TransferFunction;
import org.loopform.process.ProcessModel;
import org.loopform.scan.PulseLaw;
import org.loopform.scan.ScanController;
import org.loopform.simulate.ClosedLoopRun;
import org.loopform.simulate.LoopSimulator;
import org.loopform.simulate.Richardson;
import org.loopform.simulate.StepTest;

/**
 * The design loop of one check: the source law with the process, continuous, or the source's own
 * algorithm at its own scan when the loop gives one. Its margins and stability are evaluated when
 * it is made; {@link #evaluate} runs the steps. A continuous design loop is simulated on a fine
 * step and twice that, then extrapolated (Richardson).
 */
final class DesignLoop {

    /** Steps of the design loop's fine reference run over the horizon (a second run takes half as many). */
    static final int REFERENCE_STEPS = 2000;

    private final LoopSpec loop;
    private final Conversion conversion;
    private final ProcessModel process;
    private final LoopMargins margins;
    private final LoopStability stability;

    private DesignLoop(LoopSpec loop, Conversion conversion, ProcessModel process, LoopMargins margins,
                       LoopStability stability) {
        this.loop = loop;
        this.conversion = conversion;
        this.process = process;
        this.margins = margins;
        this.stability = stability;
    }

    /** The design loop of {@code loop} with {@code process}, its crossings searched above {@code lowRadPerSecond}. */
    static DesignLoop of(LoopSpec loop, Conversion conversion, ProcessModel process, double lowRadPerSecond,
                         double exactDelayMarginBelowScans) {
        ControlLaw law = conversion.sourceLaw();
        Double sourceScan = loop.sourceScanSeconds();
        if (sourceScan != null) {
            PulseLaw pulse = sourcePulse(loop, conversion, sourceScan);
            SampledStateSpace sampled = process.sampled(sourceScan);
            MarginAnalysis analysis = MarginAnalysis.over(FrequencyBand.belowNyquist(Math.min(lowRadPerSecond,
                    0.1 / sourceScan), sourceScan));
            LoopMargins margins = analysis.analyze(LoopBand.sampledLoop(pulse, sampled));
            // stability from the closed-loop poles, never from the margins alone (the sampling is immutable: shared)
            LoopStability stability = SampledStability.of(new SampledOpenLoop(pulse, sampled));
            if (stability.isStable()) {
                margins = SampledDelayMargin.exact(margins, pulse, process.rationalPart(), process.deadTimeSeconds(),
                        sourceScan, analysis, exactDelayMarginBelowScans);
            }
            return new DesignLoop(loop, conversion, process, margins, stability);
        }
        LoopResponse response = LoopBand.continuousLoop(law, process);
        FrequencyBand band = MarginAnalysis.reachingNegligibleGain(response, FrequencyBand.of(lowRadPerSecond,
                Math.max(LoopBand.continuousTop(law, process), 10 * lowRadPerSecond)));
        LoopMargins margins = MarginAnalysis.over(band).analyze(response);
        TransferFunction rational = law.feedback().times(process.rationalPart());
        if (rational.denominator().degree() > rational.numerator().degree()) {
            margins = margins.withSensitivityAtLeastOne(band.highRadPerSecond());
        }
        LoopStability stability = ContinuousStability.of(rational, process.deadTimeSeconds(), lowRadPerSecond);
        return new DesignLoop(loop, conversion, process, margins, stability);
    }

    LoopMargins margins() {
        return margins;
    }

    LoopStability stability() {
        return stability;
    }

    /** The design loop's evaluation under {@code test}, and how its reference run was made. */
    record Evaluated(LoopEvaluation evaluation, double referenceStepSeconds, double referenceErrorPercent) {
    }

    /** Runs {@code test} (over {@code horizonSeconds}) on the design loop. */
    Evaluated evaluate(StepTest test, double horizonSeconds) {
        Double sourceScan = loop.sourceScanSeconds();
        if (sourceScan != null) {
            ClosedLoopRun run = LoopSimulator.runBetweenScans(ScanController.of(loop.sourceForm(),
                    conversion.sourceSetting(), sourceScan), process.rationalPart(), process.deadTimeSeconds(),
                    sourceScan, test, stability.isStable());
            return new Evaluated(LoopEvaluation.of(margins, stability, run, test), sourceScan, 0);
        }
        double step = referenceStep(horizonSeconds, conversion.sourceSetting());
        PidSetting src = conversion.sourceSetting();
        if (src.filterSeconds() == 0 && src.derivative() != 0) {
            // an unfiltered derivative cannot be simulated as such: filter it at the reference step
            src = src.withFilterSeconds(step);
        }
        DiscreteAlgorithm reference = referenceAlgorithm(loop.sourceForm().algorithm());
        var placement = loop.sourceForm().filter().placement();
        ClosedLoopRun fine = LoopSimulator.run(ScanController.limited(src, placement, reference, step),
                process.sampled(step), test, stability.isStable());
        ClosedLoopRun coarse = LoopSimulator.run(ScanController.limited(src, placement, reference, 2 * step),
                process.sampled(2 * step), test, stability.isStable());
        Richardson.Result extrapolated = Richardson.extrapolate(fine, coarse);
        return new Evaluated(LoopEvaluation.of(margins, stability, extrapolated.run(), test), step,
                extrapolated.fineErrorPercent());
    }

    private static PulseLaw sourcePulse(LoopSpec loop, Conversion conversion, double sourceScan) {
        return PulseLaw.of(conversion.sourceSetting(), loop.sourceForm().filter().placement(),
                loop.sourceForm().algorithm(), sourceScan);
    }

    /** The design loop runs the law on a fine step, trapezoidal integral and ramp-invariant filter, with clamping. */
    private static DiscreteAlgorithm referenceAlgorithm(DiscreteAlgorithm source) {
        return new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.TRAPEZOIDAL, Discretization.RAMP_INVARIANT,
                AntiWindup.CLAMPING, 0.0, source.outputLowPercent(), source.outputHighPercent(), List.of(), 0.0,
                Double.MAX_VALUE);
    }

    private static double referenceStep(double horizon, PidSetting s) {
        double step = horizon / REFERENCE_STEPS;
        if (s.filterSeconds() > 0) {
            // the coarse run (2 steps) still resolves the filter: a step-invariant pole of exp(-1)
            step = Math.min(step, s.filterSeconds() / 2);
        }
        // no rule for the dead time: the sampling is exact for any dead time, whole scans or not
        return Math.max(step, horizon / (4.0 * LoopCheck.MAX_TARGET_STEPS));
    }
}

package org.loopform.check;

import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.LoopStability;
import org.loopform.analysis.MarginAnalysis;
import org.loopform.analysis.SampledStability;
import org.loopform.form.FormDefinition;
import org.loopform.form.PidSetting;
import org.loopform.lti.FrequencyBand;
import org.loopform.lti.SampledStateSpace;
import org.loopform.process.ProcessModel;
import org.loopform.scan.PulseLaw;
import org.loopform.simulate.StepTest;

/**
 * The target loop of one check: the target's algorithm with the entered tuning at the target scan,
 * the process sampled exactly (zero-order hold, fractional dead time). Its margins and stability
 * are evaluated when it is made; {@link #evaluate} runs the steps, judged on the continuous PV
 * between scans, and picks smaller ones when the output would reach a limit ({@link StepChoice}).
 */
final class TargetLoop {

    private final FormDefinition form;
    private final PidSetting entered;
    private final double scanSeconds;
    private final ProcessModel process;
    private final SampledStateSpace sampled;
    private final LoopMargins margins;
    private final LoopStability stability;

    private TargetLoop(FormDefinition form, PidSetting entered, double scanSeconds, ProcessModel process,
                       SampledStateSpace sampled, LoopMargins margins, LoopStability stability) {
        this.form = form;
        this.entered = entered;
        this.scanSeconds = scanSeconds;
        this.process = process;
        this.sampled = sampled;
        this.margins = margins;
        this.stability = stability;
    }

    /** The target loop running {@code pulse} at {@code scanSeconds}, its crossings searched above {@code lowRadPerSecond}. */
    static TargetLoop of(FormDefinition form, PidSetting entered, PulseLaw pulse, double scanSeconds,
                         ProcessModel process, double lowRadPerSecond, double exactDelayMarginBelowScans) {
        SampledStateSpace sampled = process.sampled(scanSeconds);
        MarginAnalysis analysis = MarginAnalysis.over(FrequencyBand.belowNyquist(Math.min(lowRadPerSecond,
                0.1 / scanSeconds), scanSeconds));
        LoopMargins margins = analysis.analyze(LoopBand.sampledLoop(pulse, sampled));
        // stability from the closed-loop poles, never from the margins alone
        LoopStability stability = SampledStability.of(new SampledOpenLoop(pulse, sampled));
        if (stability.isStable()) {
            // PM / omega_c is exact only for whole scans of extra dead time; the policy reads this one in scans
            margins = SampledDelayMargin.exact(margins, pulse, process.rationalPart(), process.deadTimeSeconds(),
                    scanSeconds, analysis, exactDelayMarginBelowScans);
        }
        return new TargetLoop(form, entered, scanSeconds, process, sampled, margins, stability);
    }

    LoopMargins margins() {
        return margins;
    }

    LoopStability stability() {
        return stability;
    }

    /** The target loop's evaluation, the steps it chose and what the output limits did to them. */
    record Evaluated(LoopEvaluation evaluation, StepChoice choice) {
    }

    /** Runs {@code standard} steps (or smaller ones that keep the output off its limits) on the target loop. */
    Evaluated evaluate(StepTest standard) {
        StepChoice choice = StepChoice.run(standard, form, entered, scanSeconds, sampled, process.rationalPart(),
                process.deadTimeSeconds(), stability.isStable());
        return new Evaluated(LoopEvaluation.of(margins, stability, choice.targetRun(), choice.steps()), choice);
    }
}

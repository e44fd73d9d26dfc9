package org.loopform.check;

import java.util.List;
import java.util.Optional;
import org.loopform.findings.Finding;
import org.loopform.findings.SaturationRules;
import org.loopform.form.FormDefinition;
import org.loopform.form.PidSetting;
import org.loopform.lti.SampledStateSpace;
import org.loopform.scan.ScanController;
import org.loopform.simulate.ClosedLoopRun;
import org.loopform.simulate.LoopSimulator;
import org.loopform.simulate.StepTest;
import org.loopform.simulate.StepTest.OutputExtremes;

/**
 * The steps a check tests the loops with, the target loop's run under them, and what the output
 * limits did. The target loop runs the standard steps first; when its output reaches a limit,
 * the linear (unlimited) loop runs them once, the steps are scaled to keep the output off the
 * limits ({@link StepTest#scaledToStayWithin}) and the target loop runs again. An unstable loop
 * keeps the standard steps: no step keeps it linear.
 */
record StepChoice(StepTest steps, ClosedLoopRun targetRun, List<Finding> findings) {

    StepChoice {
        findings = List.copyOf(findings);
    }

    /**
     * The target's runs, judged on the continuous PV between scans ({@code g} and {@code deadTimeSeconds}
     * the process); the linear trial that sizes the steps reads only the held outputs, so it runs at the
     * scan instants ({@code process}, the same process sampled at the scan).
     */
    static StepChoice run(StepTest standard, FormDefinition target, PidSetting entered, double scanSeconds,
                          SampledStateSpace process, org.loopform.lti.TransferFunction g, double deadTimeSeconds,
                          boolean stable) {
        if (!stable) {
            return new StepChoice(standard, LoopSimulator.runBetweenScans(ScanController.of(target, entered,
                    scanSeconds), g, deadTimeSeconds, scanSeconds, standard, false), List.of());
        }
        double low = target.algorithm().outputLowPercent();
        double high = target.algorithm().outputHighPercent();
        // the run under the standard steps is kept only when its output stays off the limits
        // (OutputExtremes.reaches); one that reaches a limit is cut there
        Optional<ClosedLoopRun> offLimits = LoopSimulator.runBetweenScansOffLimits(ScanController.of(target, entered,
                scanSeconds), g, deadTimeSeconds, scanSeconds, standard, low, high);
        ClosedLoopRun run = offLimits.orElse(null);
        Optional<SaturationRules.LinearOutput> linearOutput = Optional.empty();
        StepTest steps = standard;
        if (offLimits.isEmpty()) {
            ClosedLoopRun linear = LoopSimulator.run(ScanController.unlimited(entered, target.filter().placement(),
                    target.algorithm(), scanSeconds), process, standard, true);
            OutputExtremes linearSetpoint = OutputExtremes.of(linear.setpoint());
            OutputExtremes linearLoad = OutputExtremes.of(linear.load());
            linearOutput = Optional.of(new SaturationRules.LinearOutput(linearSetpoint, linearLoad));
            steps = standard.scaledToStayWithin(linearSetpoint, linearLoad, low, high);
            // the cut run is not kept: the run under the steps chosen (the standard ones again, should the
            // linear loop leave room enough; a loop reaches a limit only once its linear output does)
            run = LoopSimulator.runBetweenScans(ScanController.of(target, entered, scanSeconds), g, deadTimeSeconds,
                    scanSeconds, steps, true);
        }
        List<Finding> findings = SaturationRules.evaluate(new SaturationRules.Inputs(standard, steps, run.setpoint(),
                run.load(), linearOutput, low, high));
        return new StepChoice(steps, run, findings);
    }
}

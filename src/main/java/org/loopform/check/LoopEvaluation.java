package org.loopform.check;

import java.util.Objects;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.LoopStability;
import org.loopform.analysis.StepMetrics;
import org.loopform.simulate.ClosedLoopRun;
import org.loopform.simulate.StepTest;

/**
 * One loop (the design loop or the target loop) evaluated against its process: its margins at
 * every crossing, its stability decided from the closed-loop poles, and its responses to the
 * check's setpoint and load steps (metrics and the run they come from). Every part is present.
 */
public record LoopEvaluation(LoopMargins margins, LoopStability stability, StepMetrics setpoint, StepMetrics load,
                             ClosedLoopRun run) {

    public LoopEvaluation {
        Objects.requireNonNull(margins, "margins");
        Objects.requireNonNull(stability, "stability");
        Objects.requireNonNull(setpoint, "setpoint");
        Objects.requireNonNull(load, "load");
        Objects.requireNonNull(run, "run");
    }

    /**
     * The evaluation of a loop with {@code margins} and {@code stability} that ran {@code test} as
     * {@code run}: the setpoint step's metrics against the stepped setpoint, the load step's with a
     * settling band of 2 % of the load step.
     */
    static LoopEvaluation of(LoopMargins margins, LoopStability stability, ClosedLoopRun run, StepTest test) {
        double operating = test.operatingPvPercent();
        double setpoint = operating + test.setpointStepPercent();
        return new LoopEvaluation(margins, stability, StepMetrics.ofSetpointStep(run.setpoint(), operating, setpoint),
                StepMetrics.ofLoadStep(run.load(), operating, LOAD_SETTLING_BAND * test.loadStepPercent()), run);
    }

    /** The load step's settling band, a share of the load step (the 2 % band of common practice). */
    static final double LOAD_SETTLING_BAND = 0.02;
}

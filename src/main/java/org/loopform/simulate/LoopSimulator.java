package org.loopform.simulate;

import org.loopform.analysis.SampledResponse;
import org.loopform.lti.SampledProcess;
import org.loopform.lti.SampledStateSpace;
import org.loopform.scan.ScanController;

/**
 * Runs a scan controller against a process sampled exactly at the same step (zero-order hold,
 * fractional dead time included): each step the controller reads the PV at the sample instant,
 * its output is held over the step, and the process answers at the next instant. The process is
 * linear about the operating point; the controller works in absolute percent so its output
 * limits act where they would on the plant. The inner loop allocates nothing.
 */
public final class LoopSimulator {

    private LoopSimulator() {
    }

    /** Setpoint-step and load-step runs over the test's horizon. */
    public static ClosedLoopRun run(ScanController controller, SampledStateSpace process, StepTest test) {
        double h = process.scanSeconds();
        int steps = Math.max(2, (int) Math.ceil(test.horizonSeconds() / h));
        SampledProcess plant = process.newProcess();
        SampledResponse sp = simulate(controller, plant, test, steps, h, true);
        SampledResponse load = simulate(controller, plant, test, steps, h, false);
        return new ClosedLoopRun(sp, load, h);
    }

    private static SampledResponse simulate(ScanController c, SampledProcess plant, StepTest test, int steps,
                                            double h, boolean setpointStep) {
        double pv0 = test.operatingPvPercent();
        double u0 = test.operatingOutputPercent();
        double r = pv0 + (setpointStep ? test.setpointStepPercent() : 0.0);
        double load = setpointStep ? 0.0 : test.loadStepPercent();
        c.reset(u0, pv0, pv0);
        plant.reset();
        SampledResponse.Recorder response = SampledResponse.recorder(steps + 1, h);
        double pv = pv0;
        for (int k = 0; k <= steps; k++) {
            double out = c.update(r, pv);
            response.add(pv, out);
            pv = pv0 + plant.step(out - u0 + load);
        }
        return response.toResponse();
    }
}

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

    /**
     * Setpoint-step and load-step runs over the test's horizon. The two runs are independent;
     * they advance side by side in one loop (the setpoint run on a {@link ScanController#fresh}
     * copy of {@code controller}, the load run on {@code controller} itself, which ends in the
     * load run's state), so the processor can overlap their arithmetic.
     */
    public static ClosedLoopRun run(ScanController controller, SampledStateSpace process, StepTest test) {
        double h = process.scanSeconds();
        int steps = Math.max(2, (int) Math.ceil(test.horizonSeconds() / h));
        ScanController spController = controller.fresh();
        SampledProcess spPlant = process.newProcess();
        SampledProcess loadPlant = process.newProcess();
        SampledResponse.Recorder sp = SampledResponse.recorder(steps + 1, h);
        SampledResponse.Recorder load = SampledResponse.recorder(steps + 1, h);

        double pv0 = test.operatingPvPercent();
        double u0 = test.operatingOutputPercent();
        double spSetpoint = pv0 + test.setpointStepPercent();
        double spLoad = 0.0;
        double loadSetpoint = pv0 + 0.0;
        double loadLoad = test.loadStepPercent();
        spController.reset(u0, pv0, pv0);
        controller.reset(u0, pv0, pv0);
        double spPv = pv0;
        double loadPv = pv0;
        for (int k = 0; k <= steps; k++) {
            double spOut = spController.update(spSetpoint, spPv);
            double loadOut = controller.update(loadSetpoint, loadPv);
            sp.add(spPv, spOut);
            load.add(loadPv, loadOut);
            spPv = pv0 + spPlant.step(spOut - u0 + spLoad);
            loadPv = pv0 + loadPlant.step(loadOut - u0 + loadLoad);
        }
        return new ClosedLoopRun(sp.toResponse(), load.toResponse(), h);
    }
}

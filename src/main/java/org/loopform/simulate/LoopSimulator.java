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
 * limits act where they would on the plant. The inner loop allocates nothing. Once a run has
 * settled (PV on its setpoint and output still, within {@link #QUIET_FRACTION} of the step, for
 * {@link #QUIET_SHARE} of the horizon) the rest of the horizon holds those values without being
 * simulated: a settled linear loop stays where it is.
 */
public final class LoopSimulator {

    /** A response within this share of its step of its final value counts as settled (1e-5: its IAE tail is negligible). */
    static final double QUIET_FRACTION = 1e-5;
    /** It must stay so for this share of the horizon (horizon 30 / crossover: 2 / crossover) ... */
    static final double QUIET_SHARE = 1.0 / 15;
    /** ... and at least this many steps, ... */
    static final int MIN_QUIET_STEPS = 20;
    /** ... after the run has left its start by this many settling bands. */
    static final double MOVED_BANDS = 100;

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

    /**
     * True when the loop without output limits runs away: over at least {@link #RUNAWAY_MIN_STEPS}
     * steps of a load step, the largest error in the last third exceeds twice the largest in the
     * first third (a stable loop's error dies away; an unstable one's grows without bound). Used
     * where the frequency-domain test cannot decide (a sampled loop whose gain is still above 1 at
     * the Nyquist frequency).
     */
    public static boolean runsAway(ScanController unlimited, SampledStateSpace process, StepTest test) {
        double h = process.scanSeconds();
        int steps = Math.max(RUNAWAY_MIN_STEPS, (int) Math.ceil(test.horizonSeconds() / h));
        SampledProcess plant = process.newProcess();
        double pv0 = test.operatingPvPercent();
        double u0 = test.operatingOutputPercent();
        unlimited.reset(u0, pv0, pv0);
        double pv = pv0;
        double first = 0;
        double last = 0;
        for (int k = 0; k < steps; k++) {
            double out = unlimited.update(pv0, pv);
            pv = pv0 + plant.step(out - u0 + test.loadStepPercent());
            double e = Math.abs(pv - pv0);
            if (!Double.isFinite(e)) {
                return true;
            }
            if (k < steps / 3) {
                first = Math.max(first, e);
            } else if (k >= 2 * steps / 3) {
                last = Math.max(last, e);
            }
        }
        return last > 2 * first;
    }

    /** The runaway test runs at least this many steps. */
    static final int RUNAWAY_MIN_STEPS = 600;

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
        double quietBand = QUIET_FRACTION * Math.abs(setpointStep ? test.setpointStepPercent() : test.loadStepPercent());
        int quietNeeded = Math.max(MIN_QUIET_STEPS, (int) Math.ceil(test.horizonSeconds() * QUIET_SHARE / h));
        int quiet = 0;
        boolean moved = false;
        double previousOut = u0;
        for (int k = 0; k <= steps; k++) {
            double out = c.update(r, pv);
            response.add(pv, out);
            // settled: PV on its setpoint and the output still, both within a hair of the step, for a
            // good while; the rest of the horizon would only repeat these values
            // a run settles only after it has moved: a load behind a dead time leaves the PV still at first
            moved = moved || Math.abs(pv - pv0) > MOVED_BANDS * quietBand || Math.abs(out - u0) > MOVED_BANDS * quietBand;
            quiet = moved && Math.abs(pv - r) <= quietBand && Math.abs(out - previousOut) <= quietBand ? quiet + 1 : 0;
            previousOut = out;
            if (quiet >= quietNeeded && k < steps) {
                response.fillRemaining(pv, out);
                break;
            }
            pv = pv0 + plant.step(out - u0 + load);
        }
        return response.toResponse();
    }
}

package org.loopform.simulate;

import org.loopform.lti.HeldProcess;
import org.loopform.lti.SampledProcess;
import org.loopform.lti.SampledStateSpace;
import org.loopform.lti.TransferFunction;
import org.loopform.scan.ScanController;

/**
 * Runs a scan controller against a process sampled exactly at the same step (zero-order hold,
 * fractional dead time included): each step the controller reads the PV at the sample instant,
 * its output is held over the step, and the process answers at the next instant. The process is
 * linear about the operating point; the controller works in absolute percent so its output
 * limits act where they would on the plant. The inner loop allocates nothing.
 *
 * <p>Settled tails. A run of a loop proven stable stops being simulated once it has settled, and
 * the rest of the horizon holds its last values: PV on its setpoint and the controller output
 * still, both within {@link #QUIET_FRACTION} of the step, at every scan of a window of the longer
 * of {@link #QUIET_SHARE} of the horizon, {@link #MIN_QUIET_STEPS} scans, and the dead time plus
 * {@link #QUIET_SCANS_PAST_DEAD_TIME} scans. Why the window decides from the full state: over the
 * dead time the delay line fills with the still output, so every input in it is the held one; the
 * process and the controller are then each a finite-order linear system whose input (the held
 * output, the still error) and output were constant over more samples than their order, which
 * by observability puts their inner states at rest (common practice; Kailath, Linear Systems,
 * 1980, sec. 2.3, observability from n outputs - from memory). A loop not proven stable is
 * simulated to the end: a slowly growing mode can sit below any tolerance for a while.
 *
 * <p>{@link #run} records the loop at the scan instants only, which is what the controller sees;
 * {@link #runBetweenScans} also records the continuous PV between them, which is what the plant
 * does (see there).
 */
public final class LoopSimulator {

    /** A response within this share of its step of its final value counts as settled (1e-5: its IAE tail is negligible). */
    static final double QUIET_FRACTION = 1e-5;
    /** It must stay so for this share of the horizon (horizon 30 / crossover: 2 / crossover) ... */
    static final double QUIET_SHARE = 1.0 / 15;
    /** ... and at least this many steps, ... */
    static final int MIN_QUIET_STEPS = 20;
    /** ... after the run has left its start by this many settling bands, ... */
    static final double MOVED_BANDS = 100;
    /** ... and over the dead time plus this many scans (the delay line holds only the still output). */
    static final int QUIET_SCANS_PAST_DEAD_TIME = 5;

    private LoopSimulator() {
    }

    /**
     * Sub-steps between scans per horizon: the continuous PV is resolved at least as finely as the
     * design loop's reference, whose extrapolated run is sampled on horizon / 1000 (audit.LoopCheck
     * runs it on horizon / 2000 and twice that).
     */
    static final int SUBSTEPS_PER_HORIZON = 1000;
    /** Most sub-steps per horizon, whatever the process's own oscillations ask for: bounds the cost. */
    static final int MAX_SUBSTEPS_PER_HORIZON = 200_000;
    /** Longest sub-step against the process's fastest oscillation omega: 0.25 rad of it. */
    static final double OSCILLATION_RADIANS_PER_SUBSTEP = 0.25;

    /**
     * Setpoint-step and load-step runs over the test's horizon, recorded at the scan instants;
     * {@code provenStable} says whether the closed loop was proven stable (only then may a settled
     * tail be left unsimulated).
     */
    public static ClosedLoopRun run(ScanController controller, SampledStateSpace process, StepTest test,
                                    boolean provenStable) {
        double h = process.scanSeconds();
        int steps = Math.max(2, (int) Math.ceil(test.horizonSeconds() / h));
        SampledProcess sampled = process.newProcess();
        Plant plant = new Plant(sampled, null);
        double deadTimeSeconds = process.delayScans() * h + process.fractionalDelaySeconds();
        int quiet = provenStable ? quietScans(test, h, deadTimeSeconds) : NEVER;
        SampledResponse sp = simulate(controller, plant, test, steps, h, true, quiet);
        SampledResponse load = simulate(controller, plant, test, steps, h, false, quiet);
        return new ClosedLoopRun(sp, load, h);
    }

    /**
     * Setpoint-step and load-step runs over the test's horizon with the process {@code g} and
     * dead time {@code deadTimeSeconds} behind the controller's hold, the PV recorded as the
     * continuous process output, between the scans as well as at them ({@link HeldProcess}); the
     * controller still reads the PV at the scan instants only, and its output is held over each
     * scan. The scan instants of the result are the samples of {@link #run}, to rounding.
     *
     * <p>Sub-step rule: the scan's two pieces (before and after the delayed input switches) are cut
     * into equal sub-steps of at most {@link #subStepSeconds}: horizon / {@value #SUBSTEPS_PER_HORIZON},
     * shorter where the process itself oscillates. Accuracy: every sample is the exact continuous
     * PV (zero-order-hold sampling is exact for a held input); between samples the PV is smooth,
     * since every instant where its input switches is a sample, so a peak read from the samples
     * is low by at most {@code max|y''| delta^2 / 8} and the trapezoid IAE is off by at most
     * {@code T max|y''| delta^2 / 12} over the horizon T (the trapezoid rule's error; common
     * practice). For a loop that moves on its crossover time scale, {@code |y''|} of the order of
     * the step times wc^2 with the horizon 30 / wc, that is about 1e-4 of the step: some 0.01
     * points of overshoot (nothing where the peak is at a switch, as for a first-order process).
     * Cost: about max(1000, scans) process sub-steps per run (twice the scans with a fraction of a
     * scan of dead time), against the scans alone for {@link #run}. {@code provenStable} as for {@link #run}.
     */
    public static ClosedLoopRun runBetweenScans(ScanController controller, TransferFunction g, double deadTimeSeconds,
            double scanSeconds, StepTest test, boolean provenStable) {
        int steps = Math.max(2, (int) Math.ceil(test.horizonSeconds() / scanSeconds));
        HeldProcess held = HeldProcess.of(g, deadTimeSeconds, scanSeconds, subStepSeconds(g, test));
        Plant plant = new Plant(null, held);
        int quiet = provenStable ? quietScans(test, scanSeconds, deadTimeSeconds) : NEVER;
        SampledResponse sp = simulate(controller, plant, test, steps, scanSeconds, true, quiet);
        SampledResponse load = simulate(controller, plant, test, steps, scanSeconds, false, quiet);
        return new ClosedLoopRun(sp, load, scanSeconds);
    }

    /**
     * {@link #runBetweenScans} of a loop proven stable, cut short as soon as the controller output
     * written at a scan reaches {@code lowPercent} or {@code highPercent} (at or past it), or the limits act
     * without it (clamping holds the integral while the output stays just inside): then
     * empty, else the run itself, sample for sample the one {@link #runBetweenScans} gives. For a
     * caller that keeps a run only when its output stays off the limits: an output that reaches
     * one is seen at the scan where it does, since the output changes only at the scans, and the
     * rest of that run (and the load run, when the setpoint run reaches a limit) is not simulated.
     */
    public static java.util.Optional<ClosedLoopRun> runBetweenScansOffLimits(ScanController controller,
            TransferFunction g, double deadTimeSeconds, double scanSeconds, StepTest test, double lowPercent,
            double highPercent) {
        int steps = Math.max(2, (int) Math.ceil(test.horizonSeconds() / scanSeconds));
        HeldProcess held = HeldProcess.of(g, deadTimeSeconds, scanSeconds, subStepSeconds(g, test));
        Plant plant = new Plant(null, held);
        int quiet = quietScans(test, scanSeconds, deadTimeSeconds);
        SampledResponse sp = simulate(controller, plant, test, steps, scanSeconds, true, quiet, lowPercent, highPercent);
        if (sp == null) {
            return java.util.Optional.empty();
        }
        SampledResponse load = simulate(controller, plant, test, steps, scanSeconds, false, quiet, lowPercent,
                highPercent);
        return load == null ? java.util.Optional.empty()
                : java.util.Optional.of(new ClosedLoopRun(sp, load, scanSeconds));
    }

    /** A quiet window no run reaches: the loop is simulated to the end of its horizon. */
    private static final int NEVER = Integer.MAX_VALUE;

    /**
     * The scans a run must stay quiet before its tail is taken as settled: the longest of
     * {@link #QUIET_SHARE} of the horizon, {@link #MIN_QUIET_STEPS}, and the dead time plus
     * {@link #QUIET_SCANS_PAST_DEAD_TIME} scans (see the class comment).
     */
    static int quietScans(StepTest test, double scanSeconds, double deadTimeSeconds) {
        int share = (int) Math.ceil(test.horizonSeconds() * QUIET_SHARE / scanSeconds);
        int deadTime = (int) Math.min(NEVER - 1L, (long) Math.ceil(deadTimeSeconds / scanSeconds) + QUIET_SCANS_PAST_DEAD_TIME);
        return Math.max(MIN_QUIET_STEPS, Math.max(share, deadTime));
    }

    /**
     * The longest sub-step between scans: horizon / {@value #SUBSTEPS_PER_HORIZON}, and no more than
     * {@value #OSCILLATION_RADIANS_PER_SUBSTEP} rad of the process's fastest oscillation (a lightly
     * damped mode faster than the loop still has its peaks resolved), but not below horizon /
     * {@value #MAX_SUBSTEPS_PER_HORIZON}.
     */
    static double subStepSeconds(TransferFunction g, StepTest test) {
        double horizon = test.horizonSeconds();
        double step = horizon / SUBSTEPS_PER_HORIZON;
        double oscillation = HeldProcess.fastestOscillationRadPerSecond(g);
        if (oscillation > 0) {
            step = Math.min(step, OSCILLATION_RADIANS_PER_SUBSTEP / oscillation);
        }
        return Math.max(step, horizon / MAX_SUBSTEPS_PER_HORIZON);
    }

    /**
     * A process stepped one scan at a time, at the scan instants or between them, with the sample
     * instants it fills within each scan. One final class, not two subclasses, so that the
     * simulation loop's call stays monomorphic and inlined.
     */
    private static final class Plant {
        private final SampledProcess sampled;
        private final HeldProcess held;
        final double[] offsetsSeconds;
        final double[] between;

        Plant(SampledProcess sampled, HeldProcess held) {
            this.sampled = sampled;
            this.held = held;
            this.offsetsSeconds = held != null ? held.offsetsSeconds() : new double[] {0.0};
            this.between = new double[offsetsSeconds.length - 1];
        }

        void reset() {
            if (held != null) {
                held.reset();
            } else {
                sampled.reset();
            }
        }

        /**
         * Holds {@code u} over scan {@code k} with the step {@code load} at the process input; fills
         * {@link #between}, returns the output at the next scan instant. At the scan instants only, the
         * load enters with the output (behind the dead time, from scan 0); followed between the scans, it
         * reaches the process just after a scan instant, from {@link HeldProcess#blindestOnsetScan()}
         * on, the timing a sampled controller answers latest.
         */
        double scan(double u, double load, int k) {
            if (held == null) {
                return sampled.step(u + load);
            }
            return held.scan(u, k >= held.blindestOnsetScan() ? load : 0.0, between);
        }
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

    private static SampledResponse simulate(ScanController c, Plant plant, StepTest test, int steps,
                                            double h, boolean setpointStep, int quietNeeded) {
        return simulate(c, plant, test, steps, h, setpointStep, quietNeeded, Double.NEGATIVE_INFINITY,
                Double.POSITIVE_INFINITY);
    }

    /**
     * The run, or null as soon as an output written reaches {@code stopLow} or {@code stopHigh}, or (when
     * either is finite) the limits act in a scan without the output reaching them (clamping held the
     * integral: the loop is no longer linear).
     */
    private static SampledResponse simulate(ScanController c, Plant plant, StepTest test, int steps,
                                            double h, boolean setpointStep, int quietNeeded, double stopLow,
                                            double stopHigh) {
        double pv0 = test.operatingPvPercent();
        double u0 = test.operatingOutputPercent();
        double r = pv0 + (setpointStep ? test.setpointStepPercent() : 0.0);
        double load = setpointStep ? 0.0 : test.loadStepPercent();
        c.reset(u0, pv0, pv0);
        plant.reset();
        SampledResponse.Recorder response = SampledResponse.recorder(steps, h, plant.offsetsSeconds);
        double[] between = plant.between;
        double pv = pv0;
        double quietBand = QUIET_FRACTION * Math.abs(setpointStep ? test.setpointStepPercent() : test.loadStepPercent());
        int quiet = 0;
        boolean moved = false;
        double previousOut = u0;
        boolean stops = stopLow > Double.NEGATIVE_INFINITY || stopHigh < Double.POSITIVE_INFINITY;
        for (int k = 0; k <= steps; k++) {
            double out = c.update(r, pv);
            if (!Double.isFinite(out) || !Double.isFinite(pv)) {
                // the controller's own arithmetic overflowed (a forward-difference derivative filter with
                // h > 2 Tf grows each scan, and no output limit bounds its state): an unstable loop, which
                // the stability test reports; the run ends at the last finite sample
                if (stops) {
                    return null;
                }
                response.endHere();
                break;
            }
            if (stops && (out <= stopLow || out >= stopHigh || c.limitsActedLastScan())) {
                return null;
            }
            response.add(pv, out);
            // settled: PV on its setpoint and the output still, both within a hair of the step, for a
            // good while; the rest of the horizon would only repeat these values
            // a run settles only after it has moved: a load behind a dead time leaves the PV still at first
            moved = moved || Math.abs(pv - pv0) > MOVED_BANDS * quietBand || Math.abs(out - u0) > MOVED_BANDS * quietBand;
            quiet = moved && Math.abs(pv - r) <= quietBand && Math.abs(out - previousOut) <= quietBand ? quiet + 1 : 0;
            previousOut = out;
            if (k == steps) {
                break;
            }
            if (quiet >= quietNeeded) {
                response.holdRemaining();
                break;
            }
            double next = pv0 + plant.scan(out - u0, load, k);
            for (int j = 0; j < between.length; j++) {
                response.add(pv0 + between[j], out);
            }
            pv = next;
        }
        return response.toResponse();
    }
}

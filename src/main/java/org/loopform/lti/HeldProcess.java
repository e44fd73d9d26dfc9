package org.loopform.lti;

import java.util.Arrays;

/**
 * A process behind a zero-order hold, followed between the scans: the continuous output at
 * sub-instants of every scan, not only at the scan instants. With dead time
 * {@code L = d h + tau} ({@code 0 <= tau < h}) the input reaching the process during scan k is
 * u(k-d-1) over {@code [k h, k h + tau)} and u(k-d) over {@code [k h + tau, (k+1) h)}. Each of
 * the two pieces is cut into equal sub-steps no longer than the sub-step asked for, and the
 * process is stepped through them with its exact zero-order-hold sampling at that sub-step
 * ({@code Phi = e^(A delta)}, {@code Gamma = int_0^delta e^(A s) ds B}; Astrom &amp; Wittenmark,
 * Computer-Controlled Systems, 3rd ed., 1997, ch. 2, sampling of a continuous system - from
 * memory). The input is constant over every sub-step, so every sub-sample is the continuous
 * output at its instant to rounding, with no approximation; and the instant where the delayed
 * input switches, where the output has a corner, is itself a sub-sample.
 *
 * <p>Samples are taken just before an input switch acts (left limits), as
 * {@link SampledProcess} does at the scan instants, so the two agree there. With direct
 * feedthrough (a biproper process) the output jumps at a switch; the jump shows from the next
 * sub-sample on. Not thread-safe; {@link #scan} allocates nothing. Starts at rest (deviation
 * variables).
 */
public final class HeldProcess {

    /**
     * Sub-step counts are rounded up from a ratio this close to a whole number down to it
     * (rounding noise in {@code h / delta}, never a real fraction of a sub-step).
     */
    private static final double WHOLE_RATIO_TOLERANCE = 1e-9;

    private final int order;
    private final double scanSeconds;
    private final int delayScans;
    private final double fractionSeconds;
    private final int earlySteps;
    private final int lateSteps;
    private final double[] earlyA;
    private final double[] earlyB;
    private final double[] lateA;
    private final double[] lateB;
    private final double[] c;
    private final double d;
    /** Inputs u(k), u(k-1), ..., u(k-d-1): d + 2 slots. */
    private final double[] inputRing;
    private double[] state;
    private double[] nextState;
    private int newest;

    private HeldProcess(StateSpace model, double scanSeconds, DelaySplit delay, double maxSubStepSeconds) {
        this.order = model.order();
        this.scanSeconds = scanSeconds;
        this.delayScans = delay.delayScans();
        this.fractionSeconds = delay.fractionSeconds();
        double lateSeconds = scanSeconds - fractionSeconds;
        this.earlySteps = fractionSeconds > 0 ? pieces(fractionSeconds, maxSubStepSeconds) : 0;
        this.lateSteps = pieces(lateSeconds, maxSubStepSeconds);
        SampledStateSpace late = ZeroOrderHold.of(model, 0.0, lateSeconds / lateSteps);
        this.lateA = late.stateRowMajor().clone();
        this.lateB = late.inputNowVector().clone();
        if (earlySteps > 0) {
            SampledStateSpace early = ZeroOrderHold.of(model, 0.0, fractionSeconds / earlySteps);
            this.earlyA = early.stateRowMajor().clone();
            this.earlyB = early.inputNowVector().clone();
        } else {
            this.earlyA = new double[0];
            this.earlyB = new double[0];
        }
        this.c = model.c();
        this.d = model.d();
        this.inputRing = new double[delayScans + 2];
        this.state = new double[order];
        this.nextState = new double[order];
    }

    /**
     * The proper transfer function {@code g} with dead time {@code deadTimeSeconds} behind a hold
     * of {@code scanSeconds}, followed on sub-steps of at most {@code maxSubStepSeconds} (the
     * scan itself when that is longer).
     */
    public static HeldProcess of(TransferFunction g, double deadTimeSeconds, double scanSeconds,
            double maxSubStepSeconds) {
        if (!(maxSubStepSeconds > 0) || Double.isInfinite(maxSubStepSeconds)) {
            throw new IllegalArgumentException("sub-step must be finite and > 0 s (got " + maxSubStepSeconds + " s)");
        }
        return new HeldProcess(StateSpace.of(g), scanSeconds, DelaySplit.of(deadTimeSeconds, scanSeconds),
                Math.min(maxSubStepSeconds, scanSeconds));
    }

    /**
     * The fastest oscillation of {@code g}'s own modes, rad/s: the largest imaginary part of its
     * poles (roots of the denominator, Laguerre's method), 0 when every pole is real.
     */
    public static double fastestOscillationRadPerSecond(TransferFunction g) {
        double[] den = g.denominator().ascending();
        if (den.length < 3) {
            return 0.0;
        }
        org.apache.commons.math3.complex.Complex[] roots = new org.apache.commons.math3.analysis.solvers
                .LaguerreSolver().solveAllComplex(den, 0.0);
        double fastest = 0;
        for (var root : roots) {
            fastest = Math.max(fastest, Math.abs(root.getImaginary()));
        }
        return fastest;
    }

    private static int pieces(double spanSeconds, double maxSubStepSeconds) {
        double ratio = spanSeconds / maxSubStepSeconds;
        double whole = Math.rint(ratio);
        if (Math.abs(ratio - whole) <= WHOLE_RATIO_TOLERANCE * Math.max(1.0, ratio)) {
            return Math.max(1, (int) whole);
        }
        return Math.max(1, (int) Math.ceil(ratio));
    }

    /** Samples per scan: the scan instant and the sub-instants that follow it within the scan. */
    public int samplesPerScan() {
        return earlySteps + lateSteps;
    }

    /**
     * The sample instants within one scan, seconds after the scan instant: 0 first, then each
     * sub-instant, increasing, all below the scan time.
     */
    public double[] offsetsSeconds() {
        double[] offsets = new double[samplesPerScan()];
        for (int j = 1; j < offsets.length; j++) {
            offsets[j] = j <= earlySteps ? j * fractionSeconds / earlySteps
                    : fractionSeconds + (j - earlySteps) * (scanSeconds - fractionSeconds) / lateSteps;
        }
        return offsets;
    }

    public double scanSeconds() {
        return scanSeconds;
    }

    /** Back to rest: zero state and an empty (zero) delay line. */
    public void reset() {
        Arrays.fill(state, 0.0);
        Arrays.fill(nextState, 0.0);
        Arrays.fill(inputRing, 0.0);
        newest = 0;
    }

    /** The output now, at the current scan instant, before the next input takes effect. */
    public double output() {
        return outputWith(inputRing[slot(delayScans)]);
    }

    /**
     * Applies {@code u} held over the next scan: writes the output at the scan's sub-instants
     * ({@code offsetsSeconds()[1..]}) into {@code between[0 .. samplesPerScan() - 2]} and returns
     * the output at the end of the scan, just before the following input takes effect.
     */
    public double scan(double u, double[] between) {
        int size = inputRing.length;
        newest = newest + 1 == size ? 0 : newest + 1;
        inputRing[newest] = u;
        double arriving = inputRing[slot(delayScans)];
        // u(k-d-1) sits in the slot just after the newest one: the ring holds d + 2 inputs
        double leaving = inputRing[newest + 1 == size ? 0 : newest + 1];
        if (earlySteps == 0 && lateSteps == 1 && order == 1) {
            // one sample a scan, first order: the whole scan in one exact step
            state[0] = lateA[0] * state[0] + lateB[0] * arriving;
            return d * arriving + c[0] * state[0];
        }
        int m = samplesPerScan();
        int written = 0;
        for (int j = 0; j < earlySteps; j++) {
            advance(earlyA, earlyB, leaving);
            // at the switch (j = earlySteps - 1) this is the left limit: the old input still acts
            between[written++] = outputWith(leaving);
        }
        for (int j = 0; j < lateSteps; j++) {
            advance(lateA, lateB, arriving);
            double y = outputWith(arriving);
            if (written < m - 1) {
                between[written++] = y;
            } else {
                return y;
            }
        }
        throw new IllegalStateException("unreachable: a scan has at least one late sub-step");
    }

    private void advance(double[] a, double[] b, double v) {
        if (order == 1) {
            state[0] = a[0] * state[0] + b[0] * v;
            return;
        }
        if (order == 2) {
            // the loop below written out, term for term in the same order (same rounding)
            double x0 = state[0];
            double x1 = state[1];
            state[0] = b[0] * v + a[0] * x0 + a[1] * x1;
            state[1] = b[1] * v + a[2] * x0 + a[3] * x1;
            return;
        }
        for (int i = 0; i < order; i++) {
            double sum = b[i] * v;
            int row = i * order;
            for (int j = 0; j < order; j++) {
                sum += a[row + j] * state[j];
            }
            nextState[i] = sum;
        }
        double[] swap = state;
        state = nextState;
        nextState = swap;
    }

    private double outputWith(double input) {
        if (order == 2) {
            return d * input + c[0] * state[0] + c[1] * state[1];
        }
        double y = d * input;
        for (int i = 0; i < order; i++) {
            y += c[i] * state[i];
        }
        return y;
    }

    /** Ring slot of the input {@code age} scans older than the newest one. */
    private int slot(int age) {
        int s = newest - age;
        return s < 0 ? s + inputRing.length : s;
    }
}

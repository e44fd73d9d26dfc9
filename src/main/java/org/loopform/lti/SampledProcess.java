package org.loopform.lti;

/**
 * A running sampled process: the state of a {@link SampledStateSpace} and a ring buffer of the
 * inputs still in its delay line. {@link #step} is allocation-free. Not thread-safe; use one per
 * simulation. Starts at rest: zero state, zero past inputs (deviation variables).
 */
public final class SampledProcess {

    private final SampledStateSpace model;
    private final int order;
    private final double[] a;
    private final double[] b0;
    private final double[] b1;
    private final double[] c;
    private final double d;
    private final int delayScans;
    /** Inputs u(k), u(k-1), ..., u(k-d-1): d + 2 slots. */
    private final double[] inputRing;
    private double[] state;
    private double[] nextState;
    private int newest;

    public SampledProcess(SampledStateSpace model) {
        this.model = model;
        this.order = model.order();
        this.a = model.stateRowMajor().clone();
        this.b0 = model.inputNowVector().clone();
        this.b1 = model.inputPreviousVector().clone();
        this.c = model.outputVector().clone();
        this.d = model.d();
        this.delayScans = model.delayScans();
        this.inputRing = new double[delayScans + 2];
        this.state = new double[order];
        this.nextState = new double[order];
    }

    public SampledStateSpace model() {
        return model;
    }

    /** Back to rest: zero state and an empty (zero) delay line. */
    public void reset() {
        java.util.Arrays.fill(state, 0.0);
        java.util.Arrays.fill(nextState, 0.0);
        java.util.Arrays.fill(inputRing, 0.0);
        newest = 0;
    }

    /**
     * Applies {@code u} held over the next scan and returns the output at the end of that scan,
     * sampled just before the following input takes effect.
     */
    public double step(double u) {
        int size = inputRing.length;
        newest = newest + 1 == size ? 0 : newest + 1;
        inputRing[newest] = u;
        double arriving = inputRing[slot(delayScans)];
        // u(k-d-1) sits in the slot just after the newest one: the ring holds d + 2 inputs
        double leaving = inputRing[newest + 1 == size ? 0 : newest + 1];
        if (order == 1) {
            // the first-order case written out, in the same order of operations as the general one
            double x = b0[0] * arriving + b1[0] * leaving;
            x += a[0] * state[0];
            state[0] = x;
            double y = d * arriving;
            return y + c[0] * x;
        }
        if (order == 2) {
            // the second-order case written out, term for term in the general order (same rounding)
            double x0 = state[0];
            double x1 = state[1];
            double n0 = b0[0] * arriving + b1[0] * leaving + a[0] * x0 + a[1] * x1;
            double n1 = b0[1] * arriving + b1[1] * leaving + a[2] * x0 + a[3] * x1;
            state[0] = n0;
            state[1] = n1;
            return d * arriving + c[0] * n0 + c[1] * n1;
        }
        for (int i = 0; i < order; i++) {
            double sum = b0[i] * arriving + b1[i] * leaving;
            int row = i * order;
            for (int j = 0; j < order; j++) {
                sum += a[row + j] * state[j];
            }
            nextState[i] = sum;
        }
        double[] swap = state;
        state = nextState;
        nextState = swap;
        return outputWith(arriving);
    }

    /** The output now, at the current sample instant, before the next input takes effect. */
    public double output() {
        return outputWith(inputRing[slot(delayScans)]);
    }

    /** Copies the current state into {@code out} (length at least the model order). */
    public void stateInto(double[] out) {
        System.arraycopy(state, 0, out, 0, order);
    }

    private double outputWith(double feedthroughInput) {
        double y = d * feedthroughInput;
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

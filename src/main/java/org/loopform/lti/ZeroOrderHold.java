package org.loopform.lti;

import org.apache.commons.math3.linear.MatrixUtils;
import org.apache.commons.math3.linear.RealMatrix;

/**
 * Exact zero-order-hold sampling of a process with dead time {@code L = d h + tau},
 * {@code 0 <= tau < h}. Over one scan the delayed input is u(k-d-1) for the first tau and u(k-d)
 * for the remaining {@code h - tau}, so
 * {@code A = e^(Ac h)}, {@code B0 = int_0^(h-tau) e^(Ac s) ds Bc},
 * {@code B1 = e^(Ac (h-tau)) int_0^tau e^(Ac s) ds Bc}
 * (Astrom &amp; Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 2 - from memory;
 * Wittenmark, "Sampling of a system with a time delay", IEEE Trans. Autom. Control, 1985).
 * The integrals come from one exponential of the block matrix {@code [[Ac, Bc], [0, 0]] t},
 * whose upper blocks are {@code e^(Ac t)} and {@code int_0^t e^(Ac s) ds Bc} (Van Loan,
 * "Computing integrals involving the matrix exponential", IEEE Trans. Autom. Control 23(3), 1978).
 */
public final class ZeroOrderHold {

    private ZeroOrderHold() {
    }

    /** A proper transfer function with dead time, through its controllable canonical realization. */
    public static SampledStateSpace of(TransferFunction g, double deadTimeSeconds, double scanSeconds) {
        return of(StateSpace.of(g), deadTimeSeconds, scanSeconds);
    }

    /** A continuous state-space model whose input arrives after {@code deadTimeSeconds}. */
    public static SampledStateSpace of(StateSpace model, double deadTimeSeconds, double scanSeconds) {
        DelaySplit delay = DelaySplit.of(deadTimeSeconds, scanSeconds);
        int n = model.order();
        double lateSeconds = scanSeconds - delay.fractionSeconds();
        RealMatrix augmented = augmented(model);
        double[][] late = MatrixExponential.of(augmented.scalarMultiply(lateSeconds)).getData();
        double[][] a = block(late, n);
        double[] b0 = column(late, n);
        double[] b1 = new double[n];
        if (delay.fractionSeconds() > 0.0 && n > 0) {
            double[][] early = MatrixExponential.of(augmented.scalarMultiply(delay.fractionSeconds())).getData();
            RealMatrix lateTransition = MatrixUtils.createRealMatrix(a);
            a = lateTransition.multiply(MatrixUtils.createRealMatrix(block(early, n))).getData();
            b1 = lateTransition.operate(column(early, n));
        }
        return new SampledStateSpace(a, b0, b1, model.c(), model.d(), delay, scanSeconds);
    }

    /**
     * First order {@code K e^(-s L) / (1 + s T)} in closed form, state x = y: with
     * {@code a = 1/T, b = K/T}, {@code A = e^(-h/T)}, {@code B0 = K (1 - e^(-(h - tau)/T))},
     * {@code B1 = K e^(-(h - tau)/T) (1 - e^(-tau/T))} (Astrom &amp; Wittenmark, ch. 2, and
     * Wittenmark 1985; the G0, G1 of the first-order example).
     */
    public static SampledStateSpace firstOrder(
            double gain, double timeConstantSeconds, double deadTimeSeconds, double scanSeconds) {
        requireFinite("gain", gain);
        if (!Double.isFinite(timeConstantSeconds) || timeConstantSeconds <= 0.0) {
            throw new IllegalArgumentException("timeConstantSeconds must be finite and > 0 s (got " + timeConstantSeconds + ")");
        }
        DelaySplit delay = DelaySplit.of(deadTimeSeconds, scanSeconds);
        double tau = delay.fractionSeconds();
        double lateDecay = Math.exp(-(scanSeconds - tau) / timeConstantSeconds);
        // 1 - e^(-x) as -expm1(-x): exact to the last bit when x is small (fast scans)
        double lateRise = -Math.expm1(-(scanSeconds - tau) / timeConstantSeconds);
        double earlyRise = -Math.expm1(-tau / timeConstantSeconds);
        double[][] a = {{Math.exp(-scanSeconds / timeConstantSeconds)}};
        double[] b0 = {gain * lateRise};
        double[] b1 = {gain * lateDecay * earlyRise};
        return new SampledStateSpace(a, b0, b1, new double[] {1.0}, 0.0, delay, scanSeconds);
    }

    /**
     * Pure integrator {@code Kv e^(-s L) / s} in closed form, state x = y: {@code A = 1},
     * {@code B0 = Kv (h - tau)}, {@code B1 = Kv tau} (the integrals of the general formula with
     * {@code Ac = 0}).
     */
    public static SampledStateSpace integrator(double slopePerSecond, double deadTimeSeconds, double scanSeconds) {
        requireFinite("slopePerSecond", slopePerSecond);
        DelaySplit delay = DelaySplit.of(deadTimeSeconds, scanSeconds);
        double tau = delay.fractionSeconds();
        double[][] a = {{1.0}};
        double[] b0 = {slopePerSecond * (scanSeconds - tau)};
        double[] b1 = {slopePerSecond * tau};
        return new SampledStateSpace(a, b0, b1, new double[] {1.0}, 0.0, delay, scanSeconds);
    }

    /** {@code [[Ac, Bc], [0, 0]]}, size n+1. */
    private static RealMatrix augmented(StateSpace model) {
        int n = model.order();
        double[][] ac = model.a();
        double[] bc = model.b();
        double[][] m = new double[n + 1][n + 1];
        for (int i = 0; i < n; i++) {
            System.arraycopy(ac[i], 0, m[i], 0, n);
            m[i][n] = bc[i];
        }
        return MatrixUtils.createRealMatrix(m);
    }

    private static double[][] block(double[][] m, int n) {
        double[][] r = new double[n][n];
        for (int i = 0; i < n; i++) {
            System.arraycopy(m[i], 0, r[i], 0, n);
        }
        return r;
    }

    private static double[] column(double[][] m, int n) {
        double[] r = new double[n];
        for (int i = 0; i < n; i++) {
            r[i] = m[i][n];
        }
        return r;
    }

    private static void requireFinite(String name, double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(name + " must be finite (got " + value + ")");
        }
    }
}

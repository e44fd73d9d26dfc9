package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * Sampled processes with fractional dead time against an adaptive ODE integration of the
 * continuous process (Commons Math DormandPrince853, tolerances 1e-13), written directly from
 * each process's differential equation rather than from loopform's realization. Tolerance
 * 1e-9 on outputs of order one: the integrator's local error is about 1e-13 per step and a
 * run has a few hundred steps, so 1e-9 leaves a wide margin while still catching any error in
 * the delay split, which shows at the 1e-2 level.
 * Source: the processes' differential equations (common practice) integrated numerically; the
 * sampling it checks is that of Astrom & Wittenmark, Computer-Controlled Systems, 3rd ed., 1997,
 * ch. 2 (from memory).
 */
@DisplayName("Zero-order hold against a fine numerical integration")
class ZeroOrderHoldFineStepTest {

    private static final double TOL = 1e-9;
    private static final int SCANS = 80;

    /** A piecewise-constant input with steps of both signs and a varying level. */
    private static double[] inputs() {
        double[] u = new double[SCANS];
        for (int k = 0; k < SCANS; k++) {
            u[k] = (k < 3 ? 0.0 : 1.0) + 0.6 * Math.sin(0.45 * k) - (k % 11 == 5 ? 1.3 : 0.0);
        }
        return u;
    }

    private static void assertSamplesMatch(SampledStateSpace sampled, double[] reference, double[] u) {
        SampledProcess p = sampled.newProcess();
        assertThat(p.output()).isCloseTo(reference[0], within(TOL));
        for (int k = 0; k < u.length; k++) {
            double y = p.step(u[k]);
            assertThat(y).as("sample %d", k + 1).isCloseTo(reference[k + 1], within(TOL));
        }
    }

    @Test
    void first_order_with_fractional_dead_time() {
        // T y' + y = K v: K = 2, T = 3 s, L = 1.37 s = 2 scans + 0.37 s at h = 0.5 s
        double[] u = inputs();
        double[] ref = DelayedOde.samples(1, (x, v, dx) -> dx[0] = (2.0 * v - x[0]) / 3.0, x -> x[0], 1.37, 0.5, u);
        assertSamplesMatch(ZeroOrderHold.firstOrder(2.0, 3.0, 1.37, 0.5), ref, u);
        assertSamplesMatch(ZeroOrderHold.of(TransferFunction.ofDescending(new double[] {2}, new double[] {3, 1}), 1.37, 0.5), ref, u);
    }

    @Test
    void underdamped_second_order_with_fractional_dead_time() {
        // T^2 y'' + 2 zeta T y' + y = K v: K = 1.5, T = 2 s, zeta = 0.2, L = 0.73 s, h = 0.4 s
        double t = 2.0;
        double zeta = 0.2;
        double[] u = inputs();
        double[] ref = DelayedOde.samples(2, (x, v, dx) -> {
            dx[0] = x[1];
            dx[1] = (1.5 * v - x[0] - 2 * zeta * t * x[1]) / (t * t);
        }, x -> x[0], 0.73, 0.4, u);
        TransferFunction g = TransferFunction.ofDescending(new double[] {1.5}, new double[] {t * t, 2 * zeta * t, 1});
        assertSamplesMatch(ZeroOrderHold.of(g, 0.73, 0.4), ref, u);
    }

    @Test
    void pure_integrator_with_fractional_dead_time() {
        // y' = Kv v: Kv = 0.1 /s, L = 0.35 s, h = 1 s
        double[] u = inputs();
        double[] ref = DelayedOde.samples(1, (x, v, dx) -> dx[0] = 0.1 * v, x -> x[0], 0.35, 1.0, u);
        assertSamplesMatch(ZeroOrderHold.integrator(0.1, 0.35, 1.0), ref, u);
    }

    @Test
    void integrator_with_lag_and_fractional_dead_time() {
        // Tlag y'' + y' = Kv v: Kv = 0.05 /s, Tlag = 4 s, L = 2.1 s, h = 1 s
        double[] u = inputs();
        double[] ref = DelayedOde.samples(2, (x, v, dx) -> {
            dx[0] = x[1];
            dx[1] = (0.05 * v - x[1]) / 4.0;
        }, x -> x[0], 2.1, 1.0, u);
        TransferFunction g = TransferFunction.ofDescending(new double[] {0.05}, new double[] {4, 1, 0});
        assertSamplesMatch(ZeroOrderHold.of(g, 2.1, 1.0), ref, u);
    }

    @Test
    void three_equal_lags_with_fractional_dead_time() {
        // 1 / (s + 1)^3 as three unit lags in cascade; L = 0.45 s, h = 0.3 s
        double[] u = inputs();
        double[] ref = DelayedOde.samples(3, (x, v, dx) -> {
            dx[0] = v - x[0];
            dx[1] = x[0] - x[1];
            dx[2] = x[1] - x[2];
        }, x -> x[2], 0.45, 0.3, u);
        TransferFunction g = TransferFunction.ofDescending(new double[] {1}, new double[] {1, 3, 3, 1});
        assertSamplesMatch(ZeroOrderHold.of(g, 0.45, 0.3), ref, u);
    }

    @Test
    void lead_lag_numerator_with_fractional_dead_time() {
        // (4s + 1) / ((2s + 1)(s + 1)) = -2 / (2s + 1) + 3 / (s + 1) (partial fractions), two parallel lags;
        // L = 0.25 s, h = 0.2 s
        double[] u = inputs();
        double[] ref = DelayedOde.samples(2, (x, v, dx) -> {
            dx[0] = (v - x[0]) / 2.0;
            dx[1] = v - x[1];
        }, x -> -2 * x[0] + 3 * x[1], 0.25, 0.2, u);
        TransferFunction g = TransferFunction.ofDescending(new double[] {4, 1}, new double[] {2, 3, 1});
        assertSamplesMatch(ZeroOrderHold.of(g, 0.25, 0.2), ref, u);
    }
}

// source: step responses from Laplace transform tables, hand-derived: 1/(T s + 1) gives 1 - e^(-t/T); 1/(s + 1)^3 gives 1 - e^(-t) (1 + t + t^2/2) (inverse transform of 1/(s (s + 1)^3) by partial fractions)
package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;

/** A held process stepped one sample a scan (first order) and through sub-steps (third order), and set back to rest. */
class HeldStepTest {

    private static final double TOL = 1e-12;

    // 1/(2 s + 1), h = 1 s, sub-steps no shorter than the scan: one sample a scan
    @Test
    void a_first_order_lag_one_sample_a_scan_follows_one_minus_e_to_the_minus_t_over_2() {
        HeldProcess p = HeldProcess.of(TransferFunction.ofDescending(new double[] {1}, new double[] {2, 1}), 0, 1.0, 1.0);
        assertThat(p.samplesPerScan()).isEqualTo(1);
        assertThat(p.scanSeconds()).isEqualTo(1.0);
        double[] between = new double[0];
        assertThat(p.scan(1.0, between)).isCloseTo(1 - Math.exp(-0.5), within(TOL));
        assertThat(p.scan(1.0, between)).isCloseTo(1 - Math.exp(-1.0), within(TOL));
        assertThat(p.output()).isCloseTo(1 - Math.exp(-1.0), within(TOL));
        p.reset();
        assertThat(p.output()).isZero();
        assertThat(p.scan(1.0, between)).isCloseTo(1 - Math.exp(-0.5), within(TOL));
    }

    // 1/(s + 1)^3 = 1/(s^3 + 3 s^2 + 3 s + 1), h = 1 s, sub-steps of 0.5 s
    @Test
    void a_third_order_lag_through_sub_steps_follows_its_step_response() {
        HeldProcess p = HeldProcess.of(TransferFunction.ofDescending(new double[] {1}, new double[] {1, 3, 3, 1}), 0,
                1.0, 0.5);
        assertThat(p.samplesPerScan()).isEqualTo(2);
        double[] between = new double[1];
        double end = p.scan(1.0, between);
        assertThat(between[0]).isCloseTo(1 - Math.exp(-0.5) * (1 + 0.5 + 0.125), within(1e-10));
        assertThat(end).isCloseTo(1 - Math.exp(-1.0) * 2.5, within(1e-10));
        end = p.scan(1.0, between);
        assertThat(between[0]).isCloseTo(1 - Math.exp(-1.5) * (1 + 1.5 + 1.125), within(1e-10));
        assertThat(end).isCloseTo(1 - Math.exp(-2.0) * 5, within(1e-10));
        p.reset();
        assertThat(p.output()).isZero();
    }
}

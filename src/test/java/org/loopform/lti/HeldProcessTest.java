package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * The process followed between scans under a zero-order hold, against closed-form step responses
 * (first order K (1 - e^(-t/T)) after the dead time, the integrator's ramp: inverse Laplace
 * transforms, common practice) and against the scan-sampled process (Astrom and Wittenmark,
 * Computer-Controlled Systems, 3rd ed., 1997, ch. 2, sampling with a time delay - from memory for the
 * chapter).
 */
@DisplayName("A process followed between scans")
class HeldProcessTest {

    private static final double TOL = 1e-12;

    /**
     * K/(1 + T s) with dead time L under a unit step held from t = 0 answers
     * {@code K (1 - e^(-(t - L)/T))} for t >= L and 0 before (inverse Laplace transform; common
     * practice). K = 2, T = 3 s, L = 1.3 s at a 1 s scan: the switch falls 0.3 s into each scan.
     */
    @Test
    void a_first_order_lag_has_its_continuous_step_response_at_every_sub_instant() {
        double h = 1.0;
        HeldProcess p = HeldProcess.of(TransferFunction.ofDescending(new double[] {2}, new double[] {3, 1}), 1.3, h,
                0.1);
        double[] offsets = p.offsetsSeconds();
        // 0.3 s before the switch in 3 sub-steps, 0.7 s after it in 7
        assertThat(offsets).hasSize(10);
        assertThat(offsets[3]).isCloseTo(0.3, within(TOL));
        double[] between = new double[offsets.length - 1];
        for (int k = 0; k < 6; k++) {
            double atEnd = p.scan(1.0, between);
            for (int j = 1; j < offsets.length; j++) {
                double t = k * h + offsets[j];
                assertThat(between[j - 1]).as("t = %s s", t).isCloseTo(stepResponse(t), within(TOL));
            }
            assertThat(atEnd).isCloseTo(stepResponse((k + 1) * h), within(TOL));
        }
    }

    private static double stepResponse(double t) {
        return t < 1.3 ? 0.0 : 2 * (1 - Math.exp(-(t - 1.3) / 3));
    }

    @Test
    void agrees_with_the_scan_sampled_process_at_the_scan_instants() {
        TransferFunction g = TransferFunction.ofDescending(new double[] {1, 0.5}, new double[] {4, 3, 1});
        HeldProcess held = HeldProcess.of(g, 2.45, 0.7, 0.05);
        SampledProcess sampled = ZeroOrderHold.of(g, 2.45, 0.7).newProcess();
        double[] between = new double[held.samplesPerScan() - 1];
        for (int k = 0; k < 40; k++) {
            double u = Math.sin(0.37 * k) + (k % 5 == 0 ? 1 : 0);
            assertThat(held.scan(u, between)).isCloseTo(sampled.step(u), within(1e-12));
        }
    }

    /**
     * (2s + 1)/(s + 1) = 2 - 1/(s + 1) has the unit step response 1 + e^(-t) for t > 0 (common
     * practice); the sample at a switch is the left limit, so the jump to 2 shows from the next one.
     */
    @Test
    void a_biproper_process_jumps_after_the_switch_instant() {
        HeldProcess p = HeldProcess.of(TransferFunction.ofDescending(new double[] {2, 1}, new double[] {1, 1}), 0.0,
                1.0, 0.25);
        double[] between = new double[3];
        assertThat(p.output()).isZero();
        double end = p.scan(1.0, between);
        assertThat(between).containsExactly(new double[] {1 + Math.exp(-0.25), 1 + Math.exp(-0.5),
                1 + Math.exp(-0.75)}, within(TOL));
        assertThat(end).isCloseTo(1 + Math.exp(-1), within(TOL));
    }

    @Test
    void a_scan_shorter_than_the_sub_step_is_one_sample_unless_the_delay_splits_it() {
        TransferFunction lag = TransferFunction.ofDescending(new double[] {1}, new double[] {5, 1});
        assertThat(HeldProcess.of(lag, 2.0, 0.5, 1.0).samplesPerScan()).isEqualTo(1);
        assertThat(HeldProcess.of(lag, 2.2, 0.5, 1.0).offsetsSeconds()).containsExactly(new double[] {0, 0.2},
                within(TOL));
    }

    /** s^2 + 0.2 s + 4: poles -0.1 +- i sqrt(3.99) (quadratic formula). */
    @Test
    void finds_the_fastest_oscillation_of_its_poles() {
        TransferFunction resonant = TransferFunction.ofDescending(new double[] {4}, new double[] {1, 0.2, 4});
        assertThat(HeldProcess.fastestOscillationRadPerSecond(resonant)).isCloseTo(Math.sqrt(3.99), within(1e-9));
        TransferFunction twoLags = TransferFunction.ofDescending(new double[] {1}, new double[] {24, 11, 1});
        assertThat(HeldProcess.fastestOscillationRadPerSecond(twoLags)).isCloseTo(0.0, within(1e-9));
    }
}

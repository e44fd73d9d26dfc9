package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.lang.management.ManagementFactory;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;

@DisplayName("A sampled process")
class SampledProcessTest {

    private static final double TOL = 1e-13;

    @Nested
    @DisplayName("samples the output just before the new input takes effect")
    class SampleBeforeOutput {

        // A computer samples the PV, then computes and writes the output (common practice), so
        // a pure gain with no delay answers one scan later and a dead time of exactly 2 scans
        // shows as 3 scans between writing an input and reading it back.
        @Test
        void a_pure_gain_with_two_scans_of_dead_time_answers_three_samples_later() {
            SampledProcess p = ZeroOrderHold.of(TransferFunction.gain(2.0), 2.0, 1.0).newProcess();
            double[] u = {1, 3, -2, 5, 7, 0, 4};
            double[] y = new double[u.length];
            for (int k = 0; k < u.length; k++) {
                y[k] = p.step(u[k]);
            }
            // y[k] is the sample at t = (k+1) h, so it shows u[k - 2]
            assertThat(y).containsExactly(0, 0, 2, 6, -4, 10, 14);
        }

        // (2s + 1)/(s + 1) = 2 - 1/(s + 1); its unit step response is 1 + e^(-t) for t > 0
        // (inverse Laplace transform, common practice)
        @Test
        void a_lead_lag_with_feedthrough_has_the_continuous_step_response_at_each_sample() {
            double h = 0.3;
            SampledProcess p = ZeroOrderHold.of(
                    TransferFunction.ofDescending(new double[] {2, 1}, new double[] {1, 1}), 0.0, h).newProcess();
            assertThat(p.output()).isZero();
            for (int k = 1; k <= 20; k++) {
                assertThat(p.step(1.0)).isCloseTo(1 + Math.exp(-k * h), within(TOL));
            }
        }
    }

    @Test
    void reset_returns_it_to_rest() {
        SampledProcess p = ZeroOrderHold.firstOrder(1.5, 4.0, 2.7, 1.0).newProcess();
        double[] first = new double[12];
        for (int k = 0; k < first.length; k++) {
            first[k] = p.step(k % 3);
        }
        p.reset();
        assertThat(p.output()).isZero();
        for (int k = 0; k < first.length; k++) {
            assertThat(p.step(k % 3)).isEqualTo(first[k]);
        }
    }

    @Test
    void stepping_allocates_nothing() {
        SampledProcess p = ZeroOrderHold.of(
                TransferFunction.ofDescending(new double[] {1}, new double[] {1, 3, 3, 1}), 4.45, 0.3).newProcess();
        com.sun.management.ThreadMXBean threads = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        double sink = 0;
        for (int k = 0; k < 200_000; k++) {
            sink += p.step(Math.sin(k));
        }
        long before = threads.getCurrentThreadAllocatedBytes();
        for (int k = 0; k < 1_000_000; k++) {
            sink += p.step(Math.sin(k));
        }
        long allocatedBytes = threads.getCurrentThreadAllocatedBytes() - before;
        assertThat(sink).isFinite();
        // a million steps; the reading itself may cost a few hundred bytes
        assertThat(allocatedBytes).isLessThan(4_096);
    }

    @Nested
    @DisplayName("pulse frequency response with a fractional dead time")
    class PulseFrequencyResponse {

        // FOPDT sampled with L = d h + tau: x(k+1) = e^(-h/T) x(k) + G0 u(k-d) + G1 u(k-d-1), so
        // H(z) = z^-d (G0 + G1 z^-1) / (z - e^(-h/T)) (Astrom & Wittenmark ch. 2, from memory;
        // G0, G1 as in docs/references.md 5, evaluated here from the published formula)
        @Test
        void matches_the_modified_z_transform_of_a_first_order_process() {
            double k = 1.7;
            double t = 6.0;
            double h = 0.8;
            double delay = 3 * h + 0.35;
            double tau = 0.35;
            double g0 = k * (1 - Math.exp(-(h - tau) / t));
            double g1 = k * Math.exp(-(h - tau) / t) * (1 - Math.exp(-tau / t));
            double pole = Math.exp(-h / t);
            SampledStateSpace s = ZeroOrderHold.of(
                    TransferFunction.ofDescending(new double[] {k}, new double[] {t, 1}), delay, h);
            for (double omega : new double[] {0.01, 0.2, 1.0, 3.5}) {
                double theta = omega * h;
                // numerator (g0 + g1 e^(-i theta)) e^(-i 3 theta), denominator e^(i theta) - pole
                double nRe = g0 * Math.cos(3 * theta) + g1 * Math.cos(4 * theta);
                double nIm = -g0 * Math.sin(3 * theta) - g1 * Math.sin(4 * theta);
                double dRe = Math.cos(theta) - pole;
                double dIm = Math.sin(theta);
                double d2 = dRe * dRe + dIm * dIm;
                double[] r = s.responseAt(omega);
                assertThat(r[0]).isCloseTo((nRe * dRe + nIm * dIm) / d2, within(1e-12));
                assertThat(r[1]).isCloseTo((nIm * dRe - nRe * dIm) / d2, within(1e-12));
            }
        }

        // A third-order process with a fractional delay: the reusable workspace, used again and
        // again in any order of frequencies, gives exactly the allocating path's numbers.
        @Test
        void a_reused_workspace_gives_the_same_numbers_to_the_last_bit() {
            SampledStateSpace s = ZeroOrderHold.of(
                    TransferFunction.ofDescending(new double[] {0.5, 2.0}, new double[] {4.0, 9.0, 5.0, 1.0}), 1.3, 0.4);
            SampledStateSpace.Workspace work = s.newWorkspace();
            double[] out = new double[2];
            for (double omega : new double[] {3.5, 0.01, 1.0, 0.2, 3.5, 7.8}) {
                s.responseAt(omega, work, out);
                assertThat(out).containsExactly(s.responseAt(omega));
            }
        }

        @Test
        void refuses_a_workspace_of_another_order() {
            SampledStateSpace first = ZeroOrderHold.of(
                    TransferFunction.ofDescending(new double[] {1.0}, new double[] {6.0, 1.0}), 0.0, 0.5);
            SampledStateSpace second = ZeroOrderHold.of(
                    TransferFunction.ofDescending(new double[] {1.0}, new double[] {2.0, 3.0, 1.0}), 0.0, 0.5);
            assertThatThrownBy(() -> first.responseAt(0.1, second.newWorkspace(), new double[2]))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("order 2");
        }
    }

    @Nested
    @DisplayName("rejects")
    class Rejects {

        @Test
        void a_scan_time_that_is_not_positive() {
            assertThatThrownBy(() -> ZeroOrderHold.firstOrder(1, 1, 0, 0.0))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("scanSeconds").hasMessageContaining("0.0");
        }

        @Test
        void a_negative_dead_time() {
            assertThatThrownBy(() -> ZeroOrderHold.integrator(1, -0.5, 1.0))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("deadTimeSeconds").hasMessageContaining("-0.5");
        }

        @Test
        void a_dead_time_of_more_scans_than_a_delay_line_holds() {
            assertThatThrownBy(() -> ZeroOrderHold.integrator(1, 1e9, 1e-3))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("scans");
        }
    }

    @Test
    void a_dead_time_of_whole_scans_up_to_rounding_is_whole_scans() {
        // 0.3 / 0.1 is 2.9999999999999996 in binary floating point
        SampledStateSpace s = ZeroOrderHold.firstOrder(1, 1, 0.3, 0.1);
        assertThat(s.delayScans()).isEqualTo(3);
        assertThat(s.fractionalDelaySeconds()).isZero();
        assertThat(s.b1()).containsExactly(0.0);
    }
}

package org.loopform.scan;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.lang.management.ManagementFactory;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.AntiWindup;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;

@DisplayName("A scan controller")
class ScanControllerTest {

    private static final double TOL = 1e-12;

    static List<Setups.Case> cases() {
        return Setups.allCases();
    }

    @Nested
    @DisplayName("starts without a bump")
    class Bumpless {

        // at steady state with no error every term but the integral is at rest, so the output
        // holds (bumpless transfer, common practice)
        @ParameterizedTest
        @MethodSource("org.loopform.scan.ScanControllerTest#cases")
        void holds_its_reset_output_while_setpoint_and_pv_agree(Setups.Case c) {
            for (AlgorithmKind kind : AlgorithmKind.values()) {
                ScanController controller = ScanController.limited(c.setting(), c.placement(), c.algorithm(kind), 0.1);
                controller.reset(37.5, 61.0, 61.0);
                for (int k = 0; k < 50; k++) {
                    assertThat(controller.update(61.0, 61.0)).as("%s scan %d", kind, k).isCloseTo(37.5, within(TOL));
                }
            }
        }

        // without integral action the reset output stays as a bias: u = K (r - y) + bias; by hand
        // K = 2, r - y = 5 at reset: bias = 40 - 10 = 30, then y = 47: u = 2 x 3 + 30 = 36
        @Test
        void a_proportional_only_controller_keeps_its_reset_output_as_a_bias() {
            PidSetting p = Setups.ideal(2.0, Double.POSITIVE_INFINITY, 0.0, 0.0, 1.0, 0.0);
            ScanController c = ScanController.limited(p, FilterPlacement.DERIVATIVE, Setups.algorithm(
                    AlgorithmKind.POSITIONAL, Discretization.BACKWARD, Discretization.BACKWARD), 1.0);
            c.reset(40.0, 50.0, 45.0);
            assertThat(c.update(50.0, 45.0)).isCloseTo(40.0, within(TOL));
            assertThat(c.update(50.0, 47.0)).isCloseTo(36.0, within(TOL));
            assertThat(c.integralPercent()).isCloseTo(30.0, within(TOL));
        }
    }

    // u = C_r r - C_y y with a positive gain for reverse action (form.PidSetting): a PV rising
    // above setpoint lowers the output; a negative gain (direct action) raises it (common practice)
    @Test
    void reverse_action_lowers_the_output_when_the_pv_rises() {
        ScanController reverse = ScanController.unlimited(Setups.ideal(1.5, 20, 0, 0, 1, 0),
                FilterPlacement.DERIVATIVE, Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                        Discretization.BACKWARD), 1.0);
        ScanController direct = ScanController.unlimited(Setups.ideal(-1.5, 20, 0, 0, 1, 0),
                FilterPlacement.DERIVATIVE, Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                        Discretization.BACKWARD), 1.0);
        reverse.reset(50, 50, 50);
        direct.reset(50, 50, 50);
        assertThat(reverse.update(50, 52)).isLessThan(50);
        assertThat(direct.update(50, 52)).isGreaterThan(50);
    }

    @Test
    void update_allocates_nothing() {
        ScanController c = ScanController.limited(Setups.series(1.3, 5.0, 1.1, 0.25, 0.8, 1.0),
                FilterPlacement.DERIVATIVE, Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.TRAPEZOIDAL,
                        Discretization.RAMP_INVARIANT, AntiWindup.BACK_CALCULATION, 0.0), 0.1);
        com.sun.management.ThreadMXBean threads = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        double[] out = new double[2];
        double sink = 0;
        for (int k = 0; k < 200_000; k++) {
            sink += c.update(50, 50 + 30 * Math.sin(0.01 * k));
            c.feedbackAt(0.1 + k % 7, out);
            sink += out[0];
        }
        long before = threads.getCurrentThreadAllocatedBytes();
        for (int k = 0; k < 1_000_000; k++) {
            sink += c.update(50, 50 + 30 * Math.sin(0.01 * k));
            c.setpointAt(0.1 + k % 7, out);
            sink += out[1];
        }
        long allocatedBytes = threads.getCurrentThreadAllocatedBytes() - before;
        assertThat(sink).isFinite();
        // a million scans; the reading itself may cost a few hundred bytes
        assertThat(allocatedBytes).isLessThan(4_096);
    }

    // The filter state decays by the pole 0.78 each scan, through the subnormal doubles (where it
    // is flushed to 0); the output settles on exactly P + I = 50 - 1.
    @Test
    void a_derivative_kick_dies_away_to_exactly_the_proportional_output() {
        ScanController c = ScanController.unlimited(Setups.ideal(1.0, Double.POSITIVE_INFINITY, 2.0, 0.4, 1, 1),
                FilterPlacement.DERIVATIVE, Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                        Discretization.RAMP_INVARIANT), 0.1);
        c.reset(50, 50, 50);
        double first = c.update(50, 51);
        assertThat(first).isCloseTo(50 - 1 - 2.0 * (1 - Math.exp(-0.25)) / 0.1, within(TOL));
        double out = first;
        for (int k = 0; k < 4000; k++) {
            out = c.update(50, 51);
        }
        assertThat(out).isEqualTo(49.0);
    }

    @Test
    void velocity_form_has_no_integral_state_to_show() {
        ScanController c = ScanController.limited(Setups.ideal(1, 10, 0, 0, 1, 0), FilterPlacement.DERIVATIVE,
                Setups.algorithm(AlgorithmKind.VELOCITY, Discretization.BACKWARD, Discretization.BACKWARD), 1.0);
        assertThat(c.integralPercent()).isNaN();
    }

    @Nested
    @DisplayName("rejects")
    class Rejects {

        @Test
        void a_scan_time_that_is_not_positive() {
            assertThatThrownBy(() -> ScanController.limited(Setups.ideal(1, 10, 0, 0, 1, 0), FilterPlacement.DERIVATIVE,
                    Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD, Discretization.BACKWARD), -0.5))
                    .hasMessageContaining("scan time").hasMessageContaining("got -0.5 s");
        }

        @Test
        void a_reset_output_outside_the_limits_only_when_limited() {
            PidSetting s = Setups.ideal(1, 10, 0, 0, 1, 0);
            ScanController limited = ScanController.limited(s, FilterPlacement.DERIVATIVE,
                    Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD, Discretization.BACKWARD), 1.0);
            assertThatThrownBy(() -> limited.reset(120.0, 50, 50)).hasMessageContaining("0.0..100.0 %")
                    .hasMessageContaining("got 120.0 %");
            ScanController unlimited = ScanController.unlimited(s, FilterPlacement.DERIVATIVE,
                    Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD, Discretization.BACKWARD), 1.0);
            unlimited.reset(120.0, 50, 50);
            assertThat(unlimited.update(50, 50)).isCloseTo(120.0, within(TOL));
        }

        @Test
        void a_reset_to_values_that_are_not_finite() {
            ScanController c = ScanController.unlimited(Setups.ideal(1, 10, 0, 0, 1, 0), FilterPlacement.DERIVATIVE,
                    Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD, Discretization.BACKWARD), 1.0);
            assertThatThrownBy(() -> c.reset(50, Double.NaN, 50)).hasMessageContaining("setpoint NaN");
        }
    }
}

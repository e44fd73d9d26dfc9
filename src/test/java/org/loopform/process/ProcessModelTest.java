package org.loopform.process;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.lang.management.ManagementFactory;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

@DisplayName("Process models")
class ProcessModelTest {

    private static final double TOL = 1e-13;
    private static final double[] OMEGAS = {0.0, 0.01, 0.3, 1.0, 7.0};

    private static double magnitude(double[] z) {
        return Math.hypot(z[0], z[1]);
    }

    /** Phase in rad, unwrapped against an expected value. */
    private static double phaseNear(double[] z, double expectedRad) {
        double p = Math.atan2(z[1], z[0]);
        return p + 2 * Math.PI * Math.rint((expectedRad - p) / (2 * Math.PI));
    }

    @Nested
    @DisplayName("first order plus dead time")
    class Fopdt {

        // |G| = K / sqrt(1 + (w T)^2), arg G = -atan(w T) - w L (Seborg, Edgar & Mellichamp,
        // Process Dynamics and Control, 2nd ed., 2004, ch. 14 - from memory)
        @ParameterizedTest(name = "w = {0} rad/s")
        @ValueSource(doubles = {0.0, 0.01, 0.3, 1.0, 7.0})
        void has_the_textbook_frequency_response(double w) {
            FirstOrderPlusDeadTime g = new FirstOrderPlusDeadTime(2.5, 4.0, 1.3);
            double[] r = new double[2];
            g.responseAt(w, r);
            double expectedPhase = -Math.atan(w * 4.0) - w * 1.3;
            assertThat(magnitude(r)).isCloseTo(2.5 / Math.sqrt(1 + w * w * 16), within(TOL));
            assertThat(phaseNear(r, expectedPhase)).isCloseTo(expectedPhase, within(1e-12));
        }

        @Test
        void rejects_a_negative_time_constant_naming_it_and_its_value() {
            assertThatThrownBy(() -> new FirstOrderPlusDeadTime(1, -2, 0))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("timeConstantSeconds").hasMessageContaining("-2.0");
        }

        @Test
        void rejects_a_nan_gain() {
            assertThatThrownBy(() -> new FirstOrderPlusDeadTime(Double.NaN, 2, 0))
                    .hasMessageContaining("gain").hasMessageContaining("NaN");
        }

        @Test
        void rejects_a_negative_dead_time() {
            assertThatThrownBy(() -> new FirstOrderPlusDeadTime(1, 2, -0.1))
                    .hasMessageContaining("deadTimeSeconds").hasMessageContaining("-0.1");
        }
    }

    @Nested
    @DisplayName("second order plus dead time")
    class Sopdt {

        @Test
        void from_time_constants_is_the_product_of_two_lags() {
            SecondOrderPlusDeadTime g = SecondOrderPlusDeadTime.ofTimeConstants(1.3, 2.0, 1.2, 0.77);
            TransferFunction expected = new TransferFunction(Polynomial.constant(1.3),
                    Polynomial.ofAscending(1, 2.0).times(Polynomial.ofAscending(1, 1.2)));
            assertThat(g.rationalPart().sameAs(expected, 1e-14)).isTrue();
            assertThat(g.deadTimeSeconds()).isEqualTo(0.77);
        }

        // K wn^2 / (s^2 + 2 zeta wn s + wn^2) (Seborg, Edgar & Mellichamp 2004, ch. 5 - from memory)
        @Test
        void from_natural_frequency_is_the_standard_second_order_form() {
            SecondOrderPlusDeadTime g = SecondOrderPlusDeadTime.ofNaturalFrequency(2.0, 0.3, 1.5, 0.0);
            TransferFunction expected = new TransferFunction(Polynomial.constant(2.0 * 1.5 * 1.5),
                    Polynomial.ofAscending(1.5 * 1.5, 2 * 0.3 * 1.5, 1));
            assertThat(g.rationalPart().sameAs(expected, 1e-14)).isTrue();
            assertThat(g.naturalFrequencyRadPerSecond()).isCloseTo(1.5, within(TOL));
        }

        // at w = wn the standard form is -i K / (2 zeta): gain K/(2 zeta), phase -90 degrees
        @Test
        void at_the_natural_frequency_lags_ninety_degrees_plus_the_delay() {
            SecondOrderPlusDeadTime g = SecondOrderPlusDeadTime.ofNaturalFrequency(2.0, 0.25, 0.5, 1.0);
            double[] r = new double[2];
            g.responseAt(0.5, r);
            double expectedPhase = -Math.PI / 2 - 0.5;
            assertThat(magnitude(r)).isCloseTo(2.0 / (2 * 0.25), within(TOL));
            assertThat(phaseNear(r, expectedPhase)).isCloseTo(expectedPhase, within(1e-12));
        }

        @Test
        void rejects_a_zero_damping_ratio() {
            assertThatThrownBy(() -> new SecondOrderPlusDeadTime(1, 1, 0, 0)).hasMessageContaining("dampingRatio");
        }
    }

    @Nested
    @DisplayName("integrating plus dead time")
    class Integrating {

        // Kv / (i w (1 + i w Tlag)): gain Kv / (w sqrt(1 + (w Tlag)^2)), phase -90 deg - atan(w Tlag) - w L
        @ParameterizedTest(name = "w = {0} rad/s")
        @ValueSource(doubles = {0.01, 0.3, 1.0, 7.0})
        void has_the_textbook_frequency_response(double w) {
            IntegratingPlusDeadTime g = new IntegratingPlusDeadTime(0.05, 2.0, 3.0);
            double[] r = new double[2];
            g.responseAt(w, r);
            double expectedPhase = -Math.PI / 2 - Math.atan(3 * w) - 2 * w;
            assertThat(magnitude(r)).isCloseTo(0.05 / (w * Math.sqrt(1 + 9 * w * w)), within(TOL));
            assertThat(phaseNear(r, expectedPhase)).isCloseTo(expectedPhase, within(1e-12));
        }

        @Test
        void has_no_lag_unless_given_one() {
            assertThat(new IntegratingPlusDeadTime(0.1, 2.0).lagSeconds()).isZero();
        }
    }

    @Nested
    @DisplayName("general transfer function")
    class General {

        // 1/(s+1)^3 at w = sqrt(3) is -1/8 (its ultimate frequency and gain 8: docs/references.md 10)
        @Test
        void three_equal_lags_cross_minus_180_degrees_at_sqrt_3() {
            GeneralTransferFunction g = new GeneralTransferFunction(
                    TransferFunction.ofDescending(new double[] {1}, new double[] {1, 3, 3, 1}), 0.0);
            double[] r = new double[2];
            g.responseAt(Math.sqrt(3), r);
            assertThat(r[0]).isCloseTo(-0.125, within(TOL));
            assertThat(r[1]).isCloseTo(0.0, within(TOL));
        }

        @Test
        void rejects_an_improper_transfer_function() {
            assertThatThrownBy(() -> new GeneralTransferFunction(
                    TransferFunction.ofDescending(new double[] {1, 0, 0}, new double[] {1, 1}), 0.0))
                    .hasMessageContaining("proper");
        }
    }

    private static List<ProcessModel> examples() {
        return List.of(
                new FirstOrderPlusDeadTime(2.5, 4.0, 1.3),
                SecondOrderPlusDeadTime.ofNaturalFrequency(1.0, 0.4, 0.8, 0.6),
                new IntegratingPlusDeadTime(0.05, 2.0, 3.0),
                new GeneralTransferFunction(TransferFunction.ofDescending(new double[] {4, 1}, new double[] {2, 3, 1}), 0.25));
    }

    @Test
    void every_model_responds_as_its_rational_part_times_the_dead_time() {
        double[] fast = new double[2];
        for (ProcessModel g : examples()) {
            for (double w : OMEGAS) {
                if (w == 0 && g instanceof IntegratingPlusDeadTime) {
                    continue;
                }
                double[] rational = g.rationalPart().responseAt(w);
                g.responseAt(w, fast);
                double c = Math.cos(-w * g.deadTimeSeconds());
                double s = Math.sin(-w * g.deadTimeSeconds());
                assertThat(fast[0]).as("%s at %s", g, w).isCloseTo(rational[0] * c - rational[1] * s, within(1e-12));
                assertThat(fast[1]).as("%s at %s", g, w).isCloseTo(rational[0] * s + rational[1] * c, within(1e-12));
            }
        }
    }

    @Test
    void frequency_response_allocates_nothing() {
        List<ProcessModel> models = examples();
        com.sun.management.ThreadMXBean threads = (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
        double[] out = new double[2];
        double sink = 0;
        for (int round = 0; round < 2; round++) {
            long before = threads.getCurrentThreadAllocatedBytes();
            for (int k = 0; k < 250_000; k++) {
                for (int i = 0; i < models.size(); i++) {
                    models.get(i).responseAt(0.001 * (k + 1), out);
                    sink += out[0];
                }
            }
            long allocatedBytes = threads.getCurrentThreadAllocatedBytes() - before;
            if (round == 1) {
                // the first round warms up the compiler; a million calls in the second must not allocate
                assertThat(allocatedBytes).isLessThan(4_096);
            }
        }
        assertThat(sink).isFinite();
    }
}

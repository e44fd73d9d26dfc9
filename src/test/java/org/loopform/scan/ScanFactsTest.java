package org.loopform.scan;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.form.Discretization;

@DisplayName("Scan facts")
class ScanFactsTest {

    private static final double TOL = 1e-9;

    @Test
    void n_h_over_td_is_h_over_tf() {
        // N = 10, Td = 2 s (Tf = 0.2 s), h = 0.1 s: N h/Td = 0.5, inside the 0.2..0.6 rule of thumb
        // (docs/references.md 4, from memory)
        ScanFacts facts = ScanFacts.of(Setups.ideal(1.0, 10.0, 2.0, 0.2, 1.0, 1.0), Discretization.BACKWARD, 0.1);
        assertThat(facts.nhOverTd()).isCloseTo(0.5, within(TOL));
        assertThat(facts.hasDerivative()).isTrue();
        assertThat(new ScanFacts(0.1, 0.0, 2.0, Discretization.BACKWARD).nhOverTd()).isInfinite();
    }

    @Test
    void a_parallel_setting_gives_its_derivative_time_kd_over_kp() {
        ScanFacts facts = ScanFacts.of(Setups.parallel(4.0, 0.5, 2.0, 0.1, 1.0, 1.0), Discretization.BACKWARD, 0.1);
        assertThat(facts.derivativeTimeSeconds()).isCloseTo(0.5, within(TOL));
        assertThat(facts.nhOverTd()).isCloseTo(1.0, within(TOL));
    }

    @Nested
    @DisplayName("phase lead of the discrete derivative")
    class PhaseLead {

        // (1 - e^(-i w h))/h = (2/h) sin(w h/2) e^(i (pi/2 - w h/2)): the backward difference is a
        // derivative delayed by half a scan (derived; common practice)
        @ParameterizedTest(name = "w = {0} rad/s, h = {1} s")
        @CsvSource({"1.0, 0.5", "0.2, 2.0", "3.0, 0.1"})
        void backward_difference_loses_half_a_scan(double omega, double h) {
            ScanFacts facts = new ScanFacts(h, 0.0, 1.0, Discretization.BACKWARD);
            assertThat(facts.phaseLeadDegrees(omega)).isCloseTo(90.0 - Math.toDegrees(omega * h / 2), within(TOL));
            assertThat(facts.continuousPhaseLeadDegrees(omega)).isEqualTo(90.0);
            assertThat(facts.phaseLeadLostDegrees(omega)).isCloseTo(Math.toDegrees(omega * h / 2), within(TOL));
        }

        // Tustin maps i w to i (2/h) tan(w h/2) (frequency warping; Astrom & Wittenmark,
        // Computer-Controlled Systems, 3rd ed., 1997, ch. 8 - from memory), so Td s/(1 + Tf s) keeps
        // the phase 90 - atan(Tf (2/h) tan(w h/2))
        @ParameterizedTest(name = "w = {0} rad/s, h = {1} s, Tf = {2} s")
        @CsvSource({"1.0, 0.5, 1.0", "0.3, 2.0, 0.5", "5.0, 0.1, 0.2"})
        void tustin_keeps_the_warped_phase(double omega, double h, double tf) {
            ScanFacts facts = new ScanFacts(h, tf, 2.0, Discretization.TRAPEZOIDAL);
            double warped = (2 / h) * Math.tan(omega * h / 2);
            assertThat(facts.phaseLeadDegrees(omega)).isCloseTo(90.0 - Math.toDegrees(Math.atan(tf * warped)),
                    within(TOL));
        }

        // s = (z - 1)/h and s = (z - 1)/(z h) substituted into s/(1 + Tf s) (Wittenmark, Astrom &
        // Arzen, IFAC Professional Brief 2002, Table 3), evaluated at z = e^(i w h) here
        @ParameterizedTest(name = "{0}: w = {1} rad/s, h = {2} s, Tf = {3} s")
        @CsvSource({"FORWARD, 1.0, 0.5, 1.0", "FORWARD, 0.4, 0.3, 0.2", "BACKWARD, 1.0, 0.5, 1.0",
                "BACKWARD, 2.0, 0.3, 0.6"})
        void euler_differences_keep_the_substituted_phase(Discretization method, double omega, double h, double tf) {
            double theta = omega * h;
            // forward: s = (e^(i theta) - 1)/h; backward: s = (1 - e^(-i theta))/h
            double sr = method == Discretization.FORWARD ? (Math.cos(theta) - 1) / h : (1 - Math.cos(theta)) / h;
            double si = Math.sin(theta) / h;
            // s / (1 + Tf s): phase of s minus phase of (1 + Tf s)
            double expected = Math.toDegrees(Math.atan2(si, sr) - Math.atan2(tf * si, 1 + tf * sr));
            assertThat(new ScanFacts(h, tf, 1.0, method).phaseLeadDegrees(omega)).isCloseTo(expected, within(TOL));
        }

        // the continuous filtered derivative leads by 90 - atan(w Tf) (common practice): 45 degrees at w Tf = 1
        @Test
        void continuous_lead_is_45_degrees_at_the_filter_corner() {
            assertThat(new ScanFacts(0.1, 2.0, 10.0, Discretization.STEP_INVARIANT).continuousPhaseLeadDegrees(0.5))
                    .isCloseTo(45.0, within(TOL));
        }

        // every map agrees with i w to first order in w h (Astrom & Wittenmark 1997, ch. 8 - from memory)
        @ParameterizedTest
        @CsvSource({"FORWARD", "BACKWARD", "TRAPEZOIDAL", "RAMP_INVARIANT", "STEP_INVARIANT"})
        void little_lead_is_lost_at_a_short_scan(Discretization method) {
            assertThat(new ScanFacts(1e-4, 1.0, 10.0, method).phaseLeadLostDegrees(1.0)).isCloseTo(0.0, within(0.01));
        }
    }

    @Test
    void rejects_values_that_make_no_sense_with_the_value_in_the_message() {
        assertThatThrownBy(() -> new ScanFacts(0.1, -1.0, 1.0, Discretization.BACKWARD))
                .hasMessageContaining("filter").hasMessageContaining("-1.0");
        assertThatThrownBy(() -> new ScanFacts(0.0, 1.0, 1.0, Discretization.BACKWARD))
                .hasMessageContaining("scan time").hasMessageContaining("0.0");
        assertThatThrownBy(() -> new ScanFacts(0.1, 1.0, 1.0, Discretization.BACKWARD).phaseLeadDegrees(-2))
                .hasMessageContaining("-2.0 rad/s");
    }
}

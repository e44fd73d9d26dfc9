// source: Astrom & Hagglund, PID Controllers: Theory, Design and Tuning, 2nd ed., ISA 1995, sec. 3.4 (section from memory); each law multiplied out by hand beside its check
package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.law.PidTerms;

/**
 * Each structure's law multiplied out by hand into the canonical terms C_y = (d s + p + i/s)/(1 +
 * tf s), C_r = (dr s + pr + i/s)/(1 + tf s), and back. Source of the structures: Astrom and
 * Hagglund, PID Controllers: Theory, Design and Tuning, 2nd ed., ISA 1995, sec. 3.4 (section from
 * memory); the filter and setpoint-weight versions are multiplied out in each comment. The
 * setting used throughout is K = 2, Ti = 10 s, Td = 1 s, Tf = 0.5 s, b = 0.8, c = 0.5 (invented).
 */
class StructureLawTest {

    private static final double TOL = 1e-12;

    private static void assertTerms(PidTerms t, double p, double i, double d, double tf, double pr, double dr) {
        assertThat(t.p()).as("p").isCloseTo(p, within(TOL));
        assertThat(t.i()).as("i").isCloseTo(i, within(TOL));
        assertThat(t.d()).as("d").isCloseTo(d, within(TOL));
        assertThat(t.tf()).as("tf").isCloseTo(tf, within(TOL));
        assertThat(t.pr()).as("pr").isCloseTo(pr, within(TOL));
        assertThat(t.dr()).as("dr").isCloseTo(dr, within(TOL));
    }

    private static void assertSetting(PidSetting s, double gain, double integral, double derivative, double b, double c) {
        assertThat(s).isNotNull();
        assertThat(s.gain()).as("gain").isCloseTo(gain, within(1e-9));
        assertThat(s.integral()).as("integral").isCloseTo(integral, within(1e-9));
        assertThat(s.derivative()).as("derivative").isCloseTo(derivative, within(1e-9));
        assertThat(s.b()).as("b").isCloseTo(b, within(1e-9));
        assertThat(s.c()).as("c").isCloseTo(c, within(1e-9));
    }

    @Nested
    @DisplayName("a setting to its law")
    class ToTerms {

        @Test
        void ideal_with_the_filter_on_the_derivative_term() {
            // K (1 + 1/(Ti s) + Td s/(1 + Tf s)) = K (Ti s (1 + Tf s) + (1 + Tf s) + Ti Td s^2) / (Ti s (1 + Tf s)):
            // p = K (1 + Tf/Ti) = 2.1, i = K/Ti = 0.2, d = K (Tf + Td) = 3;
            // setpoint b and c: pr = K (b + Tf/Ti) = 1.7, dr = K (b Tf + c Td) = 2 (0.4 + 0.5) = 1.8
            PidSetting s = new PidSetting(Structure.IDEAL, 2, 10, 1, 0.5, 0.8, 0.5);
            assertTerms(StructureLaw.toTerms(s, FilterPlacement.DERIVATIVE), 2.1, 0.2, 3, 0.5, 1.7, 1.8);
        }

        @Test
        void ideal_with_the_filter_on_the_measurement() {
            // K (1 + 1/(Ti s) + Td s)/(1 + Tf s): p = K = 2, i = 0.2, d = K Td = 2;
            // setpoint K (b + 1/(Ti s)) over 1 = K (b + 1/(Ti s))(1 + Tf s)/(1 + Tf s):
            // pr = K (b + Tf/Ti) = 1.7, dr = K b Tf = 0.8
            PidSetting s = new PidSetting(Structure.IDEAL, 2, 10, 1, 0.5, 0.8, 0);
            assertTerms(StructureLaw.toTerms(s, FilterPlacement.MEASUREMENT), 2, 0.2, 2, 0.5, 1.7, 0.8);
        }

        @Test
        void ideal_without_integral_action() {
            // Ti infinite: p = K = 2, i = 0, d = K (Tf + Td) = 3, pr = K b = 1.6, dr = 1.8
            PidSetting s = new PidSetting(Structure.IDEAL, 2, Double.POSITIVE_INFINITY, 1, 0.5, 0.8, 0.5);
            assertTerms(StructureLaw.toTerms(s, FilterPlacement.DERIVATIVE), 2, 0, 3, 0.5, 1.6, 1.8);
        }

        @Test
        void parallel_with_the_filter_on_the_derivative_term() {
            // kp + ki/s + kd s/(1 + Tf s), kp = 2, ki = 0.2, kd = 3: p = kp + ki Tf = 2.1, i = 0.2,
            // d = kp Tf + kd = 4; pr = b kp + ki Tf = 1.7, dr = b kp Tf + c kd = 0.8 + 1.5 = 2.3
            PidSetting s = new PidSetting(Structure.PARALLEL, 2, 0.2, 3, 0.5, 0.8, 0.5);
            assertTerms(StructureLaw.toTerms(s, FilterPlacement.DERIVATIVE), 2.1, 0.2, 4, 0.5, 1.7, 2.3);
        }

        @Test
        void parallel_with_the_filter_on_the_measurement() {
            // (kp + ki/s + kd s)/(1 + Tf s): p = 2, i = 0.2, d = 3; pr = b kp + ki Tf = 1.7, dr = b kp Tf = 0.8
            PidSetting s = new PidSetting(Structure.PARALLEL, 2, 0.2, 3, 0.5, 0.8, 0);
            assertTerms(StructureLaw.toTerms(s, FilterPlacement.MEASUREMENT), 2, 0.2, 3, 0.5, 1.7, 0.8);
        }

        @Test
        void series_with_derivative_on_error() {
            // K (1 + 1/(Ti s))(1 + Td s)/(1 + Tf s) = K (Ti s + 1)(1 + Td s)/(Ti s (1 + Tf s)):
            // p = K (1 + Td/Ti) = 2.2, i = 0.2, d = K Td = 2; c = 1, g = Td:
            // pr = K (b + Td/Ti) = 1.8, dr = K b Td = 1.6
            PidSetting s = new PidSetting(Structure.SERIES, 2, 10, 1, 0.5, 0.8, 1);
            assertTerms(StructureLaw.toTerms(s, FilterPlacement.DERIVATIVE), 2.2, 0.2, 2, 0.5, 1.8, 1.6);
        }

        @Test
        void series_with_derivative_on_measurement() {
            // c = 0, g = Tf: pr = K (b + Tf/Ti) = 1.7, dr = K b Tf = 0.8
            PidSetting s = new PidSetting(Structure.SERIES, 2, 10, 1, 0.5, 0.8, 0);
            assertTerms(StructureLaw.toTerms(s, FilterPlacement.DERIVATIVE), 2.2, 0.2, 2, 0.5, 1.7, 0.8);
            // no integral: p = K, i = 0, pr = K b
            PidSetting pd = new PidSetting(Structure.SERIES, 2, Double.POSITIVE_INFINITY, 1, 0.5, 0.8, 0);
            assertTerms(StructureLaw.toTerms(pd, FilterPlacement.DERIVATIVE), 2, 0, 2, 0.5, 1.6, 0.8);
        }

        @Test
        void a_product_that_overflows_is_bad_input() {
            // K Td = 1e200 * 1e200 overflows a double
            PidSetting s = new PidSetting(Structure.IDEAL, 1e200, 10, 1e200, 0, 1, 1);
            assertThatThrownBy(() -> StructureLaw.toLaw(s, FilterPlacement.DERIVATIVE))
                    .isInstanceOf(FormException.class).hasMessageContaining("too large or too small");
            PidSetting p = new PidSetting(Structure.PARALLEL, 1e300, 1e300, 0, 1e300, 1, 1);
            assertThatThrownBy(() -> StructureLaw.toLaw(p, FilterPlacement.DERIVATIVE))
                    .isInstanceOf(FormException.class);
        }
    }

    @Nested
    @DisplayName("a law to a setting")
    class FromTerms {

        @Test
        void ideal_recovers_gain_times_and_weights_from_the_hand_terms() {
            // the terms of ideal_with_the_filter_on_the_derivative_term: K = p - Tf i = 2, Ti = K/i = 10,
            // Td = d/K - Tf = 1, b = (pr - Tf i)/K = 0.8, c = (dr/K - b Tf)/Td = (0.9 - 0.4)/1 = 0.5
            PidSetting s = StructureLaw.fromTerms(new PidTerms(2.1, 0.2, 3, 0.5, 1.7, 1.8), Structure.IDEAL,
                    FilterPlacement.DERIVATIVE, 1);
            assertSetting(s, 2, 10, 1, 0.8, 0.5);
            assertThat(s.filterSeconds()).isEqualTo(0.5);
            // on the measurement: K = p = 2, Ti = 10, Td = d/K = 1, b = 0.8, c = 0
            PidSetting m = StructureLaw.fromTerms(new PidTerms(2, 0.2, 2, 0.5, 1.7, 0.8), Structure.IDEAL,
                    FilterPlacement.MEASUREMENT, 1);
            assertSetting(m, 2, 10, 1, 0.8, 0);
        }

        @Test
        void ideal_recovers_a_second_setting_with_no_unit_values() {
            // K 4, Ti 8 s, Td 2 s, Tf 0.25 s, b 0.5, c 0.25 multiplied out as above:
            // p = 4 (1 + 0.25/8) = 4.125, i = 0.5, d = 4 (0.25 + 2) = 9, pr = 4 (0.5 + 0.03125) = 2.125,
            // dr = 4 (0.5 * 0.25 + 0.25 * 2) = 2.5; back: K = 4.125 - 0.125 = 4, Ti = 4/0.5 = 8,
            // Td = 9/4 - 0.25 = 2, b = (2.125 - 0.125)/4 = 0.5, c = (2.5/4 - 0.5 * 0.25)/2 = 0.25
            PidSetting s = new PidSetting(Structure.IDEAL, 4, 8, 2, 0.25, 0.5, 0.25);
            assertTerms(StructureLaw.toTerms(s, FilterPlacement.DERIVATIVE), 4.125, 0.5, 9, 0.25, 2.125, 2.5);
            assertSetting(StructureLaw.fromTerms(new PidTerms(4.125, 0.5, 9, 0.25, 2.125, 2.5), Structure.IDEAL,
                    FilterPlacement.DERIVATIVE, 1), 4, 8, 2, 0.5, 0.25);
        }

        @Test
        void ideal_calls_a_negative_derivative_time_rounding_only_below_1e_12_of_ti() {
            // K 2, Ti 10 s, Tf 0.5 s and d = K (Tf + Td) with Td = -1e-12 s: 1e-12 s is a tenth of
            // 1e-12 Ti, so it is rounding (Td = 0); Td = -1e-10 s is ten times it, so no setting exists
            PidSetting s = StructureLaw.fromTerms(new PidTerms(2.1, 0.2, 2 * (0.5 - 1e-12), 0.5, 2.1, 1),
                    Structure.IDEAL, FilterPlacement.DERIVATIVE, 1);
            assertThat(s).isNotNull();
            assertThat(s.derivative()).isZero();
            assertThat(StructureLaw.fromTerms(new PidTerms(2.1, 0.2, 2 * (0.5 - 1e-10), 0.5, 2.1, 1),
                    Structure.IDEAL, FilterPlacement.DERIVATIVE, 1)).isNull();
        }

        @Test
        void parallel_calls_a_negative_derivative_rounding_only_below_1e_12_of_d_over_kp() {
            // kp 2, Tf 0.5 s, kd = d - kp Tf = -2e-12 s: kd/kp = -1e-12 s against 1e-12 |d/kp| = 5e-13 s: no setting
            assertThat(StructureLaw.fromTerms(new PidTerms(2, 0, 1 - 2e-12, 0.5, 2, 0), Structure.PARALLEL,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
            // kp 0.5, kd = -5e-13 s: kd/kp = -1e-12 s against 1e-12 |d/kp| = 1e-12 * 0.5 = 5e-13 s: no setting
            assertThat(StructureLaw.fromTerms(new PidTerms(0.5, 0, 0.25 - 5e-13, 0.5, 0.5, 0), Structure.PARALLEL,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
            // kp 2, kd = -2e-16 s: kd/kp = -1e-16 s, far below 5e-13 s: rounding, kd = 0
            assertThat(StructureLaw.fromTerms(new PidTerms(2, 0, 1 - 2e-16, 0.5, 2, 0), Structure.PARALLEL,
                    FilterPlacement.DERIVATIVE, 1).derivative()).isZero();
        }

        @Test
        void series_writes_a_pi_law_with_zero_derivative_time() {
            // p = 1, i = 0.1, d = 0: p^2 - 4 d i = 1, K = (1 + 1)/2 = 1, Ti = 10 s, Td = 0
            assertSetting(StructureLaw.fromTerms(new PidTerms(1, 0.1, 0, 0, 1, 0), Structure.SERIES,
                    FilterPlacement.DERIVATIVE, 1), 1, 10, 0, 1, 1);
            // the discriminant p^2 - 4 d i of p = 2, d = 3, i = 0.5: 4 - 6 = -2
            assertThat(StructureLaw.seriesDiscriminant(new PidTerms(2, 0.5, 3, 0, 2, 3))).isCloseTo(-2, within(TOL));
        }

        @Test
        void ideal_without_integral_has_an_infinite_ti() {
            PidSetting s = StructureLaw.fromTerms(new PidTerms(2, 0, 3, 0.5, 1.6, 1.8), Structure.IDEAL,
                    FilterPlacement.DERIVATIVE, 1);
            assertThat(s.integral()).isInfinite();
            assertThat(s.derivative()).isCloseTo(1, within(1e-12));
        }

        @Test
        void ideal_has_no_setting_for_a_zero_gain_a_negative_ti_or_a_negative_td() {
            // K = p - Tf i = 0.1 - 0.5 * 0.2 = 0
            assertThat(StructureLaw.fromTerms(new PidTerms(0.1, 0.2, 1, 0.5, 0.1, 0), Structure.IDEAL,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
            // K = 2 - 0.5 (-0.2) = 2.1, Ti = 2.1/(-0.2) < 0
            assertThat(StructureLaw.fromTerms(new PidTerms(2, -0.2, 1, 0.5, 2, 0), Structure.IDEAL,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
            // Td = d/K - Tf = 0.5/2 - 0.5 = -0.25 s
            assertThat(StructureLaw.fromTerms(new PidTerms(2, 0, 0.5, 0.5, 2, 0), Structure.IDEAL,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
            assertThat(StructureLaw.fromTerms(new PidTerms(2, 0.2, 0.5, 0.5, 2, 0), Structure.IDEAL,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
        }

        @Test
        void ideal_takes_a_derivative_time_a_rounding_below_zero_as_zero() {
            // K = 2.1 - 0.5 * 0.2 = 2, Ti = 10 s, Td = d/K - Tf = (1 - 1e-15)/2 - 0.5, about -5e-16 s:
            // below 1e-12 Ti in size, so it is rounding noise: Td = 0 and c (nothing to weight) = 0
            PidSetting s = StructureLaw.fromTerms(new PidTerms(2.1, 0.2, 1 - 1e-15, 0.5, 2.1, 1), Structure.IDEAL,
                    FilterPlacement.DERIVATIVE, 1);
            assertThat(s).isNotNull();
            assertThat(s.derivative()).isZero();
            assertThat(s.c()).isZero();
        }

        @Test
        void parallel_recovers_its_gains_from_the_hand_terms() {
            // kp = p - Tf i = 2, kd = d - kp Tf = 3, b = (pr - i Tf)/kp = 0.8, c = (dr - b kp Tf)/kd = (2.3 - 0.8)/3 = 0.5
            PidSetting s = StructureLaw.fromTerms(new PidTerms(2.1, 0.2, 4, 0.5, 1.7, 2.3), Structure.PARALLEL,
                    FilterPlacement.DERIVATIVE, 1);
            assertSetting(s, 2, 0.2, 3, 0.8, 0.5);
            PidSetting m = StructureLaw.fromTerms(new PidTerms(2, 0.2, 3, 0.5, 1.7, 0.8), Structure.PARALLEL,
                    FilterPlacement.MEASUREMENT, 1);
            assertSetting(m, 2, 0.2, 3, 0.8, 0);
        }

        @Test
        void parallel_has_no_setting_for_a_zero_gain_or_a_derivative_against_the_gain() {
            assertThat(StructureLaw.fromTerms(new PidTerms(0.1, 0.2, 1, 0.5, 0.1, 0), Structure.PARALLEL,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
            // kd = d - kp Tf = 0.5 - 1 = -0.5 with kp = 2: Td = kd/kp < 0
            assertThat(StructureLaw.fromTerms(new PidTerms(2, 0, 0.5, 0.5, 2, 0), Structure.PARALLEL,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
            // a direct-acting law: kp = -2, kd = 1 has Td = -0.5 s
            assertThat(StructureLaw.fromTerms(new PidTerms(-2, 0, 1, 0, -2, 0), Structure.PARALLEL,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
            // kp = -2, kd = -3: Td = 1.5 s, a valid direct-acting setting
            assertSetting(StructureLaw.fromTerms(new PidTerms(-2, 0, -3, 0, -2, -3), Structure.PARALLEL,
                    FilterPlacement.DERIVATIVE, 1), -2, 0, -3, 1, 1);
        }

        @Test
        void parallel_takes_a_derivative_a_rounding_below_zero_as_zero() {
            // kd = (1 - 1e-15) - 2 * 0.5, about -1e-15 s against d/kp = 0.5 s: rounding noise, kd = 0 and c = 0
            PidSetting s = StructureLaw.fromTerms(new PidTerms(2, 0, 1 - 1e-15, 0.5, 2, 1), Structure.PARALLEL,
                    FilterPlacement.DERIVATIVE, 1);
            assertThat(s).isNotNull();
            assertThat(s.derivative()).isZero();
            assertThat(s.c()).isZero();
        }

        @Test
        void series_follows_the_published_ideal_to_series_relation() {
            // ideal (Kc 1, Ti 10, Td 1) unfiltered: p = 1, i = 0.1, d = 1. Astrom and Hagglund 1995, sec. 3.4:
            // r = sqrt(1 - 4 Td/Ti) = sqrt(0.6); K' = Kc (1 + r)/2, Ti' = Ti (1 + r)/2, Td' = Ti (1 - r)/2
            double r = Math.sqrt(0.6);
            PidSetting s = StructureLaw.fromTerms(new PidTerms(1, 0.1, 1, 0, 1, 1), Structure.SERIES,
                    FilterPlacement.DERIVATIVE, 1);
            // b: pr/K - Td'/Ti' with pr = p = K' (1 + Td'/Ti') gives b = 1
            assertSetting(s, (1 + r) / 2, 10 * (1 + r) / 2, 10 * (1 - r) / 2, 1, 1);
            // direct acting, every coefficient negated: the same times, the gain negated
            PidSetting d = StructureLaw.fromTerms(new PidTerms(-1, -0.1, -1, 0, -1, -1), Structure.SERIES,
                    FilterPlacement.DERIVATIVE, 1);
            assertSetting(d, -(1 + r) / 2, 10 * (1 + r) / 2, 10 * (1 - r) / 2, 1, 1);
        }

        @Test
        void series_weights_use_td_on_error_and_tf_on_measurement() {
            // the hand terms of series_with_derivative_on_error (K 2, Ti 10, Td 1, Tf 0.5, b 0.8)
            assertSetting(StructureLaw.fromTerms(new PidTerms(2.2, 0.2, 2, 0.5, 1.8, 1.6), Structure.SERIES,
                    FilterPlacement.DERIVATIVE, 1), 2, 10, 1, 0.8, 1);
            assertSetting(StructureLaw.fromTerms(new PidTerms(2.2, 0.2, 2, 0.5, 1.7, 0.8), Structure.SERIES,
                    FilterPlacement.DERIVATIVE, 0), 2, 10, 1, 0.8, 0);
            // PD: Ti infinite, b = pr/K = 1.6/2
            PidSetting pd = StructureLaw.fromTerms(new PidTerms(2, 0, 2, 0.5, 1.6, 0.8), Structure.SERIES,
                    FilterPlacement.DERIVATIVE, 0);
            assertThat(pd.integral()).isInfinite();
            assertThat(pd.b()).isCloseTo(0.8, within(1e-12));
        }

        @Test
        void series_has_no_setting_for_complex_zeros_or_a_zero_gain() {
            // ideal (1, 2, 1): Ti < 4 Td, p^2 - 4 d i = 1 - 2 < 0
            PidTerms complex = new PidTerms(1, 0.5, 1, 0, 1, 1);
            assertThat(StructureLaw.seriesDiscriminant(complex)).isCloseTo(-1, within(TOL));
            assertThat(StructureLaw.fromTerms(complex, Structure.SERIES, FilterPlacement.DERIVATIVE, 1)).isNull();
            // Ti = 4 Td exactly: a double zero, p^2 - 4 d i = 1 - 4 * 1 * 0.25 = 0, K = p/2
            PidSetting twin = StructureLaw.fromTerms(new PidTerms(1, 0.25, 1, 0, 1, 1), Structure.SERIES,
                    FilterPlacement.DERIVATIVE, 1);
            assertSetting(twin, 0.5, 2, 2, 1, 1);
            assertThat(StructureLaw.fromTerms(new PidTerms(0, 0, 0, 0, 0, 0), Structure.SERIES,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
            // a negative integral against a positive gain: Ti < 0
            assertThat(StructureLaw.fromTerms(new PidTerms(1, -0.1, 0, 0, 1, 0), Structure.SERIES,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
            // a derivative against the gain: Td = d/K < 0
            assertThat(StructureLaw.fromTerms(new PidTerms(1, 0, -1, 0, 1, 0), Structure.SERIES,
                    FilterPlacement.DERIVATIVE, 1)).isNull();
        }
    }
}

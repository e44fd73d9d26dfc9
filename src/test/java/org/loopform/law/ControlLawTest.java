package org.loopform.law;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.lti.TransferFunction;

/**
 * The canonical two-degree-of-freedom law C_y(s) = (d s + p + i/s)/(1 + tf s), C_r(s) =
 * (dr s + pr + i/s)/(1 + tf s). Source: Astrom and Hagglund, Advanced PID Control, ISA 2006,
 * sec. 3.2 (the 2-DOF PID with setpoint weights and a filtered derivative; section from memory).
 * Every expected value is a hand derivation written out beside its check.
 */
class ControlLawTest {

    private static final double TOL = 1e-12;

    @Nested
    @DisplayName("its coefficients")
    class Coefficients {

        @ParameterizedTest(name = "{0} = NaN is refused")
        @CsvSource({"p", "i", "d", "tf", "pr", "dr"})
        void a_coefficient_that_is_not_finite_is_refused_and_named(String name) {
            double[] v = {1, 0.5, 2, 0.1, 1, 0};
            int at = java.util.List.of("p", "i", "d", "tf", "pr", "dr").indexOf(name);
            v[at] = at % 2 == 0 ? Double.NaN : Double.POSITIVE_INFINITY;
            assertThatThrownBy(() -> new PidTerms(v[0], v[1], v[2], v[3], v[4], v[5]))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("coefficient " + name + " must be finite");
        }

        @Test
        void a_negative_filter_time_is_refused_and_a_zero_one_means_no_filter() {
            assertThatThrownBy(() -> new PidTerms(1, 0, 0, -0.1, 1, 0))
                    .hasMessageContaining("tf must be >= 0 s (got -0.1 s)");
            assertThat(new PidTerms(1, 0, 0, 0, 1, 0).tf()).isZero();
        }

        @Test
        void integral_action_is_present_when_i_is_not_zero_whatever_its_sign() {
            assertThat(new PidTerms(1, 0, 0, 0, 1, 0).hasIntegral()).isFalse();
            assertThat(new PidTerms(1, 0.2, 0, 0, 1, 0).hasIntegral()).isTrue();
            // a reverse-acting law written with negative coefficients still integrates
            assertThat(new PidTerms(-1, -0.2, 0, 0, -1, 0).hasIntegral()).isTrue();
        }

        @Test
        void the_high_frequency_gain_is_d_over_tf_with_a_filter() {
            // |(d s + p + i/s)/(1 + tf s)| -> |d| s / (tf s) = |d|/tf as s -> infinity
            assertThat(new PidTerms(2, 0.1, -3, 0.5, 2, 0).highFrequencyGain()).isEqualTo(6.0);
            assertThat(new PidTerms(2, 0.1, 0, 0.5, 2, 0).highFrequencyGain()).isEqualTo(0.0);
        }

        @Test
        void the_high_frequency_gain_is_infinite_with_unfiltered_derivative_and_p_without_derivative() {
            // no filter: d s grows without bound; no derivative either: the law tends to |p|
            assertThat(new PidTerms(2, 0.1, 3, 0, 2, 0).highFrequencyGain()).isInfinite();
            assertThat(new PidTerms(-4, 0.1, 0, 0, -4, 0).highFrequencyGain()).isEqualTo(4.0);
        }
    }

    @Nested
    @DisplayName("its transfer functions")
    class Paths {

        @Test
        void a_law_needs_its_terms() {
            assertThatThrownBy(() -> new ControlLaw(null)).hasMessageContaining("needs its terms");
        }

        @Test
        void with_integral_the_feedback_path_is_d_s2_plus_p_s_plus_i_over_s_times_1_plus_tf_s() {
            // (d s + p + i/s)/(1 + tf s), multiplied by s/s: (d s^2 + p s + i)/(tf s^2 + s)
            ControlLaw law = new ControlLaw(new PidTerms(2, 0.5, 3, 0.25, 1, 0.5));
            TransferFunction cy = law.feedback();
            assertThat(cy.numerator().ascending()).containsExactly(0.5, 2, 3);
            assertThat(cy.denominator().ascending()).containsExactly(0, 1, 0.25);
            TransferFunction cr = law.setpoint();
            assertThat(cr.numerator().ascending()).containsExactly(0.5, 1, 0.5);
            assertThat(cr.denominator().ascending()).containsExactly(0, 1, 0.25);
        }

        @Test
        void without_integral_the_s_cancels() {
            // (d s + p)/(1 + tf s)
            ControlLaw law = new ControlLaw(new PidTerms(2, 0, 3, 0.25, 1, 0));
            assertThat(law.feedback().numerator().ascending()).containsExactly(2, 3);
            assertThat(law.feedback().denominator().ascending()).containsExactly(1, 0.25);
            assertThat(law.setpoint().numerator().ascending()).containsExactly(1);
        }

        @Test
        void laws_that_differ_only_in_their_setpoint_path_have_the_same_feedback() {
            ControlLaw a = new ControlLaw(new PidTerms(2, 0.5, 3, 0.25, 2, 3));
            ControlLaw b = new ControlLaw(new PidTerms(2, 0.5, 3, 0.25, 1, 0));
            assertThat(a.sameFeedbackAs(b, 1e-9)).isTrue();
            assertThat(a.sameAs(b, 1e-9)).isFalse();
            assertThat(a.sameAs(a, 1e-9)).isTrue();
            ControlLaw c = new ControlLaw(new PidTerms(2.5, 0.5, 3, 0.25, 2, 3));
            assertThat(a.sameFeedbackAs(c, 1e-9)).isFalse();
            assertThat(a.sameAs(c, 1e-9)).isFalse();
        }
    }

    @Nested
    @DisplayName("its frequency response")
    class FrequencyResponse {

        @Test
        void the_pid_feedback_path_at_2_rad_per_s_is_3_9_plus_3_8_i() {
            // p=2, i=0.5, d=3, tf=0.25, w=2: numerator 2 + i(3*2 - 0.5/2) = 2 + 5.75i,
            // denominator 1 + 0.5i; (2 + 5.75i)(1 - 0.5i)/1.25 = (4.875 + 4.75i)/1.25 = 3.9 + 3.8i
            double[] out = new double[2];
            new ControlLaw(new PidTerms(2, 0.5, 3, 0.25, 1, 0)).feedbackAt(2, out);
            assertThat(out[0]).isCloseTo(3.9, within(TOL));
            assertThat(out[1]).isCloseTo(3.8, within(TOL));
        }

        @Test
        void the_setpoint_path_uses_pr_and_dr_with_the_same_integral() {
            // pr=1, dr=0: numerator 1 - 0.25i; (1 - 0.25i)(1 - 0.5i)/1.25 = (0.875 - 0.75i)/1.25 = 0.7 - 0.6i
            double[] out = new double[2];
            new ControlLaw(new PidTerms(2, 0.5, 3, 0.25, 1, 0)).setpointAt(2, out);
            assertThat(out[0]).isCloseTo(0.7, within(TOL));
            assertThat(out[1]).isCloseTo(-0.6, within(TOL));
        }

        @Test
        void without_integral_the_pd_path_at_2_rad_per_s_is_4_plus_4_i() {
            // (2 + 6i)(1 - 0.5i)/1.25 = (5 + 5i)/1.25 = 4 + 4i
            double[] out = new double[2];
            new ControlLaw(new PidTerms(2, 0, 3, 0.25, 1, 0)).feedbackAt(2, out);
            assertThat(out[0]).isCloseTo(4, within(TOL));
            assertThat(out[1]).isCloseTo(4, within(TOL));
        }
    }
}

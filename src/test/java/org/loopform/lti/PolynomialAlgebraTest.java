// source: hand derivations written out beside each check (products, sums and values of small polynomials, complex arithmetic with i^2 = -1); the Nyquist frequency pi / h of a signal sampled every h seconds (Astrom & Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 7; from memory)
package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/** Polynomials, rational transfer functions and frequency bands, checked against hand-derived answers. */
class PolynomialAlgebraTest {

    private static final double TOL = 1e-12;

    /** p(x) = x^3 + 2 x^2 + 3 x + 6 = (x + 2)(x^2 + 3). */
    private static final Polynomial CUBIC = Polynomial.ofDescending(1, 2, 3, 6);

    @Nested
    @DisplayName("polynomials")
    class Polynomials {

        @Test
        void trailing_zero_coefficients_do_not_count_in_the_degree() {
            Polynomial p = Polynomial.ofAscending(1, 2, 0, 0);
            assertThat(p.degree()).isEqualTo(1);
            assertThat(p.ascending()).containsExactly(1.0, 2.0);
            assertThat(p.isZero()).isFalse();
            Polynomial zero = Polynomial.ofAscending(0, 0);
            assertThat(zero.degree()).isEqualTo(-1);
            assertThat(zero.isZero()).isTrue();
            assertThat(Polynomial.constant(5).degree()).isZero();
        }

        @ParameterizedTest
        @CsvSource({"NaN", "Infinity", "-Infinity"})
        void a_coefficient_that_is_not_finite_is_refused(double bad) {
            assertThatThrownBy(() -> Polynomial.ofAscending(1, bad)).isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("finite");
        }

        @Test
        void descending_coefficients_are_the_ascending_ones_reversed() {
            assertThat(CUBIC.ascending()).containsExactly(6.0, 3.0, 2.0, 1.0);
            assertThat(CUBIC.descending()).containsExactly(1.0, 2.0, 3.0, 6.0);
        }

        @Test
        void a_coefficient_outside_the_degree_is_zero() {
            assertThat(CUBIC.coefficient(-1)).isZero();
            assertThat(CUBIC.coefficient(0)).isEqualTo(6.0);
            assertThat(CUBIC.coefficient(3)).isEqualTo(1.0);
            assertThat(CUBIC.coefficient(4)).isZero();
        }

        @Test
        void the_largest_coefficient_is_taken_by_magnitude() {
            assertThat(Polynomial.ofAscending(3, -7, 2).maxAbsCoefficient()).isEqualTo(7.0);
            assertThat(Polynomial.ofAscending(0).maxAbsCoefficient()).isZero();
        }

        @Test
        void sums_and_differences_add_like_powers() {
            // (1 + 2x) + (3 + 4x + 5x^2) = 4 + 6x + 5x^2
            assertThat(Polynomial.ofAscending(1, 2).plus(Polynomial.ofAscending(3, 4, 5)).ascending())
                    .containsExactly(4.0, 6.0, 5.0);
            // (3 + 4x + 5x^2) + (1 + 2x): the longer one first
            assertThat(Polynomial.ofAscending(3, 4, 5).plus(Polynomial.ofAscending(1, 2)).ascending())
                    .containsExactly(4.0, 6.0, 5.0);
            // (5 + x) - (2 + x) = 3, degree 0
            Polynomial d = Polynomial.ofAscending(5, 1).minus(Polynomial.ofAscending(2, 1));
            assertThat(d.ascending()).containsExactly(3.0);
            assertThat(Polynomial.ofAscending(0, 0, 1).minus(Polynomial.ofAscending(0, 0, 1)).isZero()).isTrue();
        }

        @Test
        void products_multiply_out() {
            // 2.5 (1 + 2x) = 2.5 + 5x; 0 (1 + 2x) = 0
            assertThat(Polynomial.ofAscending(1, 2).times(2.5).ascending()).containsExactly(2.5, 5.0);
            assertThat(Polynomial.ofAscending(1, 2).times(0.0).isZero()).isTrue();
            // (1 + x)(1 - x) = 1 - x^2
            assertThat(Polynomial.ofAscending(1, 1).times(Polynomial.ofAscending(1, -1)).ascending())
                    .containsExactly(1.0, 0.0, -1.0);
            // (x + 2)(x^2 + 3) = x^3 + 2x^2 + 3x + 6
            assertThat(Polynomial.ofDescending(1, 2).times(Polynomial.ofDescending(1, 0, 3))).isEqualTo(CUBIC);
            assertThat(Polynomial.ofAscending(0).times(CUBIC).isZero()).isTrue();
            assertThat(CUBIC.times(Polynomial.ofAscending(0)).isZero()).isTrue();
        }

        @Test
        void values_at_real_points_by_horner() {
            // p(2) = 8 + 8 + 6 + 6 = 28; p(-1) = -1 + 2 - 3 + 6 = 4
            assertThat(CUBIC.valueAt(2)).isEqualTo(28.0);
            assertThat(CUBIC.valueAt(-1)).isEqualTo(4.0);
        }

        @Test
        void values_at_imaginary_and_complex_points() {
            // s = 2i: s^2 = -4, s^3 = -8i, so p = -8i - 8 + 6i + 6 = -2 - 2i
            double[] out = new double[2];
            CUBIC.valueAtImaginary(2, out);
            assertThat(out[0]).isCloseTo(-2, within(TOL));
            assertThat(out[1]).isCloseTo(-2, within(TOL));
            // s = 1 + 2i: s^2 = -3 + 4i, s^3 = -11 - 2i, so p = (-11 - 2i) + 2(-3 + 4i) + 3(1 + 2i) + 6 = -8 + 12i
            CUBIC.valueAtComplex(1, 2, out);
            assertThat(out[0]).isCloseTo(-8, within(TOL));
            assertThat(out[1]).isCloseTo(12, within(TOL));
        }

        @Test
        void equal_coefficients_make_equal_polynomials() {
            assertThat(Polynomial.ofAscending(1, 2, 0)).isEqualTo(Polynomial.ofAscending(1, 2))
                    .hasSameHashCodeAs(Polynomial.ofAscending(1, 2)).isNotEqualTo(Polynomial.ofAscending(1, 3))
                    .isNotEqualTo("1 + 2x");
        }

        @Test
        void a_polynomial_is_written_highest_power_first_in_s() {
            assertThat(Polynomial.ofDescending(1, -2, 0, 3)).hasToString("1.0 s^3 - 2.0 s^2 + 3.0");
            assertThat(Polynomial.ofDescending(-2, 1)).hasToString("-2.0 s + 1.0");
            assertThat(Polynomial.ofAscending(-1.5)).hasToString("-1.5");
            assertThat(Polynomial.ofAscending(0)).hasToString("0");
        }
    }

    @Nested
    @DisplayName("transfer functions")
    class TransferFunctions {

        @Test
        void a_missing_part_or_a_zero_denominator_is_refused() {
            assertThatThrownBy(() -> new TransferFunction(null, Polynomial.ONE)).isInstanceOf(IllegalArgumentException.class);
            assertThatThrownBy(() -> new TransferFunction(Polynomial.ONE, null)).isInstanceOf(IllegalArgumentException.class);
            assertThatThrownBy(() -> new TransferFunction(Polynomial.ONE, Polynomial.ofAscending(0)))
                    .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("denominator");
        }

        @Test
        void responses_at_i_omega() {
            // 3 at any frequency
            assertThat(TransferFunction.gain(3).responseAt(7.0)).containsExactly(3.0, 0.0);
            // 1/(s + 1) at omega = 2: 1/(1 + 2i) = (1 - 2i)/5
            double[] g = TransferFunction.ofDescending(new double[] {1}, new double[] {1, 1}).responseAt(2.0);
            assertThat(g[0]).isCloseTo(0.2, within(TOL));
            assertThat(g[1]).isCloseTo(-0.4, within(TOL));
            // (2s + 1)/(s + 3) at omega = 1: (1 + 2i)/(3 + i) = (1 + 2i)(3 - i)/10 = (5 + 5i)/10
            double[] h = TransferFunction.ofDescending(new double[] {2, 1}, new double[] {1, 3}).responseAt(1.0);
            assertThat(h[0]).isCloseTo(0.5, within(TOL));
            assertThat(h[1]).isCloseTo(0.5, within(TOL));
        }

        @Test
        void products_and_sums_multiply_out() {
            TransferFunction a = TransferFunction.ofDescending(new double[] {1}, new double[] {1, 1});
            TransferFunction b = TransferFunction.ofDescending(new double[] {2}, new double[] {1, 3});
            // 1/(s + 1) * 2/(s + 3) = 2/(s^2 + 4s + 3)
            TransferFunction p = a.times(b);
            assertThat(p.numerator().ascending()).containsExactly(2.0);
            assertThat(p.denominator().ascending()).containsExactly(3.0, 4.0, 1.0);
            // 1/(s + 1) + 2/(s + 3) = (s + 3 + 2s + 2)/((s + 1)(s + 3)) = (3s + 5)/(s^2 + 4s + 3)
            TransferFunction s = a.plus(b);
            assertThat(s.numerator().ascending()).containsExactly(5.0, 3.0);
            assertThat(s.denominator().ascending()).containsExactly(3.0, 4.0, 1.0);
        }

        @Test
        void proper_means_no_more_zeros_than_poles() {
            assertThat(TransferFunction.ofDescending(new double[] {1}, new double[] {1, 1}).isProper()).isTrue();
            assertThat(TransferFunction.ofDescending(new double[] {1, 0}, new double[] {1, 1}).isProper()).isTrue();
            assertThat(TransferFunction.ofDescending(new double[] {1, 0, 0}, new double[] {1, 1}).isProper()).isFalse();
        }

        @Test
        void the_same_rational_function_is_recognised_through_scale_and_rounding() {
            TransferFunction g = TransferFunction.ofDescending(new double[] {1}, new double[] {1, 1});
            // 2/(2s + 2) = 1/(s + 1)
            assertThat(g.sameAs(TransferFunction.ofDescending(new double[] {2}, new double[] {2, 2}), 1e-12)).isTrue();
            // 1/(2s + 1) differs only in the highest power of the cross products: 2s + 1 against s + 1
            assertThat(g.sameAs(TransferFunction.ofDescending(new double[] {1}, new double[] {2, 1}), 1e-6)).isFalse();
            // 1/(s + 1.5): cross products s + 1.5 and s + 1 differ by 0.5 in the constant, far above 1e-3
            assertThat(g.sameAs(TransferFunction.ofDescending(new double[] {1}, new double[] {1, 1.5}), 1e-3)).isFalse();
            // (1 + 1e-9)/(s + 1): a relative difference of 1e-9, within 1e-6, not within 1e-12
            TransferFunction near = TransferFunction.ofDescending(new double[] {1 + 1e-9}, new double[] {1, 1});
            assertThat(g.sameAs(near, 1e-6)).isTrue();
            assertThat(g.sameAs(near, 1e-12)).isFalse();
            // (1e-20 s + 1)/(s + 1): its cross product has 1e-20 s^2, under 1e-9 squared of the largest coefficient
            TransferFunction noise = TransferFunction.ofDescending(new double[] {1e-20, 1}, new double[] {1, 1});
            assertThat(g.sameAs(noise, 1e-9)).isTrue();
            // two zero functions are the same
            TransferFunction zero = new TransferFunction(Polynomial.ofAscending(0), Polynomial.ofAscending(1, 1));
            assertThat(zero.sameAs(new TransferFunction(Polynomial.ofAscending(0), Polynomial.ofAscending(5, 1)), 1e-12))
                    .isTrue();
        }

        @Test
        void a_transfer_function_is_written_as_a_quotient() {
            assertThat(TransferFunction.ofDescending(new double[] {1}, new double[] {1, 1}))
                    .hasToString("(1.0) / (1.0 s + 1.0)");
        }
    }

    @Nested
    @DisplayName("frequency bands")
    class Bands {

        @ParameterizedTest
        @CsvSource({"0,10", "-1,10", "NaN,10", "Infinity,10", "1,1", "1,0.5", "1,Infinity", "1,NaN"})
        void a_band_needs_a_finite_positive_bottom_below_a_finite_top(double low, double high) {
            assertThatThrownBy(() -> FrequencyBand.of(low, high)).isInstanceOf(IllegalArgumentException.class);
        }

        @Test
        void a_band_up_to_nyquist_ends_at_pi_over_the_scan() {
            // h = 0.5 s: pi / 0.5 = 2 pi rad/s
            FrequencyBand b = FrequencyBand.belowNyquist(0.01, 0.5);
            assertThat(b.lowRadPerSecond()).isEqualTo(0.01);
            assertThat(b.highRadPerSecond()).isCloseTo(2 * Math.PI, within(TOL));
        }

        @ParameterizedTest
        @CsvSource({"0", "-1", "Infinity", "NaN"})
        void a_band_up_to_nyquist_needs_a_finite_positive_scan(double scanSeconds) {
            assertThatThrownBy(() -> FrequencyBand.belowNyquist(0.01, scanSeconds))
                    .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("scan time");
        }

        @Test
        void a_grid_is_spaced_evenly_in_log_from_end_to_end() {
            // decades from 1 to 10^4: 1, 10, 100, 1000, 10000
            double[] w = FrequencyBand.of(1, 1e4).grid(5);
            assertThat(w).hasSize(5);
            double[] expected = {1, 10, 100, 1000, 10000};
            for (int k = 0; k < 5; k++) {
                assertThat(w[k]).isCloseTo(expected[k], within(expected[k] * 1e-12));
            }
        }
    }
}

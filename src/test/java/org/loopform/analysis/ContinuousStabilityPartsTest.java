// source: Cauchy's root bound (M. Marden, Geometry of Polynomials, 1966, sec. 27 - from memory); roots placed by hand; the small-gain theorem (G. Zames, IEEE Trans. Automatic Control, 1966)
package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Comparator;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

/**
 * The pieces of the continuous stability test on their own: Cauchy's bound, which sets how far
 * the Nyquist path must run; the roots of a polynomial with roots at the origin; and the edges of
 * the tolerance within which a high-frequency loop gain behind a dead time counts as 1.
 */
@DisplayName("Continuous stability: its pieces")
class ContinuousStabilityPartsTest {

    // Cauchy: every root of a_n s^n + ... + a_0 lies within 1 + max_{k<n} |a_k / a_n|.
    // 2 s^3 - 6 s + 4 = 2 (s - 1)^2 (s + 2): the bound is 1 + max(4/2, 6/2, 0) = 4, above |-2|.
    @Test
    void cauchy_bound_of_a_cubic() {
        Polynomial p = Polynomial.ofAscending(4, -6, 0, 2);

        assertThat(ContinuousStability.cauchyBound(p)).isEqualTo(4.0);
    }

    // 2 s + 1 (root -1/2): the bound is 1 + 1/2. The leading coefficient does not enter the maximum.
    @Test
    void cauchy_bound_of_a_line() {
        assertThat(ContinuousStability.cauchyBound(Polynomial.ofAscending(1, 2))).isEqualTo(1.5);
    }

    // A constant has no roots: no bound is needed, 0.
    @Test
    void cauchy_bound_of_a_constant_is_zero() {
        assertThat(ContinuousStability.cauchyBound(Polynomial.constant(5))).isEqualTo(0.0);
    }

    // s^2 (s + 1) = s^3 + s^2: roots 0, 0 (exactly: an integrator's pole must sit on the axis, not a
    // rounding error beside it) and -1.
    @Test
    void roots_at_the_origin_are_returned_exactly() {
        List<Complex> roots = ContinuousStability.polesOf(Polynomial.ofAscending(0, 0, 1, 1));

        assertThat(roots).hasSize(3);
        assertThat(roots.stream().filter(r -> r.getReal() == 0 && r.getImaginary() == 0).count()).isEqualTo(2);
        Complex other = roots.stream().max(Comparator.comparingDouble(Complex::abs)).orElseThrow();
        assertThat(other.getReal()).isCloseTo(-1, within(1e-12));
        assertThat(other.getImaginary()).isCloseTo(0, within(1e-12));
    }

    // (s + 2)(s + 3) = s^2 + 5 s + 6: roots -2 and -3, none at the origin.
    @Test
    void a_polynomial_without_roots_at_the_origin_gets_none() {
        List<Complex> roots = ContinuousStability.polesOf(Polynomial.ofAscending(6, 5, 1));

        assertThat(roots).hasSize(2);
        assertThat(roots).noneMatch(r -> r.abs() < 1);
        assertThat(roots.stream().mapToDouble(Complex::getReal).sorted().toArray())
                .containsExactly(new double[] {-3, -2}, within(1e-12));
    }

    /** c (s + 1)/(s + 2) behind 1 s of dead time: the loop gain tends to c at high frequency. */
    private static LoopStability biproper(double c) {
        TransferFunction r = new TransferFunction(Polynomial.ofAscending(c, c), Polynomial.ofAscending(2, 1));
        return ContinuousStability.of(r, 1.0, 0.1);
    }

    // The neutral chain of roots lies at Re s = ln|c| / L (Hale and Verduyn Lunel 1993, ch. 9, from
    // memory): |c| = 1 is the edge. A gain within the stated tolerance of 1, either side, is that edge.
    @Test
    void a_high_frequency_gain_at_either_end_of_the_tolerance_is_marginal() {
        double tolerance = ContinuousStability.HIGH_FREQUENCY_GAIN_TOLERANCE;
        for (double c : new double[] {1 + tolerance, 1 - tolerance, 1.0}) {
            LoopStability s = biproper(c);
            assertThat(s.verdict()).as("c = %s", c).isEqualTo(Stability.MARGINAL);
            assertThat(s.test()).as("c = %s", c).isEqualTo(StabilityTest.HIGH_FREQUENCY_GAIN);
        }
    }

    // Beyond the tolerance above 1 the chain lies right of the axis: unstable. Below it, |L(i w)| =
    // c sqrt(w^2 + 1) / sqrt(w^2 + 4) < 1 for every w, so the loop is stable by the small-gain theorem.
    @Test
    void a_high_frequency_gain_beyond_the_tolerance_is_decided() {
        assertThat(biproper(1 + 1e-9).verdict()).isEqualTo(Stability.UNSTABLE);
        assertThat(biproper(1 + 1e-9).test()).isEqualTo(StabilityTest.HIGH_FREQUENCY_GAIN);
        assertThat(biproper(1 - 1e-6).verdict()).isEqualTo(Stability.STABLE);
        assertThat(biproper(1 - 1e-6).test()).isEqualTo(StabilityTest.NYQUIST);
    }
}

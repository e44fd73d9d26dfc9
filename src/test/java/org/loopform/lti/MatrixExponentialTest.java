package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.apache.commons.math3.linear.MatrixUtils;
import org.apache.commons.math3.linear.RealMatrix;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

@DisplayName("The matrix exponential")
class MatrixExponentialTest {

    private static final double TOL = 1e-13;

    // exp([[0, w], [-w, 0]]) = [[cos w, sin w], [-sin w, cos w]], a rotation (common practice:
    // the solution of the harmonic oscillator x'' = -w^2 x)
    @ParameterizedTest(name = "w = {0}")
    @ValueSource(doubles = {0.1, 1.0, 3.0, 25.0})
    void of_a_skew_matrix_is_a_rotation(double w) {
        RealMatrix e = MatrixExponential.of(MatrixUtils.createRealMatrix(new double[][] {{0, w}, {-w, 0}}));
        double tol = TOL * Math.max(1.0, w * w);
        assertThat(e.getEntry(0, 0)).isCloseTo(Math.cos(w), within(tol));
        assertThat(e.getEntry(0, 1)).isCloseTo(Math.sin(w), within(tol));
        assertThat(e.getEntry(1, 0)).isCloseTo(-Math.sin(w), within(tol));
        assertThat(e.getEntry(1, 1)).isCloseTo(Math.cos(w), within(tol));
    }

    // exp([[a, 1], [0, a]]) = e^a [[1, 1], [0, 1]] (Jordan block; Golub & Van Loan 1996, section 11.1)
    @ParameterizedTest(name = "a = {0}")
    @ValueSource(doubles = {-20.0, -1.0, 0.0, 0.5, 3.0})
    void of_a_jordan_block_has_the_known_closed_form(double a) {
        RealMatrix e = MatrixExponential.of(MatrixUtils.createRealMatrix(new double[][] {{a, 1}, {0, a}}));
        double ea = Math.exp(a);
        assertThat(e.getEntry(0, 0)).isCloseTo(ea, within(TOL * Math.max(1, ea) * 10));
        assertThat(e.getEntry(0, 1)).isCloseTo(ea, within(TOL * Math.max(1, ea) * 10));
        assertThat(e.getEntry(1, 0)).isCloseTo(0.0, within(TOL));
        assertThat(e.getEntry(1, 1)).isCloseTo(ea, within(TOL * Math.max(1, ea) * 10));
    }

    @Test
    void of_the_zero_matrix_is_the_identity() {
        RealMatrix e = MatrixExponential.of(MatrixUtils.createRealMatrix(3, 3));
        assertThat(e.subtract(MatrixUtils.createRealIdentityMatrix(3)).getNorm()).isZero();
    }

    @Test
    void rejects_a_non_square_matrix() {
        assertThatThrownBy(() -> MatrixExponential.of(MatrixUtils.createRealMatrix(2, 3)))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("2x3");
    }
}

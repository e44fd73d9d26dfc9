// source: hand derivations written out beside each check; Gaussian elimination with partial pivoting (common practice)
package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;

/**
 * The small pieces of linear algebra under the frequency responses, checked where the loops in
 * other tests never take them: pivots that must be chosen by complex magnitude, and models that
 * must be refused. Answers are hand derivations written out beside each check.
 */
class SmallAlgebraTest {

    private static final double TOL = 1e-12;

    @Nested
    @DisplayName("complex Gaussian elimination with partial pivoting")
    class Pivoting {

        @Test
        void a_zero_leading_entry_is_pivoted_away() {
            // M = [[0, 1], [2, 0]], x = (1, i): M x = (i, 2). Without a row swap the first pivot is 0.
            double[] mRe = {0, 1, 2, 0};
            double[] mIm = {0, 0, 0, 0};
            double[] rRe = {0, 2};
            double[] rIm = {1, 0};
            ComplexLinearSolve.solveInPlace(2, mRe, mIm, rRe, rIm);
            assertThat(rRe[0]).isCloseTo(1, within(TOL));
            assertThat(rIm[0]).isCloseTo(0, within(TOL));
            assertThat(rRe[1]).isCloseTo(0, within(TOL));
            assertThat(rIm[1]).isCloseTo(1, within(TOL));
        }

        @Test
        void the_pivot_is_chosen_by_complex_magnitude_not_by_its_real_part() {
            // M = [[0, 1], [i, 1]], x = (1, 1): M x = (1, 1 + i). The second row's entry is purely
            // imaginary; a choice by real part would keep the zero pivot and divide by zero.
            double[] mRe = {0, 1, 0, 1};
            double[] mIm = {0, 0, 1, 0};
            double[] rRe = {1, 1};
            double[] rIm = {0, 1};
            ComplexLinearSolve.solveInPlace(2, mRe, mIm, rRe, rIm);
            assertThat(rRe[0]).isCloseTo(1, within(TOL));
            assertThat(rIm[0]).isCloseTo(0, within(TOL));
            assertThat(rRe[1]).isCloseTo(1, within(TOL));
            assertThat(rIm[1]).isCloseTo(0, within(TOL));
        }

        @Test
        void a_three_by_three_system_with_complex_entries_everywhere() {
            // M = [[1, 2i, 0], [3, 1, 1 + i], [0, i, 4]], x = (1 - i, 2, i):
            // row 1: (1 - i) + 4i            = 1 + 3i
            // row 2: 3 - 3i + 2 + (1 + i) i  = 5 - 3i + i - 1 = 4 - 2i
            // row 3: 2i + 4i                 = 6i
            double[] mRe = {1, 0, 0, 3, 1, 1, 0, 0, 4};
            double[] mIm = {0, 2, 0, 0, 0, 1, 0, 1, 0};
            double[] rRe = {1, 4, 0};
            double[] rIm = {3, -2, 6};
            ComplexLinearSolve.solveInPlace(3, mRe, mIm, rRe, rIm);
            assertThat(rRe).containsExactly(new double[] {1, 2, 0}, within(1e-12));
            assertThat(rIm).containsExactly(new double[] {-1, 0, 1}, within(1e-12));
        }
    }

    @Nested
    @DisplayName("a state-space model")
    class StateSpaceModel {

        @Test
        void refuses_a_non_finite_entry_in_each_matrix() {
            double[][] a = {{-1}};
            assertThatThrownBy(() -> StateSpace.of(new double[][] {{Double.NaN}}, new double[] {1}, new double[] {1}, 0))
                    .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("A");
            assertThatThrownBy(() -> StateSpace.of(a, new double[] {Double.POSITIVE_INFINITY}, new double[] {1}, 0))
                    .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("B");
            assertThatThrownBy(() -> StateSpace.of(a, new double[] {1}, new double[] {Double.NaN}, 0))
                    .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("C");
            assertThatThrownBy(() -> StateSpace.of(a, new double[] {1}, new double[] {1}, Double.NaN))
                    .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("D");
        }

        @Test
        void exists_only_for_a_proper_transfer_function() {
            // (s^2 + 1)/(s + 1) has relative degree -1: no realization x' = A x + B u, y = C x + D u
            TransferFunction improper = TransferFunction.ofDescending(new double[] {1, 0, 1}, new double[] {1, 1});
            assertThat(improper.isProper()).isFalse();
            assertThat(TransferFunction.ofDescending(new double[] {1, 0}, new double[] {1, 1}).isProper()).isTrue();
            assertThatThrownBy(() -> StateSpace.of(improper)).isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("proper");
        }
    }
}

// source: hand derivation (RootPlacedLoop: the zeros of 1 + L are the roots placed); Newton's method: Press et al., Numerical Recipes, 3rd ed., 2007, ch. 9 (chapter from memory)
package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;
import static org.loopform.analysis.RootPlacedLoop.at;
import static org.loopform.analysis.RootPlacedLoop.concat;
import static org.loopform.analysis.RootPlacedLoop.join;
import static org.loopform.analysis.RootPlacedLoop.pair;

import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * The pieces of the sampled stability search on their own: Newton's method on
 * {@code f(w) = 1 + L(e^w)} (w = ln r + i theta), which must land on a placed closed-loop pole, give
 * up when it travels too far, and, on {@code (z - p)(1 + L)}, find the closed-loop pole beside a
 * nearly cancelled open-loop pole p; the choice of the larger proposal; and the log-spaced steps
 * of the walks' seed points.
 */
@DisplayName("Sampled stability: Newton's method and its helpers")
class SampledNewtonTest {

    /** Closed-loop poles 0.8 and 0.3 +- 0.2i and 0.1; open-loop poles 1, 0.5 and 0.4; one scan of delay. */
    private static final SampledLoop REAL_POLE = RootPlacedLoop.of(
            concat(join(at(0.8, 0)), pair(Math.hypot(0.3, 0.2), Math.atan2(0.2, 0.3)), join(at(0.1, 0))),
            join(at(1.0, 0), at(0.5, 0), at(0.4, 0)), 1);

    /** Closed-loop pair 0.9 e^(+-0.5i) and 0.2; open-loop poles 1 and 0.6 e^(+-1.2i); no delay. */
    private static final SampledLoop COMPLEX_PAIR = RootPlacedLoop.of(
            concat(pair(0.9, 0.5), join(at(0.2, 0))),
            concat(join(at(1.0, 0)), pair(0.6, 1.2)), 0);

    // Newton's method converges quadratically to a simple zero from a start close to it (Numerical
    // Recipes ch. 9): the real part it returns is ln 0.8, the placed pole's log radius.
    @Test
    void newton_lands_on_a_placed_real_pole() {
        double x = SampledStability.newton(REAL_POLE, Math.log(0.8) + 0.02, 0.03);

        assertThat(x).isCloseTo(Math.log(0.8), within(1e-12));
    }

    // The same from beside the pair 0.9 e^(0.5 i): the log radius ln 0.9.
    @Test
    void newton_lands_on_a_placed_complex_pole() {
        double x = SampledStability.newton(COMPLEX_PAIR, Math.log(0.9) - 0.03, 0.47);

        assertThat(x).isCloseTo(Math.log(0.9), within(1e-12));
    }

    // An unstable pair 1.2 e^(+-0.5i): from ln r = -0.1 (inside the unit circle) its log radius
    // ln 1.2 = 0.182 is a travel of 0.28. With the travel bounded at 0.2 Newton gives up (NaN); with
    // it bounded at 1 it arrives.
    @Test
    void newton_gives_up_when_it_travels_further_than_allowed() {
        SampledLoop unstable = RootPlacedLoop.of(concat(pair(1.2, 0.5), join(at(0.2, 0))),
                concat(join(at(0.5, 0)), pair(0.6, 1.2)), 0);

        assertThat(SampledStability.newton(unstable, -0.1, 0.5, 0.2, null)).isNaN();
        assertThat(SampledStability.newton(unstable, -0.1, 0.5, 1.0, null)).isCloseTo(Math.log(1.2), within(1e-12));
    }

    // A closed-loop pair 0.70001 e^(+-0.9i) a hair from the open-loop pair q = 0.7 e^(+-0.9i) (a lag the
    // controller's zero nearly cancels). (z - q)(1 + L) has the zeros of 1 + L without its pole at q, so
    // Newton's method on it from beside q lands on the closed-loop pole: ln 0.70001.
    @Test
    void newton_on_the_deflated_function_finds_the_pole_beside_a_nearly_cancelled_one() {
        double theta = 0.9;
        SampledLoop loop = RootPlacedLoop.of(concat(pair(0.70001, theta), join(at(0.3, 0))),
                concat(join(at(1.0, 0)), pair(0.7, theta)), 0);
        Complex q = new Complex(0.7 * Math.cos(theta), 0.7 * Math.sin(theta));

        double x = SampledStability.newton(loop, Math.log(0.7) * (1 - 1e-6), theta, 10, q);

        assertThat(x).isCloseTo(Math.log(0.70001), within(1e-12));
    }

    // larger(best, proposal, start) keeps the larger of two proposals strictly inside start (ln r of
    // the circle the search starts from); NaN or a proposal at or beyond start is no proposal.
    @Test
    void the_larger_proposal_inside_the_start_is_kept() {
        double start = -1e-9;
        assertThat(SampledStability.larger(Double.NaN, -0.5, start)).isEqualTo(-0.5);
        assertThat(SampledStability.larger(-0.5, -0.2, start)).isEqualTo(-0.2);
        assertThat(SampledStability.larger(-0.2, -0.5, start)).isEqualTo(-0.2);
        assertThat(SampledStability.larger(-0.2, Double.NaN, start)).isEqualTo(-0.2);
        // a proposal on the start circle itself is not inside it
        assertThat(SampledStability.larger(-0.2, start, start)).isEqualTo(-0.2);
        assertThat(SampledStability.larger(Double.NaN, start, start)).isNaN();
        // nor is a best that lies on it: the proposal inside replaces it
        assertThat(SampledStability.larger(start, -0.5, start)).isEqualTo(-0.5);
        assertThat(SampledStability.larger(0.3, -0.5, start)).isEqualTo(-0.5);
    }

    // The seed points of a walk step by 10^(1/8): eight to a decade, the table and beyond it alike
    // (reference: the JDK's Math.pow).
    @Test
    void the_decade_steps_are_eight_to_a_decade() {
        assertThat(SampledStability.decadeStep(0)).isEqualTo(1.0);
        assertThat(SampledStability.decadeStep(8)).isEqualTo(10.0);
        assertThat(SampledStability.decadeStep(3)).isEqualTo(Math.pow(10, 3.0 / 8));
        assertThat(SampledStability.decadeStep(319)).isEqualTo(Math.pow(10, 319.0 / 8));
        assertThat(SampledStability.decadeStep(320)).isCloseTo(1e40, within(1e26));
        assertThat(SampledStability.decadeStep(324)).isEqualTo(Math.pow(10, 40.5));
    }
}

package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.api.Test;

/**
 * The walk must find every turn by itself when given only the ends of the path: the windings below
 * are derived by hand from the argument principle (Astrom and Murray, Feedback Systems, 2008, ch. 9,
 * the Nyquist criterion; Churchill and Brown, Complex Variables and Applications, the argument
 * principle - from memory for the chapters).
 */
@DisplayName("The argument walk refines a coarse path until no turn is hidden")
class ArgumentWalkRefinementTest {

    private static final double TWO_PI = 2 * Math.PI;

    /**
     * {@code 1 + L = 1 + g z^-d} on the unit circle {@code z = e^(i theta)}, R = g (constant): as theta
     * goes once round, {@code g e^(-i d theta)} turns d times clockwise about 0, so 1 + L turns -d
     * times about 0 when g > 1 and not at all when g < 1. The path's two ends coincide, so only the
     * delay's turn rate can tell the walk to refine.
     */
    @ParameterizedTest(name = "g = {0}, d = {1}")
    @CsvSource({"2.0, 1", "5.0, 7", "1.2, 3", "0.3, 5", "0.45, 1", "0.8, 4"})
    void a_delay_alone_turns_the_loop_d_times(double g, int d) {
        ArgumentWalk walk = new ArgumentWalk((theta, out) -> {
            out[0] = g * Math.cos(-d * theta);
            out[1] = g * Math.sin(-d * theta);
            out[2] = g;
            out[3] = 0;
        }, d);
        double change = walk.change(new double[] {0, TWO_PI});
        assertThat(change).isCloseTo(g > 1 ? -TWO_PI * d : 0.0, within(1e-9));
        assertThat(walk.unresolved()).isFalse();
    }

    /**
     * {@code 1 + L = prod (z - z_k)} with roots 0.1 % inside or outside the unit circle, walked from
     * 64 seed points 0.1 rad apart, a hundred times the roots' distance: the turn is 2 pi times the
     * roots inside. (Here R = 1 + L, so the walk's own checks must resolve each root; with fewer
     * seeds a step can alias a whole turn, which is why the callers seed the path.)
     */
    @ParameterizedTest(name = "inside radius {0}, outside radius {1}")
    @CsvSource({"0.999, 1.001", "0.99, 1.01", "0.5, 1.001", "0.999, 3.0"})
    void roots_close_to_the_circle_are_counted_from_a_coarse_start(double in, double out) {
        double[][] roots = {
                {in * Math.cos(0.3), in * Math.sin(0.3)},
                {out * Math.cos(2.0), out * Math.sin(2.0)},
                {in * Math.cos(-2.5), in * Math.sin(-2.5)},
                {out * Math.cos(-0.7), out * Math.sin(-0.7)},
                {in * Math.cos(1.2), in * Math.sin(1.2)}};
        ArgumentWalk walk = new ArgumentWalk((theta, o) -> {
            double pr = 1;
            double pi = 0;
            for (double[] r : roots) {
                double fr = Math.cos(theta) - r[0];
                double fi = Math.sin(theta) - r[1];
                double t = pr * fr - pi * fi;
                pi = pr * fi + pi * fr;
                pr = t;
            }
            o[0] = pr - 1;
            o[1] = pi;
            o[2] = pr;
            o[3] = pi;
        }, 0.0);
        double[] seeds = new double[65];
        for (int k = 0; k < seeds.length; k++) {
            seeds[k] = TWO_PI * k / 64;
        }
        assertThat(walk.change(seeds))
                .isCloseTo(TWO_PI * 3, within(1e-9));
        assertThat(walk.unresolved()).isFalse();
    }

    /**
     * A zero of 1 + L on the path itself, {@code 1 + L = t - 1/3} on t in [0, 1] (real): no step
     * across it can be resolved, the walk says so, and the closest point is next to t = 1/3.
     */
    @Test
    void a_zero_on_the_path_leaves_the_walk_unresolved_next_to_it() {
        ArgumentWalk walk = new ArgumentWalk((t, out) -> {
            out[0] = t - 1.0 / 3 - 1;
            out[1] = 0;
            out[2] = out[0];
            out[3] = 0;
        }, 0.0);
        walk.change(new double[] {0, 1});
        assertThat(walk.unresolved()).isTrue();
        assertThat(walk.closestT()).isCloseTo(1.0 / 3, within(1e-12));
        assertThat(walk.evaluations()).isGreaterThan(40);
    }

    /**
     * {@code 1 + L = 1 + 0.4 e^(i 40 t)} with {@code R = 0.4 e^(i 40 t)}: |L| stays below 1/2, so 1 + L
     * never goes round 0 (change 0), but R turns 40 rad over [0, 1] and must still be followed in steps
     * of at most twice the largest turn; the walk may not accept the whole interval at once.
     */
    @Test
    void a_small_loop_still_follows_a_fast_turning_rational_part() {
        ArgumentWalk walk = new ArgumentWalk((t, out) -> {
            out[0] = 0.4 * Math.cos(40 * t);
            out[1] = 0.4 * Math.sin(40 * t);
            out[2] = out[0];
            out[3] = out[1];
        }, 0.0);
        assertThat(walk.change(new double[] {0, 1})).isCloseTo(Math.atan2(0.4 * Math.sin(40), 1 + 0.4 * Math.cos(40))
                , within(1e-12));
        assertThat(walk.unresolved()).isFalse();
    }

    /**
     * {@code 1 + L = 1 + 3 e^(i t)} on t in [0, 2 pi] with a rational part of growing magnitude
     * {@code R = e^(5 t)}: 1 + L goes once round 0 counter-clockwise (3 > 1), and the walk must cut the
     * path so that |R| changes by at most e^0.5 a step (at least 10 pi / 0.5 = 62 steps).
     */
    @Test
    void a_fast_growing_rational_part_is_followed_in_small_steps() {
        ArgumentWalk walk = new ArgumentWalk((t, out) -> {
            out[0] = 3 * Math.cos(t);
            out[1] = 3 * Math.sin(t);
            out[2] = Math.exp(5 * t);
            out[3] = 0;
        }, 0.0);
        assertThat(walk.change(new double[] {0, TWO_PI})).isCloseTo(TWO_PI, within(1e-9));
        assertThat(walk.evaluations()).isGreaterThanOrEqualTo((int) (5 * TWO_PI / ArgumentWalk.MAX_LOG_MAGNITUDE_STEP));
        assertThat(walk.unresolved()).isFalse();
    }
}

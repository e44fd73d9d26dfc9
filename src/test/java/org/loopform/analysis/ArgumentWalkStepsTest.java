package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The walk's steps against the rule its Javadoc states, read back from the points it evaluated: every
 * step it kept turns each tracked angle by at most pi/8 (the argument of 1 + L, of R, and of the delay
 * factor), changes |R| by at most e^0.5, or, with |L| below 1/2 at both ends, turns R by at most pi/4;
 * every step it cut failed that rule; and the change it reports is the sum of the kept steps' principal
 * turns (the argument principle adds principal turns: Astrom and Murray, Feedback Systems, 2008, ch. 9;
 * Churchill and Brown, Complex Variables and Applications - from memory for the chapters). The rule is
 * evaluated here with atan2 and log, not with the walk's tangents and squared magnitudes, so a threshold
 * moved either way shows: a looser one keeps a step the rule forbids, a tighter one cuts a step the rule
 * keeps.
 */
@DisplayName("The argument walk keeps exactly the steps its rule allows")
class ArgumentWalkStepsTest {

    private static final double MAX_TURN = Math.PI / 8;
    /** Slack for the rule evaluated in another arithmetic than the walk's (a few ulps of the angles). */
    private static final double SLACK = 1e-12;

    /** A path together with the points the walk asked for, in order. */
    private static final class Recorded implements ArgumentWalk.Path {
        final ArgumentWalk.Path inner;
        final List<Double> asked = new ArrayList<>();

        Recorded(ArgumentWalk.Path inner) {
            this.inner = inner;
        }

        @Override
        public void at(double t, double[] out) {
            asked.add(t);
            inner.at(t, out);
        }

        double[] value(double t) {
            double[] v = new double[4];
            inner.at(t, v);
            return v;
        }
    }

    private static double angle(double ar, double ai, double br, double bi) {
        return Math.atan2(bi * ar - br * ai, br * ar + bi * ai);
    }

    /** The rule of the class Javadoc, in angles and logarithms. Returns the margin: >= 0 kept, < 0 cut. */
    private static double ruleMargin(double a, double[] fa, double b, double[] fb, double delayTurnPerUnit) {
        double logStep = Math.abs(Math.log(Math.hypot(fb[2], fb[3])) - Math.log(Math.hypot(fa[2], fa[3])));
        double margin = ArgumentWalk.MAX_LOG_MAGNITUDE_STEP - logStep;
        double rTurn = Math.abs(angle(fa[2], fa[3], fb[2], fb[3]));
        boolean small = Math.hypot(fa[0], fa[1]) < ArgumentWalk.SMALL_LOOP && Math.hypot(fb[0], fb[1]) < ArgumentWalk.SMALL_LOOP;
        if (small) {
            return Math.min(margin, 2 * MAX_TURN - rTurn);
        }
        margin = Math.min(margin, MAX_TURN - rTurn);
        margin = Math.min(margin, MAX_TURN - (b - a) * delayTurnPerUnit);
        margin = Math.min(margin, MAX_TURN - Math.abs(angle(1 + fa[0], fa[1], 1 + fb[0], fb[1])));
        return margin;
    }

    /** Replays the walk's refinement from the points it asked for and checks every step against the rule. */
    private static final class Replay {
        final Recorded path;
        final double delay;
        int next;
        double sumOfTurns;
        int kept;
        int cut;

        Replay(Recorded path, double delay) {
            this.path = path;
            this.delay = delay;
        }

        void interval(double a, double b) {
            double[] fa = path.value(a);
            double[] fb = path.value(b);
            double margin = ruleMargin(a, fa, b, fb, delay);
            boolean refined = next < path.asked.size() && path.asked.get(next) > a && path.asked.get(next) < b;
            if (!refined) {
                assertThat(margin).as("kept step [%s, %s] meets the rule", a, b).isGreaterThanOrEqualTo(-SLACK);
                sumOfTurns += angle(1 + fa[0], fa[1], 1 + fb[0], fb[1]);
                kept++;
                return;
            }
            assertThat(margin).as("cut step [%s, %s] fails the rule", a, b).isLessThanOrEqualTo(SLACK);
            cut++;
            double mid = path.asked.get(next++);
            interval(a, mid);
            interval(mid, b);
        }
    }

    private static void assertStepsFollowTheRule(ArgumentWalk.Path inner, double delay, double[] ts, double winding) {
        Recorded path = new Recorded(inner);
        ArgumentWalk walk = new ArgumentWalk(path, delay);
        double change = walk.change(ts);
        assertThat(walk.unresolved()).isFalse();
        assertThat(walk.evaluations()).isEqualTo(path.asked.size());
        Replay replay = new Replay(path, delay);
        double[] sorted = ts.clone();
        java.util.Arrays.sort(sorted);
        assertThat(path.asked.get(0)).isEqualTo(sorted[0]);
        replay.next = 1;
        for (int k = 1; k < sorted.length; k++) {
            if (sorted[k] == sorted[k - 1]) {
                continue;
            }
            assertThat(path.asked.get(replay.next++)).isEqualTo(sorted[k]);
            replay.interval(sorted[k - 1], sorted[k]);
        }
        assertThat(replay.next).as("every point the walk asked for is a step's end").isEqualTo(path.asked.size());
        assertThat(change).as("the sum of the kept steps' principal turns").isCloseTo(replay.sumOfTurns, within(1e-9));
        if (!Double.isNaN(winding)) {
            assertThat(change).as("the winding derived by hand").isCloseTo(winding, within(1e-9));
        }
    }

    // source: hand derivation; 1 + L = 1 + g e^(-i d t), R = g: 1 + L turns -d times round 0 over [0, 2 pi] when g > 1
    @ParameterizedTest(name = "g = {0}, d = {1}")
    @CsvSource({"2.0, 1", "5.0, 3", "1.2, 2", "0.3, 4", "0.6, 2", "0.45, 6"})
    void a_delay_alone(double g, int d) {
        assertStepsFollowTheRule((t, out) -> {
            out[0] = g * Math.cos(-d * t);
            out[1] = g * Math.sin(-d * t);
            out[2] = g;
            out[3] = 0;
        }, d, new double[] {0, 2 * Math.PI}, g > 1 ? -2 * Math.PI * d : 0.0);
    }

    // source: hand derivation; 1 + L = 1 + 3 e^(i t) once round 0, with |R| = e^(c t) growing or shrinking
    @ParameterizedTest(name = "c = {0}")
    @CsvSource({"5", "-5", "0.3", "-2"})
    void a_rational_part_of_changing_magnitude(double c) {
        assertStepsFollowTheRule((t, out) -> {
            out[0] = 3 * Math.cos(t);
            out[1] = 3 * Math.sin(t);
            out[2] = Math.exp(c * t);
            out[3] = 0;
        }, 0.0, new double[] {0, 2 * Math.PI}, 2 * Math.PI);
    }

    // source: hand derivation; L = R = s(t) e^(i w t) with |L| rising from 0.1 to 3 over [0, 1]: 1 + L ends at
    // 1 + 3 e^(i w), and crosses from the small-loop rule to the full one on the way
    @ParameterizedTest(name = "w = {0}")
    @CsvSource({"40", "12", "3", "25"})
    void a_loop_growing_through_one_half(double w) {
        assertStepsFollowTheRule((t, out) -> {
            double s = 0.1 + 2.9 * t * t;
            out[0] = s * Math.cos(w * t);
            out[1] = s * Math.sin(w * t);
            out[2] = out[0];
            out[3] = out[1];
        }, 0.0, new double[] {0, 1}, Double.NaN);
    }

    // source: hand derivation; 1 + L = prod (z - z_k) on z = e^(i t) with three roots inside the unit circle
    // and two outside, from 17 seeds pi/8 apart starting at 0 and away from it: the change is 2 pi * 3 (with the
    // two ends alone the closed path would look like one step that does not turn, which is why callers seed)
    @ParameterizedTest(name = "from {0}")
    @CsvSource({"0", "0.001", "1"})
    void roots_near_the_circle(double from) {
        double[][] roots = {
                {0.95 * Math.cos(0.3), 0.95 * Math.sin(0.3)},
                {1.05 * Math.cos(2.0), 1.05 * Math.sin(2.0)},
                {0.9 * Math.cos(-2.5), 0.9 * Math.sin(-2.5)},
                {1.1 * Math.cos(-0.7), 1.1 * Math.sin(-0.7)},
                {0.97 * Math.cos(1.2), 0.97 * Math.sin(1.2)}};
        assertStepsFollowTheRule((t, o) -> {
            double pr = 1;
            double pi = 0;
            for (double[] r : roots) {
                double fr = Math.cos(t) - r[0];
                double fi = Math.sin(t) - r[1];
                double x = pr * fr - pi * fi;
                pi = pr * fi + pi * fr;
                pr = x;
            }
            o[0] = pr - 1;
            o[1] = pi;
            o[2] = pr;
            o[3] = pi;
        }, 0.0, seeds(from, 17), 2 * Math.PI * 3);
    }

    private static double[] seeds(double from, int n) {
        double[] ts = new double[n];
        for (int k = 0; k < n; k++) {
            ts[k] = from + 2 * Math.PI * k / (n - 1);
        }
        return ts;
    }

    // source: hand derivation; the points may come unsorted and repeated: they are walked sorted and distinct,
    // so 1 + L = 1 + 3 e^(i t) still turns once round 0 and each distinct point is asked for once when no step is cut
    @Test
    void points_are_walked_sorted_and_once_each() {
        assertStepsFollowTheRule((t, out) -> {
            out[0] = 3 * Math.cos(t);
            out[1] = 3 * Math.sin(t);
            out[2] = 1;
            out[3] = 0;
        }, 0.0, new double[] {2 * Math.PI, Math.PI, 0, Math.PI, 0.5, 2 * Math.PI}, 2 * Math.PI);
        Recorded flat = new Recorded((t, out) -> {
            out[0] = 0;
            out[1] = 0;
            out[2] = 1;
            out[3] = 0;
        });
        ArgumentWalk walk = new ArgumentWalk(flat, 0.0);
        assertThat(walk.change(new double[] {3, 1, 2, 2, 1})).isEqualTo(0.0);
        assertThat(flat.asked).containsExactly(1.0, 2.0, 3.0);
        assertThat(walk.evaluations()).isEqualTo(3);
    }

    // source: hand derivation; |1 + 0.9 e^(i t)|^2 = 1.81 + 1.8 cos t is smallest at t = pi (0.1), and pi is a seed
    @Test
    void the_closest_point_is_where_one_plus_l_is_smallest() {
        ArgumentWalk walk = new ArgumentWalk((t, out) -> {
            out[0] = 0.9 * Math.cos(t);
            out[1] = 0.9 * Math.sin(t);
            out[2] = out[0];
            out[3] = out[1];
        }, 0.0);
        walk.change(new double[] {0, 1, Math.PI, 5, 2 * Math.PI});
        assertThat(walk.closestT()).isEqualTo(Math.PI);
    }

    // source: the JDK's Math.atan2 (fdlibm, outside the project), whose sign the two predicates promise to
    // give without the arctangent, on every pair of signed zeros, small, unit and large values (whose ratios do
    // not underflow: atan2(1e-320, 1e300) rounds to 0, a sign no cross and dot product of a walk's points carries)
    @Test
    void the_turn_signs_are_those_of_atan2() {
        double[] values = {0.0, -0.0, 1e-150, -1e-150, 1.0, -1.0, 1e150, -1e150};
        for (double y : values) {
            for (double x : values) {
                double a = Math.atan2(y, x);
                assertThat(ArgumentWalk.positiveTurn(y, x)).as("atan2(%s, %s) > 0", y, x).isEqualTo(a > 0);
                assertThat(ArgumentWalk.negativeTurn(y, x)).as("atan2(%s, %s) < 0", y, x).isEqualTo(a < 0);
            }
        }
    }

    // source: hand derivation; 1 + L = 1 + 3 e^(i t) goes once round 0 counter-clockwise over [0, 2 pi] and
    // crosses the negative real axis at t = pi, exactly where |R| jumps tenfold: that step can never meet the
    // magnitude rule, so the walk stops cutting it at its smallest step and must still add the crossing (the
    // seeds start at 0.1, so no seed sits on pi and the stopped step straddles the crossing)
    @Test
    void a_step_stopped_at_the_smallest_size_still_adds_its_crossing() {
        ArgumentWalk walk = new ArgumentWalk((t, out) -> {
            out[0] = 3 * Math.cos(t);
            out[1] = 3 * Math.sin(t);
            out[2] = t < Math.PI ? 1 : 10;
            out[3] = 0;
        }, 0.0);
        assertThat(walk.change(seeds(0.1, 17))).isCloseTo(2 * Math.PI, within(1e-9));
    }

    // source: hand derivation; 1 + L = t on [0, 1] vanishes at the path's first point, where no step towards 0
    // ever shrinks below its position's relative size: the walk must still end (by its depth cap), with the
    // closest point t = 0, where |1 + L| = 0
    @Test
    void a_zero_at_the_start_of_the_path_still_ends_the_walk() {
        ArgumentWalk walk = new ArgumentWalk((t, out) -> {
            out[0] = t - 1;
            out[1] = 0;
            out[2] = out[0];
            out[3] = 0;
        }, 0.0);
        walk.change(new double[] {0, 1});
        assertThat(walk.closestT()).isEqualTo(0.0);
    }
}

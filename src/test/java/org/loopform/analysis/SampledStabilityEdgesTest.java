package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;
import static org.loopform.analysis.RootPlacedLoop.at;
import static org.loopform.analysis.RootPlacedLoop.concat;
import static org.loopform.analysis.RootPlacedLoop.join;
import static org.loopform.analysis.RootPlacedLoop.pair;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * Sampled stability on loops built from their roots ({@link RootPlacedLoop}): the closed-loop poles
 * are chosen, so every expected verdict, count and largest magnitude is the chosen root itself (hand
 * derivation: {@code 1 + L = C(z) / (z^d D(z))} vanishes exactly at the roots of C). The contract
 * checked is the one {@link SampledStability} states: stable, marginal or unstable by the ring
 * {@code 1 +- 1e-8}, the largest magnitude to 1e-6 of |ln r|, held at e^+-40 beyond.
 */
@DisplayName("Sampled stability on loops with chosen closed-loop poles")
class SampledStabilityEdgesTest {

    /** Twice the stated accuracy, as SampledLoopGoldenTest allows. */
    private static final double LOG_TOLERANCE = 2 * SampledStability.RELATIVE_LOG_TOLERANCE;

    private static void assertLargest(LoopStability s, double expected) {
        double got = Math.log(s.largestPoleMagnitude().getAsDouble());
        double want = Math.log(expected);
        assertThat(got).as("ln of the largest |z|").isCloseTo(want, within(Math.max(1e-12, LOG_TOLERANCE * Math.abs(want))));
    }

    @Nested
    @DisplayName("the largest pole")
    class Largest {

        // source: hand derivation; 1 + L = (z - p) / (z - 0.2) has its one closed-loop pole at p
        @ParameterizedTest(name = "pole at {0}")
        @CsvSource({"0.999", "0.9999", "0.99", "0.9", "0.5", "0.1", "0.01", "1e-4", "1e-9", "-0.7", "-0.99995",
                "1.00001", "1.001", "1.01", "1.5", "3", "20", "1e5", "1e12", "-4"})
        void one_real_pole_is_found_at_every_decade(double p) {
            LoopStability s = SampledStability.of(RootPlacedLoop.of(join(at(p, 0)), join(at(0.2, 0)), 0));
            boolean outside = Math.abs(p) > 1;
            assertThat(s.verdict()).isEqualTo(outside ? Stability.UNSTABLE : Stability.STABLE);
            assertThat(s.unstablePoles()).isEqualTo(outside ? 1 : 0);
            assertThat(s.test()).isEqualTo(StabilityTest.SAMPLED_POLES);
            assertLargest(s, Math.abs(p));
        }

        // source: hand derivation; the closed-loop poles are the chosen pair r e^(+-i theta) and 0.3
        @ParameterizedTest(name = "pair of magnitude {0} at {1} rad")
        @CsvSource({"0.95, 2.0", "0.6, 0.3", "0.999, 3.0", "1.05, 1.0", "2.5, 0.05", "1.0002, 2.9", "1e-3, 1.5",
                "40, 0.7"})
        void a_complex_pair_is_found(double r, double theta) {
            double[][] closed = concat(pair(r, theta), join(at(0.3, 0)));
            double[][] open = join(at(0.9, 0), at(0.5, 0), at(-0.4, 0));
            LoopStability s = SampledStability.of(RootPlacedLoop.of(closed, open, 0));
            assertThat(s.unstablePoles()).isEqualTo(r > 1 ? 2 : 0);
            assertLargest(s, Math.max(r, 0.3));
        }

        // source: hand derivation; 1 + L = (z - p) / (z - 0.2), and the contract holds magnitudes at e^40.
        // (Nothing is asserted below e^-10 inward: a circle is passed as its offset from 1, so radii under
        // about 1e-12 are not represented finely enough, and e^-40 itself rounds to radius 0.)
        @Test
        void beyond_e_to_the_40_the_magnitude_is_held_at_the_bound() {
            LoopStability huge = SampledStability.of(RootPlacedLoop.of(join(at(Math.exp(45), 0)), join(at(0.2, 0)), 0));
            assertThat(huge.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(huge.largestPoleMagnitude().getAsDouble()).isEqualTo(Math.exp(SampledStability.LARGEST_LOG_RADIUS));
        }

        // source: hand derivation; 1 + L = (z - p) / z, a gain behind one scan of delay (L = -p z^-1):
        // poles far out, up to just inside the bound e^40, and far in are located
        @ParameterizedTest(name = "ln|p| = {0}")
        @CsvSource({"39", "35", "12", "3", "-3", "-9.5", "-12", "-20", "-24.9"})
        void far_poles_are_located(double logRadius) {
            double p = Math.exp(logRadius);
            LoopStability s = SampledStability.of(RootPlacedLoop.of(join(at(p, 0)), new double[0][], 1));
            assertLargest(s, p);
        }

        // source: hand derivation; 1 + L = (z - p) / z with p = e^-30, and deadbeat (p = 0): below the floor
        // e^-25 the magnitude is reported at the floor (a radius passed as its offset from 1 keeps about
        // 1.1e-16 absolute, so e^-30 = 9.4e-14 would be known only to 1e-3), never as a smaller made-up figure
        @ParameterizedTest(name = "p = {0}")
        @CsvSource({"9.357622968840175e-14", "0"})
        void below_e_to_the_minus_25_the_magnitude_is_held_at_the_floor(double p) {
            LoopStability s = SampledStability.of(RootPlacedLoop.of(join(at(p, 0)), new double[0][], 1));
            assertThat(s.verdict()).isEqualTo(Stability.STABLE);
            assertThat(s.largestPoleMagnitude().getAsDouble()).isEqualTo(Math.exp(SampledStability.SMALLEST_LOG_RADIUS));
        }

        // source: hand derivation; the largest of several poles at different radii, the rest far inside it
        @Test
        void the_largest_of_several_poles_is_the_one_reported() {
            double[][] closed = concat(pair(0.7, 1.0), join(at(0.69, 0), at(-0.3, 0)), pair(0.2, 2.5));
            double[][] open = concat(pair(0.95, 0.2), join(at(1.0, 0), at(0.5, 0)), pair(1.2, 2.0));
            LoopStability s = SampledStability.of(RootPlacedLoop.of(closed, open, 0));
            assertThat(s.verdict()).isEqualTo(Stability.STABLE);
            assertLargest(s, 0.7);
        }
    }

    @Nested
    @DisplayName("the ring about the unit circle")
    class Ring {

        // source: hand derivation; a pole 5e-9 off the circle lies in the ring 1 +- 1e-8 the contract names marginal
        @ParameterizedTest(name = "pole at {0}")
        @CsvSource({"1.000000005", "0.999999995", "-1.000000005", "-0.999999995"})
        void a_pole_inside_the_ring_is_marginal(double p) {
            LoopStability s = SampledStability.of(RootPlacedLoop.of(join(at(p, 0)), join(at(0.2, 0)), 0));
            assertThat(s.verdict()).isEqualTo(Stability.MARGINAL);
            assertThat(s.unstablePoles()).isZero();
            assertThat(s.largestPoleMagnitude().getAsDouble()).isEqualTo(1.0);
            assertThat(s.explanation()).contains("on the unit circle").contains("1.0E-8");
        }

        // source: hand derivation; a pole exactly on the ring's inner or outer circle (z = 1 -+ 1e-8, on the
        // positive real axis where the count's path starts, or at 1 rad) lies in the closed ring: never stable
        @ParameterizedTest(name = "offset {0}, angle {1} rad")
        @CsvSource({"-1e-8, 0", "1e-8, 0", "-1e-8, 1", "1e-8, 1", "-1e-8, 3.141592653589793"})
        void a_pole_on_the_ring_edge_is_not_stable(double offset, double angle) {
            double r = 1 + offset;
            double[][] closed = angle == 0 || angle == Math.PI
                    ? join(at(r * Math.cos(angle), 0), at(0.3, 0)) : pair(r, angle);
            LoopStability s = SampledStability.of(RootPlacedLoop.of(closed, join(at(0.5, 0), at(0.6, 0)), 0));
            assertThat(s.verdict()).isNotEqualTo(Stability.STABLE);
            if (offset < 0) {
                assertThat(s.verdict()).isEqualTo(Stability.MARGINAL);
            }
        }

        // source: hand derivation; poles 3e-8 off the circle are outside the ring on either side
        @Test
        void a_pole_just_outside_the_ring_is_decided() {
            LoopStability out = SampledStability.of(RootPlacedLoop.of(join(at(1 + 3e-8, 0)), join(at(0.2, 0)), 0));
            assertThat(out.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(out.unstablePoles()).isEqualTo(1);
            assertLargest(out, 1 + 3e-8);
            LoopStability in = SampledStability.of(RootPlacedLoop.of(join(at(1 - 3e-8, 0)), join(at(0.2, 0)), 0));
            assertThat(in.verdict()).isEqualTo(Stability.STABLE);
            assertLargest(in, 1 - 3e-8);
        }

        // source: hand derivation; an integrator (open-loop pole at z = 1) with the closed loop well inside
        @Test
        void an_open_loop_pole_on_the_circle_does_not_make_the_loop_marginal() {
            LoopStability s = SampledStability.of(RootPlacedLoop.of(join(at(0.6, 0), at(0.4, 0)),
                    join(at(1.0, 0), at(0.7, 0)), 0));
            assertThat(s.verdict()).isEqualTo(Stability.STABLE);
            assertLargest(s, 0.6);
        }
    }

    @Nested
    @DisplayName("the count outside a circle")
    class Count {

        // source: hand derivation; the count outside |z| = 1 + offset is the chosen poles beyond that radius.
        // Closed-loop radii 0.1, 0.5 (pair), 0.6, 0.7, 1.2 (pair). The circles at 0.8 and 1.5 pass through
        // open-loop poles (the pair 0.8 e^(+-2i), the real 1.5), where the count must still be the closed-loop one.
        @ParameterizedTest(name = "offset {0}: {1} outside")
        @CsvSource({"-0.999, 7", "-0.95, 7", "-0.75, 6", "-0.45, 4", "-0.35, 3", "-0.25, 2", "-0.2, 2", "0.1, 2",
                "0.5, 0", "2.5, 0"})
        void poles_outside_each_circle_are_counted(double offset, int expected) {
            double[][] closed = concat(join(at(0.1, 0)), pair(0.5, 1.2), join(at(-0.6, 0)), pair(1.2, 0.5),
                    join(at(0.7, 0)));
            double[][] open = concat(join(at(0.9, 0), at(1.5, 0), at(-0.3, 0)), pair(0.8, 2.0), pair(2.0, 0.3));
            int count = SampledStability.polesOutside(RootPlacedLoop.of(closed, open, 0), offset);
            assertThat(count).isEqualTo(expected);
        }
    }

    @Nested
    @DisplayName("a circle through an open-loop pole")
    class ThroughAPole {

        // source: hand derivation; the circle |z| = 1.5 passes through the open-loop pole 1.5, and the closed-loop
        // pole 1.5 (1 - 1e-9) lies a hair inside it (with 0.3 far inside): no pole lies outside |z| = 1.5, nor
        // outside |z| = 0.75 e^(+-2.2 i)'s circle through the other open-loop pair. The count must move its circle
        // off the open-loop pole outward, past no closed-loop pole, never inward across one
        @Test
        void the_circle_steps_outward_off_the_pole() {
            double[][] closed = concat(join(at(1.5 * (1 - 1e-9), 0), at(0.3, 0)), pair(0.75 * (1 - 1e-9), 2.2));
            double[][] open = concat(join(at(1.5, 0), at(0.5, 0)), pair(0.75, 2.2));
            SampledLoop loop = RootPlacedLoop.of(closed, open, 0);
            assertThat(SampledStability.polesOutside(loop, 0.5)).isZero();
            assertThat(SampledStability.polesOutside(loop, -0.25)).isEqualTo(1);
            // and a hair further in, the pole just inside is counted
            assertThat(SampledStability.polesOutside(loop, 0.5 - 1e-7)).isEqualTo(1);
        }
    }

    @Nested
    @DisplayName("Newton's step towards a pole")
    class Newton {

        // source: hand derivation; 1 + L = C / D vanishes at the chosen pair 0.9 e^(+-i), so Newton's method on
        // f(w) = 1 + L(e^w) converges to w = ln 0.9 + i (Newton's method for analytic functions, common practice)
        @ParameterizedTest(name = "from ln r = {0}, theta = {1}")
        @CsvSource({"-0.1, 1.0", "-0.2, 1.1", "-0.05, 0.95", "-0.1054, 1.3"})
        void newton_converges_to_the_real_part_of_a_chosen_zero(double x, double theta) {
            SampledLoop loop = RootPlacedLoop.of(concat(pair(0.9, 1.0), join(at(0.2, 0))),
                    join(at(0.5, 0), at(-0.5, 0), at(0.1, 0)), 0);
            assertThat(SampledStability.newton(loop, x, theta)).isCloseTo(Math.log(0.9), within(1e-12));
        }

        // source: hand derivation; the same for a real pole outside the circle, 1 + L = (z - 3) / z
        @Test
        void newton_converges_outside_the_circle() {
            SampledLoop loop = RootPlacedLoop.of(join(at(3, 0)), new double[0][], 1);
            assertThat(SampledStability.newton(loop, 1.0, 0.05)).isCloseTo(Math.log(3), within(1e-12));
        }

        // source: hand derivation; L = 0.5 everywhere (R = 0.5, no delay) has f' = 0: Newton has no step to take
        @Test
        void newton_gives_up_on_a_flat_loop() {
            SampledLoop flat = new SampledLoop() {
                @Override
                public void at(double radiusOffset, double theta, double[] out) {
                    out[0] = 0.5;
                    out[1] = 0;
                    out[2] = 0.5;
                    out[3] = 0;
                }

                @Override
                public java.util.List<org.apache.commons.math3.complex.Complex> openLoopPoles() {
                    return java.util.List.of();
                }

                @Override
                public int delayScans() {
                    return 0;
                }
            };
            assertThat(SampledStability.newton(flat, -0.1, 1.0)).isNaN();
            // and with no closed-loop pole at all the verdict is stable (1 + L = 1.5 never vanishes)
            assertThat(SampledStability.of(flat).verdict()).isEqualTo(Stability.STABLE);
        }
    }

    @Nested
    @DisplayName("the sentence")
    class Sentence {

        // source: hand derivation; one pole at z = 2 (1 + L = (z - 2) / (z - 0.2)), printed with six significant digits
        @Test
        void one_pole_outside_is_named_in_the_singular_with_its_magnitude() {
            LoopStability s = SampledStability.of(RootPlacedLoop.of(join(at(2, 0)), join(at(0.2, 0)), 0));
            assertThat(s.explanation()).isEqualTo(
                    "One closed-loop pole lies outside the unit circle (largest |z| = 2.00000): the loop runs away.");
        }

        // source: hand derivation; the pair 3 e^(+-0.5 i) and 0.1: two poles outside, the largest of magnitude 3
        @Test
        void several_poles_outside_are_counted_in_the_sentence() {
            LoopStability s = SampledStability.of(RootPlacedLoop.of(concat(pair(3, 0.5), join(at(0.1, 0))),
                    join(at(0.2, 0), at(0.3, 0), at(0.4, 0)), 0));
            assertThat(s.explanation()).isEqualTo(
                    "2 closed-loop poles lie outside the unit circle (largest |z| = 3.00000): the loop runs away.");
        }

        // source: hand derivation; poles 0.25 and -0.5: stable, the largest 0.5
        @Test
        void a_stable_loop_names_its_largest_pole() {
            LoopStability s = SampledStability.of(RootPlacedLoop.of(join(at(0.25, 0), at(-0.5, 0)),
                    join(at(0.9, 0), at(0.8, 0)), 0));
            assertThat(s.explanation()).isEqualTo(
                    "Every closed-loop pole lies inside the unit circle (largest |z| = 0.500000).");
        }
    }

    @Nested
    @DisplayName("a pole-zero pair the loop cancels")
    class Cancelled {

        // source: hand derivation; 1 + L = (z - q)(z - 0.3) / ((z - q)(z - 0.5)): q is an open-loop pole the
        // controller's zero cancels. The closed loop keeps the mode z = q (the class contract: the count keeps a
        // cancelled pair on both sides; an unstable cancelled mode is internally unstable, Astrom and Murray,
        // Feedback Systems, 2008, ch. 11 on pole-zero cancellations - from memory for the chapter), and
        // 1 + L has no zero there, so Newton cannot find it and the bracket must.
        @ParameterizedTest(name = "cancelled mode at {0}")
        @CsvSource({"1.5, UNSTABLE", "-3, UNSTABLE", "1.02, UNSTABLE", "0.8, STABLE", "0.995, STABLE", "1.000000005, MARGINAL"})
        void the_cancelled_mode_is_counted(double q, Stability verdict) {
            LoopStability s = SampledStability.of(RootPlacedLoop.of(join(at(q, 0), at(0.3, 0)),
                    join(at(q, 0), at(0.5, 0)), 0));
            assertThat(s.verdict()).isEqualTo(verdict);
            if (verdict != Stability.MARGINAL) {
                assertThat(s.unstablePoles()).isEqualTo(Math.abs(q) > 1 ? 1 : 0);
                assertLargest(s, Math.abs(q));
            }
        }
    }

    @Nested
    @DisplayName("open-loop poles that need many seed points")
    class Seeds {

        // source: hand derivation; an open-loop pair 0.5 e^(+-i 1e-45), a double pole at 0.5 for every purpose,
        // seeds the walk down to angle 1e-45 (46 decades of points); the closed-loop poles are 0.2 and -0.6
        @Test
        void a_pair_at_a_tiny_angle_is_walked_to_the_same_answer() {
            LoopStability s = SampledStability.of(RootPlacedLoop.of(join(at(0.2, 0), at(-0.6, 0)),
                    pair(0.5, 1e-45), 0));
            assertThat(s.verdict()).isEqualTo(Stability.STABLE);
            assertLargest(s, 0.6);
            LoopStability unstable = SampledStability.of(RootPlacedLoop.of(join(at(0.2, 0), at(-1.6, 0)),
                    pair(0.5, 1e-45), 0));
            assertThat(unstable.unstablePoles()).isEqualTo(1);
            assertLargest(unstable, 1.6);
        }

        // source: hand derivation; a double open-loop pair 0.99999 e^(+-i phi), phi = 4.5 pi / 16 = 0.8836 midway
        // between two of the walk's fixed points (pi / 4 = 0.785 below, 5 pi / 16 = 0.982 above, no other between):
        // seen only from those points, R turns by nearly 2 pi between them and looks as if it had not turned at all.
        // The closed-loop poles are the unstable pair 1.2 e^(+-0.3 i) and 0.5 e^(+-2.5 i): two lie outside, and a
        // walk that missed the double pole's turn would count none (a false pass)
        @Test
        void a_double_open_loop_pole_next_to_the_circle_is_not_stepped_over() {
            double phi = 4.5 * Math.PI / 16;
            double[][] open = concat(pair(0.99999, phi), pair(0.99999, phi));
            double[][] closed = concat(pair(1.2, 0.3), pair(0.5, 2.5));
            LoopStability s = SampledStability.of(RootPlacedLoop.of(closed, open, 0));
            assertThat(s.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(s.unstablePoles()).isEqualTo(2);
            assertLargest(s, 1.2);
            // and outside the circle, with the closed loop stable: the two turns it would miss are counted
            LoopStability stable = SampledStability.of(RootPlacedLoop.of(concat(pair(0.6, 0.3), pair(0.5, 2.5)),
                    concat(pair(1.00001, phi), pair(1.00001, phi)), 0));
            assertThat(stable.verdict()).isEqualTo(Stability.STABLE);
            assertLargest(stable, 0.6);
        }

        // source: hand derivation; open-loop poles 1e-9 (relative) inside the unit circle and inside the ring's
        // circles, closed-loop poles 0.4 e^(+-0.9 i)
        @Test
        void open_loop_poles_hugging_the_circles_do_not_move_the_answer() {
            double[][] open = concat(pair(1 - 1e-8 + 1e-17, 0.3), pair(1 + 1e-8 - 5e-18, 2.2));
            double[][] closed = concat(pair(0.4, 0.9), pair(0.35, 2.0));
            LoopStability s = SampledStability.of(RootPlacedLoop.of(closed, open, 0));
            assertThat(s.verdict()).isEqualTo(Stability.STABLE);
            assertLargest(s, 0.4);
        }
    }

    @Nested
    @DisplayName("a pole nearer the circle than the largest")
    class Decoy {

        // source: hand derivation; closed-loop pairs 1.0001 e^(+-2i) and 1.003 e^(+-0.5i) (open-loop poles 0.5,
        // 0.4, -0.3, 0.2): the first lies nearest the unit circle, so a step towards the nearest zero finds it,
        // but 1.003 is the largest and four poles lie outside
        @Test
        void an_unstable_loop_reports_the_largest_not_the_nearest() {
            double[][] closed = concat(pair(1.0001, 2.0), pair(1.003, 0.5));
            LoopStability s = SampledStability.of(RootPlacedLoop.of(closed,
                    join(at(0.5, 0), at(0.4, 0), at(-0.3, 0), at(0.2, 0)), 0));
            assertThat(s.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(s.unstablePoles()).isEqualTo(4);
            assertLargest(s, 1.003);
        }

        // source: hand derivation; closed-loop pairs 0.9995 e^(+-i) and 0.999 e^(+-2.5i), with open-loop poles
        // 0.9996 e^(+-i) beside the first (so |1 + L| is near 1 there) and 0.2, 0.3 e^(+-2i): 1 + L is smallest on
        // the unit circle near the second, yet the largest pole is 0.9995
        @Test
        void a_stable_loop_reports_the_largest_not_the_nearest_zero() {
            double[][] closed = concat(pair(0.9995, 1.0), pair(0.999, 2.5));
            double[][] open = concat(pair(0.9996, 1.0), pair(0.3, 2.0));
            LoopStability s = SampledStability.of(RootPlacedLoop.of(closed, open, 0));
            assertThat(s.verdict()).isEqualTo(Stability.STABLE);
            assertLargest(s, 0.9995);
        }
    }
}

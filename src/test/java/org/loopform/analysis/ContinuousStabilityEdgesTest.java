package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.junit.jupiter.params.provider.ValueSource;
import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

/**
 * The edges of the continuous stability test: loops whose decisive feature lies where the ends of
 * the Nyquist path do not show it, the biproper and improper loops behind a dead time, and the
 * argument checks. Sources beside each check (numpy reference, small-gain and hand derivations).
 */
@DisplayName("Continuous stability at its edges")
class ContinuousStabilityEdgesTest {

    private static TransferFunction tf(double[] numAscending, double[] denAscending) {
        return new TransferFunction(Polynomial.ofAscending(numAscending), Polynomial.ofAscending(denAscending));
    }

    record Golden(String id, TransferFunction rational, double deadTimeSeconds, double slowestRadPerSecond,
            Stability verdict, int unstablePoles) {
        @Override
        public String toString() {
            return id;
        }
    }

    static Stream<Golden> goldenLoops() {
        return read().stream();
    }

    // source: src/test/python/write_continuous_edges_golden.py (numpy: the argument principle on a
    // rectangle round the right half plane, each count confirmed by Newton's method); regenerate with
    // python3 src/test/python/write_continuous_edges_golden.py from the repository root
    @ParameterizedTest(name = "{0}")
    @MethodSource("goldenLoops")
    void resonances_and_slow_lags_match_the_numpy_count(Golden golden) {
        LoopStability s = ContinuousStability.of(golden.rational(), golden.deadTimeSeconds(),
                golden.slowestRadPerSecond());

        assertThat(s.verdict()).isEqualTo(golden.verdict());
        assertThat(s.unstablePoles()).isEqualTo(golden.unstablePoles());
        assertThat(s.test()).isEqualTo(StabilityTest.NYQUIST);
    }

    @Nested
    @DisplayName("an integrator with dead time, k e^(-s L) / s")
    class IntegratorWithDeadTime {

        // source: hand derivation. L = k e^(-s L)/s crosses |L| = 1 at w = k with phase
        // -pi/2 - k L, so it is stable exactly when k L < pi/2; at k L = pi/2 a root sits at
        // s = i k. L 0.5 s: k 2 (k L = 1) stable, k 3.5 (k L = 1.75) one pair just right of the
        // axis. With the dead time read as 1/L = 2 s instead, k 2 would give k L = 4: unstable.
        @Test
        void a_dead_time_other_than_one_second_is_used_as_given() {
            TransferFunction two = tf(new double[] {2}, new double[] {0, 1});
            TransferFunction threeAndHalf = tf(new double[] {3.5}, new double[] {0, 1});
            assertThat(ContinuousStability.of(two, 0.5, 0.01).verdict()).isEqualTo(Stability.STABLE);
            LoopStability above = ContinuousStability.of(threeAndHalf, 0.5, 0.01);
            assertThat(above.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(above.unstablePoles()).isEqualTo(2);
            assertThat(above.explanation()).isEqualTo("2 closed-loop poles lie in the right half plane.");
        }

        // source: hand derivation, as above: k L = pi/2 puts the root s = i k on the axis. The
        // message states the band the test calls "on the axis": 1e-7 of the slowest frequency
        // (ContinuousStability.AXIS_OFFSET_RELATIVE), here 1e-7 x 0.01 rad/s = 1e-9 rad/s.
        @Test
        void at_its_ultimate_gain_it_is_marginal_within_the_stated_band() {
            double deadTimeSeconds = 2.0;
            TransferFunction atLimit = tf(new double[] {Math.PI / (2 * deadTimeSeconds)}, new double[] {0, 1});
            LoopStability s = ContinuousStability.of(atLimit, deadTimeSeconds, 0.01);
            assertThat(s.verdict()).isEqualTo(Stability.MARGINAL);
            assertThat(s.unstablePoles()).isZero();
            assertThat(s.explanation()).contains("within 1.0e-09 rad/s");
        }
    }

    @Nested
    @DisplayName("a loop that does not fall off at high frequency, behind a dead time")
    class HighFrequencyGain {

        // source: small-gain argument (Nyquist): k (1 + 3 s)/(1 + 4 s) has |L| <= k max(1, 3/4) = k
        // on the whole axis (|1 + 3 i w| <= |1 + 4 i w|), so with k = 0.8 the plot stays inside
        // the unit disk and cannot encircle -1, whatever the dead time: stable. Its high-frequency
        // gain is 0.8 x 3 / 4 = 0.6 < 1 (the neutral chain lies left of the axis, Hale and Verduyn
        // Lunel 1993, ch. 9 - from memory), so the Nyquist count decides.
        @ParameterizedTest
        @ValueSource(doubles = {0.3, 1.0, 2.7, 7.3})
        void a_lead_lag_inside_the_unit_disk_is_stable_at_any_dead_time(double deadTimeSeconds) {
            LoopStability s = ContinuousStability.of(tf(new double[] {0.8, 2.4}, new double[] {1, 4}),
                    deadTimeSeconds, 0.01);
            assertThat(s.verdict()).isEqualTo(Stability.STABLE);
            assertThat(s.test()).isEqualTo(StabilityTest.NYQUIST);
        }

        // source: the same small-gain argument: 0.95 (1 + 3.9 s)/(1 + 4 s) has |L| <= 0.95 on the
        // axis, stable at any dead time; its high-frequency gain 0.95 x 3.9 / 4 = 0.926 keeps 1 + L
        // up to 68 deg away from the positive real axis at the end of the path, so the count must
        // take the argument there from the loop itself.
        @ParameterizedTest
        @ValueSource(doubles = {0.3, 1.0, 2.7, 7.3, 11.1, 0.05})
        void a_lead_lag_just_inside_the_unit_disk_is_stable_at_any_dead_time(double deadTimeSeconds) {
            LoopStability s = ContinuousStability.of(tf(new double[] {0.95, 0.95 * 3.9}, new double[] {1, 4}),
                    deadTimeSeconds, 0.01);
            assertThat(s.verdict()).isEqualTo(Stability.STABLE);
        }

        // source: the neutral chain at Re s = ln|c| / L (Hale and Verduyn Lunel 1993, ch. 9 - from
        // memory): c = 1.5 x 4 / 2 = 3 > 1, so infinitely many poles lie right of the axis.
        @Test
        void a_high_frequency_gain_above_one_over_a_leading_coefficient_other_than_one_is_unstable() {
            LoopStability s = ContinuousStability.of(tf(new double[] {1.5, 6}, new double[] {1, 2}), 0.5, 0.01);
            assertThat(s.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(s.test()).isEqualTo(StabilityTest.HIGH_FREQUENCY_GAIN);
            assertThat(s.unstablePoles()).isEqualTo(Integer.MAX_VALUE);
            assertThat(s.explanation()).contains("3.000 (above 1)");
        }

        // source: the same chain, |c| = 1 exactly: (1 + 0.5 s)/(0.5 + 0.5 s)
        // has c = 0.5 / 0.5 = 1: the chain lies on the axis (marginal).
        @Test
        void a_high_frequency_gain_of_one_is_marginal() {
            LoopStability s = ContinuousStability.of(tf(new double[] {1, 0.5}, new double[] {0.5, 0.5}), 0.5, 0.01);
            assertThat(s.verdict()).isEqualTo(Stability.MARGINAL);
            assertThat(s.test()).isEqualTo(StabilityTest.HIGH_FREQUENCY_GAIN);
        }

        // source: an advanced delay equation (numerator degree above the denominator's): the loop
        // gain grows without bound, infinitely many roots lie right of any vertical line (Hale and
        // Verduyn Lunel 1993, ch. 9 - from memory).
        @Test
        void a_loop_gain_that_grows_is_unstable() {
            LoopStability s = ContinuousStability.of(tf(new double[] {1, 1}, new double[] {1}), 0.5, 0.01);
            assertThat(s.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(s.test()).isEqualTo(StabilityTest.HIGH_FREQUENCY_GAIN);
            assertThat(s.unstablePoles()).isEqualTo(Integer.MAX_VALUE);
            assertThat(s.explanation()).contains("grows without bound");
        }
    }

    @Nested
    @DisplayName("without dead time")
    class DelayFree {

        // source: hand derivation. 1/(s + 1) under gain k: the closed-loop pole is -(1 + k); k = 2
        // puts it at -3 (stable), k = -1 at 0 (marginal), k = -3 at +2 (unstable, one pole).
        @Test
        void a_first_order_loop_has_its_pole_at_minus_one_minus_k() {
            assertThat(ContinuousStability.of(tf(new double[] {2}, new double[] {1, 1}), 0, 0.1).verdict())
                    .isEqualTo(Stability.STABLE);
            assertThat(ContinuousStability.of(tf(new double[] {-1}, new double[] {1, 1}), 0, 0.1).verdict())
                    .isEqualTo(Stability.MARGINAL);
            LoopStability unstable = ContinuousStability.of(tf(new double[] {-3}, new double[] {1, 1}), 0, 0.1);
            assertThat(unstable.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(unstable.unstablePoles()).isEqualTo(1);
            assertThat(unstable.explanation()).isEqualTo("One closed-loop pole lies in the right half plane.");
        }

        // source: hand derivation. A first-order denominator 4 s + 1 under gain 1: 4 s + 2 = 0 at
        // s = -0.5; a pole at the origin is found exactly: 1/(s (s + 1)) under gain 0 is s^2 + s.
        @Test
        void first_order_and_origin_roots_are_exact() {
            assertThat(ContinuousStability.of(tf(new double[] {1}, new double[] {1, 4}), 0, 0.1).verdict())
                    .isEqualTo(Stability.STABLE);
            assertThat(ContinuousStability.polesOf(Polynomial.ofAscending(2, 4)))
                    .containsExactly(new org.apache.commons.math3.complex.Complex(-0.5, 0));
            assertThat(ContinuousStability.polesOf(Polynomial.ofAscending(0, 0, 3, 6)))
                    .startsWith(org.apache.commons.math3.complex.Complex.ZERO,
                            org.apache.commons.math3.complex.Complex.ZERO)
                    .hasSize(3);
            assertThat(ContinuousStability.polesOf(Polynomial.ofAscending(0, 0, 3, 6)).get(2).getReal())
                    .isCloseTo(-0.5, org.assertj.core.api.Assertions.within(1e-12));
        }

        // source: hand derivation, and the stated tolerance (ContinuousStability.ROOT_AXIS_TOLERANCE,
        // 1e-9 of the larger of the root's size and the slowest frequency). 1/(s + 1) under gain
        // -(1 - 5e-9): the closed-loop pole is at -5e-9 rad/s. With a slowest frequency of 10 rad/s
        // the band is 1e-8 rad/s wide, so the pole counts as on the axis (marginal); with 1e-3 rad/s
        // the band is 1e-12 rad/s and the pole is stable.
        @Test
        void a_root_within_the_stated_band_of_the_axis_is_marginal() {
            TransferFunction loop = tf(new double[] {-(1 - 5e-9)}, new double[] {1, 1});
            assertThat(ContinuousStability.of(loop, 0, 10).verdict()).isEqualTo(Stability.MARGINAL);
            assertThat(ContinuousStability.of(loop, 0, 1e-3).verdict()).isEqualTo(Stability.STABLE);
        }

        // source: hand derivation. A constant loop has no closed-loop poles.
        @Test
        void a_constant_loop_has_no_poles() {
            LoopStability s = ContinuousStability.of(tf(new double[] {3}, new double[] {2}), 0, 0.1);
            assertThat(s.verdict()).isEqualTo(Stability.STABLE);
            assertThat(s.explanation()).contains("no poles");
        }
    }

    // plumbing: the argument checks and their messages
    @Test
    void dead_time_and_slowest_frequency_are_checked() {
        TransferFunction lag = tf(new double[] {1}, new double[] {1, 1});
        assertThatThrownBy(() -> ContinuousStability.of(lag, -1, 0.1)).hasMessageContaining("got -1.0 s");
        assertThatThrownBy(() -> ContinuousStability.of(lag, Double.POSITIVE_INFINITY, 0.1))
                .hasMessageContaining("dead time");
        assertThatThrownBy(() -> ContinuousStability.of(lag, 1, 0)).hasMessageContaining("slowest frequency");
        assertThatThrownBy(() -> ContinuousStability.of(lag, 1, Double.POSITIVE_INFINITY))
                .hasMessageContaining("slowest frequency");
        assertThatThrownBy(() -> ContinuousStability.of(lag, 1, Double.NaN)).hasMessageContaining("slowest frequency");
    }

    private static List<Golden> read() {
        var stream = ContinuousStabilityEdgesTest.class.getResourceAsStream("continuous-edges-golden.csv");
        if (stream == null) {
            throw new IllegalStateException(
                    "continuous-edges-golden.csv missing; run src/test/python/write_continuous_edges_golden.py");
        }
        List<Golden> rows = new ArrayList<>();
        try (BufferedReader in = new BufferedReader(new InputStreamReader(stream, StandardCharsets.UTF_8))) {
            in.readLine();
            for (String line = in.readLine(); line != null; line = in.readLine()) {
                String[] f = line.split(",", -1);
                rows.add(new Golden(f[0], TransferFunction.ofDescending(numbers(f[1]), numbers(f[2])),
                        Double.parseDouble(f[3]), Double.parseDouble(f[4]),
                        Stability.valueOf(f[5].toUpperCase(Locale.ROOT)), Integer.parseInt(f[6])));
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return rows;
    }

    private static double[] numbers(String field) {
        return Arrays.stream(field.trim().split(" ")).mapToDouble(Double::parseDouble).toArray();
    }
}

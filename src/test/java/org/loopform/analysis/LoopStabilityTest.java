package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

/**
 * Stability decided from closed-loop poles, on loops whose poles are known by hand. Nyquist
 * criterion and argument principle: Astrom and Murray, Feedback Systems, 2008, ch. 9; sampled
 * loops: Astrom and Wittenmark, Computer-Controlled Systems, 3rd ed., 1997 (from memory for the
 * chapters). Each expected value is derived in the test's comment.
 */
class LoopStabilityTest {

    private static TransferFunction tf(double[] numAscending, double[] denAscending) {
        return new TransferFunction(Polynomial.ofAscending(numAscending), Polynomial.ofAscending(denAscending));
    }

    @Nested
    @DisplayName("a continuous loop")
    class Continuous {

        /**
         * k e^-s / (s + 1): the phase -atan(w) - w reaches -pi at w_u = 2.0288 (solved by bisection
         * here), where |L| = k / sqrt(1 + w_u^2), so the ultimate gain is sqrt(1 + w_u^2) = 2.2618
         * (the textbook value for this process).
         */
        @Test
        void first_order_with_dead_time_is_stable_below_its_ultimate_gain_and_not_above() {
            double lo = 1;
            double hi = 3;
            for (int k = 0; k < 200; k++) {
                double mid = 0.5 * (lo + hi);
                if (-Math.atan(mid) - mid > -Math.PI) {
                    lo = mid;
                } else {
                    hi = mid;
                }
            }
            double ku = Math.sqrt(1 + lo * lo);
            assertThat(ku).isCloseTo(2.2618, within(1e-4));
            LoopStability below = ContinuousStability.of(tf(new double[] {0.99 * ku}, new double[] {1, 1}), 1.0, 0.1);
            LoopStability above = ContinuousStability.of(tf(new double[] {1.01 * ku}, new double[] {1, 1}), 1.0, 0.1);
            assertThat(below.verdict()).isEqualTo(Stability.STABLE);
            assertThat(below.test()).isEqualTo(StabilityTest.NYQUIST);
            assertThat(above.verdict()).isEqualTo(Stability.UNSTABLE);
            // crossing the ultimate gain moves one complex pair into the right half plane
            assertThat(above.unstablePoles()).isEqualTo(2);
        }

        /** k / (s + 1)^3: Routh on s^3 + 3 s^2 + 3 s + 1 + k gives stability for k < 8. */
        @Test
        void third_order_lag_follows_routh_with_and_without_dead_time() {
            double[] den = {1, 3, 3, 1};
            assertThat(ContinuousStability.of(tf(new double[] {7.9}, den), 0, 0.1).verdict()).isEqualTo(Stability.STABLE);
            LoopStability unstable = ContinuousStability.of(tf(new double[] {8.1}, den), 0, 0.1);
            assertThat(unstable.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(unstable.unstablePoles()).isEqualTo(2);
            assertThat(unstable.test()).isEqualTo(StabilityTest.POLYNOMIAL_ROOTS);
            // a dead time of 1 ms moves the limit by a hair: the Nyquist count must agree away from it
            assertThat(ContinuousStability.of(tf(new double[] {7.5}, den), 1e-3, 0.1).verdict())
                    .isEqualTo(Stability.STABLE);
            assertThat(ContinuousStability.of(tf(new double[] {8.5}, den), 1e-3, 0.1).unstablePoles()).isEqualTo(2);
        }

        /**
         * Positive feedback, -2 e^-s / (s + 1): the characteristic function s + 1 - 2 e^-s is -1 at
         * s = 0 and grows without bound along the positive real axis, so it has a real root s > 0.
         */
        @Test
        void positive_feedback_is_unstable() {
            LoopStability s = ContinuousStability.of(tf(new double[] {-2}, new double[] {1, 1}), 1.0, 0.1);
            assertThat(s.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(s.unstablePoles()).isGreaterThanOrEqualTo(1);
        }

        /** k / s^2 in proportional feedback: s^2 + k = 0 puts both poles on the imaginary axis. */
        @Test
        void double_integrator_under_proportional_control_is_marginal_and_with_dead_time_unstable() {
            assertThat(ContinuousStability.of(tf(new double[] {4}, new double[] {0, 0, 1}), 0, 0.1).verdict())
                    .isEqualTo(Stability.MARGINAL);
            // with a dead time the phase -pi - w L lies below -pi at every frequency
            assertThat(ContinuousStability.of(tf(new double[] {4}, new double[] {0, 0, 1}), 0.1, 0.1).verdict())
                    .isEqualTo(Stability.UNSTABLE);
        }

        /**
         * An unstable open loop k / (s - 1): the closed-loop pole is 1 - k, so k = 2 is stable and
         * k = 0.5 is not. With a dead time of 1 ms the same (the Nyquist count must include P = 1).
         */
        @Test
        void open_loop_right_half_plane_poles_are_counted() {
            double[] den = {-1, 1};
            assertThat(ContinuousStability.of(tf(new double[] {2}, den), 0, 0.1).verdict()).isEqualTo(Stability.STABLE);
            assertThat(ContinuousStability.of(tf(new double[] {0.5}, den), 0, 0.1).verdict())
                    .isEqualTo(Stability.UNSTABLE);
            assertThat(ContinuousStability.of(tf(new double[] {2}, den), 1e-3, 0.1).verdict())
                    .isEqualTo(Stability.STABLE);
            assertThat(ContinuousStability.of(tf(new double[] {0.5}, den), 1e-3, 0.1).unstablePoles()).isEqualTo(1);
        }

        /**
         * PI on an integrating process with dead time, Kv kc (1 + 1/(Ti s)) e^(-L s) / s: the phase
         * -pi + atan(w Ti) - w L is below -pi at every w > 0 when Ti <= L (atan x < x), so the
         * Nyquist plot cannot leave the -1 point on its stable side: unstable. With Ti = 4 L it is
         * stable for a small gain (phase margin from the PI zero).
         */
        @Test
        void integrating_process_with_integral_time_below_dead_time_is_unstable() {
            // Kv 0.05, kc 0.5, Ti 4 s, L 5 s: R = 0.025 (4 s + 1) / (4 s^2)
            LoopStability s = ContinuousStability.of(tf(new double[] {0.025, 0.1}, new double[] {0, 0, 4}), 5.0, 0.01);
            assertThat(s.verdict()).isEqualTo(Stability.UNSTABLE);
            // Kv 0.05, kc 0.1, Ti 20 s, L 5 s: at crossover w ~ 0.005 the phase is -180 + 84 - 1.4 deg
            LoopStability t = ContinuousStability.of(tf(new double[] {0.005, 0.1}, new double[] {0, 0, 20}), 5.0,
                    0.001);
            assertThat(t.verdict()).isEqualTo(Stability.STABLE);
        }

        /** An unfiltered derivative on a first-order process keeps |L| = kc Td K / T at high frequency. */
        @Test
        void high_frequency_loop_gain_behind_dead_time_decides_a_neutral_loop() {
            // kc (1 + Td s) K / (T s + 1) with K = 1, T = 1: high-frequency gain kc Td
            LoopStability above = ContinuousStability.of(tf(new double[] {1, 2}, new double[] {1, 1}), 0.1, 0.1);
            assertThat(above.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(above.test()).isEqualTo(StabilityTest.HIGH_FREQUENCY_GAIN);
        }
    }

    @Nested
    @DisplayName("a sampled loop")
    class Sampled {

        /** k b z^-d / (z - a): first-order process sampled with a whole-scan delay, proportional control. */
        private SampledLoop firstOrder(double k, double a, int d) {
            double b = 1 - a;
            return new SampledLoop() {
                @Override
                public void at(double offset, double theta, double[] out) {
                    double r = 1 + offset;
                    double zr = r * Math.cos(theta);
                    double zi = r * Math.sin(theta);
                    // R = k b / (z - a)
                    double dr = zr - a;
                    double m = dr * dr + zi * zi;
                    double rr = k * b * dr / m;
                    double ri = -k * b * zi / m;
                    double s = Math.pow(r, -d);
                    double c = Math.cos(-d * theta) * s;
                    double sn = Math.sin(-d * theta) * s;
                    out[0] = rr * c - ri * sn;
                    out[1] = rr * sn + ri * c;
                    out[2] = rr;
                    out[3] = ri;
                }

                @Override
                public List<Complex> openLoopPoles() {
                    return List.of(new Complex(a, 0));
                }

                @Override
                public int delayScans() {
                    return d;
                }
            };
        }

        /**
         * Without delay the closed-loop pole is z = a - k (1 - a), a = e^(-h/T); h = T gives
         * a = 0.36788 and stability for -1 < k < (1 + a)/(1 - a) = 2.1640.
         */
        @Test
        void first_order_loop_pole_is_found_exactly() {
            double a = Math.exp(-1);
            LoopStability stable = SampledStability.of(firstOrder(2.1, a, 0));
            assertThat(stable.verdict()).isEqualTo(Stability.STABLE);
            assertThat(stable.largestPoleMagnitude().getAsDouble()).isCloseTo(Math.abs(a - 2.1 * (1 - a)), within(1e-6));
            LoopStability unstable = SampledStability.of(firstOrder(2.2, a, 0));
            assertThat(unstable.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(unstable.unstablePoles()).isEqualTo(1);
            assertThat(unstable.largestPoleMagnitude().getAsDouble()).isCloseTo(Math.abs(a - 2.2 * (1 - a)),
                    within(1e-6));
            // positive feedback: k = -1 puts the pole on z = 1 (marginal), k = -2 at 2 - a (unstable)
            assertThat(SampledStability.of(firstOrder(-1, a, 0)).verdict()).isEqualTo(Stability.MARGINAL);
            LoopStability positive = SampledStability.of(firstOrder(-2, a, 0));
            assertThat(positive.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(positive.largestPoleMagnitude().getAsDouble()).isCloseTo(2 - a, within(1e-6));
        }

        /**
         * One scan of delay: z^2 - a z + k (1 - a) = 0. For k (1 - a) > a^2/4 the poles are a complex
         * pair of magnitude sqrt(k (1 - a)): stable for k < 1/(1 - a) = 1.5820.
         */
        @Test
        void one_scan_of_delay_gives_the_complex_pair_of_the_quadratic() {
            double a = Math.exp(-1);
            LoopStability stable = SampledStability.of(firstOrder(1.5, a, 1));
            assertThat(stable.verdict()).isEqualTo(Stability.STABLE);
            assertThat(stable.largestPoleMagnitude().getAsDouble()).isCloseTo(Math.sqrt(1.5 * (1 - a)), within(1e-6));
            LoopStability unstable = SampledStability.of(firstOrder(1.7, a, 1));
            assertThat(unstable.verdict()).isEqualTo(Stability.UNSTABLE);
            assertThat(unstable.unstablePoles()).isEqualTo(2);
            assertThat(unstable.largestPoleMagnitude().getAsDouble()).isCloseTo(Math.sqrt(1.7 * (1 - a)),
                    within(1e-6));
        }

        /**
         * A long delay line: z^d (z - a) + k (1 - a) with d = 40, a = 0.99, k = 0.5. The largest root
         * is checked against numpy-free reasoning: every root satisfies |z|^d |z - a| = k (1 - a) =
         * 0.005; here we check only the count, against the closed-form ultimate gain being far above
         * (the loop is stable: |L| = 0.005 / |z - a| < 1 wherever |z - a| > 0.005, and -1 lies
         * outside that region's image... ) - instead pin the verdict by gain: at k = 0.5 the phase
         * crossover has |L| < 1.
         */
        @Test
        void a_long_delay_line_is_counted() {
            LoopStability s = SampledStability.of(firstOrder(0.5, 0.99, 40));
            assertThat(s.verdict()).isEqualTo(Stability.STABLE);
            // every root obeys |z|^40 |z - 0.99| = 0.005, so the largest is below 1 and above 0.005^(1/41)
            double r = s.largestPoleMagnitude().getAsDouble();
            assertThat(r).isLessThan(1).isGreaterThan(Math.pow(0.005, 1.0 / 41));
        }
    }
}

package org.loopform.analysis;

import org.loopform.lti.FrequencyBand;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

@DisplayName("Margin analysis")
/**
 * Source: margins derived exactly for loops whose crossings have closed forms (derivations in the
 * comments below; docs/references.md 10 for the ultimate gain of 1/(s + 1)^3, Ku = 8).
 */
class MarginAnalysisTest {

    private static final FrequencyBand BAND = FrequencyBand.of(1e-3, 1e3);

    @Nested
    @DisplayName("on loops with known margins")
    class KnownMargins {

        // Derived exactly: L = k e^(-Ls)/s crosses over at wc = k with PM = 90 deg - k L rad,
        // has its phase crossover at pi/(2L) with GM = pi/(2 k L), and delay margin PM/wc.
        @ParameterizedTest
        @CsvSource({"0.25, 1.0", "0.5, 2.0", "2.0, 0.1"})
        void integrator_with_dead_time(double gainPerSecond, double deadTimeSeconds) {
            TransferFunction integrator = new TransferFunction(Polynomial.constant(gainPerSecond), Polynomial.ofAscending(0, 1));

            LoopMargins margins = MarginAnalysis.over(BAND).analyze(LoopResponse.of(integrator, deadTimeSeconds));

            double pmRadians = Math.PI / 2 - gainPerSecond * deadTimeSeconds;
            assertThat(margins.crossoverRadPerSecond().getAsDouble()).isCloseTo(gainPerSecond, within(1e-6 * gainPerSecond));
            assertThat(margins.phaseMarginDegrees().getAsDouble()).isCloseTo(Math.toDegrees(pmRadians), within(1e-4));
            assertThat(margins.delayMarginSeconds().getAsDouble())
                    .isCloseTo(pmRadians / gainPerSecond, within(1e-6 * pmRadians / gainPerSecond));
            double gm = Math.PI / (2 * gainPerSecond * deadTimeSeconds);
            assertThat(margins.gainMargin().getAsDouble()).isCloseTo(gm, within(1e-6 * gm));
            // PM = pi/2 - k L > 0 for every row: the closed-loop poles agree (stable)
            assertThat(ContinuousStability.of(integrator, deadTimeSeconds, 0.01).verdict()).isEqualTo(Stability.STABLE);
        }

        // Derived exactly from Ku = 8 for 1/(s + 1)^3: a P gain k gives the factor 8/k at w = sqrt(3),
        // the only phase crossover; above 1 it is the gain margin, below 1 the lower gain margin
        // (the gain must shrink by it), and then no gain increase reaches the limit.
        @ParameterizedTest
        @CsvSource({"7.9, STABLE", "8.1, UNSTABLE", "1.0, STABLE", "20.0, UNSTABLE"})
        void third_order_lag_under_p_control_is_stable_below_ku(double gain, Stability expected) {
            LoopMargins margins = MarginAnalysis.over(BAND).analyze(LoopResponse.of(Loops.lag(3).times(TransferFunction.gain(gain))));

            assertThat(margins.phaseCrossovers()).hasSize(1);
            PhaseCrossover only = margins.phaseCrossovers().get(0);
            assertThat(only.gainFactor()).isCloseTo(8 / gain, within(1e-6 * 8 / gain));
            assertThat(only.radPerSecond()).isCloseTo(Math.sqrt(3), within(1e-6));
            if (gain < 8) {
                assertThat(margins.gainMargin().getAsDouble()).isCloseTo(8 / gain, within(1e-6 * 8 / gain));
                assertThat(margins.lowerGainMargin()).isEmpty();
            } else {
                assertThat(margins.gainMargin()).isEmpty();
                assertThat(margins.gainMarginNote()).contains(MarginNote.NO_UPPER_GAIN_LIMIT);
                assertThat(margins.lowerGainMargin().getAsDouble()).isCloseTo(8 / gain, within(1e-6 * 8 / gain));
            }
            // stability itself comes from the closed-loop poles (Routh: s^3 + 3 s^2 + 3 s + 1 + k, k < 8)
            assertThat(ContinuousStability.of(Loops.lag(3).times(TransferFunction.gain(gain)), 0, 0.1).verdict())
                    .isEqualTo(expected);
        }

        // Dead time makes the phase run down without bound: at w = 100 rad/s and L = 1 s it has
        // turned by about 100 rad. Derived: with gain 0.5 for 1/(s + 1), |L| < 1 everywhere.
        @Test
        void dead_time_far_beyond_crossover_leaves_the_gain_margin_finite() {
            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(1e-2, 1e2))
                    .analyze(LoopResponse.of(Loops.lag(1).times(TransferFunction.gain(0.5)), 1.0));

            assertThat(margins.phaseMarginDegrees()).isEmpty();
            assertThat(margins.crossoverRadPerSecond()).isEmpty();
            assertThat(margins.delayMarginSeconds()).isEmpty();
            // smallest GM at the first phase crossover, where w + atan w = pi
            double w = margins.phaseCrossoverRadPerSecond().getAsDouble();
            assertThat(w + Math.atan(w)).isCloseTo(Math.PI, within(1e-8));
            assertThat(margins.gainMargin().getAsDouble()).isCloseTo(2 * Math.hypot(1, w), within(1e-8));
            // 0.5 e^-s / (s + 1): |L| < 1 everywhere, so -1 cannot be encircled (small-gain argument)
            assertThat(ContinuousStability.of(Loops.lag(1).times(TransferFunction.gain(0.5)), 1.0, 0.01).verdict())
                    .isEqualTo(Stability.STABLE);
        }
    }

    @Nested
    @DisplayName("finds every crossing")
    class EveryCrossing {

        // Derived by hand: L(z) = k / (z - 1), z = e^(i theta), theta = omega h. e^(i theta) - 1 =
        // 2 sin(theta/2) e^(i (theta + pi)/2), so arg L = -(pi + theta)/2, which reaches -pi only at
        // theta = pi, the Nyquist frequency, where L = -k/2: GM = 2/k. |L| = 1 at
        // theta_c = 2 asin(k/2), PM = pi/2 - theta_c/2, DM = PM / (theta_c / h).
        @Test
        void a_phase_crossover_at_the_nyquist_frequency_is_found() {
            double k = 0.5;
            double h = 2.0;
            LoopResponse loop = Loops.sampled(Polynomial.constant(k), Polynomial.ofAscending(-1, 1), h);

            LoopMargins margins = MarginAnalysis.over(FrequencyBand.belowNyquist(1e-4, h)).analyze(loop);

            assertThat(margins.gainMargin().getAsDouble()).isCloseTo(2 / k, within(1e-9));
            assertThat(margins.phaseCrossoverRadPerSecond().getAsDouble()).isEqualTo(Math.PI / h);
            double thetaC = 2 * Math.asin(k / 2);
            double pm = Math.PI / 2 - thetaC / 2;
            assertThat(margins.phaseMarginDegrees().getAsDouble()).isCloseTo(Math.toDegrees(pm), within(1e-6));
            assertThat(margins.delayMarginSeconds().getAsDouble()).isCloseTo(pm * h / thetaC, within(1e-6 * pm * h / thetaC));
            assertThat(margins.delayMarginScans(h).getAsDouble()).isCloseTo(pm / thetaC, within(1e-6 * pm / thetaC));
        }

        // Derived by hand: a resonance under P control, x = omega / wn, L = k / (1 - x^2 + 2 i zeta x).
        // |L| = 1 where u = x^2 solves u^2 - 2 u (1 - 2 zeta^2) + 1 - k^2 = 0; with zeta = 0.01 and
        // k = 0.0202 (peak |L| about 1.01) the two roots lie 0.3 % apart, far inside one base step
        // (9.6 %). arg L = -atan2(2 zeta x, 1 - x^2), PM = 180 deg + arg L at each.
        @Test
        void two_gain_crossovers_closer_than_the_base_step_are_both_found() {
            double zeta = 0.01;
            double k = 0.0202;
            TransferFunction resonance = new TransferFunction(Polynomial.constant(k),
                    Polynomial.ofAscending(1, 2 * zeta, 1));

            LoopMargins margins = MarginAnalysis.over(BAND).analyze(LoopResponse.of(resonance));

            double b = 1 - 2 * zeta * zeta;
            double root = Math.sqrt(b * b - 1 + k * k);
            double[] x = {Math.sqrt(b - root), Math.sqrt(b + root)};
            assertThat(margins.gainCrossovers()).hasSize(2);
            double smallestPm = Double.POSITIVE_INFINITY;
            double smallestDm = Double.POSITIVE_INFINITY;
            for (int j = 0; j < 2; j++) {
                GainCrossover c = margins.gainCrossovers().get(j);
                assertThat(c.radPerSecond()).isCloseTo(x[j], within(1e-6 * x[j]));
                double pm = 180 - Math.toDegrees(Math.atan2(2 * zeta * x[j], 1 - x[j] * x[j]));
                assertThat(c.phaseMarginDegrees()).isCloseTo(pm, within(1e-4));
                smallestPm = Math.min(smallestPm, pm);
                smallestDm = Math.min(smallestDm, Math.toRadians(pm) / x[j]);
            }
            assertThat(margins.phaseMarginDegrees().getAsDouble()).isCloseTo(smallestPm, within(1e-4));
            assertThat(margins.delayMarginSeconds().getAsDouble()).isCloseTo(smallestDm, within(1e-6 * smallestDm));
            // the phase of a second-order lag never reaches -180 deg
            assertThat(margins.gainMarginNote()).contains(MarginNote.PHASE_NEVER_REACHES_MINUS_180);
        }

        // Derived by hand: L = k e^(-s L) / s has PM = 90 deg - k L rad at wc = k. With k L = 2 rad
        // the unwrapped phase at the crossover is -90 - 114.6 = -204.6 deg, the phase margin -24.6
        // deg (unstable), and the wrapped margin mod 360, 335.4 deg, is the extra delay that brings
        // the crossover around to -1 again: DM = 335.4 deg in rad / k.
        @Test
        void the_delay_margin_is_the_phase_margin_modulo_a_turn_over_the_crossover() {
            double k = 2.0;
            TransferFunction integrator = new TransferFunction(Polynomial.constant(k), Polynomial.ofAscending(0, 1));

            LoopMargins margins = MarginAnalysis.over(BAND).analyze(LoopResponse.of(integrator, 1.0));

            double pmDegrees = 90 - Math.toDegrees(2.0);
            assertThat(margins.phaseMarginDegrees().getAsDouble()).isCloseTo(pmDegrees, within(1e-4));
            double dm = Math.toRadians(pmDegrees + 360) / k;
            assertThat(margins.delayMarginSeconds().getAsDouble()).isCloseTo(dm, within(1e-6 * dm));
        }
    }

    @Nested
    @DisplayName("on loops the band cannot judge")
    class Undetermined {

        @Test
        void gain_above_one_at_the_band_top_leaves_stability_undetermined() {
            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(1e-2, 1e-1))
                    .analyze(LoopResponse.of(Loops.lag(3).times(TransferFunction.gain(2))));

            assertThat(margins.phaseMarginDegrees()).isEmpty();
            assertThat(margins.gainMargin()).isEmpty();
        }
    }

    @Nested
    @DisplayName("validates its inputs")
    class Validation {

        @Test
        void band_must_rise() {
            assertThatThrownBy(() -> FrequencyBand.of(10, 1))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("got 1.0 rad/s");
        }

        @Test
        void band_below_nyquist_ends_at_pi_over_h() {
            assertThat(FrequencyBand.belowNyquist(0.01, 0.5).highRadPerSecond()).isEqualTo(Math.PI / 0.5);
            assertThatThrownBy(() -> FrequencyBand.belowNyquist(0.01, 0))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("scan time");
        }

        @Test
        void grid_needs_a_few_points() {
            assertThatThrownBy(() -> MarginAnalysis.over(BAND, 3))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("got 3");
        }

        @Test
        void dead_time_must_not_be_negative() {
            assertThatThrownBy(() -> LoopResponse.of(Loops.lag(1), -0.5))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("got -0.5 s");
        }
    }
}

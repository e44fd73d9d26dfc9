package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.lti.FrequencyBand;
import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

/**
 * The margin search at the edges of its band and of its grid: crossings at the band's ends and in
 * its first interval, a gain margin of exactly 1, a sensitivity peak inside the last interval,
 * every phase crossover of a long dead time, and the band and grid arguments. Each expected value
 * is derived in the comment above its check.
 */
@DisplayName("Margin search at its edges")
class MarginSearchEdgesTest {

    private static TransferFunction integrator(double gainPerSecond) {
        return new TransferFunction(Polynomial.constant(gainPerSecond), Polynomial.ofAscending(0, 1));
    }

    // source: hand derivation. L = k/s^2 (a double integrator under proportional control) is real and
    // negative at every frequency: |L| = 1 at w = sqrt(k) with phase -180 deg, so the loop sits on -1
    // there (closed-loop poles +-i sqrt(k)): PM 0 deg and no extra dead time needed, DM 0 s.
    @Test
    void a_plot_on_the_negative_real_axis_has_no_phase_margin_and_no_delay_margin() {
        for (double k : new double[] {1, 4, 0.25}) {
            TransferFunction doubleIntegrator = new TransferFunction(Polynomial.constant(k), Polynomial.ofAscending(0, 0, 1));
            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(0.01, 100)).analyze(LoopResponse.of(doubleIntegrator));

            assertThat(margins.crossoverRadPerSecond().getAsDouble()).isCloseTo(Math.sqrt(k), within(1e-9));
            assertThat(margins.phaseMarginDegrees().getAsDouble()).isCloseTo(0, within(1e-9));
            assertThat(margins.delayMarginSeconds().getAsDouble()).isCloseTo(0, within(1e-9));
        }
    }

    @Nested
    @DisplayName("a crossing at an end of the band")
    class BandEnds {

        // source: hand derivation. L = 1/s: |L| = 1/w is exactly 1 at w = 1, the band's first
        // point, with arg L = -90 deg: PM = 90 deg, DM = (pi/2)/1 s.
        @Test
        void a_gain_crossover_on_the_first_point_is_found() {
            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(1, 100)).analyze(LoopResponse.of(integrator(1)));

            assertThat(margins.crossoverRadPerSecond().getAsDouble()).isCloseTo(1, within(1e-9));
            assertThat(margins.phaseMarginDegrees().getAsDouble()).isCloseTo(90, within(1e-9));
            assertThat(margins.delayMarginSeconds().getAsDouble()).isCloseTo(Math.PI / 2, within(1e-9));
        }

        // source: hand derivation. L = s: |L| = w >= 1 on [1, 100], equal to 1 only at the first
        // point: the gain never falls below 1, so there is no crossover and the note says it stays above.
        @Test
        void a_gain_that_touches_one_at_the_bottom_and_rises_stays_above_one() {
            TransferFunction differentiator = new TransferFunction(Polynomial.ofAscending(0, 1), Polynomial.ONE);
            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(1, 100)).analyze(LoopResponse.of(differentiator));

            assertThat(margins.phaseMarginDegrees()).isEmpty();
            assertThat(margins.phaseMarginNote()).contains(MarginNote.GAIN_STAYS_ABOVE_ONE);
        }

        // source: hand derivation. L = 500/s has |L| = 500/w >= 5 on [10, 100]: no gain crossover
        // lies in the band (it is at 500 rad/s, outside it).
        @Test
        void a_crossover_above_the_band_is_not_reported() {
            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(10, 100)).analyze(LoopResponse.of(integrator(500)));

            assertThat(margins.gainCrossovers()).isEmpty();
            assertThat(margins.phaseMarginNote()).contains(MarginNote.GAIN_STAYS_ABOVE_ONE);
        }

        // source: docs/references.md 10: 1/(s + 1)^3 has Ku = 8 at w = sqrt(3). With gain 2 the
        // gain margin is 4. The band starts at 1.73 rad/s, just below sqrt(3) = 1.7321, so the
        // crossing lies in the grid's first interval.
        @Test
        void a_phase_crossover_in_the_first_interval_is_found() {
            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(1.73, 100))
                    .analyze(LoopResponse.of(Loops.lag(3).times(TransferFunction.gain(2))));

            assertThat(margins.gainMargin().getAsDouble()).isCloseTo(4, within(4e-6));
            assertThat(margins.phaseCrossoverRadPerSecond().getAsDouble()).isCloseTo(Math.sqrt(3), within(2e-6));
        }

        // source: hand derivation. L(z) = k/(z - 1) at z = -1 (the Nyquist frequency pi/h) is
        // -k/2: with k = 2 the plot passes through -1 exactly there, a gain margin of exactly 1
        // (the loop is at its limit; Jury's test on z - 1 + k gives |1 - k| < 1, k = 2 the edge).
        @Test
        void a_gain_margin_of_exactly_one_at_the_nyquist_frequency_is_reported_not_dropped() {
            double h = 0.5;
            LoopResponse loop = Loops.sampled(Polynomial.constant(2), Polynomial.ofAscending(-1, 1), h);

            LoopMargins margins = MarginAnalysis.over(FrequencyBand.belowNyquist(1e-3, h)).analyze(loop);

            assertThat(margins.gainMargin().getAsDouble()).isCloseTo(1, within(1e-12));
            assertThat(margins.phaseCrossoverRadPerSecond().getAsDouble()).isEqualTo(Math.PI / h);
            assertThat(margins.lowerGainMargin()).isEmpty();
            assertThat(margins.marginsPositive()).isFalse();
        }
    }

    @Nested
    @DisplayName("a very light resonance between base points")
    class LightResonance {

        // source: hand derivation, as in MarginAnalysisTest: x = w/wn, L = k/(1 - x^2 + 2 i zeta x),
        // |L| = 1 where u = x^2 solves u^2 - 2 u (1 - 2 zeta^2) + 1 - k^2 = 0, PM = 180 deg -
        // atan2(2 zeta x, 1 - x^2). With zeta = 0.001 the phase slope at the nearest base points
        // (about 4.4 % away) is about zeta/d^2 = 0.5 rad per unit x, which predicts a turn of
        // 3 deg per base step: only the search's own bisection, seeing the phase flip by half a
        // turn between neighbours, can find the two crossovers 0.06 % apart.
        @Test
        void both_gain_crossovers_of_a_resonance_with_damping_one_in_a_thousand_are_found() {
            double zeta = 0.001;
            double k = 0.0021;
            TransferFunction resonance = new TransferFunction(Polynomial.constant(k),
                    Polynomial.ofAscending(1, 2 * zeta, 1));

            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(1e-3, 1e3)).analyze(LoopResponse.of(resonance));

            double b = 1 - 2 * zeta * zeta;
            double root = Math.sqrt(b * b - 1 + k * k);
            double[] x = {Math.sqrt(b - root), Math.sqrt(b + root)};
            assertThat(margins.gainCrossovers()).hasSize(2);
            for (int j = 0; j < 2; j++) {
                GainCrossover c = margins.gainCrossovers().get(j);
                assertThat(c.radPerSecond()).isCloseTo(x[j], within(1e-6 * x[j]));
                double pm = 180 - Math.toDegrees(Math.atan2(2 * zeta * x[j], 1 - x[j] * x[j]));
                assertThat(c.phaseMarginDegrees()).isCloseTo(pm, within(1e-4));
            }
            // Re L = k (1 - x^2)/|.|^2 >= 0 for x <= 1, so |1 + L| >= 1 up to wn; just above wn Re L
            // is large and negative (about -1 at the upper crossover), |1 + L| < 1: Ms peaks above wn
            assertThat(margins.maximumSensitivityRadPerSecond()).isGreaterThan(1);
            // at a gain crossover L = e^(i (PM - 180 deg)), so |1 + L| = 2 sin(PM/2): Ms is at least
            // 1/(2 sin(PM/2)) at the upper crossover
            double pmUpper = Math.toRadians(180 - Math.toDegrees(Math.atan2(2 * zeta * x[1], 1 - x[1] * x[1])));
            assertThat(margins.maximumSensitivity()).isGreaterThanOrEqualTo(1 / (2 * Math.sin(pmUpper / 2)) * (1 - 1e-9));
        }
    }

    @Nested
    @DisplayName("a resonance with an anti-resonance inside one base step")
    class ResonanceAndAntiResonance {

        private static final double ZETA = 0.001;
        private static final double ZERO_RAD_PER_SECOND = 1.03;
        private static final double GAIN = 0.05;

        /** {|L|^2, arg L} of k (1 + 2 zeta s/wz + s^2/wz^2)/(1 + 2 zeta s + s^2) at s = i w, by hand. */
        private double[] at(double w) {
            double nr = 1 - w * w / (ZERO_RAD_PER_SECOND * ZERO_RAD_PER_SECOND);
            double ni = 2 * ZETA * w / ZERO_RAD_PER_SECOND;
            double dr = 1 - w * w;
            double di = 2 * ZETA * w;
            double mag2 = GAIN * GAIN * (nr * nr + ni * ni) / (dr * dr + di * di);
            return new double[] {mag2, Math.atan2(ni, nr) - Math.atan2(di, dr)};
        }

        // source: hand derivation. A lightly damped pole pair at 1 rad/s and zero pair at 1.03 rad/s
        // (a flexible mechanism with its anti-resonance just above the resonance), both inside the
        // base step [0.957, 1.0445] rad/s of a 160-point grid over [1e-3, 1e3]. Across that step
        // the phase comes back to about 0 (the pole pair's -180 deg and the zero pair's +180 deg)
        // while |L| falls from 0.081 to 0.016, a factor of 5: only the magnitude check can send
        // the search into the step. Near 1 rad/s |L| peaks at about k (1 - 1/wz^2)/(2 zeta) = 1.43,
        // so two gain crossovers lie there; they are found below by scanning |L|^2 - 1 on a 1e-6
        // grid over [0.98, 1.02] and bisecting each sign change, PM = 180 deg + arg L.
        @Test
        void both_gain_crossovers_are_found() {
            TransferFunction loop = new TransferFunction(
                    Polynomial.ofAscending(GAIN, GAIN * 2 * ZETA / ZERO_RAD_PER_SECOND,
                            GAIN / (ZERO_RAD_PER_SECOND * ZERO_RAD_PER_SECOND)),
                    Polynomial.ofAscending(1, 2 * ZETA, 1));

            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(1e-3, 1e3), 160).analyze(LoopResponse.of(loop));

            java.util.List<Double> expected = new java.util.ArrayList<>();
            double step = 1e-6;
            for (double w = 0.98; w < 1.02; w += step) {
                if ((at(w)[0] < 1) != (at(w + step)[0] < 1)) {
                    double lo = w;
                    double hi = w + step;
                    for (int i = 0; i < 100; i++) {
                        double mid = 0.5 * (lo + hi);
                        if ((at(mid)[0] < 1) == (at(lo)[0] < 1)) {
                            lo = mid;
                        } else {
                            hi = mid;
                        }
                    }
                    expected.add(lo);
                }
            }
            assertThat(expected).hasSize(2);
            assertThat(margins.gainCrossovers()).hasSize(2);
            for (int j = 0; j < 2; j++) {
                double w = expected.get(j);
                GainCrossover c = margins.gainCrossovers().get(j);
                assertThat(c.radPerSecond()).isCloseTo(w, within(1e-6 * w));
                double pm = 180 + Math.toDegrees(at(w)[1]);
                pm -= 360 * Math.ceil((pm - 180) / 360);
                assertThat(c.phaseMarginDegrees()).isCloseTo(pm, within(1e-3));
            }
        }
    }

    @Nested
    @DisplayName("an undamped notch")
    class UndampedNotch {

        // source: hand derivation. L = 2 (1 + s^2)/(s + 1)^3: the undamped zero pair (a notch filter
        // with zero damping) makes L vanish at w = 1, where the real factor 1 - w^2 changes sign and
        // the phase flips by half a turn, which no bisection resolves: the search must stop closing
        // in at its smallest width. Elsewhere |L| = 2 |1 - w^2| / (1 + w^2)^(3/2): 2 at w = 0, 0 at
        // w = 1 and below 0.55 above it, so the one gain crossover lies below 1 rad/s, where
        // 2 (1 - w^2) = (1 + w^2)^(3/2) (solved by bisection below) and arg L = -3 atan w:
        // PM = 180 deg - 3 atan(wc). The phase -3 atan w stays above -180 deg below w = 1 and
        // 180 deg - 3 atan w stays in (-90, 45] deg above it, so no finite gain factor puts the
        // plot on -1: no gain margin.
        @Test
        void the_crossover_below_an_undamped_notch_is_found_and_the_notch_ends_the_bisection() {
            TransferFunction notched = new TransferFunction(Polynomial.ofAscending(2, 0, 2),
                    Polynomial.ofAscending(1, 3, 3, 1));

            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(1e-3, 1e3)).analyze(LoopResponse.of(notched));

            double lo = 0;
            double hi = 1;
            for (int i = 0; i < 200; i++) {
                double mid = 0.5 * (lo + hi);
                if (2 * (1 - mid * mid) > Math.pow(1 + mid * mid, 1.5)) {
                    lo = mid;
                } else {
                    hi = mid;
                }
            }
            assertThat(margins.gainCrossovers()).hasSize(1);
            assertThat(margins.crossoverRadPerSecond().getAsDouble()).isCloseTo(lo, within(1e-6 * lo));
            assertThat(margins.phaseMarginDegrees().getAsDouble())
                    .isCloseTo(180 - 3 * Math.toDegrees(Math.atan(lo)), within(1e-4));
            assertThat(margins.gainMargin()).isEmpty();
        }
    }

    @Nested
    @DisplayName("the sensitivity peak")
    class SensitivityPeak {

        // source: src/test/python/check_many_dips_ms.py (numpy/scipy; prints w = 97.39963704035503
        // rad/s and Ms = 9.985794616339133). L = 0.45 (1 + s)/(1 + s/2) e^(-s) has a dip of
        // |1 + L| near each of its 16 phase crossovers below 100 rad/s, about 1 - |L| deep, and |L|
        // rises with w, so the deepest is the last one, near (2 x 15 + 1) pi - small = 97.4 rad/s:
        // by hand 1/(1 - 0.45 x |1 + 97.4 i| / |1 + 48.7 i|) = 9.986. The grid point nearest a dip
        // may sit up to 11 deg of phase away from it, so the grid alone can settle on a shallower dip.
        @Test
        void the_deepest_of_many_dips_is_found() {
            TransferFunction lead = new TransferFunction(Polynomial.ofAscending(0.45, 0.45), Polynomial.ofAscending(1, 0.5));
            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(1e-3, 100)).analyze(LoopResponse.of(lead, 1.0));

            assertThat(margins.maximumSensitivity()).isCloseTo(9.985794616339133, within(1e-7));
            assertThat(margins.maximumSensitivityRadPerSecond()).isCloseTo(97.39963704035503, within(1e-4));
        }

        // source: scipy.optimize.minimize_scalar (bounded, xatol 1e-12) on |1 + 2/(1 + i w)^3|
        // gives w = 1.2247448705 and Ms = 1.6666666667, checked by hand: at w^2 = 3/2,
        // (1 + i w)^3 + 2 = -1.5 + 1.5 i w, |.|^2 = 2.25 + 3.375 = 5.625, |1 + i w|^6 = 2.5^3 =
        // 15.625, so |1 + L| = sqrt(0.36) = 0.6 and Ms = 5/3 at w = sqrt(3/2). The band ends 2 %
        // above the peak, which then lies inside the grid's last interval.
        @Test
        void a_peak_inside_the_last_interval_is_refined() {
            double peakRadPerSecond = Math.sqrt(1.5);
            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(1e-3, 1.02 * peakRadPerSecond))
                    .analyze(LoopResponse.of(Loops.lag(3).times(TransferFunction.gain(2))));

            assertThat(margins.maximumSensitivity()).isCloseTo(5.0 / 3, within(1e-9));
            assertThat(margins.maximumSensitivityRadPerSecond()).isCloseTo(peakRadPerSecond, within(1e-5));
        }
    }

    @Nested
    @DisplayName("a long dead time")
    class LongDeadTime {

        // source: hand derivation. L = 0.5 e^(-s)/(s + 1) has phase -(w + atan w), which rises
        // monotonically, so it passes -180 deg - m 360 deg once for each m with
        // (2 m + 1) pi < 1000 + atan 1000, m = 0 .. 158: 159 crossovers, each where
        // w + atan w = (2 m + 1) pi (solved by bisection below), with factor 1/|L| = 2 sqrt(1 + w^2).
        @Test
        void every_phase_crossover_up_to_the_band_top_is_found() {
            double top = 1e3;
            LoopMargins margins = MarginAnalysis.over(FrequencyBand.of(1e-3, top))
                    .analyze(LoopResponse.of(Loops.lag(1).times(TransferFunction.gain(0.5)), 1.0));

            List<PhaseCrossover> crossings = margins.phaseCrossovers();
            int expected = 0;
            while ((2 * expected + 1) * Math.PI < top + Math.atan(top)) {
                expected++;
            }
            assertThat(expected).isEqualTo(159);
            assertThat(crossings).hasSize(expected);
            for (int m = 0; m < expected; m++) {
                double target = (2 * m + 1) * Math.PI;
                double lo = 0;
                double hi = target;
                for (int i = 0; i < 200; i++) {
                    double mid = 0.5 * (lo + hi);
                    if (mid + Math.atan(mid) < target) {
                        lo = mid;
                    } else {
                        hi = mid;
                    }
                }
                PhaseCrossover c = crossings.get(m);
                assertThat(c.radPerSecond()).as("crossing %d", m).isCloseTo(lo, within(1e-6 * lo));
                assertThat(c.gainFactor()).as("factor %d", m).isCloseTo(2 * Math.hypot(1, lo), within(1e-6 * 2 * Math.hypot(1, lo)));
            }
        }
    }

    @Nested
    @DisplayName("the band and the grid")
    class BandAndGrid {

        // plumbing: the smallest grid allowed is 8 points (MarginAnalysis.MIN_GRID_POINTS)
        @Test
        void a_grid_of_eight_points_is_accepted_and_seven_refused() {
            assertThat(MarginAnalysis.over(FrequencyBand.of(0.1, 10), 8).gridPoints()).isEqualTo(8);
            assertThatThrownBy(() -> MarginAnalysis.over(FrequencyBand.of(0.1, 10), 7))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("got 7");
        }

        // source: hand derivation. L = 1/s: |L(100)| = 0.01, not below the negligible 0.01, so the
        // top doubles once, to 200 rad/s, where |L| = 0.005.
        @Test
        void the_top_rises_until_the_gain_is_below_the_negligible_level() {
            FrequencyBand band = MarginAnalysis.reachingNegligibleGain(LoopResponse.of(integrator(1)),
                    FrequencyBand.of(1, 100));
            assertThat(band.highRadPerSecond()).isEqualTo(200);
            assertThat(band.lowRadPerSecond()).isEqualTo(1);
        }

        // plumbing: the documented bound, at most 20 doublings (a factor 2^20, about a million),
        // for a loop whose gain never falls (|L| = 2 at every frequency)
        @Test
        void the_top_stops_after_twenty_doublings() {
            FrequencyBand band = MarginAnalysis.reachingNegligibleGain(LoopResponse.of(TransferFunction.gain(2)),
                    FrequencyBand.of(1, 10));
            assertThat(band.highRadPerSecond()).isEqualTo(10 * Math.pow(2, 20));
        }
    }
}

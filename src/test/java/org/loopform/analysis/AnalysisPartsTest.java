package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.OptionalDouble;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.lti.FrequencyBand;
import org.loopform.lti.TransferFunction;
import org.loopform.simulate.SampledResponse;

/**
 * The analysis package's small parts: the dead-time factor of a loop response, the records'
 * validity rules (plumbing, each checked on both sides of its boundary) and the step figures on
 * hand-checkable samples. Sources beside each check.
 */
class AnalysisPartsTest {

    @Nested
    @DisplayName("a loop response with dead time")
    class DeadTime {

        @Test
        void multiplies_by_e_to_the_minus_i_omega_l() {
            // 1/(s + 1) at w = 1: 1/(1 + i) = 0.5 - 0.5i; e^(-i pi/2) = -i, so the product is
            // (0.5 - 0.5i)(-i) = -0.5 - 0.5i (complex arithmetic, by hand)
            TransferFunction lag = TransferFunction.ofDescending(new double[] {1}, new double[] {1, 1});
            double[] out = new double[2];
            LoopResponse.of(lag, Math.PI / 2).at(1, out);
            assertThat(out[0]).isCloseTo(-0.5, within(1e-12));
            assertThat(out[1]).isCloseTo(-0.5, within(1e-12));
            // a quarter turn more (L = pi): e^(-i pi) = -1, so -0.5 + 0.5i
            LoopResponse.of(lag, Math.PI).at(1, out);
            assertThat(out[0]).isCloseTo(-0.5, within(1e-12));
            assertThat(out[1]).isCloseTo(0.5, within(1e-12));
        }

        @Test
        void without_dead_time_is_the_rational_response_and_a_negative_one_is_refused() {
            TransferFunction lag = TransferFunction.ofDescending(new double[] {1}, new double[] {1, 1});
            double[] out = new double[2];
            LoopResponse.of(lag, 0).at(1, out);
            assertThat(out[0]).isCloseTo(0.5, within(1e-12));
            assertThat(out[1]).isCloseTo(-0.5, within(1e-12));
            assertThatThrownBy(() -> LoopResponse.of(lag, -1)).hasMessageContaining("got -1.0 s");
            assertThatThrownBy(() -> LoopResponse.of(lag, Double.POSITIVE_INFINITY)).hasMessageContaining("dead time");
            assertThatThrownBy(() -> LoopResponse.of(lag, Double.NaN)).hasMessageContaining("dead time");
            assertThatThrownBy(() -> LoopResponse.of(null, 1.0)).isInstanceOf(NullPointerException.class);
        }
    }

    @Nested
    @DisplayName("records")
    class Records {

        @Test
        void a_stability_verdict_is_consistent_with_its_pole_count() {
            LoopStability ok = new LoopStability(Stability.STABLE, StabilityTest.POLYNOMIAL_ROOTS, 0,
                    OptionalDouble.empty(), "fine");
            assertThat(ok.isStable()).isTrue();
            assertThat(new LoopStability(Stability.UNSTABLE, StabilityTest.NYQUIST, 2, OptionalDouble.of(1.2), "x")
                    .isStable()).isFalse();
            assertThat(new LoopStability(Stability.MARGINAL, StabilityTest.NYQUIST, 0, OptionalDouble.of(0), "x")
                    .isStable()).isFalse();
            assertThatThrownBy(() -> new LoopStability(Stability.STABLE, StabilityTest.NYQUIST, 1,
                    OptionalDouble.empty(), "x")).hasMessageContaining("no unstable poles (got 1)");
            assertThatThrownBy(() -> new LoopStability(Stability.UNSTABLE, StabilityTest.NYQUIST, -1,
                    OptionalDouble.empty(), "x")).hasMessageContaining(">= 0 (got -1)");
            assertThatThrownBy(() -> new LoopStability(Stability.UNSTABLE, StabilityTest.NYQUIST, 1,
                    OptionalDouble.of(-0.5), "x")).hasMessageContaining("magnitude must be >= 0");
            assertThatThrownBy(() -> new LoopStability(Stability.UNSTABLE, StabilityTest.NYQUIST, 1,
                    OptionalDouble.of(Double.NaN), "x")).hasMessageContaining("magnitude");
        }

        @Test
        void words_and_descriptions() {
            assertThat(Stability.MARGINAL.word()).isEqualTo("marginal");
            assertThat(MarginNote.GAIN_STAYS_ABOVE_ONE.id()).isEqualTo("gain_stays_above_one");
            assertThat(MarginNote.GAIN_STAYS_BELOW_ONE.text()).isEqualTo("|L| never reaches 1");
            assertThat(StabilityTest.POLYNOMIAL_ROOTS.describe()).contains("characteristic polynomial");
        }

        @Test
        void a_gain_crossover_has_a_phase_margin_in_the_half_open_turn() {
            assertThat(new GainCrossover(1, 180, 0).phaseMarginDegrees()).isEqualTo(180);
            assertThat(new GainCrossover(1, -179.9, 0).phaseMarginDegrees()).isEqualTo(-179.9);
            assertThatThrownBy(() -> new GainCrossover(1, -180, 0)).hasMessageContaining("(-180, 180]");
            assertThatThrownBy(() -> new GainCrossover(1, 180.1, 0)).hasMessageContaining("(-180, 180]");
            assertThatThrownBy(() -> new GainCrossover(0, 10, 0)).hasMessageContaining("gain crossover must be");
            assertThatThrownBy(() -> new GainCrossover(Double.POSITIVE_INFINITY, 10, 0))
                    .hasMessageContaining("gain crossover must be");
            assertThatThrownBy(() -> new GainCrossover(1, 10, -0.1)).hasMessageContaining("delay margin");
            assertThatThrownBy(() -> new GainCrossover(1, 10, Double.POSITIVE_INFINITY))
                    .hasMessageContaining("delay margin");
        }

        @Test
        void a_phase_crossover_has_a_positive_finite_factor() {
            assertThat(new PhaseCrossover(2, 0.5).gainFactor()).isEqualTo(0.5);
            assertThatThrownBy(() -> new PhaseCrossover(0, 1)).hasMessageContaining("phase crossover must be");
            assertThatThrownBy(() -> new PhaseCrossover(Double.POSITIVE_INFINITY, 1))
                    .hasMessageContaining("phase crossover must be");
            assertThatThrownBy(() -> new PhaseCrossover(1, 0)).hasMessageContaining("gain factor");
            assertThatThrownBy(() -> new PhaseCrossover(1, Double.POSITIVE_INFINITY)).hasMessageContaining("gain factor");
        }

        @Test
        void an_ultimate_cycle_has_a_period_of_two_pi_over_its_frequency() {
            // Tu = 2 pi / wu (Ziegler and Nichols 1942)
            assertThat(new UltimateCycle(8, Math.sqrt(3)).ultimatePeriodSeconds())
                    .isCloseTo(2 * Math.PI / Math.sqrt(3), within(1e-12));
            assertThatThrownBy(() -> new UltimateCycle(Double.POSITIVE_INFINITY, 1)).hasMessageContaining("ultimate gain");
            assertThatThrownBy(() -> new UltimateCycle(1, 0)).hasMessageContaining("ultimate frequency");
            assertThatThrownBy(() -> new UltimateCycle(1, Double.POSITIVE_INFINITY))
                    .hasMessageContaining("ultimate frequency");
        }
    }

    @Nested
    @DisplayName("step figures on hand-checkable samples")
    class Steps {

        @Test
        void a_downward_step_measures_overshoot_below_the_setpoint() {
            // from 10 % to 0 %: the PV dips to -1 %, one tenth of the 10 % step beyond the setpoint: 10 %
            SampledResponse r = SampledResponse.of(new double[] {0, 1, 2, 3}, new double[] {10, 2, -1, 0},
                    new double[4]);
            StepMetrics m = StepMetrics.ofSetpointStep(r, 10, 0);
            assertThat(m.overshootPercent().getAsDouble()).isCloseTo(10, within(1e-12));
            // error = setpoint - PV = -PV: -10, -2, 1, 0 at 0..3 s; the band is 2 % of 10 = 0.2 %; last
            // outside at sample 2 (e = 1), the edge 0.2 reached at 2 + (1 - 0.2)/(1 - 0) = 2.8 s
            assertThat(m.settlingTimeSeconds().getAsDouble()).isCloseTo(2.8, within(1e-12));
            assertThat(m.peakDeviationPercent()).isEqualTo(10);
        }

        @Test
        void a_response_inside_the_band_from_the_start_has_settled_at_once() {
            SampledResponse r = SampledResponse.of(new double[] {0, 1}, new double[] {0.5, 0.5}, new double[2]);
            StepMetrics m = StepMetrics.ofLoadStep(r, 0.5, 0.1);
            assertThat(m.settlingTimeSeconds().getAsDouble()).isZero();
            assertThat(m.integralAbsoluteErrorPercentSeconds()).isZero();
        }

        @Test
        void the_iae_of_an_error_that_touches_zero_is_one_triangle() {
            // e: 1 at t = 0, 0 at t = 2 (a sample exactly on the setpoint): the triangle 0.5 * 2 * 1 = 1
            SampledResponse r = SampledResponse.of(new double[] {0, 2}, new double[] {0, 1}, new double[2]);
            assertThat(StepMetrics.ofSetpointStep(r, 0, 1).integralAbsoluteErrorPercentSeconds())
                    .isCloseTo(1, within(1e-15));
            // e: 0 then -1 over 2 s (PV above the setpoint): the triangle 1 as well
            SampledResponse above = SampledResponse.of(new double[] {0, 2}, new double[] {1, 2}, new double[2]);
            assertThat(StepMetrics.ofLoadStep(above, 1, 5).integralAbsoluteErrorPercentSeconds())
                    .isCloseTo(1, within(1e-15));
        }

        @Test
        void load_step_inputs_are_checked() {
            SampledResponse r = SampledResponse.of(new double[] {0, 1}, new double[2], new double[2]);
            assertThatThrownBy(() -> StepMetrics.ofLoadStep(r, Double.NaN, 1)).hasMessageContaining("setpoint");
            assertThatThrownBy(() -> StepMetrics.ofLoadStep(r, 0, 0)).hasMessageContaining("settling band");
            assertThatThrownBy(() -> StepMetrics.ofLoadStep(r, 0, Double.POSITIVE_INFINITY))
                    .hasMessageContaining("settling band");
            assertThatThrownBy(() -> StepMetrics.ofSetpointStep(r, 0, Double.NaN)).hasMessageContaining("finite");
            assertThatThrownBy(() -> new StepMetrics(-1, OptionalDouble.empty(), OptionalDouble.empty(), 0, 0))
                    .hasMessageContaining("IAE");
            assertThatThrownBy(() -> new StepMetrics(0, OptionalDouble.of(-1), OptionalDouble.empty(), 0, 0))
                    .hasMessageContaining("overshoot");
            assertThatThrownBy(() -> new StepMetrics(0, OptionalDouble.empty(), OptionalDouble.of(-1), 0, 0))
                    .hasMessageContaining("settling time");
            assertThatThrownBy(() -> new StepMetrics(0, OptionalDouble.empty(), OptionalDouble.empty(), -1, 0))
                    .hasMessageContaining("peak deviation");
            assertThatThrownBy(() -> new StepMetrics(0, OptionalDouble.empty(), OptionalDouble.empty(), 0,
                    Double.POSITIVE_INFINITY)).hasMessageContaining("output travel");
        }
    }

    @Nested
    @DisplayName("loop margins")
    class Margins {

        private final OptionalDouble none = OptionalDouble.empty();

        private LoopMargins margins(double gm, double pm, double ms) {
            return new LoopMargins(OptionalDouble.of(gm), OptionalDouble.of(1), OptionalDouble.of(pm),
                    OptionalDouble.of(0.5), OptionalDouble.of(2), ms, 0.8);
        }

        @Test
        void margins_are_positive_above_a_gain_of_1_and_a_phase_of_0() {
            assertThat(margins(2, 45, 1.5).marginsPositive()).isTrue();
            assertThat(margins(1, 45, 1.5).marginsPositive()).isFalse();
            assertThat(margins(2, 0, 1.5).marginsPositive()).isFalse();
            assertThat(margins(0.5, 45, 1.5).marginsPositive()).isFalse();
            assertThat(new LoopMargins(none, none, none, none, none, 1.2, 1).marginsPositive()).isTrue();
        }

        @Test
        void the_delay_margin_in_scans_is_the_delay_margin_over_the_scan_time() {
            // DM / h: 2 s over 0.5 s = 4 scans
            assertThat(margins(2, 45, 1.5).delayMarginScans(0.5).getAsDouble()).isEqualTo(4.0);
            assertThat(new LoopMargins(none, none, none, none, none, 1.2, 1).delayMarginScans(0.5)).isEmpty();
            assertThatThrownBy(() -> margins(2, 45, 1.5).delayMarginScans(0)).hasMessageContaining("scan time");
            assertThatThrownBy(() -> margins(2, 45, 1.5).delayMarginScans(Double.POSITIVE_INFINITY))
                    .hasMessageContaining("scan time");
            assertThat(new LoopMargins(none, none, none, none, none, 1.2, 1).delayMarginNote())
                    .contains(MarginNote.NOT_IN_BAND);
        }

        @Test
        void ms_of_a_strictly_proper_loop_is_at_least_1_read_at_the_band_top() {
            // |S| -> 1 as |L| -> 0 at high frequency, so the supremum is at least 1
            LoopMargins low = margins(2, 45, 0.9).withSensitivityAtLeastOne(100);
            assertThat(low.maximumSensitivity()).isEqualTo(1.0);
            assertThat(low.maximumSensitivityRadPerSecond()).isEqualTo(100);
            LoopMargins one = margins(2, 45, 1.0);
            assertThat(one.withSensitivityAtLeastOne(100)).isSameAs(one);
            LoopMargins high = margins(2, 45, 1.7);
            assertThat(high.withSensitivityAtLeastOne(100)).isSameAs(high);
        }

        @Test
        void each_figure_is_checked_where_it_is_given() {
            assertThatThrownBy(() -> new LoopMargins(OptionalDouble.of(2), OptionalDouble.of(0), none, none, none, 1.2, 1))
                    .hasMessageContaining("phase crossover must be finite and > 0 (got 0.0)");
            assertThatThrownBy(() -> new LoopMargins(OptionalDouble.of(Double.POSITIVE_INFINITY), OptionalDouble.of(1),
                    none, none, none, 1.2, 1)).hasMessageContaining("gain margin must be finite");
            assertThatThrownBy(() -> new LoopMargins(none, none, OptionalDouble.of(Double.NaN), OptionalDouble.of(1),
                    OptionalDouble.of(1), 1.2, 1)).hasMessageContaining("phase margin must be finite (got NaN)");
            // a phase margin may be negative or zero; a crossover may not
            assertThat(new LoopMargins(none, none, OptionalDouble.of(-10), OptionalDouble.of(1), OptionalDouble.of(0),
                    1.2, 1).phaseMarginDegrees().getAsDouble()).isEqualTo(-10);
            assertThatThrownBy(() -> new LoopMargins(none, none, OptionalDouble.of(10), OptionalDouble.of(0),
                    OptionalDouble.of(1), 1.2, 1)).hasMessageContaining("gain crossover must be finite and > 0");
            assertThatThrownBy(() -> new LoopMargins(none, none, OptionalDouble.of(10), OptionalDouble.of(1),
                    OptionalDouble.of(Double.NaN), 1.2, 1)).hasMessageContaining("delay margin must be finite (got NaN)");
            assertThatThrownBy(() -> new LoopMargins(none, none, none, none, none, 0, 1))
                    .hasMessageContaining("maximum sensitivity must be > 0");
            assertThatThrownBy(() -> new LoopMargins(none, none, none, none, none, 1.2, 0))
                    .hasMessageContaining("maximum sensitivity frequency");
            assertThatThrownBy(() -> new LoopMargins(none, none, none, none, none, 1.2, Double.POSITIVE_INFINITY))
                    .hasMessageContaining("maximum sensitivity frequency");
            assertThatThrownBy(() -> new LoopMargins(none, none, OptionalDouble.of(10), OptionalDouble.of(1), none,
                    1.2, 1)).hasMessageContaining("must come together");
        }

        @Test
        void a_lower_gain_margin_lies_below_1() {
            java.util.Optional<MarginNote> noNote = java.util.Optional.empty();
            java.util.Optional<MarginNote> note = java.util.Optional.of(MarginNote.NOT_IN_BAND);
            assertThatThrownBy(() -> new LoopMargins(OptionalDouble.of(2), OptionalDouble.of(1), OptionalDouble.of(1),
                    none, none, none, 1.2, 1, noNote, note, java.util.List.of(), java.util.List.of()))
                    .hasMessageContaining("lower gain margin must be below 1 (got 1.0)");
            assertThat(new LoopMargins(OptionalDouble.of(2), OptionalDouble.of(1), OptionalDouble.of(0.5),
                    none, none, none, 1.2, 1, noNote, note, java.util.List.of(), java.util.List.of())
                    .lowerGainMargin().getAsDouble()).isEqualTo(0.5);
            assertThatThrownBy(() -> new LoopMargins(OptionalDouble.of(2), OptionalDouble.of(1), none,
                    none, none, none, 1.2, 1, note, note, java.util.List.of(), java.util.List.of()))
                    .hasMessageContaining("give exactly one");
            assertThatThrownBy(() -> new LoopMargins(OptionalDouble.of(2), OptionalDouble.of(1), none,
                    none, none, none, 1.2, 1, noNote, noNote, java.util.List.of(), java.util.List.of()))
                    .hasMessageContaining("give exactly one");
        }

        @Test
        void the_iae_across_a_sign_change_is_two_triangles_split_at_the_zero() {
            // e = 3 then -1 over 2 s: zero at 3/4 of the interval, 0.5 * 1.5 * 3 + 0.5 * 0.5 * 1 = 2.5
            SampledResponse r = SampledResponse.of(new double[] {0, 2}, new double[] {-3, 1}, new double[2]);
            assertThat(StepMetrics.ofLoadStep(r, 0, 10).integralAbsoluteErrorPercentSeconds()).isCloseTo(2.5, within(1e-15));
        }
    }

    @Nested
    @DisplayName("the margin grid")
    class Grid {

        @Test
        void takes_160_points_or_25_a_decade_on_a_wide_band() {
            // 4 decades: 25 * 4 + 1 = 101 < 160, so 160 points
            assertThat(MarginAnalysis.over(FrequencyBand.of(0.01, 100)).gridPoints()).isEqualTo(160);
            // 8 decades: 25 * 8 + 1 = 201 points
            assertThat(MarginAnalysis.over(FrequencyBand.of(1e-4, 1e4)).gridPoints()).isEqualTo(201);
            assertThat(MarginAnalysis.over(FrequencyBand.of(0.01, 100)).band()).isEqualTo(FrequencyBand.of(0.01, 100));
        }

        @Test
        void is_raised_by_doublings_until_the_loop_gain_is_below_a_hundredth() {
            // |1/(s + 1)| = 1/sqrt(1 + w^2) < 0.01 first at w = 1.6 * 2^6 = 102.4 rad/s (at 51.2: 0.0195)
            LoopResponse lag = LoopResponse.of(TransferFunction.ofDescending(new double[] {1}, new double[] {1, 1}));
            FrequencyBand raised = MarginAnalysis.reachingNegligibleGain(lag, FrequencyBand.of(0.1, 1.6));
            assertThat(raised.lowRadPerSecond()).isEqualTo(0.1);
            assertThat(raised.highRadPerSecond()).isEqualTo(102.4);
            // already negligible at the top: unchanged
            assertThat(MarginAnalysis.reachingNegligibleGain(lag, FrequencyBand.of(0.1, 200)).highRadPerSecond())
                    .isEqualTo(200);
        }
    }
}

package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.OptionalDouble;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;
import org.loopform.form.Structure;
import org.loopform.form.StructureLaw;
import org.loopform.law.LawDeviation;
import org.loopform.lti.FrequencyBand;
import org.loopform.scan.PulseLaw;
import org.loopform.simulate.SampledResponse;

/**
 * Edges of the analysis package's smaller figures: step figures on a few hand-checkable samples,
 * the setpoint path of the controller mismatch, and the records' limits. Sources beside each check.
 */
@DisplayName("Analysis figures at their edges")
class AnalysisFiguresEdgesTest {

    @Nested
    @DisplayName("step figures")
    class Steps {

        private SampledResponse response(double[] t, double[] pv) {
            return SampledResponse.of(t, pv, new double[t.length]);
        }

        // source: hand derivation. Setpoint step 0 -> 100 %, band 2 %; PV 50 at t = 10 s (error 50),
        // 99 at t = 11 s (error 1, inside): the error enters the band (2) where it falls linearly
        // from 50 to 1: 10 + (50 - 2)/(50 - 1) s = 10.97959 s, counted from the first sample at 10 s.
        @Test
        void settling_is_counted_from_the_first_sample_even_when_it_is_not_at_zero() {
            StepMetrics m = StepMetrics.ofSetpointStep(response(new double[] {10, 11, 12}, new double[] {50, 99, 100}),
                    0, 100);
            assertThat(m.settlingTimeSeconds().getAsDouble()).isCloseTo(48.0 / 49, within(1e-12));
        }

        // source: hand derivation. An error exactly on the band edge (PV 98 for a setpoint of 100,
        // error 2 = 2 % of the step) is inside the band ("within 2 %", common practice): the response
        // is settled from the sample where it reaches it, t = 1 s, entered between 0 and 1 s at
        // 0 + (100 - 2)/(100 - 2) = 1 s.
        @Test
        void an_error_on_the_band_edge_counts_as_inside() {
            StepMetrics m = StepMetrics.ofSetpointStep(response(new double[] {0, 1, 2}, new double[] {0, 98, 98}),
                    0, 100);
            assertThat(m.settlingTimeSeconds().getAsDouble()).isCloseTo(1, within(1e-12));
        }

        // source: hand derivation. Load response about 50 %: error -4 at 0 s, +4 at 2 s (sign change
        // half way, at 1 s), then 0: two triangles of base 1 s and height 4, 2 x (0.5 x 1 x 4) = 4 % s,
        // plus the last interval 0.5 x 2 x 4 = 4 % s: IAE 8 % s.
        @Test
        void an_interval_where_the_error_changes_sign_is_split_at_its_zero() {
            StepMetrics m = StepMetrics.ofLoadStep(response(new double[] {0, 2, 4}, new double[] {54, 46, 50}), 50, 1);
            assertThat(m.integralAbsoluteErrorPercentSeconds()).isCloseTo(8, within(1e-12));
            assertThat(m.peakDeviationPercent()).isEqualTo(4);
        }
    }

    @Nested
    @DisplayName("the controller mismatch")
    class Mismatch {

        private PidSetting p(double gain, double b) {
            return new PidSetting(Structure.IDEAL, gain, Double.POSITIVE_INFINITY, 0, 0, b, 1);
        }

        // source: hand derivation. P control, gain 2, setpoint weight b: C_y = 2, C_r = 2 b. The run
        // law has b = 0.5, the design b = 1: the feedback paths agree (0 dB) and the setpoint path
        // runs at half the designed gain, 20 log10(0.5) = -6.02 dB, so 6.02 dB over both paths.
        @Test
        void a_run_setpoint_weight_below_the_design_shows_on_the_setpoint_path() {
            var design = StructureLaw.toLaw(p(2, 1), FilterPlacement.DERIVATIVE);
            PulseLaw run = PulseLaw.of(p(2, 0.5), FilterPlacement.DERIVATIVE, Discretization.BACKWARD,
                    Discretization.BACKWARD, 1);
            FrequencyBand band = FrequencyBand.of(0.01, 1);
            LawDeviation both = ControllerMismatch.over(design, run, band);
            assertThat(both.gainDb()).isCloseTo(20 * Math.log10(2), within(1e-9));
            assertThat(ControllerMismatch.over(design, run, band, true).gainDb()).isCloseTo(0, within(1e-12));
        }
    }

    @Nested
    @DisplayName("records")
    class Records {

        // plumbing: a delay margin must be finite like every other figure
        @Test
        void a_delay_margin_must_be_finite() {
            assertThatThrownBy(() -> new LoopMargins(OptionalDouble.empty(), OptionalDouble.empty(),
                    OptionalDouble.of(30), OptionalDouble.of(1), OptionalDouble.of(Double.POSITIVE_INFINITY), 1.5, 1))
                    .hasMessageContaining("delay margin must be finite");
            assertThatThrownBy(() -> new LoopMargins(OptionalDouble.empty(), OptionalDouble.empty(),
                    OptionalDouble.of(30), OptionalDouble.of(1), OptionalDouble.of(Double.NaN), 1.5, 1))
                    .hasMessageContaining("delay margin must be finite");
        }

        // plumbing: a lower gain margin is a factor in (0, 1); zero or below is no factor
        @Test
        void a_lower_gain_margin_must_be_positive() {
            for (double bad : new double[] {0, -0.5, Double.NEGATIVE_INFINITY}) {
                assertThatThrownBy(() -> new LoopMargins(OptionalDouble.of(2), OptionalDouble.of(1), OptionalDouble.of(bad),
                        OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty(), 1.5, 1,
                        java.util.Optional.empty(), java.util.Optional.of(MarginNote.GAIN_STAYS_BELOW_ONE),
                        java.util.List.of(), java.util.List.of()))
                        .as("lower gain margin %s", bad)
                        .hasMessageContaining("lower gain margin must be finite and > 0");
            }
        }

        // plumbing: an ultimate gain of zero is no gain at all (Ku > 0, Ziegler and Nichols 1942)
        @Test
        void an_ultimate_gain_of_zero_is_refused() {
            assertThatThrownBy(() -> new UltimateCycle(0, 1)).hasMessageContaining("ultimate gain");
            assertThatThrownBy(() -> new UltimateCycle(-1, 1)).hasMessageContaining("ultimate gain");
        }
    }
}

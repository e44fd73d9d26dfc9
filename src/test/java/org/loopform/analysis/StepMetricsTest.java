package org.loopform.analysis;

import org.loopform.simulate.SampledResponse;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.function.DoubleUnaryOperator;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

@DisplayName("Step metrics")
class StepMetricsTest {

    /** Samples {@code f} every {@code dt} from 0 to {@code end}; the controller output is held at zero. */
    private static SampledResponse sample(DoubleUnaryOperator f, double dtSeconds, double endSeconds) {
        int n = (int) Math.round(endSeconds / dtSeconds) + 1;
        double[] t = new double[n];
        double[] y = new double[n];
        for (int k = 0; k < n; k++) {
            t[k] = k * dtSeconds;
            y[k] = f.applyAsDouble(t[k]);
        }
        return SampledResponse.of(t, y, new double[n]);
    }

    @Nested
    @DisplayName("of a first-order step response y = A (1 - e^(-t/T))")
    class FirstOrder {

        private static final double STEP_PERCENT = 10;
        private static final double TIME_CONSTANT_SECONDS = 2;
        private final StepMetrics metrics = StepMetrics.ofSetpointStep(
                sample(t -> STEP_PERCENT * (1 - Math.exp(-t / TIME_CONSTANT_SECONDS)), 1e-3, 30 * TIME_CONSTANT_SECONDS),
                0, STEP_PERCENT);

        // Calculus: the integral of A e^(-t/T) over t >= 0 is A T.
        @Test
        void iae_is_step_times_time_constant() {
            assertThat(metrics.integralAbsoluteErrorPercentSeconds())
                    .isCloseTo(STEP_PERCENT * TIME_CONSTANT_SECONDS, within(1e-5));
        }

        // Ogata, Modern Control Engineering, 4th ed., 2002, section 5-2 (from memory): the error
        // e^(-t/T) falls to 2 % at t = T ln 50 (about 4 T).
        @Test
        void settles_to_two_percent_at_t_ln_50() {
            assertThat(metrics.settlingTimeSeconds().getAsDouble())
                    .isCloseTo(TIME_CONSTANT_SECONDS * Math.log(50), within(1e-6));
        }

        @Test
        void does_not_overshoot_and_deviates_most_at_the_start() {
            assertThat(metrics.overshootPercent().getAsDouble()).isZero();
            assertThat(metrics.peakDeviationPercent()).isEqualTo(STEP_PERCENT);
        }
    }

    @Nested
    @DisplayName("of an underdamped second-order step response")
    class SecondOrder {

        // Ogata, Modern Control Engineering, 4th ed., 2002, section 5-3 (from memory):
        // y = 1 - e^(-zeta wn t) (cos wd t + zeta / sqrt(1 - zeta^2) sin wd t), wd = wn sqrt(1 - zeta^2),
        // maximum overshoot exp(-zeta pi / sqrt(1 - zeta^2)).
        @ParameterizedTest
        @ValueSource(doubles = {0.1, 0.3, 0.5, 0.7})
        void overshoot_is_exp_of_minus_zeta_pi_over_sqrt_one_minus_zeta_squared(double zeta) {
            double wn = 1.5;
            double root = Math.sqrt(1 - zeta * zeta);
            DoubleUnaryOperator y = t -> 1 - Math.exp(-zeta * wn * t)
                    * (Math.cos(wn * root * t) + zeta / root * Math.sin(wn * root * t));

            StepMetrics metrics = StepMetrics.ofSetpointStep(sample(y, 1e-4, 100), 0, 1);

            assertThat(metrics.overshootPercent().getAsDouble())
                    .isCloseTo(100 * Math.exp(-zeta * Math.PI / root), within(1e-4));
            // the settling time is where the error last leaves the 2 % band
            double settling = metrics.settlingTimeSeconds().getAsDouble();
            assertThat(Math.abs(1 - y.applyAsDouble(settling))).isCloseTo(0.02, within(1e-6));
            for (double t = settling + 0.01; t < 100; t += 0.01) {
                assertThat(Math.abs(1 - y.applyAsDouble(t))).isLessThanOrEqualTo(0.02);
            }
        }
    }

    @Nested
    @DisplayName("of a load response y = r + A t e^(-t/T)")
    class LoadResponse {

        private static final double SETPOINT_PERCENT = 50;
        private static final double AMPLITUDE_PERCENT_PER_SECOND = 3;
        private static final double TIME_CONSTANT_SECONDS = 4;
        private final StepMetrics metrics = StepMetrics.ofLoadStep(
                sample(t -> SETPOINT_PERCENT + AMPLITUDE_PERCENT_PER_SECOND * t * Math.exp(-t / TIME_CONSTANT_SECONDS),
                        1e-3, 40 * TIME_CONSTANT_SECONDS),
                SETPOINT_PERCENT, 0.1);

        // Calculus: A t e^(-t/T) peaks at t = T with A T / e, and integrates to A T^2.
        @Test
        void peak_deviation_is_a_t_over_e() {
            assertThat(metrics.peakDeviationPercent())
                    .isCloseTo(AMPLITUDE_PERCENT_PER_SECOND * TIME_CONSTANT_SECONDS / Math.E, within(1e-6));
        }

        @Test
        void iae_is_a_t_squared() {
            assertThat(metrics.integralAbsoluteErrorPercentSeconds())
                    .isCloseTo(AMPLITUDE_PERCENT_PER_SECOND * TIME_CONSTANT_SECONDS * TIME_CONSTANT_SECONDS, within(1e-4));
        }

        @Test
        void has_no_overshoot_figure() {
            assertThat(metrics.overshootPercent()).isEmpty();
            assertThat(metrics.settlingTimeSeconds()).isPresent();
        }
    }

    @Nested
    @DisplayName("on hand-checkable samples")
    class ByHand {

        // Two triangles of base 1/2 and height 1: 1/4 each.
        @Test
        void iae_splits_an_interval_where_the_error_changes_sign() {
            SampledResponse response = SampledResponse.of(new double[] {0, 1}, new double[] {0, 2}, new double[2]);

            assertThat(StepMetrics.ofSetpointStep(response, 0, 1).integralAbsoluteErrorPercentSeconds())
                    .isCloseTo(0.5, within(1e-15));
        }

        // |5 - 0| + |3 - 5| + |4 - 3| = 8.
        @Test
        void output_travel_sums_the_moves() {
            SampledResponse response = SampledResponse.of(
                    new double[] {0, 1, 2, 3}, new double[] {0, 0.5, 1, 1}, new double[] {0, 5, 3, 4});

            assertThat(StepMetrics.ofSetpointStep(response, 0, 1).outputTravelPercent()).isEqualTo(8.0);
        }

        @Test
        void a_response_still_outside_the_band_has_not_settled() {
            SampledResponse response = SampledResponse.of(new double[] {0, 1, 2}, new double[] {0, 0.5, 0.9}, new double[3]);

            assertThat(StepMetrics.ofSetpointStep(response, 0, 1).settlingTimeSeconds()).isEmpty();
        }

        /**
         * Samples on 1 s: PV 50, 55, 58, then held at 58 to t = 9 s; output 40, 45, 47, then held.
         * Step 50 -> 60: errors 10, 5, 2, then 2 to the end. IAE (10 + 5)/2 + (5 + 2)/2 + 2 (9 - 2) = 25;
         * travel 5 + 2 = 7; still outside the 2 % band (0.2) at the end: not settled. As a load response
         * about 60 with a 3 % band it leaves the band for good between 1 s (e = 5) and 2 s (e = 2), at
         * 1 + (5 - 3)/(5 - 2) s; its peak is 10.
         */
        @Test
        void a_held_tail_counts_as_its_repeated_samples() {
            SampledResponse.Recorder r = SampledResponse.recorder(10, 1.0);
            r.add(50, 40);
            r.add(55, 45);
            r.add(58, 47);
            r.holdRemaining();
            SampledResponse held = r.toResponse();

            StepMetrics sp = StepMetrics.ofSetpointStep(held, 50, 60);
            assertThat(sp.integralAbsoluteErrorPercentSeconds()).isCloseTo(25.0, within(1e-12));
            assertThat(sp.outputTravelPercent()).isEqualTo(7.0);
            assertThat(sp.settlingTimeSeconds()).isEmpty();
            assertThat(sp.overshootPercent()).hasValue(0.0);
            StepMetrics load = StepMetrics.ofLoadStep(held, 60, 3);
            assertThat(load.settlingTimeSeconds().getAsDouble()).isCloseTo(1 + 2.0 / 3, within(1e-12));
            assertThat(load.peakDeviationPercent()).isEqualTo(10.0);
        }
    }

    @Nested
    @DisplayName("validates its inputs")
    class Validation {

        @Test
        void times_must_increase() {
            assertThatThrownBy(() -> SampledResponse.of(new double[] {0, 1, 1}, new double[3], new double[3]))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("sample 2 at 1.0 s");
        }

        @Test
        void arrays_must_match() {
            assertThatThrownBy(() -> SampledResponse.of(new double[] {0, 1}, new double[3], new double[2]))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("3 process values");
        }

        @Test
        void a_setpoint_step_must_move_the_setpoint() {
            SampledResponse response = SampledResponse.of(new double[] {0, 1}, new double[2], new double[2]);

            assertThatThrownBy(() -> StepMetrics.ofSetpointStep(response, 40, 40))
                    .isInstanceOf(IllegalArgumentException.class)
                    .hasMessageContaining("40.0 % to 40.0 %");
        }
    }
}

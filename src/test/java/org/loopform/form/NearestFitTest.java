// source: Astrom & Hagglund, PID Controllers: Theory, Design and Tuning, 2nd ed., ISA 1995, sec. 3.4 (section from memory); the expected values are the invented settings the fit must recover
package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.law.ControlLaw;
import org.loopform.law.TuningBand;
import org.loopform.lti.FrequencyBand;
import org.loopform.units.TimeUnit;

/**
 * The nearest fit, tried where the answer is known without it: when the target's family holds
 * the source law, the fit's cost (a weighted sum of squared complex log-ratios, zero only where
 * the two responses agree at every grid frequency) has its minimum, zero, at the setting that
 * writes the law, and the map from setting to law is one-to-one (StructureLaw's maps,
 * Astrom and Hagglund 1995, sec. 3.4). So a fit started away from that setting must come back to
 * it. The settings are invented; the expected values are the settings themselves.
 */
class NearestFitTest {

    /** Relative agreement asked of a recovered coordinate: the simplex stops at 1e-10 relative cost. */
    private static final double RECOVERED = 1e-4;

    private static FormDefinition target(Structure structure, FilterSpec filter, Weight b, Weight c) {
        boolean parallel = structure == Structure.PARALLEL;
        return new FormDefinition("t", "target", "", structure,
                new GainSpec(GainWriting.GAIN, GainBasis.PERCENT, SignConvention.SIGNED),
                new IntegralSpec(parallel ? IntegralWriting.GAIN : IntegralWriting.TIME, TimeUnit.SECONDS, 0.0),
                new DerivativeSpec(parallel ? DerivativeWriting.GAIN : DerivativeWriting.TIME, TimeUnit.SECONDS),
                filter, b, c, Map.of(), DiscreteAlgorithm.defaults());
    }

    private static FilterSpec filter(FilterKind kind, double ratio) {
        return new FilterSpec(kind, FilterPlacement.DERIVATIVE, ratio, TimeUnit.SECONDS, 0);
    }

    private static PidSetting fit(FormDefinition to, PidSetting truth, PidSetting start) {
        ControlLaw law = StructureLaw.toLaw(truth, to.filter().placement());
        FrequencyBand band = TuningBand.implied(law.terms(), 0);
        FrequencyBand lives = TuningBand.whereLoopLives(law.terms(), 0);
        return new NearestFit(to, law, band, lives).fit(start);
    }

    private static void assertRecovers(PidSetting got, PidSetting truth) {
        assertThat(got.structure()).isEqualTo(truth.structure());
        assertClose("gain", got.gain(), truth.gain());
        if (Double.isInfinite(truth.integral())) {
            assertThat(got.integral()).as("integral").isInfinite();
        } else {
            assertClose("integral", got.integral(), truth.integral());
        }
        assertClose("derivative", got.derivative(), truth.derivative());
        assertClose("filter", got.filterSeconds(), truth.filterSeconds());
        assertThat(got.b()).as("b").isCloseTo(truth.b(), within(RECOVERED));
        assertThat(got.c()).as("c").isCloseTo(truth.c(), within(RECOVERED));
    }

    private static void assertClose(String what, double got, double want) {
        assertThat(got).as(what).isCloseTo(want, within(RECOVERED * Math.max(Math.abs(want), 1e-9)));
    }

    @Nested
    @DisplayName("weighting")
    class Weighting {

        @Test
        void is_one_where_the_loop_lives_and_falls_as_the_square_of_the_distance_outside() {
            FrequencyBand lives = FrequencyBand.of(1, 10);
            assertThat(NearestFit.weight(1, lives)).isEqualTo(1.0);
            assertThat(NearestFit.weight(10, lives)).isEqualTo(1.0);
            assertThat(NearestFit.weight(3, lives)).isEqualTo(1.0);
            // a decade away counts a hundredth; half the bottom a quarter
            assertThat(NearestFit.weight(0.1, lives)).isCloseTo(0.01, within(1e-15));
            assertThat(NearestFit.weight(0.5, lives)).isCloseTo(0.25, within(1e-15));
            assertThat(NearestFit.weight(100, lives)).isCloseTo(0.01, within(1e-15));
            assertThat(NearestFit.weight(20, lives)).isCloseTo(0.25, within(1e-15));
        }
    }

    @Nested
    @DisplayName("a law the target can write is found again")
    class Recovers {

        @Test
        void an_ideal_pid_with_an_adjustable_filter_ratio() {
            // truth K 2, Ti 20 s, Td 3 s, Tf 0.5 s (N = 6); start K 3, Ti 10 s, Td 5 s, N 10
            FormDefinition to = target(Structure.IDEAL, filter(FilterKind.RATIO, 10), Weight.fixed(1), Weight.fixed(1));
            PidSetting truth = new PidSetting(Structure.IDEAL, 2, 20, 3, 0.5, 1, 1);
            PidSetting start = new PidSetting(Structure.IDEAL, 3, 10, 5, 0.5, 1, 1);
            assertRecovers(fit(to, truth, start), truth);
        }

        @Test
        void a_direct_acting_parallel_pid_keeps_its_signs() {
            // kp -2, ki -0.1 1/s, kd -4 s, Tf 0.4 s; start kp -1, ki -0.3, kd -1, Tf 0.1 s
            FormDefinition to = target(Structure.PARALLEL, filter(FilterKind.RATIO, 10), Weight.fixed(1), Weight.fixed(1));
            PidSetting truth = new PidSetting(Structure.PARALLEL, -2, -0.1, -4, 0.4, 1, 1);
            PidSetting start = new PidSetting(Structure.PARALLEL, -1, -0.3, -1, 0.1, 1, 1);
            assertRecovers(fit(to, truth, start), truth);
        }

        @Test
        void a_series_pid_with_an_adjustable_filter_time_constant() {
            // K 2, Ti 10 s, Td 1 s, Tf 0.3 s; start K 1, Ti 30 s, Td 3 s, Tf 1 s
            FormDefinition to = target(Structure.SERIES,
                    new FilterSpec(FilterKind.TIME_CONSTANT, FilterPlacement.DERIVATIVE, 10, TimeUnit.SECONDS, 1),
                    Weight.fixed(1), Weight.fixed(1));
            PidSetting truth = new PidSetting(Structure.SERIES, 2, 10, 1, 0.3, 1, 1);
            PidSetting start = new PidSetting(Structure.SERIES, 1, 30, 3, 1, 1, 1);
            assertRecovers(fit(to, truth, start), truth);
        }

        @Test
        void an_ideal_pd_without_integral_action() {
            FormDefinition to = target(Structure.IDEAL, filter(FilterKind.RATIO, 10), Weight.fixed(1), Weight.fixed(1));
            PidSetting truth = new PidSetting(Structure.IDEAL, 2, Double.POSITIVE_INFINITY, 3, 0.3, 1, 1);
            PidSetting start = new PidSetting(Structure.IDEAL, 1, Double.POSITIVE_INFINITY, 1, 0.1, 1, 1);
            assertRecovers(fit(to, truth, start), truth);
        }

        @Test
        void a_pi_law_leaves_the_derivative_and_its_filter_at_zero() {
            FormDefinition to = target(Structure.IDEAL, filter(FilterKind.RATIO, 10), Weight.fixed(1), Weight.fixed(1));
            PidSetting truth = new PidSetting(Structure.IDEAL, 0.8, 45, 0, 0, 1, 1);
            PidSetting start = new PidSetting(Structure.IDEAL, 2, 10, 0, 0, 1, 1);
            assertRecovers(fit(to, truth, start), truth);
        }

        @Test
        void a_parallel_pi_law_without_integral_keeps_ki_zero() {
            FormDefinition to = target(Structure.PARALLEL, filter(FilterKind.NONE, 10), Weight.fixed(1), Weight.fixed(1));
            PidSetting truth = new PidSetting(Structure.PARALLEL, 1.5, 0, 2, 0, 1, 1);
            PidSetting start = new PidSetting(Structure.PARALLEL, 3, 0, 5, 0, 1, 1);
            assertRecovers(fit(to, truth, start), truth);
        }

        @Test
        void a_fixed_ratio_filter_follows_the_derivative_time() {
            // N fixed at 8: Tf = Td/8 = 0.5 s for Td 4 s
            FormDefinition to = target(Structure.IDEAL, filter(FilterKind.FIXED_RATIO, 8), Weight.fixed(1), Weight.fixed(1));
            PidSetting truth = new PidSetting(Structure.IDEAL, 1.2, 30, 4, 0.5, 1, 1);
            PidSetting start = new PidSetting(Structure.IDEAL, 1, 20, 2, 0.25, 1, 1);
            assertRecovers(fit(to, truth, start), truth);
        }

        @Test
        void a_time_constant_filter_without_derivative_takes_the_forms_default() {
            // an unfiltered PI law: the filter on a zero derivative term changes nothing, and the fit
            // writes the form's default time constant, 2 min = 120 s
            FormDefinition to = target(Structure.IDEAL,
                    new FilterSpec(FilterKind.TIME_CONSTANT, FilterPlacement.DERIVATIVE, 10, TimeUnit.MINUTES, 2),
                    Weight.fixed(1), Weight.fixed(1));
            PidSetting truth = new PidSetting(Structure.IDEAL, 1.2, 30, 0, 0, 1, 1);
            PidSetting start = new PidSetting(Structure.IDEAL, 2, 10, 0, 0, 1, 1);
            assertRecovers(fit(to, truth, start), truth.withFilterSeconds(120));
        }

        @Test
        void adjustable_setpoint_weights_are_fitted_on_the_setpoint_path() {
            // b 0.6 and c 0.3 leave the feedback path alone; the second stage finds them on C_r
            FormDefinition to = target(Structure.IDEAL, filter(FilterKind.RATIO, 10), Weight.adjustable(1),
                    Weight.adjustable(1));
            PidSetting truth = new PidSetting(Structure.IDEAL, 2, 20, 3, 0.5, 0.6, 0.3);
            PidSetting start = new PidSetting(Structure.IDEAL, 3, 10, 5, 0.5, 1, 1);
            assertRecovers(fit(to, truth, start), truth);
        }

        @Test
        void weights_in_a_range_other_than_0_to_1_are_fitted_inside_it() {
            // b in 0.5..2 with the truth 1.5; c fixed at 1
            FormDefinition to = target(Structure.IDEAL, filter(FilterKind.RATIO, 10), new Weight(1, true, 0.5, 2),
                    Weight.fixed(1));
            PidSetting truth = new PidSetting(Structure.IDEAL, 2, 20, 3, 0.5, 1.5, 1);
            PidSetting start = new PidSetting(Structure.IDEAL, 2, 20, 3, 0.5, 1, 1);
            assertRecovers(fit(to, truth, start), truth);
        }

        @Test
        void a_weight_on_derivative_is_not_fitted_without_derivative_action() {
            // a PI law: c weights nothing, so it stays where it started (0.7); b is fitted to 0.4
            FormDefinition to = target(Structure.IDEAL, filter(FilterKind.RATIO, 10), Weight.adjustable(1),
                    Weight.adjustable(0.7));
            PidSetting truth = new PidSetting(Structure.IDEAL, 2, 20, 0, 0, 0.4, 0.7);
            PidSetting start = new PidSetting(Structure.IDEAL, 1, 10, 0, 0, 1, 0.7);
            assertRecovers(fit(to, truth, start), truth);
        }
    }

    @Test
    void a_derivative_below_1e_12_of_the_proportional_gain_at_high_frequency_is_not_fitted() {
        // d/tf = 1e-14 against p = 1: the derivative's high-frequency gain is nothing the loop feels, so
        // the fit keeps no derivative action at all (exactly 0) and no filter
        FormDefinition to = target(Structure.IDEAL, filter(FilterKind.RATIO, 10), Weight.fixed(1), Weight.fixed(1));
        ControlLaw law = new ControlLaw(new org.loopform.law.PidTerms(1, 0.1, 1e-14, 1, 1, 1e-14));
        FrequencyBand band = TuningBand.implied(law.terms(), 0);
        PidSetting got = new NearestFit(to, law, band, TuningBand.whereLoopLives(law.terms(), 0))
                .fit(new PidSetting(Structure.IDEAL, 2, 5, 0, 0, 1, 1));
        assertThat(got.derivative()).isZero();
        assertThat(got.filterSeconds()).isZero();
        assertThat(got.gain()).isPositive();
    }
}

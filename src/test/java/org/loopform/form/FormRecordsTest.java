package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.units.Span;
import org.loopform.units.TimeUnit;

/**
 * The small records a form is made of, and what they accept. Plumbing: these are the validity
 * rules the records document (a gain is not zero, a time is not negative, a range has min <= max),
 * each checked on both sides of its boundary. Trade facts are common practice: reverse action is
 * a positive gain on the error r - y, an integral time of 0 or a rate of 0 means no integral
 * action, half-away-from-zero rounding to a stored step.
 */
class FormRecordsTest {

    @Nested
    @DisplayName("a parameter limit")
    class Limits {

        @Test
        void accepts_values_within_its_range_and_a_last_digit_beyond_it() {
            ParameterLimit l = new ParameterLimit(0.5, 100.0, null);
            assertThat(l.accepts(0.5)).isTrue();
            assertThat(l.accepts(100.0)).isTrue();
            assertThat(l.accepts(50.0)).isTrue();
            assertThat(l.accepts(0.49)).isFalse();
            assertThat(l.accepts(100.01)).isFalse();
            // a value printed and read back may differ in its last digit: 1e-12 relative is no breach
            assertThat(l.accepts(100.0 * (1 + 1e-13))).isTrue();
            assertThat(l.accepts(100.0 * (1 + 1e-11))).isFalse();
            assertThat(l.accepts(0.5 - 1e-13)).isTrue();
            assertThat(l.accepts(0.5 - 2e-12)).isFalse();
            // near zero the tolerance is absolute, 1e-12
            ParameterLimit z = new ParameterLimit(0.0, 0.001, null);
            assertThat(z.accepts(-5e-13)).isTrue();
            assertThat(z.accepts(-2e-12)).isFalse();
            assertThat(ParameterLimit.NONE.accepts(-1e300)).isTrue();
            assertThat(new ParameterLimit(null, 1.0, null).accepts(-1e300)).isTrue();
            assertThat(new ParameterLimit(1.0, null, null).accepts(1e300)).isTrue();
            // negative bounds: the tolerance grows with the bound's size
            ParameterLimit n = new ParameterLimit(-200.0, -100.0, null);
            assertThat(n.accepts(-200.0 * (1 + 1e-13))).isTrue();
            assertThat(n.accepts(-100.0 * (1 - 1e-13))).isTrue();
        }

        @Test
        void rounds_to_the_nearest_step_half_away_from_zero() {
            ParameterLimit l = new ParameterLimit(null, null, 0.05);
            assertThat(l.round(1.234)).isEqualTo(1.25);
            assertThat(l.round(1.224)).isEqualTo(1.2);
            assertThat(l.round(1.225)).isEqualTo(1.25);
            assertThat(l.round(-1.225)).isEqualTo(-1.25);
            assertThat(new ParameterLimit(null, null, 1.0).round(2.5)).isEqualTo(3.0);
        }

        @Test
        void without_a_resolution_keeps_twelve_significant_digits() {
            ParameterLimit l = ParameterLimit.NONE;
            // binary noise of a conversion, 117.99999999999999, is 118 to twelve digits
            assertThat(l.round(117.99999999999999)).isEqualTo(118.0);
            assertThat(l.round(1.23456789012345)).isEqualTo(1.23456789012);
            assertThat(l.round(0.0)).isEqualTo(0.0);
            assertThat(l.round(Double.POSITIVE_INFINITY)).isInfinite();
            assertThat(l.round(Double.NaN)).isNaN();
        }

        @Test
        void refuses_bounds_that_are_not_numbers_or_cross() {
            assertThatThrownBy(() -> new ParameterLimit(Double.NaN, null, null)).hasMessageContaining("finite");
            assertThatThrownBy(() -> new ParameterLimit(null, Double.POSITIVE_INFINITY, null)).hasMessageContaining("finite");
            assertThatThrownBy(() -> new ParameterLimit(2.0, 1.0, null)).hasMessageContaining("2.0 > 1.0");
            assertThat(new ParameterLimit(1.0, 1.0, null).accepts(1.0)).isTrue();
            assertThatThrownBy(() -> new ParameterLimit(null, null, 0.0)).hasMessageContaining("positive step");
            assertThatThrownBy(() -> new ParameterLimit(null, null, -0.1)).hasMessageContaining("positive step");
            assertThatThrownBy(() -> new ParameterLimit(null, null, Double.POSITIVE_INFINITY))
                    .hasMessageContaining("positive step");
        }
    }

    @Nested
    @DisplayName("a setting")
    class Settings {

        @Test
        void needs_a_structure_and_a_finite_nonzero_gain() {
            assertThatThrownBy(() -> new PidSetting(null, 1, 10, 0, 0, 1, 1)).hasMessageContaining("structure");
            assertThatThrownBy(() -> new PidSetting(Structure.IDEAL, 0, 10, 0, 0, 1, 1)).hasMessageContaining("non-zero");
            assertThatThrownBy(() -> new PidSetting(Structure.IDEAL, Double.NaN, 10, 0, 0, 1, 1))
                    .hasMessageContaining("gain must be");
        }

        @Test
        void a_parallel_setting_takes_any_finite_ki_and_kd() {
            assertThat(new PidSetting(Structure.PARALLEL, 1, 0, -1, 0, 1, 1).hasIntegral()).isFalse();
            assertThat(new PidSetting(Structure.PARALLEL, 1, -0.1, 0, 0, 1, 1).hasIntegral()).isTrue();
            assertThatThrownBy(() -> new PidSetting(Structure.PARALLEL, 1, Double.NaN, 0, 0, 1, 1))
                    .hasMessageContaining("ki must be finite");
            assertThatThrownBy(() -> new PidSetting(Structure.PARALLEL, 1, 0, Double.POSITIVE_INFINITY, 0, 1, 1))
                    .hasMessageContaining("kd must be finite");
        }

        @Test
        void an_ideal_setting_needs_ti_above_zero_and_td_at_or_above_zero() {
            assertThatThrownBy(() -> new PidSetting(Structure.IDEAL, 1, 0, 0, 0, 1, 1)).hasMessageContaining("ti must be > 0 s");
            assertThatThrownBy(() -> new PidSetting(Structure.SERIES, 1, 10, -1, 0, 1, 1)).hasMessageContaining("td must be >= 0 s");
            assertThatThrownBy(() -> new PidSetting(Structure.SERIES, 1, 10, Double.POSITIVE_INFINITY, 0, 1, 1))
                    .hasMessageContaining("td must be");
            PidSetting off = new PidSetting(Structure.IDEAL, 1, Double.POSITIVE_INFINITY, 0, 0, 1, 1);
            assertThat(off.hasIntegral()).isFalse();
            assertThat(new PidSetting(Structure.IDEAL, 1, 10, 0, 0, 1, 1).hasIntegral()).isTrue();
        }

        @Test
        void filter_and_weights_must_be_finite_and_the_filter_not_negative() {
            assertThat(new PidSetting(Structure.IDEAL, 1, 10, 1, 0, 1, 1).filterSeconds()).isZero();
            assertThatThrownBy(() -> new PidSetting(Structure.IDEAL, 1, 10, 1, -0.1, 1, 1)).hasMessageContaining("filter");
            assertThatThrownBy(() -> new PidSetting(Structure.IDEAL, 1, 10, 1, Double.POSITIVE_INFINITY, 1, 1))
                    .hasMessageContaining("filter");
            assertThatThrownBy(() -> new PidSetting(Structure.IDEAL, 1, 10, 1, 0, Double.NaN, 1)).hasMessageContaining("weights");
            assertThatThrownBy(() -> new PidSetting(Structure.IDEAL, 1, 10, 1, 0, 1, Double.NaN)).hasMessageContaining("weights");
        }

        @Test
        void the_derivative_time_of_a_parallel_setting_is_kd_over_kp() {
            // Td = kd / kp (Astrom and Hagglund 1995, sec. 3.4): 6 / 2 = 3 s
            assertThat(new PidSetting(Structure.PARALLEL, 2, 0.1, 6, 0, 1, 1).derivativeTimeSeconds()).isEqualTo(3.0);
            assertThat(new PidSetting(Structure.IDEAL, 2, 10, 6, 0, 1, 1).derivativeTimeSeconds()).isEqualTo(6.0);
        }

        @Test
        void with_filter_and_weights_change_only_those() {
            PidSetting s = new PidSetting(Structure.IDEAL, 2, 10, 6, 0, 1, 1);
            assertThat(s.withFilterSeconds(0.6)).isEqualTo(new PidSetting(Structure.IDEAL, 2, 10, 6, 0.6, 1, 1));
            assertThat(s.withWeights(0.5, 0)).isEqualTo(new PidSetting(Structure.IDEAL, 2, 10, 6, 0, 0.5, 0));
        }
    }

    @Nested
    @DisplayName("small parts")
    class Parts {

        @Test
        void a_catalog_holds_forms_by_id_in_id_order_and_refuses_a_twin() {
            FormDefinition b = TestForms.unfiltered(Structure.SERIES);
            FormDefinition a = TestForms.unfiltered(Structure.IDEAL);
            Catalog c = new Catalog(List.of(b, a));
            assertThat(c.ids()).containsExactly("ideal-nofilter", "series-nofilter");
            assertThat(c.all()).containsExactly(a, b);
            assertThat(c.find("series-nofilter")).contains(b);
            assertThat(c.find("x")).isEmpty();
            assertThatThrownBy(() -> new Catalog(List.of(a, a))).hasMessageContaining("two forms with id ideal-nofilter");
            assertThat(FormUnits.of(a, "ti")).isEqualTo("s/repeat");
        }

        // A source value is shown as the user wrote it; a bare number gets the form's unit, so no
        // figure is printed without one (a value written with its own unit keeps it).
        @Test
        void a_source_value_as_written_carries_a_unit() {
            FormDefinition a = TestForms.unfiltered(Structure.IDEAL);
            assertThat(FormUnits.asWritten(a, "ti", " 120 ")).isEqualTo("120 s/repeat");
            assertThat(FormUnits.asWritten(a, "ti", "2min")).isEqualTo("2min");
            assertThat(FormUnits.asWritten(a, "ti", "2 min")).isEqualTo("2 min");
            assertThat(FormUnits.asWritten(a, "nothing-like-it", "3")).isEqualTo("3");
        }

        @Test
        void reverse_action_is_a_positive_gain() {
            assertThat(Action.REVERSE.sign()).isEqualTo(1.0);
            assertThat(Action.DIRECT.sign()).isEqualTo(-1.0);
            assertThat(Action.ofSign(-0.1)).isEqualTo(Action.DIRECT);
            assertThat(Action.ofSign(0.1)).isEqualTo(Action.REVERSE);
            assertThat(Action.ofSign(0.0)).isEqualTo(Action.REVERSE);
            assertThat(Action.parse(" Rev ")).contains(Action.REVERSE);
            assertThat(Action.parse("d")).contains(Action.DIRECT);
            assertThat(Action.parse("up")).isEmpty();
            assertThat(Action.DIRECT.id()).isEqualTo("direct");
        }

        @Test
        void a_weight_lies_in_its_range() {
            assertThat(Weight.fixed(0.5)).isEqualTo(new Weight(0.5, false, 0.5, 0.5));
            assertThat(Weight.adjustable(0.3)).isEqualTo(new Weight(0.3, true, 0.0, 1.0));
            assertThatThrownBy(() -> new Weight(1.5, true, 0, 1)).hasMessageContaining("within its range");
            assertThatThrownBy(() -> new Weight(-0.5, true, 0, 1)).hasMessageContaining("within its range");
            assertThatThrownBy(() -> new Weight(0.5, true, 1, 0)).hasMessageContaining("within its range");
            assertThatThrownBy(() -> new Weight(Double.NaN, true, 0, 1)).hasMessageContaining("finite");
            assertThatThrownBy(() -> new Weight(0, true, Double.NEGATIVE_INFINITY, 1)).hasMessageContaining("finite");
            assertThatThrownBy(() -> new Weight(0, true, 0, Double.POSITIVE_INFINITY)).hasMessageContaining("finite");
        }

        @Test
        void a_filter_ratio_is_positive_and_a_default_time_not_negative() {
            assertThat(FilterSpec.defaults()).isEqualTo(
                    new FilterSpec(FilterKind.RATIO, FilterPlacement.DERIVATIVE, 10.0, TimeUnit.SECONDS, 0.0));
            assertThatThrownBy(() -> new FilterSpec(FilterKind.RATIO, FilterPlacement.DERIVATIVE, 0, TimeUnit.SECONDS, 0))
                    .hasMessageContaining("ratio N");
            assertThatThrownBy(() -> new FilterSpec(FilterKind.FIXED_RATIO, FilterPlacement.DERIVATIVE,
                    Double.POSITIVE_INFINITY, TimeUnit.SECONDS, 0)).hasMessageContaining("ratio N");
            // a time-constant filter has no ratio to check
            assertThat(new FilterSpec(FilterKind.TIME_CONSTANT, FilterPlacement.DERIVATIVE, 0, TimeUnit.SECONDS, 0)
                    .kind()).isEqualTo(FilterKind.TIME_CONSTANT);
            assertThatThrownBy(() -> new FilterSpec(FilterKind.TIME_CONSTANT, FilterPlacement.DERIVATIVE, 0,
                    TimeUnit.SECONDS, -1)).hasMessageContaining("default time constant");
            assertThatThrownBy(() -> new FilterSpec(FilterKind.TIME_CONSTANT, FilterPlacement.DERIVATIVE, 0,
                    TimeUnit.SECONDS, Double.POSITIVE_INFINITY)).hasMessageContaining("default time constant");
            assertThatThrownBy(() -> new FilterSpec(null, FilterPlacement.DERIVATIVE, 1, TimeUnit.SECONDS, 0))
                    .hasMessageContaining("kind");
            assertThatThrownBy(() -> new FilterSpec(FilterKind.NONE, null, 1, TimeUnit.SECONDS, 0))
                    .hasMessageContaining("kind");
            assertThatThrownBy(() -> new FilterSpec(FilterKind.NONE, FilterPlacement.DERIVATIVE, 1, null, 0))
                    .hasMessageContaining("kind");
        }

        @Test
        void integral_off_is_a_time_at_or_above_the_off_value_or_a_rate_equal_to_it() {
            IntegralSpec time = new IntegralSpec(IntegralWriting.TIME, TimeUnit.MINUTES, 0);
            assertThat(time.isOff(0)).isTrue();
            assertThat(time.isOff(0.01)).isFalse();
            IntegralSpec capped = new IntegralSpec(IntegralWriting.TIME, TimeUnit.MINUTES, 9999);
            assertThat(capped.isOff(9999)).isTrue();
            assertThat(capped.isOff(10000)).isTrue();
            assertThat(capped.isOff(9998)).isFalse();
            IntegralSpec rate = new IntegralSpec(IntegralWriting.RATE, TimeUnit.MINUTES, 0);
            assertThat(rate.isOff(0)).isTrue();
            assertThat(rate.isOff(0.1)).isFalse();
            assertThatThrownBy(() -> new IntegralSpec(IntegralWriting.RATE, TimeUnit.MINUTES, -1))
                    .hasMessageContaining("'off' must be a value >= 0");
            assertThatThrownBy(() -> new IntegralSpec(IntegralWriting.RATE, TimeUnit.MINUTES, Double.NaN))
                    .hasMessageContaining("'off'");
            assertThatThrownBy(() -> new IntegralSpec(null, TimeUnit.MINUTES, 0)).hasMessageContaining("'as'");
            assertThatThrownBy(() -> new IntegralSpec(IntegralWriting.RATE, null, 0)).hasMessageContaining("'as'");
            assertThatThrownBy(() -> new DerivativeSpec(null, TimeUnit.SECONDS)).hasMessageContaining("'as'");
            assertThatThrownBy(() -> new DerivativeSpec(DerivativeWriting.TIME, null)).hasMessageContaining("'as'");
        }

        @Test
        void a_gain_spec_needs_all_three_and_a_band_has_no_engineering_basis() {
            assertThatThrownBy(() -> new GainSpec(GainWriting.BAND, GainBasis.ENGINEERING, SignConvention.SIGNED))
                    .hasMessageContaining("basis 'engineering'");
            assertThatThrownBy(() -> new GainSpec(null, GainBasis.PERCENT, SignConvention.SIGNED)).hasMessageContaining("'as'");
            assertThatThrownBy(() -> new GainSpec(GainWriting.GAIN, null, SignConvention.SIGNED)).hasMessageContaining("'as'");
            assertThatThrownBy(() -> new GainSpec(GainWriting.GAIN, GainBasis.PERCENT, null)).hasMessageContaining("'as'");
        }

        @Test
        void the_writing_context_gives_the_span_ratio_and_the_scan_or_says_what_is_missing() {
            FormDefinition f = TestForms.unfiltered(Structure.IDEAL);
            // PV 0..200, output 0..100: 200/100 = 2
            WritingContext ctx = new WritingContext(new Span(0, 200), new Span(0, 100), 0.5);
            assertThat(ctx.engineeringToPercent(f, "source")).isCloseTo(2.0, within(1e-12));
            assertThat(ctx.scan(f, "target")).isEqualTo(0.5);
            assertThatThrownBy(() -> WritingContext.NONE.engineeringToPercent(f, "source"))
                    .hasMessageContaining("give --pv-range and --out-range");
            assertThatThrownBy(() -> new WritingContext(null, new Span(0, 100), null).engineeringToPercent(f, "source"))
                    .hasMessageContaining("give --pv-range (");
            assertThatThrownBy(() -> new WritingContext(new Span(0, 100), null, null).engineeringToPercent(f, "source"))
                    .hasMessageContaining("give --out-range (");
            assertThatThrownBy(() -> WritingContext.NONE.scan(f, "target")).hasMessageContaining("--scan");
            assertThatThrownBy(() -> new WritingContext(null, null, 0.0)).hasMessageContaining("scan time must be > 0 s");
            assertThatThrownBy(() -> new WritingContext(null, null, Double.POSITIVE_INFINITY))
                    .hasMessageContaining("scan time");
        }

        @Test
        void the_algorithm_checks_its_scan_times_and_limits() {
            DiscreteAlgorithm d = DiscreteAlgorithm.defaults();
            assertThat(d.allowsScan(0.1)).isTrue();
            DiscreteAlgorithm list = new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                    Discretization.BACKWARD, AntiWindup.CLAMPING, 0, 0, 100, List.of(0.1, 0.5), 0, 0);
            assertThat(list.allowsScan(0.5)).isTrue();
            assertThat(list.allowsScan(0.5 * (1 + 1e-10))).isTrue();
            assertThat(list.allowsScan(0.25)).isFalse();
            // the match is relative, 1e-9 of the allowed time: 0.1 s +- 1e-10 s
            assertThat(list.allowsScan(0.1 + 5e-11)).isTrue();
            assertThat(list.allowsScan(0.1 + 5e-9)).isFalse();
            DiscreteAlgorithm range = new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                    Discretization.BACKWARD, AntiWindup.CLAMPING, 0, 0, 100, List.of(), 0.1, 2);
            assertThat(range.allowsScan(0.1)).isTrue();
            assertThat(range.allowsScan(2)).isTrue();
            assertThat(range.allowsScan(0.05)).isFalse();
            assertThat(range.allowsScan(2.5)).isFalse();
            assertThatThrownBy(() -> new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.STEP_INVARIANT,
                    Discretization.BACKWARD, AntiWindup.CLAMPING, 0, 0, 100, List.of(), 0, 1))
                    .hasMessageContaining("step_invariant");
            assertThatThrownBy(() -> new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                    Discretization.BACKWARD, AntiWindup.CLAMPING, -1, 0, 100, List.of(), 0, 1))
                    .hasMessageContaining("tracking time");
            assertThatThrownBy(() -> new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                    Discretization.BACKWARD, AntiWindup.CLAMPING, 0, 100, 100, List.of(), 0, 1))
                    .hasMessageContaining("high > low");
            assertThatThrownBy(() -> new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                    Discretization.BACKWARD, AntiWindup.CLAMPING, 0, 0, 100, List.of(0.0), 0, 1))
                    .hasMessageContaining("allowed scan times must be > 0 s");
            assertThatThrownBy(() -> new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                    Discretization.BACKWARD, AntiWindup.CLAMPING, 0, 0, 100, List.of(), 2, 1))
                    .hasMessageContaining("0 <= min <= max");
            assertThatThrownBy(() -> new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                    Discretization.BACKWARD, AntiWindup.CLAMPING, 0, 0, 100, List.of(), -1, 1))
                    .hasMessageContaining("0 <= min <= max");
        }
    }
}

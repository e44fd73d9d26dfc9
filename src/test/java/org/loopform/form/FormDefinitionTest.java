// source: Astrom & Hagglund, PID Controllers: Theory, Design and Tuning, 2nd ed., ISA 1995, sec. 3.4 (section from memory); common practice for the series form's derivative placement; the rest is plumbing
package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.units.TimeUnit;

/**
 * What a form file may say, and what the form then asks a person to type. The structural rules
 * are trade facts: a parallel form writes independent gains kp, ki, kd, an ideal or series form
 * a gain or band with times or rates (Astrom and Hagglund 1995, sec. 3.4); a series controller
 * takes its derivative on the error or on the measurement, not a weight between (common
 * practice); a filter on the measurement leaves no derivative on the setpoint (c = 0, multiplied
 * out in StructureLaw's Javadoc). The rest is plumbing: names, units and messages.
 */
class FormDefinitionTest {

    private static final FilterSpec RATIO = FilterSpec.defaults();
    private static final FilterSpec ON_PV = new FilterSpec(FilterKind.RATIO, FilterPlacement.MEASUREMENT, 10,
            TimeUnit.SECONDS, 0);

    private static FormDefinition form(String id, String title, Structure structure, GainWriting gain,
                                       IntegralWriting integral, DerivativeWriting derivative, FilterSpec filter,
                                       Weight b, Weight c, Map<String, ParameterLimit> limits) {
        return new FormDefinition(id, title, null, structure,
                new GainSpec(gain, GainBasis.PERCENT, SignConvention.SIGNED),
                new IntegralSpec(integral, TimeUnit.SECONDS, 0), new DerivativeSpec(derivative, TimeUnit.SECONDS),
                filter, b, c, limits, DiscreteAlgorithm.defaults());
    }

    private static FormDefinition ideal(String id) {
        return form(id, "t", Structure.IDEAL, GainWriting.GAIN, IntegralWriting.TIME, DerivativeWriting.TIME, RATIO,
                Weight.fixed(1), Weight.fixed(1), Map.of());
    }

    @Nested
    @DisplayName("what it refuses")
    class Refuses {

        @Test
        void ids_are_lower_case_words() {
            assertThat(ideal("ideal-2.x_y").id()).isEqualTo("ideal-2.x_y");
            assertThatThrownBy(() -> ideal("Ideal")).isInstanceOf(FormException.class)
                    .hasMessageContaining("id: must be lower-case letters, digits, '.', '_' or '-' (got 'Ideal')");
            assertThatThrownBy(() -> ideal("-x")).hasMessageContaining("id:");
            assertThatThrownBy(() -> ideal(null)).hasMessageContaining("id:");
        }

        @Test
        void a_title_is_needed_and_a_missing_description_is_empty() {
            assertThatThrownBy(() -> form("a", " ", Structure.IDEAL, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.TIME, RATIO, Weight.fixed(1), Weight.fixed(1), Map.of()))
                    .hasMessageContaining("title: every form needs a one-line title");
            assertThatThrownBy(() -> form("a", null, Structure.IDEAL, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.TIME, RATIO, Weight.fixed(1), Weight.fixed(1), Map.of()))
                    .hasMessageContaining("title:");
            assertThat(ideal("a").description()).isEmpty();
            // an integral time off at 0 says so plainly (not "0 or more")
            assertThat(ideal("a").parameters().get(1).meaning()).isEqualTo("integral time per repeat (0: off)");
        }

        @Test
        void a_missing_part_makes_the_form_incomplete() {
            assertThatThrownBy(() -> new FormDefinition("a", "t", "", null, null, null, null, null, null, null,
                    Map.of(), null)).hasMessageContaining("form a is incomplete");
        }

        @Test
        void parallel_gains_belong_to_parallel_forms_only() {
            assertThatThrownBy(() -> form("a", "t", Structure.IDEAL, GainWriting.GAIN, IntegralWriting.GAIN,
                    DerivativeWriting.TIME, RATIO, Weight.fixed(1), Weight.fixed(1), Map.of()))
                    .hasMessageContaining("integral.as: 'gain' needs structure parallel; an ideal form writes");
            assertThatThrownBy(() -> form("a", "t", Structure.SERIES, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.GAIN, RATIO, Weight.fixed(1), Weight.fixed(1), Map.of()))
                    .hasMessageContaining("derivative.as: 'gain' needs structure parallel; an series form");
            assertThatThrownBy(() -> form("a", "t", Structure.PARALLEL, GainWriting.GAIN, IntegralWriting.GAIN,
                    DerivativeWriting.TIME, RATIO, Weight.fixed(1), Weight.fixed(1), Map.of()))
                    .hasMessageContaining("derivative.as: a parallel form writes derivative as 'gain' or 'per_scan'");
            assertThatThrownBy(() -> form("a", "t", Structure.PARALLEL, GainWriting.BAND, IntegralWriting.GAIN,
                    DerivativeWriting.GAIN, RATIO, Weight.fixed(1), Weight.fixed(1), Map.of()))
                    .hasMessageContaining("gain.as: a parallel form writes kp as 'gain'");
            // a parallel form may write its integral as a time (ki = 1/ti)
            assertThat(form("a", "t", Structure.PARALLEL, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.GAIN, RATIO, Weight.fixed(1), Weight.fixed(1), Map.of()).integralName())
                    .isEqualTo("ti");
        }

        @Test
        void a_filter_on_the_measurement_needs_a_fixed_c_of_zero_except_in_a_series_form() {
            assertThatThrownBy(() -> form("a", "t", Structure.IDEAL, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.TIME, ON_PV, Weight.fixed(1), Weight.fixed(1), Map.of()))
                    .hasMessageContaining("weights.c: a filter on the measurement");
            assertThatThrownBy(() -> form("a", "t", Structure.IDEAL, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.TIME, ON_PV, Weight.fixed(1), Weight.adjustable(0), Map.of()))
                    .hasMessageContaining("weights.c: a filter on the measurement");
            assertThat(form("a", "t", Structure.IDEAL, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.TIME, ON_PV, Weight.fixed(1), Weight.fixed(0), Map.of()).c().defaultValue())
                    .isZero();
            assertThat(form("a", "t", Structure.SERIES, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.TIME, ON_PV, Weight.fixed(1), Weight.fixed(1), Map.of()).structure())
                    .isEqualTo(Structure.SERIES);
        }

        @Test
        void a_series_form_takes_derivative_on_error_or_on_measurement_only() {
            assertThatThrownBy(() -> form("a", "t", Structure.SERIES, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.TIME, RATIO, Weight.fixed(1), Weight.fixed(0.5), Map.of()))
                    .hasMessageContaining("weights.c: a series form takes derivative on error (c: 1) or on "
                            + "measurement (c: 0), fixed (got 0.5)");
            assertThatThrownBy(() -> form("a", "t", Structure.SERIES, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.TIME, RATIO, Weight.fixed(1), Weight.adjustable(1), Map.of()))
                    .hasMessageContaining("(got adjustable)");
            assertThat(form("a", "t", Structure.SERIES, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.TIME, RATIO, Weight.fixed(1), Weight.fixed(0), Map.of())).isNotNull();
        }

        @Test
        void limits_name_parameters_the_form_has_and_every_problem_is_reported_at_once() {
            assertThatThrownBy(() -> form("a", "t", Structure.IDEAL, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.TIME, RATIO, Weight.fixed(1), Weight.fixed(1),
                    Map.of("kp", new ParameterLimit(0.0, 10.0, null))))
                    .hasMessageContaining("limits.kp: form a has no parameter 'kp'; its parameters are kc, ti, td, n");
            assertThatThrownBy(() -> form("A", "", Structure.IDEAL, GainWriting.GAIN, IntegralWriting.TIME,
                    DerivativeWriting.TIME, RATIO, Weight.fixed(1), Weight.fixed(1), Map.of()))
                    .hasMessageContaining("id:").hasMessageContaining("title:");
        }
    }

    @Nested
    @DisplayName("what it asks for")
    class AsksFor {

        @Test
        void an_ideal_form_with_an_adjustable_ratio_and_weights() {
            FormDefinition f = form("a", "t", Structure.IDEAL, GainWriting.BAND, IntegralWriting.RATE,
                    DerivativeWriting.TIME, RATIO, Weight.adjustable(1), Weight.adjustable(0.5),
                    Map.of("pb", new ParameterLimit(1.0, 1000.0, null)));
            assertThat(f.parameterNames()).containsExactly("pb", "reset", "td", "n", "b", "c");
            assertThat(f.gainName()).isEqualTo("pb");
            assertThat(f.integralName()).isEqualTo("reset");
            assertThat(f.derivativeName()).isEqualTo("td");
            assertThat(f.unitOf("reset")).isEqualTo("repeats/s");
            assertThat(f.unitOf("n")).isEqualTo("ratio");
            assertThat(f.unitOf("x")).isEmpty();
            assertThat(f.limit("pb").max()).isEqualTo(1000.0);
            assertThat(f.limit("td")).isEqualTo(ParameterLimit.NONE);
            assertThat(f.needsRanges()).isFalse();
            assertThat(f.needsScan()).isFalse();
            FormParameter n = f.parameters().get(3);
            assertThat(n.required()).isFalse();
            assertThat(n.defaultValue()).isEqualTo(10.0);
            assertThat(f.parameters().get(5).defaultValue()).isEqualTo(0.5);
            assertThat(f.parameters().get(0).required()).isTrue();
            assertThat(f.parameters().get(1).meaning()).isEqualTo("reset rate (0: off)");
            assertThat(f.parameters().get(2).meaning()).isEqualTo("derivative time (0: off)");
        }

        @Test
        void a_time_constant_filter_an_action_flag_and_an_off_time() {
            FormDefinition f = new FormDefinition("b", "t", "", Structure.IDEAL,
                    new GainSpec(GainWriting.GAIN, GainBasis.PERCENT, SignConvention.ACTION),
                    new IntegralSpec(IntegralWriting.TIME, TimeUnit.MINUTES, 9999),
                    new DerivativeSpec(DerivativeWriting.TIME, TimeUnit.MINUTES),
                    new FilterSpec(FilterKind.TIME_CONSTANT, FilterPlacement.DERIVATIVE, 0, TimeUnit.SECONDS, 2),
                    Weight.fixed(1), Weight.fixed(1), Map.of(), DiscreteAlgorithm.defaults());
            assertThat(f.parameters()).extracting(FormParameter::name)
                    .containsExactly("kc", "ti", "td", "tf", "action");
            assertThat(f.parameterNames()).containsExactly("kc", "ti", "td", "tf");
            assertThat(f.parameters().get(1).meaning()).isEqualTo("integral time per repeat (9999 or more: off)");
            assertThat(f.parameters().get(3).defaultValue()).isEqualTo(2.0);
            // 'action' is a setting, not a number: no limits for it
            assertThatThrownBy(() -> new FormDefinition("b", "t", "", Structure.IDEAL, f.gain(), f.integral(),
                    f.derivative(), f.filter(), f.b(), f.c(), Map.of("action", new ParameterLimit(0.0, 1.0, null)),
                    f.algorithm())).hasMessageContaining("limits.action: form b has no parameter 'action'");
            assertThat(f.unitOf("tf")).isEqualTo("s");
            assertThat(f.unitOf("action")).isEqualTo("reverse|direct");
        }

        @Test
        void an_off_value_that_is_not_whole_is_printed_as_it_is() {
            FormDefinition f = new FormDefinition("b", "t", "", Structure.IDEAL,
                    new GainSpec(GainWriting.GAIN, GainBasis.PERCENT, SignConvention.SIGNED),
                    new IntegralSpec(IntegralWriting.TIME, TimeUnit.MINUTES, 99.5),
                    new DerivativeSpec(DerivativeWriting.TIME, TimeUnit.MINUTES),
                    new FilterSpec(FilterKind.NONE, FilterPlacement.DERIVATIVE, 10, TimeUnit.SECONDS, 0),
                    Weight.fixed(1), Weight.fixed(1), Map.of(), DiscreteAlgorithm.defaults());
            assertThat(f.parameters().get(1).meaning()).isEqualTo("integral time per repeat (99.5 or more: off)");
            assertThat(f.parameterNames()).containsExactly("kc", "ti", "td");
        }

        @Test
        void engineering_units_need_ranges_and_per_scan_gains_a_scan() {
            FormDefinition eu = new FormDefinition("p", "t", "", Structure.PARALLEL,
                    new GainSpec(GainWriting.GAIN, GainBasis.ENGINEERING, SignConvention.SIGNED),
                    new IntegralSpec(IntegralWriting.PER_SCAN, TimeUnit.SECONDS, 0),
                    new DerivativeSpec(DerivativeWriting.GAIN, TimeUnit.SECONDS), RATIO,
                    Weight.fixed(1), Weight.fixed(1), Map.of(), DiscreteAlgorithm.defaults());
            assertThat(eu.needsRanges()).isTrue();
            assertThat(eu.needsScan()).isTrue();
            assertThat(eu.gainName()).isEqualTo("kp");
            FormDefinition kd = new FormDefinition("p", "t", "", Structure.PARALLEL,
                    new GainSpec(GainWriting.GAIN, GainBasis.PERCENT, SignConvention.SIGNED),
                    new IntegralSpec(IntegralWriting.GAIN, TimeUnit.SECONDS, 0),
                    new DerivativeSpec(DerivativeWriting.PER_SCAN, TimeUnit.SECONDS), RATIO,
                    Weight.fixed(1), Weight.fixed(1), Map.of(), DiscreteAlgorithm.defaults());
            assertThat(kd.needsScan()).isTrue();
            assertThat(kd.needsRanges()).isFalse();
        }
    }
}

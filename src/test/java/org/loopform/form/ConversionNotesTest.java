package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.LinkedHashMap;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.units.TimeUnit;

/**
 * The facts a conversion notes beside its values: a value outside what the target accepts, an
 * integral value the target reads as "off", rounding to the target's resolution (and what it
 * costs), and a filter setting the exact conversion needs. The conversions are ideal to ideal,
 * so the values are carried unchanged (the identity of a structure with itself) and each note's
 * figures can be checked by hand: a limit breach against the limit, a rounded value against
 * half-away-from-zero rounding to the step, N = Td/Tf (Astrom and Hagglund 1995, sec. 3.4 for
 * the filtered derivative Td s/(1 + s Td/N)). Forms and values are invented.
 */
class ConversionNotesTest {

    private static final FilterSpec RATIO_10 = new FilterSpec(FilterKind.RATIO, FilterPlacement.DERIVATIVE, 10,
            TimeUnit.SECONDS, 0);

    private static FormDefinition ideal(String id, FilterSpec filter, double integralOff,
                                        Map<String, ParameterLimit> limits) {
        return new FormDefinition(id, "test form " + id, "", Structure.IDEAL,
                new GainSpec(GainWriting.GAIN, GainBasis.PERCENT, SignConvention.SIGNED),
                new IntegralSpec(IntegralWriting.TIME, TimeUnit.SECONDS, integralOff),
                new DerivativeSpec(DerivativeWriting.TIME, TimeUnit.SECONDS),
                filter, Weight.fixed(1), Weight.fixed(1), limits, DiscreteAlgorithm.defaults());
    }

    private static final FormDefinition SOURCE = ideal("src", RATIO_10, 0, Map.of());

    private static Conversion convert(FormDefinition to, String... pairs) {
        Map<String, String> m = new LinkedHashMap<>();
        for (int k = 0; k < pairs.length; k += 2) {
            m.put(pairs[k], pairs[k + 1]);
        }
        return Converter.convert(SOURCE, m, to, WritingContext.NONE);
    }

    private static <T extends ConversionNote> T only(Conversion c, Class<T> kind) {
        return c.notes().stream().filter(kind::isInstance).map(kind::cast).findFirst()
                .orElseThrow(() -> new AssertionError("no " + kind.getSimpleName() + " in " + c.notes()));
    }

    @Nested
    @DisplayName("limits")
    class Limits {

        @Test
        void a_gain_above_the_maximum_is_refused_and_noted() {
            FormDefinition to = ideal("t", RATIO_10, 0, Map.of("kc", new ParameterLimit(0.1, 5.0, null)));
            Conversion c = convert(to, "kc", "10", "ti", "20", "td", "0");
            assertThat(c.exact()).isTrue();
            ConversionNote.OutOfRange o = only(c, ConversionNote.OutOfRange.class);
            assertThat(o.parameter()).isEqualTo("kc");
            assertThat(o.value()).isEqualTo(10.0);
            assertThat(o.bound()).isEqualTo(5.0);
            assertThat(o.high()).isTrue();
            assertThat(c.refusal("kc")).isEqualTo("above the maximum 5 %/% t accepts");
            assertThat(c.refusal("ti")).isNull();
        }

        @Test
        void a_time_below_the_minimum_is_refused_and_noted() {
            FormDefinition to = ideal("t", RATIO_10, 0, Map.of("ti", new ParameterLimit(1.0, null, null)));
            Conversion c = convert(to, "kc", "1", "ti", "0.5", "td", "0");
            ConversionNote.OutOfRange o = only(c, ConversionNote.OutOfRange.class);
            assertThat(o.parameter()).isEqualTo("ti");
            assertThat(o.bound()).isEqualTo(1.0);
            assertThat(o.high()).isFalse();
            assertThat(c.refusal("ti")).startsWith("below the minimum 1 ");
        }

        @Test
        void a_value_within_the_limits_is_not_noted() {
            FormDefinition to = ideal("t", RATIO_10, 0, Map.of("kc", new ParameterLimit(0.1, 5.0, null)));
            Conversion c = convert(to, "kc", "5", "ti", "20", "td", "0");
            assertThat(c.notes()).isEmpty();
            assertThat(c.refused()).isEmpty();
        }

        @Test
        void an_integral_time_at_the_targets_off_value_is_read_as_off() {
            // the target reads ti >= 1000 s as integral action off; 1200 s is a real integral time at the source
            FormDefinition to = ideal("t", RATIO_10, 1000, Map.of("ti", new ParameterLimit(0.0, 500.0, null)));
            Conversion c = convert(to, "kc", "1", "ti", "1200", "td", "0");
            ConversionNote.ReadAsIntegralOff n = only(c, ConversionNote.ReadAsIntegralOff.class);
            assertThat(n.value()).isEqualTo(1200.0);
            assertThat(n.offValue()).isEqualTo(1000.0);
            assertThat(c.refusal("ti")).isEqualTo("read as integral action off by t");
            assertThat(c.notes()).noneMatch(ConversionNote.OutOfRange.class::isInstance);
        }

        @Test
        void integral_off_is_written_as_off_whatever_the_range() {
            // no integral at the source (ti 0 = off): the target writes its own off value, 1000 s,
            // which lies outside its ti range but is not a breach
            FormDefinition to = ideal("t", RATIO_10, 1000, Map.of("ti", new ParameterLimit(0.0, 500.0, null)));
            Conversion c = convert(to, "kc", "1", "ti", "0", "td", "0");
            assertThat(c.parameters().values().get("ti")).isEqualTo(1000.0);
            assertThat(c.notes()).isEmpty();
        }
    }

    @Nested
    @DisplayName("rounding to the target's resolution")
    class Rounding {

        @Test
        void moves_the_gain_to_the_nearest_step_and_says_which_value_moved() {
            // kc 1.234 with a step of 0.1: 1.2; the law moves by 20 log10(1.234/1.2) = 0.243 dB at most
            FormDefinition to = ideal("t", RATIO_10, 0, Map.of("kc", new ParameterLimit(null, null, 0.1)));
            Conversion c = convert(to, "kc", "1.234", "ti", "20", "td", "0");
            assertThat(c.entered().values().get("kc")).isEqualTo(1.2);
            ConversionNote.Rounded r = only(c, ConversionNote.Rounded.class);
            assertThat(r.movedValues()).isEqualTo("kc 1.234 -> 1.2");
            assertThat(r.moved().gainDb()).isCloseTo(20 * Math.log10(1.234 / 1.2), within(1e-9));
            assertThat(c.enteredLaw().terms().p()).isCloseTo(1.2, within(1e-12));
        }

        @Test
        void lists_every_value_that_moved() {
            FormDefinition to = ideal("t", RATIO_10, 0, Map.of("kc", new ParameterLimit(null, null, 0.1),
                    "ti", new ParameterLimit(null, null, 1.0)));
            Conversion c = convert(to, "kc", "1.234", "ti", "20.4", "td", "0");
            assertThat(only(c, ConversionNote.Rounded.class).movedValues()).isEqualTo("kc 1.234 -> 1.2, ti 20.4 -> 20");
        }

        @Test
        void a_value_already_on_a_step_is_not_noted() {
            FormDefinition to = ideal("t", RATIO_10, 0, Map.of("kc", new ParameterLimit(null, null, 0.1)));
            Conversion c = convert(to, "kc", "1.2", "ti", "20", "td", "0");
            assertThat(c.notes()).isEmpty();
            assertThat(c.enteredLaw()).isEqualTo(c.targetLaw());
        }

        @Test
        void a_gain_rounded_to_zero_is_an_invalid_entry() {
            // kc 0.3 with a step of 1: 0, a gain no form can hold
            FormDefinition to = ideal("t", RATIO_10, 0, Map.of("kc", new ParameterLimit(null, null, 1.0)));
            Conversion c = convert(to, "kc", "0.3", "ti", "20", "td", "0");
            assertThat(only(c, ConversionNote.RoundingInvalid.class).reason()).contains("gain");
            assertThat(c.enteredLaw()).isEqualTo(c.targetLaw());
        }

        @Test
        void an_integral_time_rounded_to_the_off_value_loses_integral_action() {
            // ti 0.3 s with a step of 1 s: 0 s, which this form reads as integral action off
            FormDefinition to = ideal("t", RATIO_10, 0, Map.of("ti", new ParameterLimit(null, null, 1.0)));
            Conversion c = convert(to, "kc", "1", "ti", "0.3", "td", "0");
            assertThat(c.notes()).anyMatch(ConversionNote.RoundingLosesIntegral.class::isInstance);
            assertThat(c.enteredLaw().terms().i()).isZero();
        }
    }

    @Nested
    @DisplayName("the filter an exact conversion needs")
    class FilterNeeded {

        @Test
        void a_ratio_other_than_the_targets_default_is_noted_with_both() {
            // source N = 5 (Tf = Td/5 = 0.4 s for Td 2 s); the target's default N is 10
            FormDefinition to = ideal("t", RATIO_10, 0, Map.of());
            Conversion c = convert(to, "kc", "1", "ti", "20", "td", "2", "n", "5");
            assertThat(c.exact()).isTrue();
            ConversionNote.FilterSettingNeeded f = only(c, ConversionNote.FilterSettingNeeded.class);
            assertThat(f.parameter()).isEqualTo("n");
            assertThat(f.neededValue()).isCloseTo(5, within(1e-9));
            assertThat(f.defaultValue()).isEqualTo(10);
            assertThat(f.unitSymbol()).isEmpty();
            assertThat(f.seriesInvolved()).isFalse();
            assertThat(f.sourceFilterSeconds()).isCloseTo(0.4, within(1e-12));
            // entering N = 10 instead changes the law: a cost above zero
            assertThat(f.defaultCost().gainDb()).isPositive();
        }

        @Test
        void the_targets_default_ratio_needs_no_note() {
            Conversion c = convert(ideal("t", RATIO_10, 0, Map.of()), "kc", "1", "ti", "20", "td", "2", "n", "10");
            assertThat(c.notes()).isEmpty();
            // nor does a law without derivative action
            assertThat(convert(ideal("t", RATIO_10, 0, Map.of()), "kc", "1", "ti", "20", "td", "0", "n", "5").notes())
                    .isEmpty();
        }

        @Test
        void a_time_constant_other_than_the_targets_default_is_noted_in_its_unit() {
            // source Td 2 s, N 10: Tf 0.2 s; the target writes tf in seconds with a default of 1 s
            FormDefinition to = ideal("t", new FilterSpec(FilterKind.TIME_CONSTANT, FilterPlacement.DERIVATIVE, 10,
                    TimeUnit.SECONDS, 1), 0, Map.of());
            Conversion c = convert(to, "kc", "1", "ti", "20", "td", "2", "n", "10");
            ConversionNote.FilterSettingNeeded f = only(c, ConversionNote.FilterSettingNeeded.class);
            assertThat(f.parameter()).isEqualTo("tf");
            assertThat(f.neededValue()).isCloseTo(0.2, within(1e-12));
            assertThat(f.defaultValue()).isEqualTo(1.0);
            assertThat(f.unitSymbol()).isEqualTo("s");
            // the default equal to the need: no note
            FormDefinition same = ideal("t", new FilterSpec(FilterKind.TIME_CONSTANT, FilterPlacement.DERIVATIVE, 10,
                    TimeUnit.SECONDS, 0.2), 0, Map.of());
            assertThat(convert(same, "kc", "1", "ti", "20", "td", "2", "n", "10").notes()).isEmpty();
        }
    }

    @Nested
    @DisplayName("what a conversion states beside its values")
    class Stated {

        @Test
        void complex_zeros_into_a_series_form_are_noted_with_ti_over_td() {
            // ideal K 2, Ti 3 s, Td 1 s unfiltered: Ti < 4 Td, so no series setting writes it (Astrom and
            // Hagglund 1995, sec. 3.4). p^2/(d i) = K^2/(K Td K/Ti) = Ti/Td = 3
            Conversion c = Converter.convert(TestForms.unfiltered(Structure.IDEAL), Map.of("kc", "2", "ti", "3", "td", "1"),
                    TestForms.unfiltered(Structure.SERIES), WritingContext.NONE);
            assertThat(c.exact()).isFalse();
            ConversionNote.Inexact n = only(c, ConversionNote.Inexact.class);
            assertThat(n.complexZerosRatio().getAsDouble()).isCloseTo(3, within(1e-12));
            assertThat(n.derivative()).isTrue();
            assertThat(n.filterBound()).isTrue();
            assertThat(n.sourceHighFrequencyGain()).isInfinite();
            assertThat(n.feedbackExact()).isFalse();
            assertThat(c.deviation().gainDb()).isPositive();
            assertThat(c.loopDeviation().gainDb()).isPositive();
        }

        @Test
        void a_series_source_needing_another_ratio_says_a_series_form_is_involved() {
            // series K 1, Ti 20 s, Td 2 s, N 5 (Tf 0.4 s) into an ideal form: exact with Tf 0.4 s, whose
            // ratio to the ideal Td is not the target's default 10; the textbook values (which ignore
            // the filter) differ from the exact ones, so their cost is stated too
            Conversion c = Converter.convert(TestForms.of("ser", Structure.SERIES, RATIO_10),
                    Map.of("kc", "1", "ti", "20", "td", "2", "n", "5"), ideal("t", RATIO_10, 0, Map.of()),
                    WritingContext.NONE);
            assertThat(c.exact()).isTrue();
            ConversionNote.FilterSettingNeeded f = only(c, ConversionNote.FilterSettingNeeded.class);
            assertThat(f.seriesInvolved()).isTrue();
            assertThat(f.textbookCost()).isPresent();
            assertThat(c.textbook()).isNotNull();
        }

        @Test
        void defaults_the_user_did_not_give_are_stated_as_assumptions() {
            FormDefinition tc = ideal("tc", new FilterSpec(FilterKind.TIME_CONSTANT, FilterPlacement.DERIVATIVE, 10,
                    TimeUnit.SECONDS, 2), 0, Map.of());
            Conversion c = Converter.convert(tc, Map.of("kc", "1", "ti", "20", "td", "2"), tc, WritingContext.NONE);
            assertThat(c.assumptions()).singleElement().asString()
                    .startsWith("No tf was given for tc; its default derivative filter time constant 2 s was assumed");
            assertThat(Converter.convert(tc, Map.of("kc", "1", "ti", "20", "td", "2", "tf", "1"), tc,
                    WritingContext.NONE).assumptions()).isEmpty();
            Conversion r = Converter.convert(SOURCE, Map.of("kc", "1", "ti", "20", "td", "2"), SOURCE, WritingContext.NONE);
            assertThat(r.assumptions()).singleElement().asString().startsWith("No n was given for src; its default"
                    + " derivative filter ratio N = 10 (Tf = Td/10) was assumed");
            // without derivative action there is no filter to assume
            assertThat(Converter.convert(SOURCE, Map.of("kc", "1", "ti", "20", "td", "0"), SOURCE, WritingContext.NONE)
                    .assumptions()).isEmpty();
        }
    }

    @Nested
    @DisplayName("at the edges of a note")
    class Edges {

        @Test
        void a_ratio_within_a_millionth_of_the_default_needs_no_note() {
            // N 10.000005 against 10: 5e-7 relative, below the 1e-6 at which printed values differ
            assertThat(convert(ideal("t", RATIO_10, 0, Map.of()), "kc", "1", "ti", "20", "td", "2", "n", "10.000005")
                    .notes()).isEmpty();
        }

        @Test
        void the_cost_of_the_default_ratio_is_the_largest_gain_change_where_the_loop_lives() {
            // ideal K 1, Ti 20 s, Td 2 s entered with N 10 instead of 5: the deviation of
            // 1 + 1/(20 i w) + 2 i w/(1 + 2 i w/N) at N 10 from N 5, largest over the band where the loop
            // lives (the law's corners i/p and p/d: TuningBand), on the 400-point grid of LawDeviation
            Conversion c = convert(ideal("t", RATIO_10, 0, Map.of()), "kc", "1", "ti", "20", "td", "2", "n", "5");
            ConversionNote.FilterSettingNeeded f = only(c, ConversionNote.FilterSettingNeeded.class);
            double worst = 0;
            for (double w : c.loopBand().grid(400)) {
                worst = Math.max(worst, Math.abs(20 * Math.log10(idealMagnitude(w, 10) / idealMagnitude(w, 5))));
            }
            assertThat(f.defaultCost().gainDb()).isCloseTo(worst, within(1e-9));
        }

        /** |1 + 1/(20 i w) + 2 i w / (1 + 2 i w / n)|, written out in real and imaginary parts. */
        private double idealMagnitude(double w, double n) {
            // 2 i w / (1 + i a) with a = 2 w / n: 2 i w (1 - i a)/(1 + a^2) = (2 w a + 2 i w)/(1 + a^2)
            double a = 2 * w / n;
            double re = 1 + 2 * w * a / (1 + a * a);
            double im = -1 / (20 * w) + 2 * w / (1 + a * a);
            return Math.hypot(re, im);
        }

        @Test
        void an_ideal_source_into_a_series_target_with_another_ratio_involves_a_series_form() {
            // ideal K 1, Ti 20 s, Td 2 s, N 5: p^2 = 1.04 >= 4 d i = 0.48, so a series setting writes it exactly,
            // with a filter ratio other than the series target's default
            Conversion c = convert(TestForms.of("ser", Structure.SERIES, RATIO_10), "kc", "1", "ti", "20", "td", "2",
                    "n", "5");
            assertThat(c.exact()).isTrue();
            assertThat(only(c, ConversionNote.FilterSettingNeeded.class).seriesInvolved()).isTrue();
        }

        @Test
        void an_unfiltered_source_binds_the_fit_to_its_filter_even_into_an_adjustable_ratio() {
            // ideal K 2, Ti 3 s, Td 1 s without a filter has an infinite high-frequency gain no filtered
            // law can follow; its zeros are complex (Ti < 4 Td), so no series setting writes it
            Conversion c = Converter.convert(TestForms.unfiltered(Structure.IDEAL), Map.of("kc", "2", "ti", "3", "td", "1"),
                    TestForms.of("ser", Structure.SERIES, RATIO_10), WritingContext.NONE);
            ConversionNote.Inexact n = only(c, ConversionNote.Inexact.class);
            assertThat(n.filterBound()).isTrue();
            assertThat(n.targetHighFrequencyGain()).isFinite();
        }

        @Test
        void a_value_beyond_twelve_digits_is_entered_without_a_rounding_note() {
            // 123456.789012345 to twelve significant digits is 123456.789012: 3e-12 relative, binary noise
            // as far as the law goes, so nothing is noted
            Conversion c = convert(ideal("t", RATIO_10, 0, Map.of()), "kc", "123456.789012345", "ti", "20", "td", "0");
            assertThat(c.entered().values().get("kc")).isEqualTo(123456.789012);
            assertThat(c.notes()).isEmpty();
        }

        @Test
        void a_written_value_must_be_a_finite_number() {
            org.assertj.core.api.Assertions.assertThatThrownBy(() -> new WrittenTuning(Map.of("kc", Double.NaN), null))
                    .hasMessageContaining("kc: a written value must be a finite number (got NaN)");
        }
    }
}

package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.LinkedHashMap;
import java.util.Map;
import org.loopform.findings.ConversionRules;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.io.CatalogLoader;
import org.loopform.units.Span;

/**
 * The units layer: proportional band, repeats per minute, minutes versus seconds, engineering
 * units, per-scan gains and the action flag. Sources: PB% = 100/Kc (ISA InTech, Oct 2022, citing
 * Goettsche (ed.), Maintenance of Instruments and Systems, 2nd ed., ISA 2005; docs/references.md 2);
 * reset rate = 1/Ti in repeats per minute (common practice; docs/references.md 2); Kc% = Kc_eu * PV
 * span / output span and per-scan gains ki h, kd/h (common practice, derived from the definitions).
 */
class UnitsConversionTest {

    private static FormDefinition form(String id) {
        return CatalogLoader.bundled().find(id).orElseThrow();
    }

    private static Map<String, String> values(String... pairs) {
        Map<String, String> m = new LinkedHashMap<>();
        for (int k = 0; k < pairs.length; k += 2) {
            m.put(pairs[k], pairs[k + 1]);
        }
        return m;
    }

    private static Conversion convert(String from, String to, WritingContext ctx, String... pairs) {
        return Converter.convert(form(from), values(pairs), form(to), ctx);
    }

    @ParameterizedTest(name = "kc {0} is pb {1} %")
    @CsvSource({"1, 100", "2, 50", "0.5, 200", "4, 25", "0.8, 125"})
    void proportional_band_is_100_over_gain(double kc, double pb) {
        Conversion c = convert("ideal-min", "ideal-pb-repeats", WritingContext.NONE,
                "kc", Double.toString(kc), "ti", "2", "td", "0.5");
        assertThat(c.exact()).isTrue();
        assertThat(c.parameters().values().get("pb")).isCloseTo(pb, within(1e-9));
    }

    @ParameterizedTest(name = "ti {0} min is {1} repeats/min")
    @CsvSource({"2, 0.5", "0.25, 4", "10, 0.1", "1, 1"})
    void reset_rate_is_one_over_integral_time_in_minutes(double tiMinutes, double repeatsPerMinute) {
        Conversion c = convert("ideal-min", "ideal-pb-repeats", WritingContext.NONE,
                "kc", "1", "ti", Double.toString(tiMinutes), "td", "0");
        assertThat(c.parameters().values().get("reset")).isCloseTo(repeatsPerMinute, within(1e-12));
    }

    @Test
    void minutes_are_sixty_seconds_and_a_value_may_carry_its_own_unit() {
        Conversion c = convert("ideal", "ideal-min", WritingContext.NONE, "kc", "1.2", "ti", "1.5min", "td", "30s");
        assertThat(c.parameters().values().get("ti")).isCloseTo(1.5, within(1e-12));
        assertThat(c.parameters().values().get("td")).isCloseTo(0.5, within(1e-12));
        Conversion r = convert("ideal-pb-repeats", "ideal", WritingContext.NONE, "pb", "50%", "reset", "2/min",
                "td", "0.1");
        assertThat(r.parameters().values().get("kc")).isCloseTo(2.0, within(1e-12));
        assertThat(r.parameters().values().get("ti")).isCloseTo(30.0, within(1e-12));
        assertThat(r.parameters().values().get("td")).isCloseTo(6.0, within(1e-12));
    }

    @Test
    void integral_off_is_written_as_the_forms_off_value() {
        Conversion c = convert("ideal", "ideal-pb-repeats", WritingContext.NONE, "kc", "2", "ti", "0", "td", "0");
        assertThat(c.exact()).isTrue();
        assertThat(c.parameters().values().get("reset")).isEqualTo(0.0);
        Conversion p = convert("ideal", "parallel", WritingContext.NONE, "kc", "2", "ti", "0", "td", "0");
        assertThat(p.parameters().values().get("ki")).isEqualTo(0.0);
    }

    @Test
    void engineering_units_scale_by_pv_span_over_output_span() {
        // PV 0..150 degC, output 0..100 %: Kc% = Kc_eu * 150/100, so Kc_eu = Kc% / 1.5
        WritingContext ctx = new WritingContext(new Span(0, 150), new Span(0, 100), null);
        Conversion c = convert("ideal", "parallel-eu", ctx, "kc", "1.5", "ti", "90", "td", "0");
        assertThat(c.exact()).isTrue();
        assertThat(c.parameters().values().get("kp")).isCloseTo(1.0, within(1e-12));
        assertThat(c.parameters().values().get("ki")).isCloseTo(1.0 / 90, within(1e-14));
    }

    @Test
    void per_scan_gains_are_ki_times_h_and_kd_over_h() {
        // kp = 2, ki = 2/40 1/s, kd = 2*6 s; h = 0.5 s -> ki h = 0.025, kd/h = 24
        WritingContext ctx = new WritingContext(null, null, 0.5);
        Conversion c = convert("ideal", "parallel-scan", ctx, "kc", "2", "ti", "40", "td", "6");
        assertThat(c.exact()).isTrue();
        assertThat(c.parameters().values().get("ki")).isCloseTo(0.025, within(1e-14));
        assertThat(c.parameters().values().get("kd")).isCloseTo(24.0, within(1e-12));
    }

    @Test
    void a_negative_signed_gain_becomes_direct_action_and_back() {
        Conversion c = convert("ideal-min", "ideal-pb-repeats", WritingContext.NONE, "kc", "-2", "ti", "4", "td", "1");
        assertThat(c.exact()).isTrue();
        assertThat(c.parameters().values().get("pb")).isCloseTo(50.0, within(1e-12));
        assertThat(c.parameters().action()).isEqualTo(Action.DIRECT);
        Conversion back = convert("ideal-pb-repeats", "ideal-min", WritingContext.NONE, "pb", "50", "reset", "0.25",
                "td", "1", "action", "direct");
        assertThat(back.parameters().values().get("kc")).isCloseTo(-2.0, within(1e-12));
        assertThat(back.parameters().values().get("ti")).isCloseTo(4.0, within(1e-12));
    }

    @Test
    void an_action_form_without_action_assumes_reverse_and_says_so() {
        Conversion c = convert("ideal-pb-repeats", "ideal-min", WritingContext.NONE, "pb", "50", "reset", "0.25",
                "td", "1");
        assertThat(c.parameters().values().get("kc")).isCloseTo(2.0, within(1e-12));
        // an assumption, not a finding: an audit states it once for every loop it applies to
        assertThat(c.assumptions()).anySatisfy(a -> assertThat(a).contains("reverse action"));
    }

    @Test
    void engineering_unit_forms_name_the_missing_range_flag() {
        assertThatThrownBy(() -> convert("ideal", "parallel-eu", new WritingContext(new Span(0, 10), null, null),
                "kc", "1", "ti", "9", "td", "0"))
                .isInstanceOf(FormException.class).hasMessageContaining("--out-range");
        assertThatThrownBy(() -> convert("ideal", "parallel-scan", WritingContext.NONE, "kc", "1", "ti", "9", "td",
                "0")).isInstanceOf(FormException.class).hasMessageContaining("--scan");
    }

    @Test
    void an_integral_time_the_target_reads_as_off_is_a_failure_not_an_exact_conversion() {
        // a target that writes "integral off" as 100 min or more (common practice on some systems)
        FormDefinition offAt100 = new FormDefinition("off-at-100", "test", "", Structure.IDEAL,
                new GainSpec(GainWriting.GAIN, GainBasis.PERCENT, SignConvention.SIGNED),
                new IntegralSpec(IntegralWriting.TIME, org.loopform.units.TimeUnit.MINUTES, 100),
                new DerivativeSpec(DerivativeWriting.TIME, org.loopform.units.TimeUnit.MINUTES),
                FilterSpec.defaults(), Weight.fixed(1), Weight.fixed(1), Map.of(), DiscreteAlgorithm.defaults());
        // ti = 7000 s = 116.7 min: at or above 100 min, so the target would run without integral action
        Conversion c = Converter.convert(form("ideal"), values("kc", "2", "ti", "7000", "td", "0"), offAt100,
                WritingContext.NONE);
        assertThat(ConversionRules.findings(c)).anySatisfy(f -> {
            assertThat(f.topic()).isEqualTo(org.loopform.findings.Topic.LIMITS);
            assertThat(f.severity()).isEqualTo(org.loopform.findings.Severity.FAIL);
            assertThat(f.message()).contains("integral action off");
        });
    }
}

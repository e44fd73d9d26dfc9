package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Map;
import org.loopform.findings.ConversionRules;
import org.loopform.findings.Finding;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;

/**
 * Series, ideal and parallel PID relations. Source: Astrom & Hagglund, PID Controllers: Theory,
 * Design and Tuning, 2nd ed., ISA 1995, sec. 3.4 (controller parameterizations; section number
 * from memory), as listed in docs/references.md 1. Expected values are computed in
 * the test from the published formulas, or are the hand-derived vectors of docs/references.md 1.
 */
class StructureRelationsTest {

    private static final FormDefinition IDEAL = TestForms.unfiltered(Structure.IDEAL);
    private static final FormDefinition SERIES = TestForms.unfiltered(Structure.SERIES);
    private static final FormDefinition PARALLEL = TestForms.unfiltered(Structure.PARALLEL);

    private static Conversion convert(FormDefinition from, FormDefinition to, String... pairs) {
        Map<String, String> m = new java.util.LinkedHashMap<>();
        for (int k = 0; k < pairs.length; k += 2) {
            m.put(pairs[k], pairs[k + 1]);
        }
        return Converter.convert(from, m, to, WritingContext.NONE);
    }

    @Nested
    @DisplayName("ideal to series")
    class IdealToSeries {

        @Test
        void the_reference_vector_kc1_ti10_td1_gives_0_8873_8_873_1_127() {
            // docs/references.md 1, derived vector: ideal (1, 10, 1) -> series (0.8873, 8.8730, 1.1270)
            Conversion c = convert(IDEAL, SERIES, "kc", "1", "ti", "10", "td", "1");
            assertThat(c.exact()).isTrue();
            assertThat(c.parameters().values().get("kc")).isCloseTo(0.8873, within(1e-4));
            assertThat(c.parameters().values().get("ti")).isCloseTo(8.8730, within(1e-4));
            assertThat(c.parameters().values().get("td")).isCloseTo(1.1270, within(1e-4));
            assertThat(ConversionRules.findings(c)).isEmpty();
        }

        @ParameterizedTest(name = "ideal ({0}, {1}, {2})")
        @CsvSource({"1, 10, 1", "2.5, 100, 20", "0.4, 30, 7.4", "-1.5, 60, 3", "3, 8, 0.5", "1.2, 240, 0"})
        void follows_the_published_formula_with_r_equal_sqrt_1_minus_4_td_over_ti(double kc, double ti, double td) {
            // Kc' = Kc (1 + r)/2, Ti' = Ti (1 + r)/2, Td' = Ti (1 - r)/2, r = sqrt(1 - 4 Td/Ti)
            double r = Math.sqrt(1 - 4 * td / ti);
            Conversion c = convert(IDEAL, SERIES, "kc", Double.toString(kc), "ti", Double.toString(ti),
                    "td", Double.toString(td));
            assertThat(c.exact()).isTrue();
            assertThat(c.parameters().values().get("kc")).isCloseTo(kc * (1 + r) / 2, within(1e-12 * Math.abs(kc)));
            assertThat(c.parameters().values().get("ti")).isCloseTo(ti * (1 + r) / 2, within(1e-12 * ti));
            assertThat(c.parameters().values().get("td")).isCloseTo(ti * (1 - r) / 2, within(1e-10 * ti));
        }

        @Test
        void is_exact_on_the_boundary_ti_equal_4_td() {
            // docs/references.md 1: the boundary ideal (2, 4, 1) -> series (1, 2, 2)
            Conversion c = convert(IDEAL, SERIES, "kc", "2", "ti", "4", "td", "1");
            assertThat(c.exact()).isTrue();
            assertThat(c.parameters().values().get("kc")).isCloseTo(1.0, within(1e-9));
            assertThat(c.parameters().values().get("ti")).isCloseTo(2.0, within(1e-9));
            assertThat(c.parameters().values().get("td")).isCloseTo(2.0, within(1e-9));
        }

        @Test
        void below_ti_equal_4_td_is_not_exact_and_says_why() {
            // complex zeros when Ti < 4 Td (Astrom & Hagglund 1995, sec. 3.4)
            Conversion c = convert(IDEAL, SERIES, "kc", "1", "ti", "3", "td", "1");
            assertThat(c.exact()).isFalse();
            assertThat(ConversionRules.findings(c)).anySatisfy(f -> {
                assertThat(f.topic()).isEqualTo(Topic.REALIZABILITY);
                assertThat(f.figure()).isCloseTo(3.0, within(1e-9)); // Ti/Td of the unfiltered ideal law
                assertThat(f.threshold()).isEqualTo(4.0);
                assertThat(f.message()).contains("complex zeros");
            });
            assertThat(c.deviation().gainDb()).isGreaterThan(0.0);
            assertThat(Finding.worst(ConversionRules.findings(c))).isIn(Severity.WARN, Severity.FAIL);
        }
    }

    @Nested
    @DisplayName("series to ideal and parallel")
    class FromSeries {

        @ParameterizedTest(name = "series ({0}, {1}, {2})")
        @CsvSource({"2, 3, 4", "0.5, 120, 30", "1, 10, 1.127016653792583", "-3, 50, 5", "1.1, 7, 0"})
        void gives_ideal_with_a_equal_1_plus_td_over_ti(double kc, double ti, double td) {
            // Kc = a Kc', Ti = a Ti' = Ti' + Td', Td = Td'/a, a = 1 + Td'/Ti'
            double a = 1 + td / ti;
            Conversion c = convert(SERIES, IDEAL, "kc", Double.toString(kc), "ti", Double.toString(ti),
                    "td", Double.toString(td));
            assertThat(c.exact()).isTrue();
            assertThat(c.parameters().values().get("kc")).isCloseTo(a * kc, within(1e-12 * Math.abs(kc) * a));
            assertThat(c.parameters().values().get("ti")).isCloseTo(ti + td, within(1e-12 * (ti + td)));
            assertThat(c.parameters().values().get("td")).isCloseTo(td / a, within(1e-12 * ti));
        }

        @Test
        void series_2_3_4_is_parallel_14_over_3_2_over_3_8() {
            // docs/references.md 1, derived: series (2, 3, 4) -> parallel (14/3, 2/3, 8)
            Conversion c = convert(SERIES, PARALLEL, "kc", "2", "ti", "3", "td", "4");
            assertThat(c.exact()).isTrue();
            assertThat(c.parameters().values().get("kp")).isCloseTo(14.0 / 3, within(1e-12));
            assertThat(c.parameters().values().get("ki")).isCloseTo(2.0 / 3, within(1e-12));
            assertThat(c.parameters().values().get("kd")).isCloseTo(8.0, within(1e-12));
        }
    }

    @Test
    void ideal_to_parallel_is_kp_kc_ki_kc_over_ti_kd_kc_td() {
        // Kp = Kc, Ki = Kc/Ti, Kd = Kc Td (Astrom & Hagglund 1995, sec. 3.4)
        Conversion c = convert(IDEAL, PARALLEL, "kc", "1.6", "ti", "40", "td", "5");
        assertThat(c.exact()).isTrue();
        assertThat(c.parameters().values().get("kp")).isCloseTo(1.6, within(1e-12));
        assertThat(c.parameters().values().get("ki")).isCloseTo(1.6 / 40, within(1e-14));
        assertThat(c.parameters().values().get("kd")).isCloseTo(1.6 * 5, within(1e-12));
    }

    @Test
    void a_filtered_series_law_is_not_mistaken_for_a_filtered_ideal_law() {
        // Derived by multiplying out both definitions (derived, as docs/references.md marks it):
        // series Kc'(1 + 1/(Ti's))(1 + Td's)/(1 + Tf s) with Tf = Td'/N equals the ideal
        // Kc(1 + 1/(Ti s) + Td s/(1 + Tf s)) with the same Tf when
        //   Kc = Kc'(1 + (Td' - Tf)/Ti'),  Ti = Ti' + Td' - Tf,  Td = Kc'Td'/Kc - Tf.
        // Series (2, 30, 10), N = 10 -> Tf = 1, Kc = 2.6, Ti = 39, Td = 20/2.6 - 1, N_ideal = Td/Tf.
        FormDefinition series = TestForms.of("series-n", Structure.SERIES, FilterSpec.defaults());
        FormDefinition ideal = TestForms.of("ideal-n", Structure.IDEAL, FilterSpec.defaults());
        Conversion c = convert(series, ideal, "kc", "2", "ti", "30", "td", "10", "n", "10");
        assertThat(c.exact()).isTrue();
        double td = 20 / 2.6 - 1;
        assertThat(c.parameters().values().get("kc")).isCloseTo(2.6, within(1e-12));
        assertThat(c.parameters().values().get("ti")).isCloseTo(39.0, within(1e-11));
        assertThat(c.parameters().values().get("td")).isCloseTo(td, within(1e-11));
        assertThat(c.parameters().values().get("n")).isCloseTo(td / 1.0, within(1e-11));
    }
}

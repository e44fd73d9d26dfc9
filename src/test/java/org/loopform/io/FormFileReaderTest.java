// plumbing: no published source needed (source: none)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.loopform.form.DerivativeWriting;
import org.loopform.form.Discretization;
import org.loopform.form.FilterKind;
import org.loopform.form.FilterPlacement;
import org.loopform.form.FormDefinition;
import org.loopform.form.GainBasis;
import org.loopform.form.GainWriting;
import org.loopform.form.IntegralWriting;
import org.loopform.form.SignConvention;
import org.loopform.form.Structure;
import org.loopform.units.TimeUnit;

class FormFileReaderTest {

    private static final Path CATALOG = Path.of("forms-catalog");

    static Stream<Path> catalogFiles() throws IOException {
        try (Stream<Path> s = Files.list(CATALOG)) {
            return s.filter(p -> p.toString().endsWith(".yaml")).sorted().toList().stream();
        }
    }

    private static List<String> problemsOf(String yaml) {
        InputException e = catchThrowableOfType(InputException.class, () -> FormFileReader.parse(yaml, "f.yaml"));
        assertThat(e).as("reading should fail").isNotNull();
        return e.problems();
    }

    @Nested
    @DisplayName("the catalog")
    class TheCatalog {

        @ParameterizedTest(name = "{0} loads")
        @MethodSource("org.loopform.io.FormFileReaderTest#catalogFiles")
        void every_catalog_file_loads_and_its_id_is_its_file_name(Path file) {
            FormDefinition f = FormFileReader.read(file, file.toString());
            assertThat(f.id() + ".yaml").isEqualTo(file.getFileName().toString());
            assertThat(f.title()).isNotBlank();
        }

        @Test
        void holds_seventeen_forms_and_the_bundled_catalog_holds_the_same_ids() throws IOException {
            List<String> ids = catalogFiles().map(p -> p.getFileName().toString().replace(".yaml", "")).toList();
            assertThat(ids).hasSize(17);
            assertThat(CatalogLoader.bundled().ids()).containsExactlyInAnyOrderElementsOf(ids);
        }

        @Test
        void the_example_in_the_readme_is_a_valid_form() throws IOException {
            String readme = Files.readString(CATALOG.resolve("README.md"));
            int start = readme.indexOf("```yaml\n") + "```yaml\n".length();
            String yaml = readme.substring(start, readme.indexOf("```", start));
            FormDefinition f = FormFileReader.parse(yaml, "README.md example");
            assertThat(f.id()).isEqualTo("example-series-band");
            assertThat(f.parameterNames()).containsExactly("pb", "ti", "td");
            assertThat(f.integral().isOff(100)).isTrue();
            assertThat(f.algorithm().allowedScansSeconds()).containsExactly(0.25, 0.5, 1.0);
        }

        @Test
        void reads_a_band_and_repeats_form_as_written() {
            FormDefinition f = FormFileReader.read(CATALOG.resolve("ideal-pb-repeats.yaml"), "ideal-pb-repeats.yaml");
            assertThat(f.structure()).isEqualTo(Structure.IDEAL);
            assertThat(f.gain().writing()).isEqualTo(GainWriting.BAND);
            assertThat(f.gain().sign()).isEqualTo(SignConvention.ACTION);
            assertThat(f.integral().writing()).isEqualTo(IntegralWriting.RATE);
            assertThat(f.integral().unit()).isEqualTo(TimeUnit.MINUTES);
            assertThat(f.parameterNames()).containsExactly("pb", "reset", "td", "n");
        }
    }

    @Nested
    @DisplayName("defaults when a file says little")
    class Defaults {

        private final FormDefinition minimal = FormFileReader.parse("""
                id: tiny
                title: The least a form file can say
                structure: ideal
                """, "tiny.yaml");

        @Test
        void gain_is_a_signed_percent_gain() {
            assertThat(minimal.gain().writing()).isEqualTo(GainWriting.GAIN);
            assertThat(minimal.gain().basis()).isEqualTo(GainBasis.PERCENT);
            assertThat(minimal.gain().sign()).isEqualTo(SignConvention.SIGNED);
        }

        @Test
        void integral_is_a_time_in_seconds_off_at_0() {
            assertThat(minimal.integral().writing()).isEqualTo(IntegralWriting.TIME);
            assertThat(minimal.integral().unit()).isEqualTo(TimeUnit.SECONDS);
            assertThat(minimal.integral().offValue()).isZero();
        }

        @Test
        void filter_is_an_adjustable_ratio_of_10_on_the_derivative() {
            assertThat(minimal.filter().kind()).isEqualTo(FilterKind.RATIO);
            assertThat(minimal.filter().ratio()).isEqualTo(10.0);
            assertThat(minimal.filter().placement()).isEqualTo(FilterPlacement.DERIVATIVE);
        }

        @Test
        void weights_are_fixed_at_1_and_the_algorithm_is_positional_with_backward_differences() {
            assertThat(minimal.b().adjustable()).isFalse();
            assertThat(minimal.b().defaultValue()).isEqualTo(1.0);
            assertThat(minimal.c().defaultValue()).isEqualTo(1.0);
            assertThat(minimal.algorithm().integral()).isEqualTo(Discretization.BACKWARD);
            assertThat(minimal.algorithm().derivative()).isEqualTo(Discretization.BACKWARD);
            assertThat(minimal.derivative().writing()).isEqualTo(DerivativeWriting.TIME);
            assertThat(minimal.parameterNames()).containsExactly("kc", "ti", "td", "n");
        }
    }

    @Nested
    @DisplayName("a file with several mistakes reports each of them in one run")
    class SeveralMistakes {

        // line numbers matter below: keep this text as it is
        private static final String SECTION_MISTAKES = """
                id: section-mistakes
                title: Mistakes inside the sections
                colour: blue
                structure: ideal
                gain: {as: band, basis: engineering, sign: signed}
                integral: {as: time, unit: fortnight, off: 0}
                derivative: {as: slope, unit: s}
                filter: {kind: ratio, ratio: ten}
                """;

        private final List<String> problems = problemsOf(SECTION_MISTAKES);

        @Test
        void one_problem_each() {
            assertThat(problems).hasSize(5);
        }

        @Test
        void an_unknown_key_with_the_keys_that_are_known() {
            assertThat(problems).anySatisfy(p -> assertThat(p).startsWith("f.yaml:3: colour: unknown key")
                    .contains("expected one of").contains("structure").contains("weights"));
        }

        @Test
        void a_band_with_engineering_basis() {
            assertThat(problems).anySatisfy(p -> assertThat(p).startsWith("f.yaml:5: gain:")
                    .contains("proportional band").contains("engineering").contains("percent"));
        }

        @Test
        void a_bad_time_unit() {
            assertThat(problems).anySatisfy(p -> assertThat(p).startsWith("f.yaml:6: integral.unit:")
                    .contains("s, min or h").contains("got 'fortnight'"));
        }

        @Test
        void a_bad_enum_value_with_the_allowed_list() {
            assertThat(problems).anySatisfy(p -> assertThat(p).startsWith("f.yaml:7: derivative.as:")
                    .contains("must be one of time, gain, per_scan").contains("got 'slope'"));
        }

        @Test
        void a_non_numeric_number() {
            assertThat(problems).anySatisfy(p -> assertThat(p).startsWith("f.yaml:8: filter.ratio:")
                    .contains("must be a number").contains("got 'ten'"));
        }

        // line numbers matter below: keep this text as it is
        private static final String CROSS_FIELD_MISTAKES = """
                id: cross-mistakes
                title: Rules between fields, beside plain mistakes
                structure: ideal
                shade: green
                filter: {kind: time_constant, placement: measurement}
                weights: {b: 1, c: 1}
                limits:
                  kp: {max: 5}
                  ti: {max: lots}
                algorithm:
                  anti_windup: sometimes
                  tracking_time: 5 fortnights
                """;

        @Test
        void cross_field_rules_are_reported_beside_the_plain_mistakes() {
            List<String> p = problemsOf(CROSS_FIELD_MISTAKES);
            assertThat(p).hasSize(6);
            assertThat(p).anySatisfy(m -> assertThat(m).startsWith("f.yaml:4: shade: unknown key"));
            assertThat(p).anySatisfy(m -> assertThat(m).startsWith("f.yaml:6: weights.c:")
                    .contains("measurement").contains("fixed at 0"));
            assertThat(p).anySatisfy(m -> assertThat(m).startsWith("f.yaml:8: limits.kp:")
                    .contains("no parameter 'kp'").contains("kc, ti, td, tf"));
            assertThat(p).anySatisfy(m -> assertThat(m).startsWith("f.yaml:9: limits.ti.max: must be a number")
                    .contains("got 'lots'"));
            assertThat(p).anySatisfy(m -> assertThat(m).startsWith("f.yaml:11: algorithm.anti_windup:")
                    .contains("clamping, back_calculation, none").contains("got 'sometimes'"));
            assertThat(p).anySatisfy(m -> assertThat(m).startsWith("f.yaml:12: algorithm.tracking_time:")
                    .contains("unknown time unit 'fortnights'"));
        }

        @Test
        void the_exception_message_lists_every_problem() {
            assertThatThrownBy(() -> FormFileReader.parse(SECTION_MISTAKES, "f.yaml"))
                    .isInstanceOf(InputException.class)
                    .hasMessageContaining("colour").hasMessageContaining("fortnight").hasMessageContaining("slope");
        }
    }

    @Nested
    @DisplayName("rules between fields")
    class CrossFieldRules {

        @Test
        void a_series_form_takes_c_0_or_1_only() {
            assertThat(problemsOf("""
                    id: s
                    title: t
                    structure: series
                    weights: {b: 1, c: 0.5}
                    """)).singleElement().satisfies(p -> assertThat(p).startsWith("f.yaml:4: weights.c:")
                    .contains("c: 1").contains("c: 0"));
        }

        @Test
        void a_gain_integral_needs_structure_parallel() {
            assertThat(problemsOf("""
                    id: s
                    title: t
                    structure: ideal
                    integral: {as: gain}
                    """)).singleElement().satisfies(p -> assertThat(p).startsWith("f.yaml:4: integral.as:")
                    .contains("needs structure parallel"));
        }

        @Test
        void a_per_scan_integral_needs_structure_parallel() {
            assertThat(problemsOf("""
                    id: s
                    title: t
                    structure: series
                    integral: {as: per_scan}
                    """)).singleElement().satisfies(p -> assertThat(p).contains("integral.as")
                    .contains("per_scan").contains("parallel"));
        }

        @Test
        void a_measurement_filter_accepts_c_fixed_at_0() {
            FormDefinition f = FormFileReader.parse("""
                    id: s
                    title: t
                    structure: ideal
                    filter: {kind: time_constant, placement: measurement, unit: s, default: 0}
                    weights: {b: 1, c: 0}
                    """, "f.yaml");
            assertThat(f.parameterNames()).containsExactly("kc", "ti", "td", "tf");
        }
    }

    @Nested
    @DisplayName("files that are not a form at all")
    class NotAForm {

        @Test
        void invalid_yaml_names_its_line() {
            assertThatThrownBy(() -> FormFileReader.parse("""
                    id: bad
                    title: x
                      structure: ideal
                    """, "f.yaml"))
                    .isInstanceOf(InputException.class)
                    .hasMessageStartingWith("f.yaml:3: not valid YAML")
                    .hasMessageContaining("indentation");
        }

        @Test
        void an_empty_file_says_so() {
            assertThatThrownBy(() -> FormFileReader.parse("", "f.yaml"))
                    .isInstanceOf(InputException.class)
                    .hasMessageStartingWith("f.yaml:1:")
                    .hasMessageContaining("empty");
        }

        @Test
        void a_file_of_comments_only_is_empty() {
            assertThatThrownBy(() -> FormFileReader.parse("# nothing here\n", "f.yaml"))
                    .hasMessageContaining("empty");
        }

        @Test
        void a_duplicate_key_names_both_lines() {
            assertThatThrownBy(() -> FormFileReader.parse("""
                    id: first
                    title: x
                    structure: ideal
                    id: second
                    """, "f.yaml"))
                    .isInstanceOf(InputException.class)
                    .hasMessageStartingWith("f.yaml:4: id: duplicate key")
                    .hasMessageContaining("line 1");
        }

        @Test
        void a_duplicate_key_inside_a_section_is_found_too() {
            assertThatThrownBy(() -> FormFileReader.parse("""
                    id: first
                    title: x
                    structure: ideal
                    integral:
                      as: time
                      as: rate
                    """, "f.yaml"))
                    .hasMessageStartingWith("f.yaml:6: integral.as: duplicate key");
        }

        @Test
        void a_list_at_the_top_is_not_a_form() {
            assertThatThrownBy(() -> FormFileReader.parse("- a\n- b\n", "f.yaml"))
                    .isInstanceOf(InputException.class)
                    .hasMessageContaining("mapping");
        }

        @Test
        void required_keys_are_named_when_missing() {
            assertThat(problemsOf("description: nothing else\n"))
                    .anySatisfy(p -> assertThat(p).contains("id: required"))
                    .anySatisfy(p -> assertThat(p).contains("title: required"))
                    .anySatisfy(p -> assertThat(p).contains("structure: required").contains("parallel, ideal, series"));
        }

        @Test
        void a_missing_file_is_named() {
            assertThatThrownBy(() -> FormFileReader.read(Path.of("no/such/form.yaml"), "no/such/form.yaml"))
                    .isInstanceOf(InputException.class)
                    .hasMessageContaining("no/such/form.yaml").hasMessageContaining("no such file");
        }
    }

    @Nested
    @DisplayName("limits and the algorithm block")
    class LimitsAndAlgorithm {

        @Test
        void limits_resolution_and_scan_rules_are_read() {
            FormDefinition f = FormFileReader.parse("""
                    id: s
                    title: t
                    structure: ideal
                    limits:
                      kc: {min: 0.01, max: 50, resolution: 0.01}
                    algorithm:
                      kind: velocity
                      derivative: trapezoidal
                      output: -10..110
                      scan: {allowed: [100 ms, 0.5 s, 1 s]}
                    """, "f.yaml");
            assertThat(f.limit("kc").max()).isEqualTo(50.0);
            assertThat(f.limit("kc").resolution()).isEqualTo(0.01);
            assertThat(f.algorithm().outputLowPercent()).isEqualTo(-10.0);
            assertThat(f.algorithm().allowedScansSeconds()).containsExactly(0.1, 0.5, 1.0);
            assertThat(f.algorithm().allowsScan(0.5)).isTrue();
            assertThat(f.algorithm().allowsScan(0.25)).isFalse();
        }

        @Test
        void an_integral_discretization_cannot_be_step_invariant() {
            assertThat(problemsOf("""
                    id: s
                    title: t
                    structure: ideal
                    algorithm: {integral: step_invariant}
                    """)).singleElement().satisfies(p -> assertThat(p).startsWith("f.yaml:4: algorithm.integral:")
                    .contains("forward, backward, trapezoidal"));
        }

        @Test
        void limits_with_min_above_max_are_refused() {
            assertThat(problemsOf("""
                    id: s
                    title: t
                    structure: ideal
                    limits:
                      kc: {min: 5, max: 1}
                    """)).singleElement().satisfies(p -> assertThat(p).startsWith("f.yaml:5:")
                    .contains("min must not exceed max"));
        }
    }
}

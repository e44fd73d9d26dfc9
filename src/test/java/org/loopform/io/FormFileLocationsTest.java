// source: the test form files themselves (each expected line is the line of the key the test wrote there; YAML 1.1, 3.2.1 and 7.4: a block mapping's value starts on the line of its first key), forms-catalog/README.md ("derivative": a parallel form writes derivative as gain by default; "weights": b and c fixed at 1 unless given)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.loopform.form.DerivativeWriting;
import org.loopform.form.FormDefinition;

/** Where a form file's problems are placed, and the defaults a section takes from the structure. */
class FormFileLocationsTest {

    private static List<String> problemsOf(String yaml) {
        InputException e = catchThrowableOfType(InputException.class, () -> FormFileReader.parse(yaml, "f.yaml"));
        assertThat(e).as("reading should fail").isNotNull();
        return e.problems();
    }

    @Test
    void a_parallel_form_whose_derivative_names_only_its_unit_writes_it_as_a_gain() {
        FormDefinition f = FormFileReader.parse("""
                id: p
                title: t
                structure: parallel
                derivative: {unit: s}
                """, "f.yaml");
        assertThat(f.derivative().writing()).isEqualTo(DerivativeWriting.GAIN);
    }

    @Test
    void a_weights_section_naming_b_alone_keeps_c_fixed_at_1() {
        FormDefinition f = FormFileReader.parse("""
                id: w
                title: t
                structure: ideal
                weights: {b: 0.5}
                """, "f.yaml");
        assertThat(f.b().defaultValue()).isEqualTo(0.5);
        assertThat(f.c().defaultValue()).isEqualTo(1.0);
        assertThat(f.c().adjustable()).isFalse();
    }

    @Test
    void a_rule_between_fields_is_placed_at_the_line_of_the_field_it_names() {
        assertThat(problemsOf("""
                id: s
                title: t
                structure: series
                weights:
                  b: 1
                  c: 0.5
                """)).singleElement().asString().startsWith("f.yaml:6: weights.c:");
    }

    @Test
    void a_rule_about_a_field_left_out_is_placed_at_its_section() {
        assertThat(problemsOf("""
                id: s
                title: t
                structure: ideal
                filter: {kind: time_constant, placement: measurement}
                weights:
                  b: 1
                """)).singleElement().asString().startsWith("f.yaml:6: weights.c:");
    }

    @Test
    void a_rule_about_a_section_left_out_is_placed_at_the_top_of_the_file() {
        assertThat(problemsOf("""
                id: s
                title: t
                structure: ideal
                filter: {kind: time_constant, placement: measurement}
                """)).singleElement().asString().startsWith("f.yaml:1: weights.c:");
    }

    @Test
    void a_section_its_record_refuses_is_named_once_at_the_section() {
        assertThat(problemsOf("""
                id: s
                title: t
                structure: ideal
                filter: {ratio: -1}
                """)).singleElement().asString().isEqualTo("f.yaml:4: filter: ratio N must be a positive number (got -1.0)");
    }

    @Test
    void an_unknown_structure_is_the_only_problem_reported() {
        assertThat(problemsOf("""
                id: s
                title: t
                structure: circular
                """)).singleElement().asString().startsWith("f.yaml:3: structure:");
    }
}

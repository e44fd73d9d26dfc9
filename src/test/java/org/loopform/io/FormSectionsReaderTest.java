// plumbing: no published source needed (source: none)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.form.FormDefinition;
import org.loopform.form.Weight;

/**
 * The weights and limits sections of a form file, and the located messages of the YAML nodes
 * they are read from: each rule on both sides, each message with its file, line and key.
 */
class FormSectionsReaderTest {

    private static final String HEAD = """
            id: s
            title: t
            structure: ideal
            """;

    private static FormDefinition read(String body) {
        return FormFileReader.parse(HEAD + body, "f.yaml");
    }

    private static List<String> problemsOf(String body) {
        InputException e = catchThrowableOfType(InputException.class, () -> read(body));
        assertThat(e).as("reading should fail").isNotNull();
        return e.problems();
    }

    @Nested
    @DisplayName("weights")
    class Weights {

        @Test
        void absent_weights_are_fixed_at_1() {
            FormDefinition f = read("");
            assertThat(f.b()).isEqualTo(Weight.fixed(1.0));
            assertThat(f.c()).isEqualTo(Weight.fixed(1.0));
        }

        @Test
        void a_number_is_a_fixed_weight() {
            FormDefinition f = read("weights: {b: 0.5, c: 0}\n");
            assertThat(f.b()).isEqualTo(Weight.fixed(0.5));
            assertThat(f.c()).isEqualTo(Weight.fixed(0.0));
        }

        @Test
        void a_mapping_is_adjustable_unless_it_says_otherwise_with_range_0_to_1() {
            FormDefinition f = read("""
                    weights:
                      b: {default: 0.7}
                      c: {default: 0.2, adjustable: false}
                    """);
            assertThat(f.b()).isEqualTo(new Weight(0.7, true, 0.0, 1.0));
            assertThat(f.c()).isEqualTo(Weight.fixed(0.2));
            FormDefinition g = read("""
                    weights:
                      b: {default: 2, min: 1, max: 3}
                      c: {}
                    """);
            assertThat(g.b()).isEqualTo(new Weight(2, true, 1, 3));
            assertThat(g.c()).isEqualTo(new Weight(1, true, 0, 1));
        }

        @Test
        void a_list_or_a_default_outside_the_range_is_a_located_problem() {
            assertThat(problemsOf("""
                    weights:
                      b: [1, 2]
                    """)).singleElement().satisfies(p -> assertThat(p)
                    .startsWith("f.yaml:5: weights.b: write a fixed weight as a number"));
            assertThat(problemsOf("""
                    weights:
                      b: {default: 2}
                    """)).singleElement().satisfies(p -> assertThat(p)
                    .startsWith("f.yaml:5: weights.b: setpoint weight default 2.0 must lie within its range 0.0..1.0"));
            assertThat(problemsOf("""
                    weights:
                      b: {default: 1, step: 2}
                    """)).singleElement().satisfies(p -> assertThat(p)
                    .startsWith("f.yaml:5: weights.b.step: unknown key; expected one of adjustable, default, max, min"));
        }
    }

    @Nested
    @DisplayName("limits")
    class Limits {

        @Test
        void each_bound_is_optional() {
            FormDefinition f = read("""
                    limits:
                      kc: {max: 50}
                      ti: {min: 1, resolution: 0.1}
                    """);
            assertThat(f.limit("kc").min()).isNull();
            assertThat(f.limit("kc").max()).isEqualTo(50.0);
            assertThat(f.limit("kc").resolution()).isNull();
            assertThat(f.limit("ti").min()).isEqualTo(1.0);
            assertThat(f.limit("ti").max()).isNull();
            assertThat(f.limit("ti").resolution()).isEqualTo(0.1);
        }

        @Test
        void a_section_or_an_entry_that_is_not_a_mapping_is_a_located_problem() {
            assertThat(problemsOf("limits: 5\n")).singleElement().satisfies(p -> assertThat(p)
                    .startsWith("f.yaml:4: limits: expected a mapping from parameter name to {min, max, resolution}"));
            assertThat(problemsOf("""
                    limits:
                      kc: 5
                    """)).singleElement().satisfies(p -> assertThat(p)
                    .startsWith("f.yaml:5: limits.kc: expected {min: ..., max: ..., resolution: ...}"));
            assertThat(problemsOf("""
                    limits:
                      kc: {min: 1, most: 5}
                    """)).singleElement().satisfies(p -> assertThat(p)
                    .startsWith("f.yaml:5: limits.kc.most: unknown key; expected one of max, min, resolution"));
        }
    }
}

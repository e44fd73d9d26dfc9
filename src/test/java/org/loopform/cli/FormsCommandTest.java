// plumbing: no published source needed (source: none)
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.io.CatalogLoader;

class FormsCommandTest {

    private static final ObjectMapper JSON = new ObjectMapper();

    private static final String GOOD_FORM = """
            id: made-up-good
            title: A made-up form that is fine
            structure: series
            gain: {as: band, basis: percent, sign: action}
            integral: {as: time, unit: min, off: 0}
            derivative: {as: time, unit: min}
            weights: {b: 1, c: 0}
            """;

    // line numbers matter below: keep this text as it is
    private static final String BROKEN_FORM = """
            id: made-up-broken
            title: A made-up form with two mistakes
            structure: ideal
            integral: {as: time, unit: fortnight}
            flavour: mint
            """;

    @TempDir
    Path dir;

    private Path write(String name, String text) throws Exception {
        Path p = dir.resolve(name);
        Files.writeString(p, text);
        return p;
    }

    @Nested
    @DisplayName("forms")
    class ListForms {

        @Test
        void lists_every_catalog_id() {
            CliRun r = CliRun.of("forms");
            assertThat(r.exitCode()).isZero();
            assertThat(r.err()).isEmpty();
            List<String> ids = CatalogLoader.bundled().ids();
            assertThat(ids).hasSize(17);
            ids.forEach(id -> assertThat(r.out()).contains(id));
            assertThat(r.out()).contains("17 forms");
        }

        @Test
        void lists_every_catalog_id_as_json() throws Exception {
            CliRun r = CliRun.of("forms", "--format", "json");
            assertThat(r.exitCode()).isZero();
            List<String> ids = new ArrayList<>();
            JSON.readTree(r.out()).get("forms").forEach(f -> ids.add(f.get("id").asText()));
            assertThat(ids).containsExactlyElementsOf(CatalogLoader.bundled().ids());
        }
    }

    @Nested
    @DisplayName("forms show")
    class Show {

        @Test
        void shows_the_band_and_reset_units_of_a_catalog_form() {
            CliRun r = CliRun.of("forms", "show", "ideal-pb-repeats");
            assertThat(r.exitCode()).isZero();
            assertThat(r.out()).contains("ideal-pb-repeats").contains("proportional band").contains("repeats/min")
                    .contains("reverse|direct");
            assertThat(r.out().lines().filter(l -> l.startsWith("pb ")).findFirst()).hasValueSatisfying(
                    l -> assertThat(l).contains("%"));
            assertThat(r.out().lines().filter(l -> l.startsWith("reset ")).findFirst()).hasValueSatisfying(
                    l -> assertThat(l).contains("repeats/min"));
        }

        @Test
        void shows_a_form_file_given_by_its_path() throws Exception {
            Path f = write("good.yaml", GOOD_FORM);
            CliRun r = CliRun.of("forms", "show", f.toString());
            assertThat(r.exitCode()).isZero();
            assertThat(r.out()).contains("made-up-good").contains("series").contains("pb").contains("min");
        }

        @Test
        void shows_a_form_as_json() throws Exception {
            CliRun r = CliRun.of("forms", "show", "ideal-pb-repeats", "--format", "json");
            assertThat(r.exitCode()).isZero();
            JsonNode n = JSON.readTree(r.out());
            assertThat(n.get("id").asText()).isEqualTo("ideal-pb-repeats");
            assertThat(n.get("integral").get("as").asText()).isEqualTo("rate");
            assertThat(n.get("integral").get("unit").asText()).isEqualTo("min");
        }

        @Test
        void an_unknown_id_lists_the_catalog_and_prints_nothing_on_stdout() {
            CliRun r = CliRun.of("forms", "show", "no-such-form");
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.out()).isEmpty();
            assertThat(r.err()).contains("unknown form 'no-such-form'").contains("ideal-pb-repeats")
                    .contains("series-pv-derivative");
        }
    }

    @Nested
    @DisplayName("forms check")
    class Check {

        @Test
        void a_good_file_is_valid() throws Exception {
            Path f = write("good.yaml", GOOD_FORM);
            CliRun r = CliRun.of("forms", "check", f.toString());
            assertThat(r.exitCode()).isZero();
            assertThat(r.out()).contains("made-up-good is valid");
            assertThat(r.err()).isEmpty();
        }

        @Test
        void a_broken_file_gives_every_problem_on_stderr_and_exit_2() throws Exception {
            Path f = write("broken.yaml", BROKEN_FORM);
            CliRun r = CliRun.of("forms", "check", f.toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.out()).isEmpty();
            assertThat(r.err()).contains(f + ":4: integral.unit:").contains("fortnight")
                    .contains(f + ":5: flavour: unknown key").contains("2 problems");
        }

        @Test
        void json_gives_valid_true_for_a_good_file() throws Exception {
            Path f = write("good.yaml", GOOD_FORM);
            CliRun r = CliRun.of("forms", "check", f.toString(), "--format", "json");
            assertThat(r.exitCode()).isZero();
            JsonNode n = JSON.readTree(r.out());
            assertThat(n.get("valid").asBoolean()).isTrue();
            assertThat(n.get("id").asText()).isEqualTo("made-up-good");
            assertThat(n.get("problems")).isEmpty();
        }

        @Test
        void json_lists_the_problems_of_a_broken_file() throws Exception {
            Path f = write("broken.yaml", BROKEN_FORM);
            CliRun r = CliRun.of("forms", "check", f.toString(), "--format", "json");
            assertThat(r.exitCode()).isEqualTo(2);
            JsonNode n = JSON.readTree(r.out());
            assertThat(n.get("valid").asBoolean()).isFalse();
            assertThat(n.get("problems")).hasSize(2);
            List<String> problems = new ArrayList<>();
            n.get("problems").forEach(p -> problems.add(p.asText()));
            assertThat(problems).anySatisfy(p -> assertThat(p).contains(":4: integral.unit:"))
                    .anySatisfy(p -> assertThat(p).contains(":5: flavour: unknown key"));
        }

        @Test
        void a_missing_file_exits_2() {
            CliRun r = CliRun.of("forms", "check", dir.resolve("absent.yaml").toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("absent.yaml").contains("no such file");
        }
    }
}

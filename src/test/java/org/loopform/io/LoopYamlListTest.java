// source: the test lists themselves (lines and tags as written), YAML 1.1, 9.1 ('---' starts another document), and for the rule's values Skogestad, "Simple analytic rules for model reduction and PID controller tuning", J. Process Control 13 (2003), SIMC PI: Kc = tau1/(k (tau_c + theta)), tau_I = min(tau1, 4 (tau_c + theta)) (docs/references.md section 7)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;
import org.loopform.form.Catalog;

/** A YAML loop list: one block and a second document, new loops tuned by rule, and the file let go. */
class LoopYamlListTest {

    private static final String RULE_LOOP = "  - tag: TIC-1\n"
            + "    tuning: {rule: simc, controller: pi, tau_c: 20 s}\n"
            + "    process: {model: fopdt, gain: 2, time_constant: 60 s, dead_time: 10 s}\n";

    @TempDir
    Path dir;

    private static List<LoopRow> all(LoopYamlReader r) {
        List<LoopRow> rows = new ArrayList<>();
        try (r) {
            r.forEachRemaining(rows::add);
        }
        return rows;
    }

    @Test
    void a_single_loop_block_followed_by_a_second_document_is_refused_at_the_second() {
        assertThatThrownBy(() -> all(LoopYamlReader.of("tag: A\ntuning: {form: ideal, kc: 1, ti: 60, td: 0}\n"
                + "target: {form: ideal}\n---\ntag: B\n", "l.yaml", LoopDefaults.NONE)))
                .isInstanceOf(InputException.class)
                .hasMessageStartingWith("l.yaml:4: a second YAML document ('---')");
    }

    // SIMC PI, k = 2, tau1 = 60 s, theta = 10 s, tau_c = 20 s: Kc = 60 / (2 * 30) = 1, tau_I = min(60, 120) = 60 s
    @Test
    void a_loop_tuned_by_rule_carries_the_rule_s_tuning_into_its_target() {
        List<LoopRow> rows = all(LoopYamlReader.of("loops:\n" + RULE_LOOP + "    target: {form: ideal, scan: 1 s}\n",
                "l.yaml", LoopDefaults.NONE));
        assertThat(rows).singleElement().satisfies(r -> {
            assertThat(r.problems()).isEmpty();
            assertThat(r.ruleTuning()).isNotNull();
            assertThat(r.ruleTuning().gain()).isCloseTo(1.0, within(1e-12));
            assertThat(r.ruleTuning().integralTimeSeconds()).isCloseTo(60.0, within(1e-9));
            assertThat(r.loop().targetForm().id()).isEqualTo("ideal");
        });
    }

    @Test
    void a_loop_tuned_by_rule_without_a_target_takes_the_default_target() {
        Catalog c = CatalogLoader.bundled();
        LoopDefaults d = new LoopDefaults(c.find("ideal-pb-repeats").orElseThrow(), 0.5);
        List<LoopRow> rows = all(LoopYamlReader.of("loops:\n" + RULE_LOOP, "l.yaml", d));
        assertThat(rows).singleElement().satisfies(r -> {
            assertThat(r.problems()).isEmpty();
            assertThat(r.ruleTuning()).isNotNull();
            assertThat(r.loop().targetForm().id()).isEqualTo("ideal-pb-repeats");
        });
    }

    // a gain of 0 is no controller (common practice); the value is on line 5 of the list
    @Test
    void a_bad_tuning_value_is_placed_at_its_own_line_with_or_without_a_target() {
        String loop = "loops:\n  - tag: A\n    tuning:\n      form: ideal\n      kc: 0\n      ti: 60\n      td: 0\n";
        Catalog c = CatalogLoader.bundled();
        LoopDefaults d = new LoopDefaults(c.find("ideal-pb-repeats").orElseThrow(), 0.5);
        for (String text : List.of(loop, loop + "    target: {form: ideal, scan: 1 s}\n")) {
            List<LoopRow> rows = all(LoopYamlReader.of(text, "l.yaml", d));
            assertThat(rows).singleElement().satisfies(r -> assertThat(r.problems()).singleElement().asString()
                    .startsWith("l.yaml:5: tuning.kc: ").satisfies(m -> assertThat(m.split("kc:", -1)).hasSize(2)));
        }
    }

    // YAML 1.1, 5.1: the C0 control characters other than tab, line feed and carriage return are not
    // printable; BEL (code 7) is the 18th character of this list, at index 17 from 0
    @Test
    void a_control_character_in_a_list_read_as_it_streams_is_placed_by_its_character_index() {
        assertThatThrownBy(() -> all(LoopYamlReader.of("loops:\n  - tag: A\u0007\n", "l.yaml", LoopDefaults.NONE)))
                .isInstanceOf(InputException.class)
                .hasMessage("l.yaml: a control character (code 7) that YAML does not allow at character 17; delete it,"
                        + " or save the file as plain UTF-8 text");
    }

    @Test
    void a_file_is_let_go_after_reading_and_when_it_is_refused() throws IOException {
        assumeTrue(OpenFiles.countable(), "this system lists open descriptors in /proc/self/fd");
        Path good = Files.writeString(dir.resolve("good.yaml"), "loops:\n" + RULE_LOOP
                + "    target: {form: ideal, scan: 1 s}\n");
        LoopYamlReader r = LoopYamlReader.open(good, "good.yaml", LoopDefaults.NONE);
        assertThat(OpenFiles.on(good)).isPositive();
        assertThat(all(r)).hasSize(1);
        assertThat(OpenFiles.on(good)).isZero();
        Path bad = Files.writeString(dir.resolve("bad.yaml"), "tag: A\n---\ntag: B\n");
        assertThatThrownBy(() -> LoopYamlReader.open(bad, "bad.yaml", LoopDefaults.NONE))
                .isInstanceOf(InputException.class);
        assertThat(OpenFiles.on(bad)).isZero();
    }
}

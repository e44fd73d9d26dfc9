// plumbing: no published source needed
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;

class LoopYamlReaderTest {

    private static List<LoopRow> read(String yaml) {
        List<LoopRow> rows = new ArrayList<>();
        try (LoopYamlReader r = LoopYamlReader.of(yaml, "loops.yaml", LoopDefaults.NONE)) {
            r.forEachRemaining(rows::add);
        }
        return rows;
    }

    private static String loop(int k) {
        return "  - tag: TIC-" + k + "\n"
                + "    tuning: {form: ideal, kc: 1.2, ti: 60, td: 4}\n"
                + "    target: {form: ideal-pb-repeats, scan: 0.5 s}\n";
    }

    @Test
    void a_list_of_a_hundred_thousand_loops_reads_past_snakeyamls_default_limit() {
        StringBuilder sb = new StringBuilder("loops:\n");
        for (int k = 0; k < 100_000; k++) {
            sb.append(loop(k));
        }
        // SnakeYAML's default limit is 3 Mi code points; this list is more than twice that
        assertThat(sb.length()).isGreaterThan(7_000_000);
        int[] count = {0};
        try (LoopYamlReader r = LoopYamlReader.of(sb.toString(), "loops.yaml", LoopDefaults.NONE)) {
            r.forEachRemaining(row -> {
                assertThat(row.ok()).isTrue();
                count[0]++;
            });
        }
        assertThat(count[0]).isEqualTo(100_000);
    }

    @Test
    void a_block_with_a_repeated_key_or_tag_is_a_bad_row_and_the_next_block_is_read() {
        List<LoopRow> rows = read("loops:\n" + loop(1)
                + "  - tag: TIC-2\n    tuning: {form: ideal, kc: 1.2, kc: 2, ti: 60, td: 4}\n"
                + "    target: {form: ideal}\n" + loop(1) + loop(3));
        assertThat(rows).hasSize(4);
        assertThat(rows.get(1).problems()).singleElement().asString().startsWith("loops.yaml:6: tuning.kc: duplicate key");
        assertThat(rows.get(2).problems()).singleElement().asString().contains("duplicate tag TIC-1")
                .contains("first at loops.yaml:2");
        assertThat(rows.get(3).ok()).isTrue();
    }

    @Test
    void an_alias_bomb_stops_at_the_alias_limit() {
        StringBuilder sb = new StringBuilder("loops:\n  - tag: A\n    a: &a [x, x, x, x, x, x, x, x, x]\n");
        for (char c = 'b'; c < 'k'; c++) {
            char p = (char) (c - 1);
            sb.append("    ").append(c).append(": &").append(c).append(" [*").append(p).append(", *").append(p)
                    .append(", *").append(p).append(", *").append(p).append(", *").append(p).append(", *").append(p)
                    .append("]\n");
        }
        assertThatThrownBy(() -> read(sb.toString())).isInstanceOf(InputException.class)
                .hasMessageStartingWith("loops.yaml: more than 20 aliases");
    }

    @Test
    void deep_nesting_stops_at_the_nesting_limit_without_a_stack_overflow() {
        assertThatThrownBy(() -> read("loops:\n  - " + "[".repeat(100_000) + "\n"))
                .isInstanceOf(InputException.class).hasMessageContaining("nested more than 50 levels");
    }

    @Test
    void a_second_document_an_unknown_key_and_loops_that_are_not_a_list_are_file_errors() {
        assertThatThrownBy(() -> read("loops:\n" + loop(1) + "---\nloops: []\n"))
                .hasMessageStartingWith("loops.yaml:5: a second YAML document");
        assertThatThrownBy(() -> read("loops:\n" + loop(1) + "colour: red\n"))
                .hasMessageStartingWith("loops.yaml:5: colour: unknown key");
        assertThatThrownBy(() -> read("loops: 3\n")).hasMessageStartingWith("loops.yaml:1: loops: expected a list");
        assertThatThrownBy(() -> read("")).hasMessageStartingWith("loops.yaml:1: the file is empty");
    }

    @Test
    void an_alias_to_an_anchor_in_an_earlier_block_is_explained() {
        assertThatThrownBy(() -> read("loops:\n  - tag: A\n    tuning: &t {form: ideal, kc: 1, ti: 60, td: 0}\n"
                + "    target: {form: ideal}\n  - tag: B\n    tuning: *t\n    target: {form: ideal}\n"))
                .isInstanceOf(InputException.class).hasMessageContaining("loops.yaml:6")
                .hasMessageContaining("same loop block");
    }

    @Test
    void a_single_loop_block_is_a_list_of_one() {
        List<LoopRow> rows = read("tag: A\ntuning: {form: ideal, kc: 1, ti: 60, td: 0}\ntarget: {form: ideal}\n");
        assertThat(rows).singleElement().satisfies(r -> assertThat(r.ok()).isTrue());
    }
}

// plumbing: no published source needed (source: none)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;

/** A YAML loop list read from a file a block at a time: rows in order, bytes counted once, bad blocks as rows. */
class LoopListFileTest {

    private static String block(String tag) {
        return "  - tag: " + tag + "\n    tuning: {form: ideal, kc: 1, ti: 60, td: 0}\n    target: {form: ideal}\n";
    }

    @Test
    void rows_come_in_file_order_and_every_byte_is_counted(@TempDir Path dir) throws IOException {
        String text = "loops:\n" + block("A") + block("B") + "  - {tag: C}\n" + block("A");
        Path f = dir.resolve("l.yaml");
        Files.writeString(f, text);
        List<LoopRow> rows;
        try (LoopYamlReader r = LoopYamlReader.open(f, "l.yaml", LoopDefaults.NONE)) {
            assertThat(r.bytesRead()).isGreaterThanOrEqualTo(0);
            rows = new java.util.ArrayList<>();
            r.forEachRemaining(rows::add);
            assertThat(r.bytesRead()).isEqualTo(text.getBytes(StandardCharsets.UTF_8).length);
        }
        assertThat(rows).extracting(LoopRow::index).containsExactly(0, 1, 2, 3);
        assertThat(rows.get(0).loop().tag()).isEqualTo("A");
        assertThat(rows.get(1).loop().tag()).isEqualTo("B");
        assertThat(rows.get(2).loop()).isNull();
        assertThat(rows.get(2).tag()).isEqualTo("C");
        assertThat(rows.get(2).problems()).singleElement().asString().contains("tuning: required");
        assertThat(rows.get(3).problems()).singleElement().asString()
                .contains("tag: duplicate tag A (first at l.yaml:2)");
        assertThat(LoopFileReader.rows(f, "l.yaml", LoopDefaults.NONE)).hasSize(4);
        assertThat(LoopYamlReader.of("loops: []\n", "x.yaml", LoopDefaults.NONE).bytesRead()).isEqualTo(-1);
    }

    @Test
    void a_missing_file_is_named_and_a_file_level_problem_stops_the_reading(@TempDir Path dir) throws IOException {
        assertThatThrownBy(() -> LoopYamlReader.open(dir.resolve("none.yaml"), "none.yaml", LoopDefaults.NONE))
                .hasMessage("none.yaml: no such file; check the path");
        Path f = dir.resolve("k.yaml");
        Files.writeString(f, "loops: []\nextra: 1\n");
        assertThatThrownBy(() -> LoopFileReader.rows(f, "k.yaml", LoopDefaults.NONE)).hasMessageContaining("extra: unknown key");
    }
}

// plumbing: no published source needed (source: none)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;
import org.loopform.form.Catalog;

/** Loop lists read from files: bytes counted once, broken quotes located, a default target for blocks without one. */
class LoopCsvFileTest {

    private static List<LoopRow> all(java.util.Iterator<LoopRow> r) {
        List<LoopRow> rows = new ArrayList<>();
        r.forEachRemaining(rows::add);
        return rows;
    }

    @Test
    void a_csv_file_is_read_and_its_bytes_counted(@TempDir Path dir) throws IOException {
        String text = "tag,form,kc,ti,td,target_form\nA,ideal,1,60,0,ideal\nB,ideal,2,60,0,ideal\n";
        Path f = dir.resolve("l.csv");
        Files.writeString(f, text);
        try (LoopCsvReader r = LoopCsvReader.open(f, "l.csv", LoopDefaults.NONE)) {
            assertThat(all(r)).extracting(LoopRow::tag).containsExactly("A", "B");
            assertThat(r.bytesRead()).isEqualTo(text.getBytes(StandardCharsets.UTF_8).length);
        }
        assertThatThrownBy(() -> LoopCsvReader.open(dir.resolve("none.csv"), "none.csv", LoopDefaults.NONE))
                .hasMessage("none.csv: no such file; check the path");
    }

    @Test
    void an_unclosed_quote_and_text_after_a_closing_quote_are_located() {
        assertThatThrownBy(() -> all(LoopCsvReader.of(new StringReader("tag,form,kc\n\"A,ideal,1\nB,ideal,2\n"),
                "l.csv", null, LoopDefaults.NONE))).hasMessageContaining("a quote (\") opens a cell on this line and is never closed");
        assertThatThrownBy(() -> all(LoopCsvReader.of(new StringReader("tag,form,kc\n\"A\"x,ideal,1\n"),
                "l.csv", null, LoopDefaults.NONE))).hasMessageContaining("l.csv:2: text follows a closing quote");
    }

    @Test
    void a_yaml_block_without_a_target_takes_the_default_target() {
        Catalog c = CatalogLoader.bundled();
        LoopDefaults d = new LoopDefaults(c.find("ideal-pb-repeats").orElseThrow(), 0.5);
        List<LoopRow> rows = all(LoopYamlReader.of("loops:\n  - tag: A\n    tuning: {form: ideal, kc: 1, ti: 60, td: 0}\n",
                "l.yaml", d));
        assertThat(rows).singleElement().satisfies(r -> {
            assertThat(r.problems()).isEmpty();
            assertThat(r.loop().targetForm().id()).isEqualTo("ideal-pb-repeats");
        });
        // without a default a target is required
        assertThat(all(LoopYamlReader.of("loops:\n  - tag: A\n    tuning: {form: ideal, kc: 1, ti: 60, td: 0}\n",
                "l.yaml", LoopDefaults.NONE)).get(0).problems()).singleElement().asString().contains("target: required");
    }
}

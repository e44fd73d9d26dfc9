package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The invented example workbook {@code examples/plant-k7-loops.xlsx} audits as its CSV does: the same
 * loops with the same verdicts, findings and entered values (plumbing: the two readers against each other).
 */
class ExampleWorkbookAuditTest {

    @Test
    void the_workbook_and_the_csv_give_the_same_loops(@TempDir Path dir) throws Exception {
        CliRun x = CliRun.of("audit", "examples/plant-k7-loops.xlsx", "--to", "examples/plant-k7-target.yaml",
                "--out", dir.resolve("x").toString());
        CliRun c = CliRun.of("audit", "examples/plant-k7-loops.csv", "--to", "examples/plant-k7-target.yaml",
                "--out", dir.resolve("c").toString());
        assertThat(x.exitCode()).as(x.err()).isEqualTo(1);
        assertThat(c.exitCode()).as(c.err()).isEqualTo(1);
        assertThat(x.err()).contains("reading sheet 'Loops' (1 of 1), header in row 3");
        JsonNode fromXlsx = new ObjectMapper().readTree(dir.resolve("x/loops.json").toFile()).get("loops");
        JsonNode fromCsv = new ObjectMapper().readTree(dir.resolve("c/loops.json").toFile()).get("loops");
        assertThat(fromXlsx).hasSize(33).hasSameSizeAs(fromCsv);
        for (int k = 0; k < fromCsv.size(); k++) {
            String tag = fromCsv.get(k).get("tag").asText();
            assertThat(fromXlsx.get(k).get("tag").asText()).isEqualTo(tag);
            for (String key : new String[] {"verdict", "findings", "parameters", "design", "target"}) {
                assertThat(fromCsv.get(k).has(key)).as(tag + " " + key).isTrue();
                assertThat(fromXlsx.get(k).get(key)).as(tag + " " + key).isEqualTo(fromCsv.get(k).get(key));
            }
        }
    }
}

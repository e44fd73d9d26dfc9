package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;

/**
 * The committed {@code examples/plant-k7-loops.xlsx} is what {@link ExampleWorkbook} writes from
 * {@code examples/plant-k7-loops.csv}, byte for byte, and it holds the same loops (plumbing: no
 * published source needed). With {@code -Dloopform.writeExamples=true} the test writes the file first.
 */
class ExampleWorkbookTest {

    @TempDir
    Path dir;

    @Test
    void the_committed_workbook_is_the_generators_output_byte_for_byte() throws Exception {
        if (Boolean.getBoolean("loopform.writeExamples")) {
            ExampleWorkbook.write(ExampleWorkbook.CSV, ExampleWorkbook.XLSX);
        }
        Path first = dir.resolve("first.xlsx");
        Path second = dir.resolve("second.xlsx");
        ExampleWorkbook.write(ExampleWorkbook.CSV, first);
        Thread.sleep(1100); // a clock that leaked into the file would now read another second
        ExampleWorkbook.write(ExampleWorkbook.CSV, second);
        assertThat(Files.readAllBytes(second)).isEqualTo(Files.readAllBytes(first));
        assertThat(Files.readAllBytes(ExampleWorkbook.XLSX)).as("regenerate it: see ExampleWorkbook")
                .isEqualTo(Files.readAllBytes(first));
    }

    @Test
    void the_workbook_holds_the_csvs_loops_under_its_invented_title() throws Exception {
        LoopDefaults target = new LoopDefaults(CatalogLoader.resolve("examples/plant-k7-target.yaml", "--to"), null);
        List<LoopRow> fromCsv = new ArrayList<>();
        try (LoopCsvReader r = LoopCsvReader.open(ExampleWorkbook.CSV, "csv", target)) {
            r.forEachRemaining(fromCsv::add);
        }
        List<LoopRow> fromXlsx = new ArrayList<>();
        try (LoopXlsxReader r = LoopXlsxReader.open(ExampleWorkbook.XLSX, "xlsx", null, target)) {
            assertThat(r.sheetName()).isEqualTo("Loops");
            r.forEachRemaining(fromXlsx::add);
        }
        assertThat(fromXlsx).hasSize(33).hasSameSizeAs(fromCsv);
        for (int k = 0; k < fromCsv.size(); k++) {
            LoopRow c = fromCsv.get(k);
            LoopRow x = fromXlsx.get(k);
            assertThat(x.tag()).isEqualTo(c.tag());
            assertThat(x.ok()).as(x.tag() + " " + x.problems()).isTrue();
            assertThat(c.ok()).as(c.tag() + " " + c.problems()).isTrue();
            // a number cell reads back as the number (0.1 for a typed 0.10), text as the text
            assertThat(numbers(x.loop().tuning())).as(x.tag()).isEqualTo(numbers(c.loop().tuning()));
            assertThat(x.loop().process()).as(x.tag()).isEqualTo(c.loop().process());
            assertThat(x.loop().pvRange()).as(x.tag()).isEqualTo(c.loop().pvRange());
            assertThat(x.loop().targetScanSeconds()).as(x.tag()).isEqualTo(c.loop().targetScanSeconds());
            assertThat(x.where()).startsWith("xlsx:Loops!A" + (k + 4));
        }
    }

    @Test
    void the_demo_jar_packs_the_csv_list_and_not_the_workbook() {
        // pom.xml packs the demo's examples by name; the workbook is for the README's command only
        assertThat(Path.of("target/classes/examples/plant-k7-loops.csv")).exists();
        assertThat(Path.of("target/classes/examples/plant-k7-loops.xlsx")).doesNotExist();
    }

    private static java.util.Map<String, Object> numbers(java.util.Map<String, String> tuning) {
        java.util.Map<String, Object> m = new java.util.TreeMap<>();
        tuning.forEach((k, v) -> {
            try {
                m.put(k, Double.parseDouble(v));
            } catch (NumberFormatException e) {
                m.put(k, v);
            }
        });
        return m;
    }
}

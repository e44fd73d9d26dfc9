// source: the invented records examples/records/generate.py (numpy, independent of loopform) wrote from known controllers
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.io.XlsxTestFiles;

/**
 * {@code replay RECORDS --list LIST.xlsx [--sheet S]}: an xlsx loop list read by the reader audit uses,
 * on the invented records of {@code examples/records/generate.py} (FIC-105's reset really ran at 15 s,
 * the draft list says 15 min; PIC-401 and TIC-301 as listed).
 */
class ReplayXlsxListTest {

    @TempDir
    Path dir;

    static final String DRAFT = "examples/records/replay-loops.csv";
    static final String RECORDS = "examples/records/replay";
    static final String TARGET = "examples/plant-k7-target.yaml";

    /** The draft list on a sheet named Loops, under a title row, after a first sheet of notes. */
    private Path workbook(String csv) throws Exception {
        return XlsxTestFiles.write(dir.resolve("draft.xlsx"), wb -> {
            wb.newWorksheet("Notes").value(0, 0, "invented list for a test");
            var ws = wb.newWorksheet("Loops");
            ws.value(0, 0, "Draft migration list (invented)");
            XlsxTestFiles.csvRows(ws, 2, csv);
        });
    }

    @Test
    void an_xlsx_list_replays_as_its_csv_does() throws Exception {
        Path xlsx = workbook(Files.readString(Path.of(DRAFT)));
        CliRun fromXlsx = CliRun.of("replay", RECORDS, "--list", xlsx.toString(), "--sheet", "Loops", "--to", TARGET,
                "--format", "json");
        CliRun fromCsv = CliRun.of("replay", RECORDS, "--list", DRAFT, "--to", TARGET, "--format", "json");
        assertThat(fromXlsx.exitCode()).as(fromXlsx.err()).isEqualTo(1);
        assertThat(fromCsv.exitCode()).as(fromCsv.err()).isEqualTo(1);
        JsonNode x = new ObjectMapper().readTree(fromXlsx.out());
        JsonNode c = new ObjectMapper().readTree(fromCsv.out());
        assertThat(x).isEqualTo(c);
        assertThat(fromXlsx.out()).contains("ti is 15 s, not min");
    }

    @Test
    void the_sheet_is_found_by_its_header_when_not_named() throws Exception {
        Path xlsx = workbook(Files.readString(Path.of(DRAFT)));
        CliRun r = CliRun.of("replay", RECORDS, "--list", xlsx.toString(), "--to", TARGET);
        assertThat(r.exitCode()).as(r.err()).isEqualTo(1);
        assertThat(r.out()).contains("FIC-105").contains("TIC-301");
        assertThat(r.err()).contains("reading sheet 'Loops' (2 of 2), header in row 3");
    }

    @Test
    void a_bad_cell_is_named_by_file_sheet_and_cell_with_exit_2() throws Exception {
        // plumbing: TIC-301's pb made negative (placed at the pb cell, column C); its row is the sixth of the sheet
        // (title, blank, header, two loops)
        Path xlsx = workbook(Files.readString(Path.of(DRAFT)).replace("series-pb-min,60,", "series-pb-min,-60,"));
        CliRun r = CliRun.of("replay", RECORDS, "--list", xlsx.toString(), "--to", TARGET);
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err()).contains(xlsx + ":Loops!C6: loop TIC-301: tuning: pb: ");
    }

    @Test
    void a_missing_sheet_is_bad_input_and_nothing_is_written() throws Exception {
        Path xlsx = workbook(Files.readString(Path.of(DRAFT)));
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("replay", RECORDS, "--list", xlsx.toString(), "--sheet", "Plant", "--to", TARGET,
                "--out", out.toString());
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err()).contains("Plant");
        assertThat(out).doesNotExist();
    }

    @Test
    void sheet_with_a_csv_list_or_with_one_loop_is_bad_input() throws Exception {
        CliRun csv = CliRun.of("replay", RECORDS, "--list", DRAFT, "--sheet", "Loops");
        assertThat(csv.exitCode()).isEqualTo(2);
        assertThat(csv.err()).contains("--sheet: applies to an .xlsx loop list only");
        CliRun one = CliRun.of("replay", RECORDS + "/TIC-301.csv", "--loop", "examples/loops/tic-104.yaml", "--sheet",
                "1");
        assertThat(one.exitCode()).isEqualTo(2);
        assertThat(one.err()).contains("--sheet: applies to an .xlsx loop list given with --list");
    }
}

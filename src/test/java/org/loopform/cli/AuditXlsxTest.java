// plumbing: no published source needed (the same list read from a workbook and from CSV must give the same
// audit; exit codes and messages). SHA-256 of the workbook is checked against the JDK's MessageDigest.
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.math.BigDecimal;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.io.XlsxTestFiles;

class AuditXlsxTest {

    @TempDir
    Path dir;

    private static final String TARGET = "examples/plant-k7-target.yaml";

    /**
     * The example list as a person holds it in a spreadsheet: the same cells, numbers as number cells.
     * Its CSV twin is what the spreadsheet shows in its General format: the number without trailing
     * zeros (0.10 is 0.1), as a spreadsheet program exports it.
     */
    private static String exampleAsTyped() throws Exception {
        List<String> lines = new ArrayList<>();
        for (String line : Files.readAllLines(Path.of("examples/plant-k7-loops.csv"))) {
            List<String> cells = new ArrayList<>();
            for (String v : line.split(",", -1)) {
                cells.add(v.matches("[-+]?\\d+(\\.\\d+)?") ? new BigDecimal(v).stripTrailingZeros().toPlainString()
                        : v);
            }
            lines.add(String.join(",", cells));
        }
        return String.join("\n", lines) + "\n";
    }

    @Test
    @DisplayName("an audit of the list in a workbook writes the same loops.csv as the same list in CSV")
    void the_same_list_as_xlsx_and_as_csv_gives_the_same_loops_csv() throws Exception {
        String csv = exampleAsTyped();
        Path csvList = Files.writeString(dir.resolve("list.csv"), csv);
        Path xlsxList = XlsxTestFiles.write(dir.resolve("list.xlsx"), "Loops", ws -> XlsxTestFiles.csvRows(ws, 0,
                csv.strip()));
        CliRun a = CliRun.of("audit", csvList.toString(), "--to", TARGET, "--out", dir.resolve("a").toString());
        CliRun b = CliRun.of("audit", xlsxList.toString(), "--to", TARGET, "--out", dir.resolve("b").toString());
        assertThat(a.exitCode()).as(a.err()).isEqualTo(1); // some example loops fail on purpose
        assertThat(b.exitCode()).as(b.err()).isEqualTo(a.exitCode());
        assertThat(b.err()).contains("loopform: " + xlsxList + ": reading sheet 'Loops' (1 of 1), header in row 1");
        String fromCsv = Files.readString(dir.resolve("a/loops.csv"));
        String fromXlsx = Files.readString(dir.resolve("b/loops.csv"));
        // the one column that differs is where each loop was read: row n of the sheet is line n of the file
        Matcher m = Pattern.compile(Pattern.quote(xlsxList.toString()) + ":Loops!A(\\d+)").matcher(fromXlsx);
        String mapped = m.replaceAll(r -> Matcher.quoteReplacement(csvList + ":" + r.group(1)));
        assertThat(m.reset().results().count()).isEqualTo(csv.strip().split("\n").length - 1);
        assertThat(mapped).isEqualTo(fromCsv);
        assertThat(Files.readString(dir.resolve("b/entry-sheet.csv")))
                .isEqualTo(Files.readString(dir.resolve("a/entry-sheet.csv")));
    }

    @Test
    void the_workbook_is_fingerprinted_in_the_provenance() throws Exception {
        Path list = XlsxTestFiles.write(dir.resolve("list.xlsx"), "Loops", ws -> XlsxTestFiles.csvRows(ws, 0,
                "tag,form,kc,ti,td,scan,target_form\nFIC-1,ideal,0.5,10,0,1 s,ideal"));
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("audit", list.toString(), "--out", out.toString());
        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        JsonNode p = new ObjectMapper().readTree(out.resolve("loops.json").toFile()).get("provenance");
        JsonNode first = p.get("inputs").get(0);
        assertThat(first.get("role").asText()).isEqualTo("loop list");
        assertThat(first.get("file").asText()).isEqualTo(list.toString());
        assertThat(first.get("sha256").asText()).isEqualTo(HexFormat.of().formatHex(MessageDigest
                .getInstance("SHA-256").digest(Files.readAllBytes(list))));
        assertThat(p.get("settings").asText()).endsWith(", sheet Loops");
    }

    @Test
    void bad_cells_are_bad_rows_reported_as_for_csv_and_the_others_are_checked() throws Exception {
        Path list = XlsxTestFiles.write(dir.resolve("list.xlsx"), "Loops", ws -> {
            ws.value(0, 0, "Unit 100 (invented)");
            XlsxTestFiles.csvRows(ws, 2, "tag,form,kc,ti,td,scan,target_form\nFIC-1,ideal,0.5,10,0,1 s,ideal\n"
                    + "FIC-2,ideal,,10,0,1 s,ideal");
            ws.value(4, 2, Boolean.TRUE);
        });
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("audit", list.toString(), "--out", out.toString());
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err()).contains(list + ":Loops!C5: kc: the cell holds TRUE, not a number");
        assertThat(Files.readString(out.resolve("loops.csv"))).contains("FIC-1").contains(list + ":Loops!C5: kc:");
    }

    @Test
    void a_csv_named_xlsx_and_an_xlsx_named_csv_exit_2_saying_what_they_are() throws Exception {
        Path text = Files.writeString(dir.resolve("list.xlsx"), "tag,form\n");
        CliRun r = CliRun.of("audit", text.toString(), "--to", "ideal");
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err()).contains("is text, not an xlsx workbook").doesNotContain("at org.");
        Path book = XlsxTestFiles.write(dir.resolve("book.xlsx"), "Loops", ws -> ws.value(0, 0, "tag"));
        Path named = Files.move(book, dir.resolve("book.csv"));
        CliRun c = CliRun.of("audit", named.toString(), "--to", "ideal");
        assertThat(c.exitCode()).isEqualTo(2);
        assertThat(c.err()).contains("is a zip archive, such as an xlsx workbook, not a CSV file");
    }

    @Test
    void sheet_is_refused_for_a_csv_list() throws Exception {
        Path list = Files.writeString(dir.resolve("list.csv"), "tag,form\n");
        CliRun r = CliRun.of("audit", list.toString(), "--sheet", "Loops", "--to", "ideal");
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err()).contains("--sheet: applies to an .xlsx loop list only");
    }
}

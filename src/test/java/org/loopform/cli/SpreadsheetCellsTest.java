// source: OWASP, "CSV Injection" guidance (cells beginning with =, +, -, @ neutralised); otherwise plumbing
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.report.AuditRows;

/**
 * CSV files meant for spreadsheets carry no formulas: a cell beginning with = + - @ tab or CR gets a
 * leading single quote (OWASP, "CSV Injection", owasp.org/www-community/attacks/CSV_Injection),
 * while plain numbers keep their sign.
 */
@DisplayName("CSV outputs for spreadsheets")
class SpreadsheetCellsTest {

    @TempDir
    Path dir;

    @Test
    void a_formula_in_a_tag_reaches_the_entry_sheet_and_loops_csv_as_text() throws Exception {
        Path list = Files.writeString(dir.resolve("loops.csv"), """
                tag,form,kc,ti,td
                "=HYPERLINK(""http://example.invalid"",""open"")",ideal,0.5,10,0
                @SUM(A1),ideal,0.5,10,0
                +TIC-3,ideal,0.5,10,0
                -TIC-4,ideal,0.5,10,0
                """);
        Path out = dir.resolve("out");

        CliRun r = CliRun.of("audit", list.toString(), "--to", "ideal", "--scan", "1s", "--no-report", "--out",
                out.toString());

        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        String sheet = Files.readString(out.resolve("entry-sheet.csv"));
        String loops = Files.readString(out.resolve("loops.csv"));
        for (String csv : new String[] {sheet, loops}) {
            assertThat(csv).contains("\"'=HYPERLINK(\"\"http://example.invalid\"\",\"\"open\"\")\"")
                    .contains("'@SUM(A1)").contains("'+TIC-3").contains("'-TIC-4");
            assertThat(csv.lines().skip(1)).noneMatch(line -> line.matches("^\"?[=+\\-@].*"));
        }
    }

    @ParameterizedTest(name = "{0} -> {1}")
    @CsvSource(delimiter = '|', quoteCharacter = '`', value = {
        "-1.5|-1.5",
        "+2e-3|+2e-3",
        "0.25|0.25",
        "-.5|-.5",
        "-1.5+cmd|'-1.5+cmd",
        "=1+1|'=1+1",
        "@A1|'@A1",
        "-|'-",
        "TIC-104|TIC-104",
        "`\tx`|`'\tx`",
        "`\rx`|`'\rx`"})
    void neutralises_formula_starts_and_keeps_numbers(String cell, String expected) {
        assertThat(AuditRows.spreadsheetCell(cell)).isEqualTo(expected);
    }
}

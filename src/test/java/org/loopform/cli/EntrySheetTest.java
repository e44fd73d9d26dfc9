package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.zip.ZipEntry;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The entry sheet for the commissioning team: old and new values with units, flags, blank columns to fill. */
class EntrySheetTest {

    @TempDir
    Path dir;

    private Path audit() throws Exception {
        Path list = Files.writeString(dir.resolve("loops.csv"), "tag,form,kc,ti,td\nFIC-1,ideal,0.5,10 s,0\n");
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("audit", list.toString(), "--to", "ideal-pb-repeats", "--scan", "0.5s", "--out",
                out.toString());
        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        return out;
    }

    @Test
    void each_new_value_stands_beside_the_old_one_it_replaces_with_both_units() throws Exception {
        List<String> lines = Files.readAllLines(audit().resolve("entry-sheet.csv"));
        assertThat(lines.get(0)).isEqualTo("tag,target_form,parameter,value,unit,verdict,note,old_form,old_parameter,"
                + "old_value,old_unit,do_not_enter,as_left,entered_by,entered_on");
        // kc 0.5 -> pb 200 %, ti 10 s -> reset 6 repeats/min (pb = 100/kc, reset = 1/ti: common practice)
        assertThat(lines).anySatisfy(l -> assertThat(l).startsWith("FIC-1,ideal-pb-repeats,pb,200,%,")
                .endsWith(",ideal,kc,0.5,%/%,,,,"));
        assertThat(lines).anySatisfy(l -> assertThat(l).startsWith("FIC-1,ideal-pb-repeats,reset,6,repeats/min,")
                .endsWith(",ideal,ti,10,s,,,,"));
    }

    @Test
    void the_workbook_holds_numbers_as_numbers_no_formulas_and_prints_its_header_on_every_page() throws Exception {
        Path xlsx = audit().resolve("entry-sheet.xlsx");
        String sheet = entry(xlsx, "xl/worksheets/sheet1.xml");
        String workbook = entry(xlsx, "xl/workbook.xml");
        // SpreadsheetML (ECMA-376 Part 1, 18.3.1.4): a number cell has type n (or none) and its value in <v>
        assertThat(sheet).containsPattern("<c r=\"D2\"( s=\"\\d+\")?( t=\"n\")?><v>200(\\.0)?</v></c>")
                .containsPattern("<c r=\"J2\"( s=\"\\d+\")?( t=\"n\")?><v>0\\.5</v></c>");
        assertThat(sheet).doesNotContain("<f>").contains("orientation=\"landscape\"");
        assertThat(workbook).contains("_xlnm.Print_Titles");
    }

    private static String entry(Path zip, String name) throws Exception {
        // the central directory, as a spreadsheet reads it (entries are streamed with data descriptors)
        try (java.util.zip.ZipFile z = new java.util.zip.ZipFile(zip.toFile())) {
            ZipEntry e = z.getEntry(name);
            assertThat(e).as(name + " in " + zip).isNotNull();
            try (InputStream in = z.getInputStream(e)) {
                return new String(in.readAllBytes(), StandardCharsets.UTF_8);
            }
        }
    }
}

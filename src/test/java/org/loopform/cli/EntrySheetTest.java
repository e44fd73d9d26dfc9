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

    /**
     * Invented loops, as in examples/plant-k7-loops.csv: TIC-312 is positive feedback (a reverse-acting
     * controller on a process of gain -0.9, unstable: see report/UnstableLoopFiguresTest for the hand
     * derivation), PIC-405's pb 3 % is kc 33.3 (pb = 100/kc, common practice), above the maximum 20
     * the target form file accepts, and FIC-1 is an ordinary loop.
     */
    private Path auditWithFailingLoops() throws Exception {
        Path list = Files.writeString(dir.resolve("loops.csv"), String.join("\n",
                "tag,form,pb,ti,td,action,scan,pv_range,output_range,model,process_gain,time_constant,dead_time",
                "FIC-1,series-pb-min,180,0.12,0,,1 s,0..100,0..100,fopdt,0.8,20 s,3 s",
                "PIC-405,series-pb-min,3,0.4,0,,1 s,0..25,0..100,fopdt,0.05,15 s,1 s",
                "TIC-312,series-pb-min,60,3,0.25,reverse,1 s,0..100,0..100,fopdt,-0.9,150 s,12 s", ""));
        Path out = dir.resolve("out-fail");
        CliRun r = CliRun.of("audit", list.toString(), "--to", "examples/plant-k7-target.yaml", "--out", out.toString());
        assertThat(r.exitCode()).as(r.err()).isEqualTo(1);
        return out;
    }

    private static List<org.apache.commons.csv.CSVRecord> rows(Path csv, String tag) throws Exception {
        try (var p = org.apache.commons.csv.CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true).build()
                .parse(Files.newBufferedReader(csv))) {
            return p.getRecords().stream().filter(x -> x.get("tag").equals(tag)).toList();
        }
    }

    @Test
    void every_row_of_a_failing_loop_says_do_not_enter_and_why() throws Exception {
        Path out = auditWithFailingLoops();
        List<org.apache.commons.csv.CSVRecord> tic = rows(out.resolve("entry-sheet.csv"), "TIC-312");
        // kc, ti, td and the action: all four are flagged, none is left to be typed in unflagged
        assertThat(tic).hasSize(4).allSatisfy(x -> {
            assertThat(x.get("verdict")).isEqualTo("fail");
            assertThat(x.get("do_not_enter")).isEqualTo("yes");
            assertThat(x.get("note")).startsWith("loop fails: stability - ").contains("unstable")
                    .endsWith("do not enter until resolved");
        });
        assertThat(tic).anySatisfy(x -> assertThat(x.get("parameter")).isEqualTo("action"));
    }

    @Test
    void a_row_flagged_for_its_own_reason_keeps_it_and_the_loops_other_rows_are_flagged_too() throws Exception {
        List<org.apache.commons.csv.CSVRecord> pic = rows(auditWithFailingLoops().resolve("entry-sheet.csv"),
                "PIC-405");
        assertThat(pic).hasSize(4).allSatisfy(x -> assertThat(x.get("do_not_enter")).isEqualTo("yes"));
        assertThat(pic).filteredOn(x -> x.get("parameter").equals("kc")).singleElement().satisfies(x -> {
            assertThat(x.get("value")).isEmpty();
            assertThat(x.get("note")).startsWith("do not enter: above the maximum 20");
        });
        assertThat(pic).filteredOn(x -> !x.get("parameter").equals("kc"))
                .allSatisfy(x -> assertThat(x.get("note")).startsWith("loop fails: limits - "));
    }

    @Test
    void a_loop_that_does_not_fail_carries_no_flag_and_the_workbook_carries_the_same_notes() throws Exception {
        Path out = auditWithFailingLoops();
        List<org.apache.commons.csv.CSVRecord> fic = rows(out.resolve("entry-sheet.csv"), "FIC-1");
        assertThat(fic).isNotEmpty().allSatisfy(x -> {
            assertThat(x.get("verdict")).isNotEqualTo("fail");
            assertThat(x.get("do_not_enter")).isEmpty();
        });
        String xlsx = entry(out.resolve("entry-sheet.xlsx"), "xl/sharedStrings.xml")
                + entry(out.resolve("entry-sheet.xlsx"), "xl/worksheets/sheet1.xml");
        assertThat(xlsx).contains("loop fails: stability - ").contains("loop fails: limits - ");
    }

    @Test
    void the_workbook_shades_the_rows_not_to_be_entered_and_only_those() throws Exception {
        Path xlsx = auditWithFailingLoops().resolve("entry-sheet.xlsx");
        String styles = entry(xlsx, "xl/styles.xml");
        String sheet = entry(xlsx, "xl/worksheets/sheet1.xml");
        // SpreadsheetML (ECMA-376 Part 1, 18.8.20 fill, 18.8.45 xf): a cell's s attribute picks an xf, whose
        // fillId picks a fill; the shade is the one fill with the light red colour
        assertThat(styles).containsIgnoringCase("FFC7CE");
        List<String> xfs = java.util.regex.Pattern.compile("<xf [^>]*>").matcher(
                styles.substring(styles.indexOf("<cellXfs"))).results().map(java.util.regex.MatchResult::group).toList();
        List<String> fills = java.util.regex.Pattern.compile("<fill>.*?</fill>").matcher(styles).results()
                .map(java.util.regex.MatchResult::group).toList();
        java.util.function.Predicate<String> shaded = row -> {
            java.util.regex.Matcher m = java.util.regex.Pattern.compile(" s=\"(\\d+)\"").matcher(row);
            while (m.find()) {
                java.util.regex.Matcher f = java.util.regex.Pattern.compile("fillId=\"(\\d+)\"")
                        .matcher(xfs.get(Integer.parseInt(m.group(1))));
                if (f.find() && fills.get(Integer.parseInt(f.group(1))).toUpperCase().contains("FFC7CE")) {
                    return true;
                }
            }
            return false;
        };
        List<String> rows = java.util.regex.Pattern.compile("<row .*?</row>").matcher(sheet).results()
                .map(java.util.regex.MatchResult::group).toList();
        // header, 4 rows of FIC-1 (kc, ti, td, action), then PIC-405 and TIC-312's 4 rows each, all flagged
        List<org.apache.commons.csv.CSVRecord> csv = new java.util.ArrayList<>();
        for (String tag : List.of("FIC-1", "PIC-405", "TIC-312")) {
            csv.addAll(rows(xlsx.resolveSibling("entry-sheet.csv"), tag));
        }
        assertThat(rows).hasSize(csv.size() + 1);
        assertThat(shaded.test(rows.get(0))).isFalse();
        for (int i = 0; i < csv.size(); i++) {
            assertThat(shaded.test(rows.get(i + 1))).as(csv.get(i).toString())
                    .isEqualTo(csv.get(i).get("do_not_enter").equals("yes"));
        }
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

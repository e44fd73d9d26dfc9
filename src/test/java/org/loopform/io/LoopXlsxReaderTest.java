// plumbing: no published source needed (reading cells, positions and messages); the facts of the file
// format each test relies on are named beside it (ECMA-376, Open Packaging Conventions, [MS-CFB])
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.math.BigDecimal;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.List;
import org.dhatim.fastexcel.VisibilityState;
import org.dhatim.fastexcel.Worksheet;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;

class LoopXlsxReaderTest {

    @TempDir
    Path dir;

    private static final String HEADER = "tag,form,kc,ti,td,scan,target_form";

    private List<LoopRow> read(Path file, String sheet) {
        List<LoopRow> rows = new ArrayList<>();
        try (LoopXlsxReader r = LoopXlsxReader.open(file, "loops.xlsx", sheet, LoopDefaults.NONE)) {
            r.forEachRemaining(rows::add);
        }
        return rows;
    }

    private Path book(java.util.function.Consumer<Worksheet> fill) throws IOException {
        return XlsxTestFiles.write(dir.resolve("loops.xlsx"), "Loops", fill);
    }

    /** A loop row of FIC-1 on row 2 under the header, with {@code kc} set by {@code kc}. */
    private Path withKc(java.util.function.Consumer<Worksheet> kc) throws IOException {
        return book(ws -> {
            XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1,ideal,,60,0,1 s,ideal-min");
            kc.accept(ws);
        });
    }

    @Nested
    @DisplayName("cells are read as a CSV list would hold them")
    class Cells {

        @Test
        void numbers_keep_their_decimal_value_and_text_cells_carry_units() throws IOException {
            List<LoopRow> rows = read(book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER
                    + "\nFIC-1,ideal,0.1,60,0,250 ms,ideal-min")), null);
            assertThat(rows).singleElement().satisfies(r -> {
                assertThat(r.problems()).isEmpty();
                assertThat(r.loop().tuning()).containsEntry("kc", "0.1").containsEntry("ti", "60")
                        .containsEntry("td", "0");
                assertThat(r.loop().sourceScanSeconds()).isEqualTo(0.25);
                assertThat(r.where()).isEqualTo("loops.xlsx:Loops!A2");
            });
        }

        // The fewest digits that give back the same binary64 number: 0.1 and the 17-digit 0.10000000000000001
        // are one double (IEEE 754 round to nearest; Java's Double.parseDouble is correctly rounded), 1.0E-5
        // is 0.00001, and 0.30000000000000004 (0.1 + 0.2) is a different double from 0.3, so it keeps its digits.
        @ParameterizedTest
        @CsvSource({"0.1,0.1", "0.10000000000000001,0.1", "1.0E-5,0.00001", "2.0,2", "1500,1500",
                "0.30000000000000004,0.30000000000000004", "-0,0"})
        void stored_numbers_are_written_with_the_fewest_digits_that_keep_their_value(String stored, String text) {
            assertThat(XlsxCell.plain(new BigDecimal(stored))).isEqualTo(text);
            assertThat(Double.parseDouble(text)).isEqualTo(new BigDecimal(stored).doubleValue());
        }

        @Test
        void a_number_format_that_hides_digits_does_not_change_the_value_read() throws IOException {
            List<LoopRow> rows = read(withKc(ws -> {
                ws.value(1, 2, 1.25);
                ws.style(1, 2).format("0.0").set(); // shows 1.3
            }), null);
            assertThat(rows.get(0).loop().tuning()).containsEntry("kc", "1.25");
        }

        @Test
        void a_formula_is_read_by_its_stored_result() throws IOException {
            Path f = withKc(ws -> ws.formula(1, 2, "D2/50"));
            // the writer stores no result; a spreadsheet program that calculates stores <v> after <f>
            XlsxTestFiles.editSheet(f, xml -> xml.replace("<f>D2/50</f>", "<f>D2/50</f><v>1.2</v>"));
            assertThat(read(f, null).get(0).loop().tuning()).containsEntry("kc", "1.2");
        }

        @Test
        void a_formula_without_a_stored_result_is_a_bad_row_naming_the_cell_and_the_formula() throws IOException {
            LoopRow r = read(withKc(ws -> ws.formula(1, 2, "D2/50")), null).get(0);
            assertThat(r.ok()).isFalse();
            assertThat(r.problems()).singleElement().asString().startsWith("loops.xlsx:Loops!C2: kc: the formula"
                    + " =D2/50 has no stored result").contains("recalculate and save");
        }

        @Test
        void a_formula_whose_result_is_an_error_is_a_bad_row() throws IOException {
            Path f = withKc(ws -> ws.formula(1, 2, "D2/0"));
            XlsxTestFiles.editSheet(f, xml -> xml.replace("<c r=\"C2\"", "<c r=\"C2\" t=\"e\"")
                    .replace("<f>D2/0</f>", "<f>D2/0</f><v>#DIV/0!</v>"));
            assertThat(read(f, null).get(0).problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!C2: kc: the formula =D2/0 gives the error #DIV/0!");
        }

        @Test
        void a_date_where_a_number_is_expected_is_a_bad_row() throws IOException {
            LoopRow r = read(withKc(ws -> {
                ws.value(1, 2, LocalDate.of(2024, 3, 1));
                ws.style(1, 2).format("yyyy-mm-dd").set();
            }), null).get(0);
            assertThat(r.problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!C2: kc: the cell holds a date or time");
        }

        @Test
        void true_or_false_where_a_number_is_expected_is_a_bad_row() throws IOException {
            LoopRow r = read(withKc(ws -> ws.value(1, 2, Boolean.TRUE)), null).get(0);
            assertThat(r.problems()).singleElement().asString()
                    .isEqualTo("loops.xlsx:Loops!C2: kc: the cell holds TRUE, not a number; type the value, or clear"
                            + " the cell");
        }

        @Test
        void a_number_formatted_as_a_percentage_is_a_bad_row_that_shows_both_readings() throws IOException {
            LoopRow r = read(book(ws -> {
                XlsxTestFiles.csvRows(ws, 0, "tag,form,pb,ti,td,target_form\nFIC-1,series-pb-min,,2,0,ideal");
                ws.value(1, 2, 1.5);
                ws.style(1, 2).format("0%").set();
            }), null).get(0);
            assertThat(r.problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!C2: pb: the cell is formatted as a percentage: it shows 150% but"
                            + " holds 1.5");
        }

        // A number format shows text beside the number: quoted ("..."), escaped (\\x) or bare letters, while
        // the cell stores the number alone (ECMA-376 Part 1, 18.8.31 numFmts; from memory). 15 shown as
        // '15 s' in a ti column read in min/repeat would be a reset 60 times too slow: refused.
        @ParameterizedTest
        @CsvSource(delimiter = '|', value = {"0\" s\"|15 s", "0.0\" s\"|15.0 s", "0\\ \\s|15 s",
                "[$s-409]0|s15", "0.0\"%\"|15.0%"})
        void a_number_whose_format_shows_a_unit_is_a_bad_row_that_says_what_it_shows(String format, String shows)
                throws IOException {
            Path f = book(ws -> {
                XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1,ideal,1,,0,1 s,ideal-min");
                ws.value(1, 3, 15);
                ws.style(1, 3).format("0.000").set();
            });
            // the writer does not escape a quote in a format code: the format is put into styles.xml by hand
            XlsxTestFiles.editPart(f, "xl/styles.xml", xml -> xml.replace("formatCode=\"0.000\"",
                    "formatCode=\"" + format.replace("&", "&amp;").replace("\"", "&quot;") + "\""));
            LoopRow r = read(f, null).get(0);
            assertThat(r.ok()).isFalse();
            assertThat(r.problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!D2: ti: the cell shows '" + shows + "' through its number format")
                    .contains("but stores 15; loopform reads only what is stored");
        }

        @ParameterizedTest
        @CsvSource(delimiter = '|', value = {"General", "0.00", "#,##0.00_);[Red](#,##0.00)", "0.00E+00", "# ?/?",
                "[Blue]0.0;[Red]-0.0", "0.0_ ", "[>100]0;0.0"})
        void a_number_format_that_shows_only_the_number_is_read(String format) throws IOException {
            LoopRow r = read(book(ws -> {
                XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1,ideal,1,,0,1 s,ideal-min");
                ws.value(1, 3, 15);
                ws.style(1, 3).format(format).set();
            }), null).get(0);
            assertThat(r.problems()).isEmpty();
            assertThat(r.loop().tuning()).containsEntry("ti", "15");
        }

        @Test
        void a_bad_value_says_what_csv_says_at_the_cell() throws IOException {
            LoopRow r = read(book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1,ideal,1,60,0,0 s,ideal-min")),
                    null).get(0);
            assertThat(r.problems()).singleElement().asString()
                    .isEqualTo("loops.xlsx:Loops!F2: scan: a duration must be > 0 s (got '0 s')");
        }

        @Test
        void a_parameter_the_check_cannot_read_is_placed_at_its_own_cell() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1,ideal,1,60,0,1 s,ideal-min\n"
                    + "FIC-2,ideal,abc,60,0,1 s,ideal-min\nFIC-3,ideal,1,5 kg,0,1 s,ideal-min"));
            List<org.loopform.audit.LoopOutcome> out = new ArrayList<>();
            try (LoopXlsxReader r = LoopXlsxReader.open(f, "loops.xlsx", null, LoopDefaults.NONE)) {
                org.loopform.audit.Audit.run(r, org.loopform.findings.CheckPolicy.DEFAULT, 1, out::add);
            }
            assertThat(out).hasSize(3);
            assertThat(out.get(1).problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!C3: loop FIC-2: tuning: kc: ");
            assertThat(out.get(2).problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!D4: loop FIC-3: tuning: ti: ");
        }

        @Test
        void a_repeated_tag_names_the_first_cell() throws IOException {
            List<LoopRow> rows = read(book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER
                    + "\nFIC-1,ideal,1,60,0,1 s,ideal-min\nFIC-1,ideal,1,60,0,1 s,ideal-min")), null);
            assertThat(rows.get(1).problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!A3: tag: duplicate tag FIC-1 (first at loops.xlsx:Loops!A2)");
        }
    }

    @Nested
    @DisplayName("odd but legal or damaged sheet XML is named at its cell")
    class SheetXml {

        /** The cell C2 as the writer puts it. */
        private static final String C2 = "<c r=\"C2\"[^>]*><v>[^<]*</v></c>";

        /** FIC-1 on row 2 with kc = 1 in C2 (a number cell, t="n"), its sheet XML then edited by {@code edit}. */
        private Path edited(java.util.function.UnaryOperator<String> edit) throws IOException {
            Path f = withKc(ws -> ws.value(1, 2, 1));
            XlsxTestFiles.editSheet(f, edit);
            return f;
        }

        // A cell is written once: ECMA-376 Part 1, 18.3.1.4 c (one cell per reference in a row; from memory).
        @Test
        void a_cell_written_twice_in_a_row_is_a_bad_row_naming_it() throws IOException {
            LoopRow r = read(edited(xml -> xml.replaceFirst(C2,
                    "<c r=\"C2\" t=\"n\"><v>1</v></c><c r=\"C2\" t=\"n\"><v>10</v></c>")), null).get(0);
            assertThat(r.problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!C2: kc: the cell C2 is written twice in the sheet's file");
        }

        @ParameterizedTest
        @CsvSource({"abc", "NaN"})
        void a_number_cell_that_stores_no_number_says_so_rather_than_an_error_value(String stored) throws IOException {
            LoopRow r = read(edited(xml -> xml.replaceFirst(C2, "<c r=\"C2\" t=\"n\"><v>" + stored + "</v></c>")), null).get(0);
            assertThat(r.problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!C2: kc: the cell stores '" + stored + "', which is not what its type"
                            + " says it holds").doesNotContain("error");
        }

        // A shared-string cell (t="s") stores an index into the workbook's shared strings, from 0
        // (ECMA-376 Part 1, 18.4.9 sst; from memory).
        @Test
        void a_shared_string_index_past_the_last_string_is_a_bad_row_naming_the_damaged_cell() throws IOException {
            Path f = edited(xml -> xml.replaceFirst("<c r=\"A2\" t=\"s\"><v>\\d+</v>",
                    "<c r=\"A2\" t=\"s\"><v>999</v>"));
            LoopRow r = read(f, null).get(0);
            assertThat(r.problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!A2: tag: the cell names shared string 999, but the workbook has")
                    .contains("damaged at this cell");
        }

        // A row without r is numbered one after the row before it (ECMA-376 Part 1, 18.3.1.73 row; from memory).
        @Test
        void a_row_written_without_its_number_is_placed_after_the_row_before_it() throws IOException {
            Path f = book(ws -> {
                XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1,ideal,1,60,0,1 s,ideal-min");
                XlsxTestFiles.csvRows(ws, 4, "FIC-2,ideal,1,60,0,1 s,ideal-min\nFIC-3,ideal,1,60,0,1 s,ideal-min");
            });
            XlsxTestFiles.editSheet(f, xml -> xml.replace("<row r=\"6\"", "<row").replaceAll(" r=\"[A-Z]+6\"", ""));
            assertThat(read(f, null)).extracting(LoopRow::where)
                    .containsExactly("loops.xlsx:Loops!A2", "loops.xlsx:Loops!A5", "loops.xlsx:Loops!A6");
        }

        // t="d": a date as ISO 8601 text (ECMA-376 Part 1, 18.18.11 ST_CellType; from memory).
        @Test
        void a_date_cell_written_as_iso_text_stops_the_sheet_naming_the_cell() throws IOException {
            Path f = edited(xml -> xml.replaceFirst(C2,
                    "<c r=\"C2\" t=\"d\"><v>2024-03-01</v></c>"));
            assertThatThrownBy(() -> read(f, null)).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.xlsx:Loops!C2: the cell holds a date written as text");
        }
    }

    @Nested
    @DisplayName("the header and the rows around it")
    class Layout {

        @Test
        void title_rows_above_the_header_empty_rows_and_merged_title_rows_are_skipped() throws IOException {
            List<LoopRow> rows = read(book(ws -> {
                ws.value(0, 0, "Unit 100 loop list (invented example)");
                ws.value(1, 0, "Revision A");
                XlsxTestFiles.csvRows(ws, 3, HEADER + "\nFIC-1,ideal,1,60,0,1 s,ideal-min");
                ws.value(5, 0, "Boilers");
                ws.range(5, 0, 5, 6).merge();
                XlsxTestFiles.csvRows(ws, 7, "FIC-2,ideal,2,60,0,1 s,ideal-min");
            }), null);
            assertThat(rows).extracting(LoopRow::where).containsExactly("loops.xlsx:Loops!A5", "loops.xlsx:Loops!A8");
            assertThat(rows).allMatch(LoopRow::ok);
        }

        // A merged range stores its value in its top-left cell only; the other cells of the range are
        // empty in the file (ECMA-376 Part 1, 18.3.1.55 mergeCell; from memory).
        @Test
        void a_cell_merged_down_several_loop_rows_makes_each_of_them_a_bad_row_naming_the_range() throws IOException {
            List<LoopRow> rows = read(book(ws -> {
                XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1,ideal,1,60,0,1 s,ideal-min\nFIC-2,,2,60,0,1 s,"
                        + "ideal-min\nFIC-3,,3,60,0,1 s,ideal-min\nFIC-4,ideal,4,60,0,1 s,ideal-min");
                ws.range(1, 1, 3, 1).merge();
            }), null);
            assertThat(rows).hasSize(4);
            for (int k = 0; k < 3; k++) {
                assertThat(rows.get(k).ok()).isFalse();
                assertThat(rows.get(k).problems()).singleElement().asString().isEqualTo("loops.xlsx:Loops!B" + (k + 2)
                        + ": form: B2:B4 is merged (its value is stored in B2 alone); unmerge it and fill each row");
            }
            assertThat(rows.get(3).ok()).isTrue();
        }

        @Test
        void cells_merged_across_a_loop_row_make_it_a_bad_row() throws IOException {
            List<LoopRow> rows = read(book(ws -> {
                XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1,ideal,1,60,,1 s,ideal-min");
                ws.range(1, 3, 1, 4).merge();
            }), null);
            assertThat(rows).singleElement().satisfies(r -> assertThat(r.problems()).singleElement().asString()
                    .isEqualTo("loops.xlsx:Loops!D2: ti: D2:E2 is merged (its value is stored in D2 alone); unmerge"
                            + " it and fill each cell"));
        }

        @Test
        void a_lone_text_cell_that_is_not_merged_is_a_bad_row_not_a_skipped_one() throws IOException {
            List<LoopRow> rows = read(book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1")), null);
            assertThat(rows).singleElement().satisfies(r -> assertThat(r.problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!B2: form: required"));
        }

        @Test
        void a_value_right_of_the_header_is_a_bad_row() throws IOException {
            List<LoopRow> rows = read(book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER
                    + "\nFIC-1,ideal,1,60,0,1 s,ideal-min,stray")), null);
            assertThat(rows.get(0).problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!H2: column H has no name in the header");
        }

        @Test
        void a_list_of_new_loops_with_a_rule_column_and_no_form_column_is_found_and_read() throws IOException {
            // the first row of examples/new-loops.csv (invented), as a sheet under a title row
            List<LoopRow> rows = read(book(ws -> {
                ws.value(0, 0, "New loops (invented example)");
                XlsxTestFiles.csvRows(ws, 1, "tag,rule,controller,model,process_gain,time_constant,dead_time,"
                        + "pv_range,output_range,target_scan,target_form\nTIC-104,simc,pi,fopdt,1.998,59.71 s,10.27 s,"
                        + "0..150,0..100,0.5 s,ideal");
            }), null);
            assertThat(rows).singleElement().satisfies(r -> {
                assertThat(r.problems()).isEmpty();
                assertThat(r.where()).isEqualTo("loops.xlsx:Loops!A3");
                assertThat(r.ruleTuning()).isNotNull();
            });
        }

        @Test
        void an_unknown_column_stops_the_file_at_the_header_cell() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 1, "tag,form,gain\nFIC-1,ideal,1"));
            assertThatThrownBy(() -> read(f, null)).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.xlsx:Loops!C2: gain: unknown column");
        }

        @Test
        void the_first_visible_sheet_with_a_header_is_read_and_named() throws IOException {
            Path f = XlsxTestFiles.write(dir.resolve("loops.xlsx"), wb -> {
                wb.newWorksheet("Cover").value(0, 0, "Loop list, unit 100 (invented)");
                Worksheet hidden = wb.newWorksheet("Old");
                XlsxTestFiles.csvRows(hidden, 0, HEADER + "\nOLD-1,ideal,1,60,0,1 s,ideal-min");
                hidden.setVisibilityState(VisibilityState.HIDDEN);
                XlsxTestFiles.csvRows(wb.newWorksheet("Loop list"), 0, HEADER + "\nFIC-1,ideal,1,60,0,1 s,ideal-min");
            });
            try (LoopXlsxReader r = LoopXlsxReader.open(f, "loops.xlsx", null, LoopDefaults.NONE)) {
                assertThat(r.description()).isEqualTo("sheet 'Loop list' (3 of 3), header in row 1");
                assertThat(r.next().where()).isEqualTo("loops.xlsx:'Loop list'!A2");
            }
            assertThat(read(f, "Old")).extracting(LoopRow::tag).containsExactly("OLD-1");
            assertThat(read(f, "2")).extracting(LoopRow::tag).containsExactly("OLD-1");
        }

        @Test
        void a_sheet_that_does_not_exist_lists_the_sheets() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER));
            assertThatThrownBy(() -> read(f, "Plant")).isInstanceOf(InputException.class)
                    .hasMessage("loops.xlsx: --sheet Plant: no such sheet; the workbook's sheets are 'Loops' (give a"
                            + " name, or a number from 1 to 1)");
        }

        @Test
        void a_workbook_without_a_loop_list_says_what_to_do() throws IOException {
            Path f = book(ws -> ws.value(0, 0, "notes"));
            assertThatThrownBy(() -> read(f, null)).isInstanceOf(InputException.class)
                    .hasMessageContaining("no visible sheet has a loop-list header").hasMessageContaining("'Loops'");
            assertThatThrownBy(() -> read(f, "Loops")).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.xlsx:Loops: no header row with the columns tag and form");
        }
    }

    @Nested
    @DisplayName("files that are no xlsx workbook stop at once")
    class Files_ {

        private void refused(byte[] bytes, String fragment) throws IOException {
            Path f = Files.write(dir.resolve("loops.xlsx"), bytes);
            assertThatThrownBy(() -> read(f, null)).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.xlsx: ").hasMessageContaining(fragment);
        }

        @Test
        void csv_text_named_xlsx() throws IOException {
            refused("tag,form\nFIC-1,ideal\n".getBytes(), "is text, not an xlsx workbook");
        }

        @Test
        void an_empty_file() throws IOException {
            refused(new byte[0], "the file is empty");
        }

        // [MS-CFB] 2.2: a compound file starts with D0 CF 11 E0 A1 B1 1A E1; an encrypted OOXML file is such
        // a file with a stream named EncryptedPackage ([MS-OFFCRYPTO] 2.3.4.4), written as UTF-16LE in its directory.
        @Test
        void an_old_xls_workbook() throws IOException {
            refused(ole2(""), "Excel 97-2003 workbook (.xls)");
        }

        // ECMA-376 Part 1, 18.2.19: a sheet element's name attribute is required. Fuzzing found a workbook
        // part whose sheet lacked it (the reader then stopped on a null name); it is a damaged workbook.
        @Test
        void a_sheet_without_a_name_in_the_workbook_part() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1,ideal,1,60,0,1 s,ideal-min"));
            XlsxTestFiles.editPart(f, "xl/workbook.xml", xml -> xml.replace("name=\"Loops\"", ""));
            assertThatThrownBy(() -> read(f, null)).isInstanceOf(InputException.class)
                    .hasMessage("loops.xlsx: sheet 1 of 1 has no name in the workbook; the workbook is damaged: open it"
                            + " in a spreadsheet program and save it again, or save the sheet as CSV");
        }

        @Test
        void a_workbook_protected_by_a_password() throws IOException {
            refused(ole2("EncryptedPackage"), "protected by a password");
        }

        @Test
        void a_zip_that_is_no_workbook() throws IOException {
            Path f = dir.resolve("loops.xlsx");
            try (var z = new java.util.zip.ZipOutputStream(Files.newOutputStream(f))) {
                z.putNextEntry(new java.util.zip.ZipEntry("readme.txt"));
                z.write("not a workbook".getBytes());
            }
            assertThatThrownBy(() -> read(f, null)).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.xlsx: not a valid xlsx workbook");
        }

        @Test
        void a_truncated_workbook() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1,ideal,1,60,0,1 s,ideal-min"));
            byte[] all = Files.readAllBytes(f);
            refused(java.util.Arrays.copyOf(all, all.length / 2), "");
        }

        // XFD is column 16,384, the last a sheet can have (common practice for xlsx): 24*26^0 + 6*26 + 4*26^2 = 16,384
        @ParameterizedTest
        @CsvSource({"XFD1,false", "xfd7,false", "$A$1,false", "XFE1,true", "AAAA1,true", "ZZZZZZ9,true"})
        void a_column_past_xfd_is_beyond_the_sheet(String ref, boolean beyond) {
            assertThat(XlsxMerges.beyondLastColumn(ref)).isEqualTo(beyond);
        }

        @Test
        void a_cell_beyond_the_last_column_stops_the_file_before_any_row_is_read() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER + "\nFIC-1,ideal,1,60,0,1 s,ideal-min"));
            XlsxTestFiles.editSheet(f, xml -> xml.replace("r=\"G2\"", "r=\"AAAAA2\""));
            assertThatThrownBy(() -> read(f, null)).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.xlsx:Loops: a cell is placed at AAAAA2, beyond column XFD");
        }

        private byte[] ole2(String stream) {
            byte[] b = new byte[1024];
            byte[] magic = {(byte) 0xD0, (byte) 0xCF, 0x11, (byte) 0xE0, (byte) 0xA1, (byte) 0xB1, 0x1A, (byte) 0xE1};
            System.arraycopy(magic, 0, b, 0, magic.length);
            byte[] name = stream.getBytes(java.nio.charset.StandardCharsets.UTF_16LE);
            System.arraycopy(name, 0, b, 600, name.length);
            return b;
        }

        @Test
        void an_xlsx_named_csv_is_refused_by_the_csv_reader() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER));
            Path csv = Files.move(f, dir.resolve("loops.csv"));
            assertThatThrownBy(() -> LoopCsvReader.open(csv, "loops.csv", LoopDefaults.NONE).close())
                    .isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.csv: is a zip archive, such as an xlsx workbook, not a CSV file");
        }
    }
}

// source: the test workbooks themselves (each expected cell, row, sheet and message part is what the test wrote), README "Loop lists" (the header within a sheet's first 100 rows; --sheet by name or by number from 1) and ECMA-376 Part 1, 18.3.1 (sheetData, row, c, mergeCell; from memory)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
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

/** Which sheet and which header row an xlsx loop list is read from, what a damaged sheet says, and what is closed. */
class LoopXlsxSheetsTest {

    private static final String HEADER = "tag,form,kc,ti,td,scan,target_form";
    private static final String LOOP = "FIC-1,ideal,1,60,0,1 s,ideal-min";

    @TempDir
    Path dir;

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

    /** Sheets Cover (a title only), Old (hidden, loop OLD-1) and 'Loop list' (loop FIC-1), in that order. */
    private Path threeSheets() throws IOException {
        return XlsxTestFiles.write(dir.resolve("loops.xlsx"), wb -> {
            wb.newWorksheet("Cover").value(0, 0, "Loop list, unit 100 (invented)");
            Worksheet hidden = wb.newWorksheet("Old");
            XlsxTestFiles.csvRows(hidden, 0, HEADER + "\nOLD-1,ideal,1,60,0,1 s,ideal-min");
            hidden.setVisibilityState(VisibilityState.HIDDEN);
            XlsxTestFiles.csvRows(wb.newWorksheet("Loop list"), 0, HEADER + "\n" + LOOP);
        });
    }

    @Nested
    @DisplayName("the header row")
    class HeaderRow {

        // README: the header is the first row, within the sheet's first 100, naming tag and form
        @Test
        void a_header_in_row_100_is_found() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 99, HEADER + "\n" + LOOP));
            assertThat(read(f, null)).extracting(LoopRow::where).containsExactly("loops.xlsx:Loops!A101");
        }

        @Test
        void a_header_in_row_101_is_not_looked_for() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 100, HEADER + "\n" + LOOP));
            assertThatThrownBy(() -> read(f, null)).isInstanceOf(InputException.class)
                    .hasMessageContaining("no visible sheet has a loop-list header");
        }

        @Test
        void a_row_naming_the_tag_column_alone_is_not_the_header() throws IOException {
            Path f = book(ws -> {
                ws.value(0, 0, "tag");
                XlsxTestFiles.csvRows(ws, 1, HEADER + "\n" + LOOP);
            });
            assertThat(read(f, null)).singleElement().satisfies(r -> {
                assertThat(r.problems()).isEmpty();
                assertThat(r.where()).isEqualTo("loops.xlsx:Loops!A3");
            });
        }

        @Test
        void blank_header_cells_after_the_last_name_leave_the_columns_as_they_are() throws IOException {
            Path f = book(ws -> {
                XlsxTestFiles.csvRows(ws, 0, HEADER + "\n" + LOOP + "\nFIC-2,ideal,1,60,0,1 s,ideal-min,stray");
                ws.value(0, 7, "   ");
                ws.value(0, 8, "");
            });
            List<LoopRow> rows = read(f, null);
            assertThat(rows.get(0).problems()).isEmpty();
            assertThat(rows.get(1).problems()).singleElement().asString()
                    .startsWith("loops.xlsx:Loops!H3: column H has no name in the header");
        }

        @Test
        void rows_are_numbered_from_0_in_the_order_read() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER + "\n" + LOOP
                    + "\nFIC-2,ideal,1,60,0,1 s,ideal-min\nFIC-3,ideal,1,60,0,1 s,ideal-min"));
            assertThat(read(f, null)).extracting(LoopRow::index).containsExactly(0, 1, 2);
        }

        @Test
        void cells_merged_right_of_the_header_on_a_loop_row_are_named_by_their_column_letter() throws IOException {
            Path f = book(ws -> {
                XlsxTestFiles.csvRows(ws, 0, HEADER + "\n" + LOOP);
                ws.value(1, 7, "note");
                ws.range(1, 7, 1, 8).merge();
            });
            assertThat(read(f, null).get(0).problems())
                    .contains("loops.xlsx:Loops!H2: column H: H2:I2 is merged (its value is stored in H2 alone);"
                            + " unmerge it and fill each cell");
        }
    }

    @Nested
    @DisplayName("the sheet chosen")
    class SheetChoice {

        @Test
        void a_name_in_another_case_chooses_the_sheet() throws IOException {
            assertThat(read(threeSheets(), "LOOP LIST")).extracting(LoopRow::tag).containsExactly("FIC-1");
        }

        @Test
        void the_last_number_chooses_the_last_sheet() throws IOException {
            assertThat(read(threeSheets(), "3")).extracting(LoopRow::tag).containsExactly("FIC-1");
        }

        @ParameterizedTest
        @CsvSource({"0", "4"})
        void a_number_outside_1_to_the_sheet_count_is_no_sheet(String number) throws IOException {
            Path f = threeSheets();
            assertThatThrownBy(() -> read(f, number)).isInstanceOf(InputException.class)
                    .hasMessage("loops.xlsx: --sheet " + number + ": no such sheet; the workbook's sheets are 'Cover',"
                            + " 'Old', 'Loop list' (give a name, or a number from 1 to 3)");
        }

        @Test
        void a_chosen_sheet_without_a_header_names_the_other_sheets() throws IOException {
            Path f = threeSheets();
            assertThatThrownBy(() -> read(f, "Cover")).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.xlsx:Cover: no header row with the columns tag and form")
                    .hasMessageEndingWith(", or choose another sheet with --sheet (sheets: 'Cover', 'Old', 'Loop list')");
        }

        @Test
        void the_only_sheet_without_a_header_does_not_offer_another() throws IOException {
            Path f = book(ws -> ws.value(0, 0, "notes"));
            assertThatThrownBy(() -> read(f, "1")).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.xlsx:Loops: no header row").hasMessageNotContaining("--sheet");
        }
    }

    @Nested
    @DisplayName("a file that is not there, and a sheet whose XML breaks")
    class Damage {

        @Test
        void a_missing_file_and_a_folder_are_named_as_such() {
            assertThatThrownBy(() -> read(dir.resolve("none.xlsx"), null)).isInstanceOf(InputException.class)
                    .hasMessage("loops.xlsx: no such file; check the path");
            assertThatThrownBy(() -> read(dir, null)).isInstanceOf(InputException.class)
                    .hasMessage("loops.xlsx: is a folder, not a file; give the path of the file itself");
        }

        // XML 1.0, 2.1: an element's end tag must match its start tag; a row's XML that breaks this is not
        // well-formed, so the sheet cannot be read past the rows before it
        @Test
        void xml_that_breaks_after_row_2_is_reported_after_row_2() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER + "\n" + LOOP));
            XlsxTestFiles.editSheet(f, xml -> xml.replace("</sheetData>", "<row r=\"3\"><c r=\"A3\"></row></sheetData>"));
            List<LoopRow> rows = new ArrayList<>();
            assertThatThrownBy(() -> {
                try (LoopXlsxReader r = LoopXlsxReader.open(f, "loops.xlsx", null, LoopDefaults.NONE)) {
                    r.forEachRemaining(rows::add);
                }
            }).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.xlsx:Loops: the sheet cannot be read after row 2 (")
                    .hasMessageEndingWith("); the workbook may be damaged: open it in a spreadsheet program and save it"
                            + " again, or save the sheet as CSV");
            assertThat(rows).extracting(LoopRow::tag).containsExactly("FIC-1");
        }

        @Test
        void xml_that_breaks_in_the_first_row_names_no_row() throws IOException {
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER + "\n" + LOOP));
            XlsxTestFiles.editSheet(f, xml -> xml.replaceFirst("(<row r=\"1\"[^>]*>)", "$1<x>"));
            assertThatThrownBy(() -> read(f, null)).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.xlsx:Loops: the sheet cannot be read (")
                    .hasMessageNotContaining("after row");
        }
    }

    @Nested
    @DisplayName("the reason quoted from a failure")
    class Reason {

        @Test
        void a_wrapper_of_an_io_failure_gives_the_failure_s_message() {
            assertThat(LoopXlsxReader.reason(new UncheckedIOException(new IOException("disk gone")))).isEqualTo("disk gone");
        }

        @Test
        void a_failure_without_a_message_gives_its_cause_s_or_else_its_kind() {
            assertThat(LoopXlsxReader.reason(new RuntimeException((String) null, new IOException("zip ended"))))
                    .isEqualTo("zip ended");
            assertThat(LoopXlsxReader.reason(new IllegalStateException())).isEqualTo("IllegalStateException");
        }

        @Test
        void a_failure_with_its_own_message_gives_that_message_not_its_cause_s() {
            assertThat(LoopXlsxReader.reason(new RuntimeException("bad row", new IOException("inner"))))
                    .isEqualTo("bad row");
        }

        @Test
        void the_message_is_put_on_one_line_and_cut_after_160_characters() {
            assertThat(LoopXlsxReader.reason(new RuntimeException("  two\n  lines\t here "))).isEqualTo("two lines here");
            String exactly160 = "x".repeat(160);
            assertThat(LoopXlsxReader.reason(new RuntimeException(exactly160))).isEqualTo(exactly160);
            assertThat(LoopXlsxReader.reason(new RuntimeException(exactly160 + "y"))).isEqualTo(exactly160 + "...");
        }
    }

    @Nested
    @DisplayName("the workbook file is let go")
    class Closing {

        @Test
        void closing_the_reader_closes_the_file() throws IOException {
            assumeTrue(OpenFiles.countable(), "this system lists open descriptors in /proc/self/fd");
            Path f = book(ws -> XlsxTestFiles.csvRows(ws, 0, HEADER + "\n" + LOOP));
            LoopXlsxReader r = LoopXlsxReader.open(f, "loops.xlsx", null, LoopDefaults.NONE);
            assertThat(OpenFiles.on(f)).isPositive();
            r.close();
            assertThat(OpenFiles.on(f)).isZero();
        }

        @Test
        void a_workbook_refused_for_want_of_a_header_is_closed() throws IOException {
            assumeTrue(OpenFiles.countable(), "this system lists open descriptors in /proc/self/fd");
            Path f = book(ws -> ws.value(0, 0, "notes"));
            assertThatThrownBy(() -> LoopXlsxReader.open(f, "loops.xlsx", null, LoopDefaults.NONE))
                    .isInstanceOf(InputException.class);
            assertThat(OpenFiles.on(f)).isZero();
            assertThat(Files.exists(f)).isTrue();
        }
    }
}

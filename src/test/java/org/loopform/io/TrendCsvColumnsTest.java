// source: the test records themselves (each expected time, count, mode and message part is read off the rows the test writes), RFC 4180 section 2 (header, records, fields), RFC 3339 section 5.6 / ISO 8601 (a time with Z or an offset from UTC), the spellings of the mode and tracking columns as TrendCsvReader's Javadoc lists them, and common practice for a loop released from output tracking resuming automatic control
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.replay.Mode;
import org.loopform.replay.Trend;
import org.loopform.units.BadInput;

/** A logged record's header, rows, times, tracking column and limits on what it must hold. */
class TrendCsvColumnsTest {

    private static final String HEADER = "time,setpoint,pv,output\n";

    @TempDir
    Path dir;

    private static Trend parse(String text) {
        return TrendCsvReader.parse(text, "t.csv", TrendColumns.DEFAULT);
    }

    @Nested
    @DisplayName("the file and its lines")
    class Lines {

        @Test
        void a_file_with_a_byte_order_mark_and_a_blank_line_is_read_row_by_row() throws IOException {
            Path f = dir.resolve("t.csv");
            Files.write(f, ("\uFEFF" + HEADER + "0,40,41,50\n\n2,42,43,52\n").getBytes(StandardCharsets.UTF_8));
            Trend t = TrendCsvReader.read(f, "t.csv", TrendColumns.DEFAULT);
            assertThat(t.pv().size()).isEqualTo(2);
            assertThat(t.pv().timeSeconds(1)).isEqualTo(2.0);
            assertThat(t.pv().value(1)).isEqualTo(43.0);
            assertThat(t.setpoint().value(0)).isEqualTo(40.0);
        }

        @Test
        void a_time_repeated_on_the_next_row_is_refused() {
            assertThatThrownBy(() -> parse(HEADER + "0,40,40,50\n1,40,40,50\n1,40,40,50\n"))
                    .isInstanceOf(InputException.class)
                    .hasMessage("t.csv:4: time: times must increase (got 1 after the row above); sort the record by"
                            + " time and drop repeated rows");
        }

        // RFC 3339, 5.6: 08:00:00+01:00 is 07:00:00Z, so a row at 07:00:30Z is 30 s later
        @Test
        void timestamps_with_offsets_are_taken_to_utc() {
            Trend t = parse(HEADER + "2024-03-01T08:00:00+01:00,40,40,50\n2024-03-01T07:00:30Z,40,40,50\n");
            assertThat(t.pv().timeSeconds(1)).isCloseTo(30.0, within(1e-9));
            assertThat(t.origin()).hasToString("2024-03-01T07:00");
        }
    }

    @Nested
    @DisplayName("the header")
    class Header {

        @Test
        void a_column_named_twice_is_refused_naming_both_places() {
            assertThatThrownBy(() -> parse("time,setpoint,pv,output,PV\n0,40,40,50,1\n1,40,40,50,1\n"))
                    .isInstanceOf(InputException.class)
                    .hasMessage("t.csv:1: PV: columns 3 and 5 have the same name; rename one of them");
        }

        @Test
        void two_columns_without_a_name_are_allowed_and_counted_as_cells() {
            Trend t = parse("time,setpoint,pv,output,,\n0,40,40,50,,\n1,41,41,51,,\n");
            assertThat(t.output().size()).isEqualTo(2);
        }

        @Test
        void a_row_with_another_number_of_cells_is_refused_with_both_counts() {
            assertThatThrownBy(() -> parse("time,setpoint,pv,output,,\n0,40,40,50\n1,41,41,51,,\n"))
                    .isInstanceOf(InputException.class)
                    .hasMessageStartingWith("t.csv:2: the row has 4 cells, the header 6;");
        }

        @ParameterizedTest
        @CsvSource({"time,'setpoint,pv,output',--time", "setpoint,'time,pv,output',--setpoint",
                "pv,'time,setpoint,output',--pv", "output,'time,setpoint,pv',--output"})
        void each_required_column_missing_is_named_with_its_option(String missing, String header, String option) {
            assertThatThrownBy(() -> parse(header + "\n0,40,40\n1,40,40\n")).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("t.csv:1: " + missing + ": no such column")
                    .hasMessageEndingWith("; name the column with " + option + " NAME");
        }

        @Test
        void a_missing_column_names_the_columns_there_are_and_the_option() {
            assertThatThrownBy(() -> parse("time,setpoint,pv\n0,40,40\n1,40,40\n"))
                    .isInstanceOf(InputException.class)
                    .hasMessage("t.csv:1: output: no such column (the header has pv, setpoint, time); name the column"
                            + " with --output NAME");
        }
    }

    @Nested
    @DisplayName("the tracking column")
    class Tracking {

        @Test
        void tracking_overrides_the_mode_and_ends_in_automatic_unless_a_mode_is_given() {
            Trend t = parse("time,setpoint,pv,output,mode,tracking\n0,40,40,50,manual,0\n1,40,40,50,,1\n"
                    + "2,40,40,50,,0\n3,40,40,50,,\n4,40,40,50,man,\n");
            assertThat(t.mode().at(0.5)).isEqualTo(Mode.MANUAL);
            assertThat(t.mode().at(1.5)).isEqualTo(Mode.TRACKING);
            assertThat(t.mode().at(2.5)).isEqualTo(Mode.AUTOMATIC);
            assertThat(t.mode().at(3.5)).isEqualTo(Mode.AUTOMATIC);
            assertThat(t.mode().at(4.5)).isEqualTo(Mode.MANUAL);
        }

        @ParameterizedTest
        @CsvSource({"1,TRACKING", "on,TRACKING", "TRUE,TRACKING", "yes,TRACKING", "0,AUTOMATIC", "off,AUTOMATIC",
                "false,AUTOMATIC", "No,AUTOMATIC"})
        void tracking_is_read_in_its_usual_spellings(String cell, Mode mode) {
            Trend t = parse("time,setpoint,pv,output,tracking\n0,40,40,50," + cell + "\n1,40,40,50," + cell + "\n");
            assertThat(t.mode().at(0.5)).isEqualTo(mode);
        }

        @Test
        void another_tracking_value_is_refused_with_its_line() {
            assertThatThrownBy(() -> parse("time,setpoint,pv,output,tracking\n0,40,40,50,0\n1,40,40,50,maybe\n"))
                    .isInstanceOf(InputException.class)
                    .hasMessage("t.csv:3: tracking: expected on or off (1 or 0) (got 'maybe')");
        }
    }

    @Nested
    @DisplayName("what a record must hold")
    class Enough {

        @ParameterizedTest
        @CsvSource({"'0,40,40,50\n1,,41,51\n',setpoint", "'0,40,40,50\n1,41,,51\n',pv", "'0,40,40,50\n1,41,41,\n',output"})
        void a_signal_logged_once_is_refused_by_its_column(String rows, String column) {
            assertThatThrownBy(() -> parse(HEADER + rows)).isInstanceOf(InputException.class)
                    .hasMessage("t.csv: " + column + ": needs at least two logged values (got 1)");
        }

        @Test
        void a_record_with_many_bad_rows_lists_the_first_twenty() {
            StringBuilder text = new StringBuilder(HEADER);
            for (int k = 0; k < 25; k++) {
                text.append(k).append(",40,x,50\n");
            }
            assertThatThrownBy(() -> parse(text.toString())).isInstanceOfSatisfying(BadInput.class, e -> {
                assertThat(e.problems()).hasSize(20);
                assertThat(e.problems().get(0)).isEqualTo("t.csv:2: pv: expected a number (got 'x')");
                assertThat(e.problems().get(19)).startsWith("t.csv:21: pv:");
            });
        }
    }
}

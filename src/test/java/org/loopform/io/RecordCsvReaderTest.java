package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.identify.PlantRecord;
import org.loopform.units.Span;

/** {@code fit}'s record reader: separators, timestamps, scaling to % of span, and its messages (plumbing). */
class RecordCsvReaderTest {

    private static PlantRecord read(Path dir, String text, Span out, Span pv) throws Exception {
        Path f = dir.resolve("r.csv");
        Files.write(f, text.getBytes(StandardCharsets.UTF_8));
        return RecordCsvReader.read(f, "r.csv", "time", "output", "pv", out, pv);
    }

    @Test
    void semicolons_and_a_byte_order_mark_are_read(@TempDir Path dir) throws Exception {
        PlantRecord r = read(dir, "\uFEFFtime;output;pv\n0;50;40\n1;55;40.5\n2;55;41\n", new Span(0, 100), new Span(0, 100));
        assertThat(r.size()).isEqualTo(3);
        assertThat(r.output(1)).isEqualTo(55.0);
        assertThat(r.pv(1)).isEqualTo(40.5);
    }

    @Test
    void timestamps_become_seconds_from_the_first_row_across_an_offset(@TempDir Path dir) throws Exception {
        // 10:00:00+02:00 is 08:00:00Z; the next rows are 30 s and 90.5 s later
        PlantRecord r = read(dir, "time,output,pv\n2031-03-14T10:00:00+02:00,50,40\n2031-03-14T08:00:30Z,50,40\n"
                + "2031-03-14T08:01:30.5Z,55,41\n", new Span(0, 100), new Span(0, 100));
        assertThat(r.time(1)).isCloseTo(30, within(1e-9));
        assertThat(r.time(2)).isCloseTo(90.5, within(1e-9));
    }

    @Test
    void engineering_units_are_scaled_to_percent_of_span(@TempDir Path dir) throws Exception {
        // PV 0..150: 60 is 40 %; output 4..20 mA: 12 mA is 50 % (hand arithmetic)
        PlantRecord r = read(dir, "time,output,pv\n0,12,60\n1,12,60\n2,20,150\n", new Span(4, 20), new Span(0, 150));
        assertThat(r.pv(0)).isCloseTo(40, within(1e-12));
        assertThat(r.output(0)).isCloseTo(50, within(1e-12));
        assertThat(r.output(2)).isCloseTo(100, within(1e-12));
    }

    @Test
    void a_decimal_comma_is_named_with_its_line(@TempDir Path dir) {
        assertThatThrownBy(() -> read(dir, "time;output;pv\n0;50;40\n1;50;40,5\n2;55;41\n", new Span(0, 100), new Span(0, 100)))
                .hasMessageContaining("r.csv:3: pv:").hasMessageContaining("write the decimal separator as a point");
    }

    @Test
    void a_missing_column_lists_the_header(@TempDir Path dir) {
        assertThatThrownBy(() -> read(dir, "t,out,y\n0,50,40\n1,50,40\n2,55,41\n", new Span(0, 100), new Span(0, 100)))
                .hasMessageContaining("r.csv:1: --time: no column 'time' (the header has t, out, y)");
    }

    @Test
    void a_row_with_a_cell_missing_is_refused(@TempDir Path dir) {
        assertThatThrownBy(() -> read(dir, "time,output,pv\n0,50,40\n1,50\n2,55,41\n", new Span(0, 100), new Span(0, 100)))
                .hasMessageContaining("r.csv:3: the row has 2 cells and the header 3");
    }

    @Test
    void text_that_is_not_utf8_is_refused(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("r.csv");
        Files.write(f, "time,output,pv\n0,50,4\u00e9\n".getBytes(StandardCharsets.ISO_8859_1));
        assertThatThrownBy(() -> RecordCsvReader.read(f, "r.csv", "time", "output", "pv", new Span(0, 100), new Span(0, 100)))
                .hasMessageContaining("UTF-8");
    }
}

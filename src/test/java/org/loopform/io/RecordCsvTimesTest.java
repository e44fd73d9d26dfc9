// source: the test records themselves (each expected time and percentage is read off the rows the test writes: 100 (x - low) / (high - low) as RecordCsvReader's Javadoc states it), ISO 8601 / RFC 3339 section 5.6 (a local date-time, here read as UTC), and the unit symbols s, min, h, ms (ISO 80000-3; BIPM SI Brochure, 9th ed., 2019, Table 8)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Optional;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.identify.PlantRecord;
import org.loopform.units.Span;
import org.loopform.units.TimeUnit;

/** The time column of a plant record: numbers in a unit, local timestamps, and the unit a column's name suggests. */
class RecordCsvTimesTest {

    private static final Span PERCENT = new Span(0, 100);

    @TempDir
    Path dir;

    @Test
    void numbers_in_minutes_are_read_as_seconds_and_said_so() throws IOException {
        Path f = Files.writeString(dir.resolve("r.csv"), "time,output,pv\n0,50,40\n1,55,40\n2.5,55,41\n");
        RecordCsvReader.Reading r = RecordCsvReader.read(f, "r.csv", "time", "output", "pv", PERCENT, PERCENT,
                TimeUnit.MINUTES);
        assertThat(r.record().time(1)).isCloseTo(60.0, within(1e-12));
        assertThat(r.record().time(2)).isCloseTo(150.0, within(1e-12));
        assertThat(r.timestamps()).isFalse();
        assertThat(r.timeUnit()).isEqualTo(TimeUnit.MINUTES);
        assertThat(r.timeReadAs()).isEqualTo("numbers in min");
    }

    @Test
    void local_timestamps_with_a_space_are_seconds_from_the_first_and_said_so() throws IOException {
        Path f = Files.writeString(dir.resolve("r.csv"), "time,output,pv\n2031-03-14 10:00:00,50,40\n"
                + "2031-03-14 10:00:30,50,40\n2031-03-14 10:01:30,55,41\n");
        RecordCsvReader.Reading r = RecordCsvReader.read(f, "r.csv", "time", "output", "pv", PERCENT, PERCENT, null);
        assertThat(r.record().time(1)).isCloseTo(30.0, within(1e-9));
        assertThat(r.record().time(2)).isCloseTo(90.0, within(1e-9));
        assertThat(r.timestamps()).isTrue();
        assertThat(r.timeReadAs()).isEqualTo("ISO-8601 timestamps");
    }

    // 100 (12 - 4) / (20 - 4) = 50 %; 100 (75 - 0) / (150 - 0) = 50 %
    @Test
    void a_record_given_as_a_stream_is_read_over_its_spans() {
        byte[] text = "time,output,pv\n0,12,75\n1,12,75\n2,20,150\n".getBytes(StandardCharsets.UTF_8);
        PlantRecord r = RecordCsvReader.read(new ByteArrayInputStream(text), "r.csv", "time", "output", "pv",
                new Span(4, 20), new Span(0, 150));
        assertThat(r.size()).isEqualTo(3);
        assertThat(r.output(0)).isCloseTo(50.0, within(1e-12));
        assertThat(r.pv(0)).isCloseTo(50.0, within(1e-12));
        assertThat(r.output(2)).isCloseTo(100.0, within(1e-12));
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {"time_min|min", "t [h]|h", "Hours|h", "elapsed_ms|ms", "Time (s)|s",
            "timeSeconds|s", "TimeMinutes|min", "sample_msec|ms"})
    void a_column_name_that_names_a_time_unit_suggests_it(String column, String unit) {
        assertThat(RecordCsvReader.unitSuggestedBy(column)).contains(unit);
    }

    @ParameterizedTest
    @CsvSource({"time", "timestamp", "hms", "t"})
    void a_column_name_without_a_unit_suggests_none(String column) {
        assertThat(RecordCsvReader.unitSuggestedBy(column)).isEqualTo(Optional.empty());
    }
}

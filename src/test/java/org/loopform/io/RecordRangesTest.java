// plumbing: no published source needed (source: none), except percent of span (common practice)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.identify.PlantRecord;
import org.loopform.units.Span;

/** A step record in engineering units put in percent of span: 100 (x - low) / (high - low), common practice. */
class RecordRangesTest {

    @Test
    void values_are_put_in_percent_of_their_spans_and_times_start_at_zero(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("r.csv");
        // output span 20..120 (width 100), PV span 10..210 (width 200): output 70 is 50 %, PV 110 is 50 %, PV 60 is 25 %
        Files.writeString(f, "time,output,pv\n5,70,110\n6,20,60\n7,120,210\n");
        PlantRecord r = RecordCsvReader.read(f, "r.csv", "time", "output", "pv", new Span(20, 120), new Span(10, 210));
        assertThat(r.output(0)).isCloseTo(50, within(1e-12));
        assertThat(r.output(1)).isCloseTo(0, within(1e-12));
        assertThat(r.pv(0)).isCloseTo(50, within(1e-12));
        assertThat(r.pv(1)).isCloseTo(25, within(1e-12));
        assertThat(r.time(0)).isZero();
        assertThat(r.time(2)).isEqualTo(2.0);
    }

    @Test
    void a_repeated_time_is_refused(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("r.csv");
        Files.writeString(f, "time,output,pv\n0,1,1\n1,1,1\n1,1,1\n2,1,1\n");
        assertThatThrownBy(() -> RecordCsvReader.read(f, "r.csv", "time", "output", "pv", new Span(0, 100), new Span(0, 100)))
                .hasMessageContaining("r.csv:4: time: times must increase");
    }
}

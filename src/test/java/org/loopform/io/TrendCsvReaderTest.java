package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.loopform.replay.Mode;
import org.loopform.replay.Trend;

/** {@code replay}'s record reader: signals kept apart where cells are empty, modes, timestamps, messages (plumbing). */
class TrendCsvReaderTest {

    private static Trend parse(String text) {
        return TrendCsvReader.parse(text, "t.csv", TrendColumns.DEFAULT);
    }

    @Test
    void empty_cells_leave_each_signal_its_own_points() {
        Trend t = parse("time,setpoint,pv,output\n0,40,40,50\n1,,41,\n2,,42,51\n3,44,43,52\n");
        assertThat(t.setpoint().size()).isEqualTo(2);
        assertThat(t.pv().size()).isEqualTo(4);
        assertThat(t.output().size()).isEqualTo(3);
        // linear between logged points (the reader keeps them; the replay interpolates): setpoint at 1.5 s
        assertThat(t.setpoint().at(1.5)).isCloseTo(40 + 4 * 1.5 / 3, within(1e-12));
    }

    @Test
    void modes_are_read_in_their_usual_spellings() {
        Trend t = parse("time,setpoint,pv,output,mode\n0,40,40,50,auto\n1,40,40,50,MAN\n2,40,40,50,cas\n");
        assertThat(t.mode().at(0.5)).isEqualTo(Mode.AUTOMATIC);
        assertThat(t.mode().at(1.5)).isEqualTo(Mode.MANUAL);
        assertThat(t.mode().hasManual()).isTrue();
    }

    @Test
    void timestamps_with_a_space_and_fractions_are_seconds_from_the_first_row() {
        Trend t = parse("time,setpoint,pv,output\n2031-03-14 09:00:00,40,40,50\n2031-03-14 09:00:01.5,40,40,50\n"
                + "2031-03-14 09:00:03,40,40,50\n");
        assertThat(t.pv().timeSeconds(1)).isCloseTo(1.5, within(1e-9));
        assertThat(t.origin()).hasToString("2031-03-14T09:00");
    }

    @Test
    void an_unknown_mode_is_refused_with_its_line() {
        assertThatThrownBy(() -> parse("time,setpoint,pv,output,mode\n0,40,40,50,auto\n1,40,40,50,sleeping\n"))
                .hasMessageContaining("t.csv:3").hasMessageContaining("sleeping");
    }

    @Test
    void a_time_that_does_not_increase_is_refused_with_its_line() {
        assertThatThrownBy(() -> parse("time,setpoint,pv,output\n0,40,40,50\n2,40,40,50\n1,40,40,50\n"))
                .hasMessageContaining("t.csv:4");
    }

    @Test
    void a_decimal_comma_is_named() {
        assertThatThrownBy(() -> parse("time;setpoint;pv;output\n0;40;40,5;50\n1;40;41;50\n"))
                .hasMessageContaining("t.csv:2").hasMessageContaining("decimal");
    }
}

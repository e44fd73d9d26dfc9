package org.loopform.replay;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.cli.Main;

/** Black-box runs of {@code loopform replay} on records written by {@link TrueLoop} (plumbing and exit codes). */
class ReplayCommandTest {

    @TempDir
    Path dir;

    /** The record as a historian export: timestamps, engineering units, a mode column. */
    static String csv(TrueLoop plant) {
        StringBuilder sb = new StringBuilder("Time;SP;PV;OUT;Mode\n");
        java.time.LocalDateTime t0 = java.time.LocalDateTime.of(2024, 3, 1, 8, 0);
        for (int k = 0; k < plant.times.length; k++) {
            sb.append(t0.plusNanos((long) (plant.times[k] * 1e9))).append(';').append(plant.setpoint[k]).append(';')
                    .append(plant.pv[k]).append(';').append(plant.output[k]).append(';')
                    .append(plant.modes.get(k) == Mode.MANUAL ? "MAN" : "AUTO").append('\n');
        }
        return sb.toString();
    }

    int run(StringWriter out, StringWriter err, String... args) {
        return Main.run(args, new PrintWriter(out), new PrintWriter(err));
    }

    Path loop(String tuning) throws Exception {
        Path f = dir.resolve("loop.yaml");
        Files.writeString(f, "tag: TIC-1\ntuning: {" + tuning + ", scan: 1 s}\n"
                + "target: {form: ideal-pb-repeats, scan: 1 s}\nranges: {pv: 0..150, output: 0..100}\n");
        return f;
    }

    @Test
    void the_true_controller_passes_and_a_unit_mistake_fails_with_its_explanation() throws Exception {
        TrueLoop plant = new TrueLoop();
        plant.manualFrom = 400;
        plant.manualTo = 500;
        plant.run();
        Path record = dir.resolve("TIC-1.csv");
        Files.writeString(record, csv(plant));
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        String[] columns = {"--time", "Time", "--setpoint", "SP", "--pv", "PV", "--output", "OUT", "--mode", "Mode"};
        int code = run(out, err, concat(new String[] {"replay", record.toString(), "--loop",
                loop("form: ideal, kc: 2, ti: 60, td: 6").toString(), "--plot", dir.resolve("p.svg").toString()},
                columns));
        assertThat(err.toString()).isEmpty();
        assertThat(code).as(out.toString()).isEqualTo(0);
        assertThat(out.toString()).contains("reproduced").contains("Open loop");
        assertThat(Files.readString(dir.resolve("p.svg"))).contains("<svg");

        out = new StringWriter();
        code = run(out, err, concat(new String[] {"replay", record.toString(), "--loop",
                loop("form: ideal-min, kc: 2, ti: 60, td: 6").toString(), "--format", "json"}, columns));
        assertThat(code).isEqualTo(1);
        assertThat(out.toString()).contains("\"as_found_verdict\" : \"refuted\"")
                .contains("ti and td are in s, not min");
    }

    @Test
    void a_missing_column_is_bad_input() throws Exception {
        Path record = dir.resolve("r.csv");
        Files.writeString(record, "time,setpoint,pv\n0,1,2\n1,1,2\n");
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = run(out, err, "replay", record.toString(), "--loop", loop("form: ideal, kc: 2, ti: 60, td: 6")
                .toString());
        assertThat(code).isEqualTo(2);
        assertThat(err.toString()).contains("r.csv:1: output: no such column").contains("--output");
    }

    static String[] concat(String[] a, String[] b) {
        String[] c = java.util.Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, c, a.length, b.length);
        return c;
    }
}

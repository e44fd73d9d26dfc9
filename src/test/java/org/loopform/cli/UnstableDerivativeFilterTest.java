// source: forward-difference filter pole 1 - h/Tf (Wittenmark, Astrom & Arzen, Computer Control: An Overview, IFAC Professional Brief, 2002, Table 3), worked by hand below
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A target whose derivative is a forward difference, run at a scan longer than twice its filter time:
 * the filter's own pole 1 - h/Tf lies outside the unit circle, so the controller's derivative state grows
 * each scan past any number a double holds. The loop is unstable, and the check must say so (exit 1, the
 * stability and discretization findings), not stop with an internal error when the simulated run's
 * arithmetic overflows. Here Td = 1 s, N = 10: Tf = 0.1 s; h = 0.5 s: h/Tf = 5, filter pole 1 - 5 = -4.
 */
@DisplayName("a controller whose own derivative filter is unstable")
class UnstableDerivativeFilterTest {

    /** An invented target form: an ideal PID with a forward-difference derivative. */
    private static final String FORM = """
            # INVENTED target form for a test: a forward-difference derivative
            id: test-forward-derivative
            title: Invented test form with a forward-difference derivative
            structure: ideal
            gain: {as: gain, basis: percent, sign: signed}
            integral: {as: time, unit: s, off: 0}
            derivative: {as: time, unit: s}
            filter: {kind: ratio, ratio: 10, placement: derivative}
            weights: {b: 1, c: 1}
            algorithm: {kind: positional, integral: backward, derivative: forward, anti_windup: clamping, output: -1000..1000}
            """;

    private static final String LOOP = """
            # INVENTED loop for a test
            tag: XIC-77
            process: {model: fopdt, gain: 1.0, time_constant: 10 s, dead_time: 1 s}
            tuning: {form: ideal, kc: 1, ti: 10, td: 1, n: 10}
            target: {form: forward.yaml, scan: 0.5 s}
            """;

    @TempDir
    Path dir;

    @Test
    void fails_on_stability_instead_of_stopping() throws Exception {
        Files.writeString(dir.resolve("forward.yaml"), FORM);
        Path loop = Files.writeString(dir.resolve("loop.yaml"), LOOP);
        Path plot = dir.resolve("plot.svg");

        CliRun run = CliRun.of("check", loop.toString(), "--format", "json", "--plot", plot.toString());

        assertThat(run.exitCode()).as(run.err()).isEqualTo(1);
        assertThat(run.err()).doesNotContain("internal error");
        JsonNode json = new ObjectMapper().readTree(run.out());
        assertThat(json.get("verdict").asText()).isEqualTo("fail");
        assertThat(json.get("target").get("stability").asText()).isEqualTo("unstable");
        String findings = json.get("findings").toString();
        assertThat(findings).contains("\"topic\":\"stability\"").contains("filter pole -4");
        assertThat(Files.readString(plot)).contains("<svg");
    }

    // Replayed open loop on an invented record, the new controller's derivative state grows by a factor |1 - h/Tf|
    // each scan until the output is not a number: a failing replay finding, not an internal error.
    @Test
    void a_replay_of_it_says_it_runs_away() throws Exception {
        Files.writeString(dir.resolve("forward.yaml"), FORM);
        Path record = Path.of("examples/records/replay/TIC-301.csv").toAbsolutePath();
        Path loop = Files.writeString(dir.resolve("tic.yaml"), """
                # INVENTED loop for a test (the record is the invented example's)
                tag: TIC-301
                process: {model: fopdt, gain: 1.5, time_constant: 300 s, dead_time: 30 s}
                tuning: {form: series-pb-min, pb: 60, ti: 6, td: 0.1, scan: 1 s}
                target: {form: forward.yaml, scan: 5 s}
                ranges: {pv: 0..150, output: 0..100}
                """);

        CliRun run = CliRun.of("replay", record.toString(), "--loop", loop.toString());

        assertThat(run.exitCode()).as(run.err()).isEqualTo(1);
        assertThat(run.err()).doesNotContain("internal error");
        assertThat(run.out()).contains("[fail] replay: The new controller as entered runs away on this record");
    }

    // The same controller listed as the old one: it cannot have written the log, whatever its first scans matched.
    @Test
    void a_replay_of_it_as_the_old_controller_refutes_it() throws Exception {
        Files.writeString(dir.resolve("forward.yaml"), FORM);
        Path record = Path.of("examples/records/replay/TIC-301.csv").toAbsolutePath();
        Path loop = Files.writeString(dir.resolve("tic.yaml"), """
                # INVENTED loop for a test (the record is the invented example's)
                tag: TIC-301
                process: {model: fopdt, gain: 1.5, time_constant: 300 s, dead_time: 30 s}
                tuning: {form: forward.yaml, kc: 1.67, ti: 360, td: 6, n: 10, scan: 5 s}
                target: {form: ideal, scan: 1 s}
                ranges: {pv: 0..150, output: 0..100}
                """);

        CliRun run = CliRun.of("replay", record.toString(), "--loop", loop.toString(), "--format", "json");

        assertThat(run.exitCode()).as(run.err()).isEqualTo(1);
        JsonNode json = new ObjectMapper().readTree(run.out());
        assertThat(json.toString()).contains("The old controller as listed runs away on this record")
                .contains("cannot be the controller that wrote this log");
        assertThat(json.findValue("as_found_verdict").asText()).isEqualTo("refuted");
    }

    @Test
    void an_audit_of_it_is_a_failing_loop_not_a_bad_row() throws Exception {
        Files.writeString(dir.resolve("forward.yaml"), FORM);
        Path list = Files.writeString(dir.resolve("loops.csv"), "tag,form,kc,ti,td,n,target_form,target_scan,model,"
                + "process_gain,time_constant,dead_time\nXIC-77,ideal,1,10,1,10,forward.yaml,0.5 s,fopdt,1,10 s,1 s\n");

        CliRun run = CliRun.of("audit", list.toString(), "--no-report", "--out", dir.resolve("out").toString());

        assertThat(run.exitCode()).as(run.err()).isEqualTo(1);
        assertThat(run.out()).contains("1 fail").contains("0 bad rows");
    }
}

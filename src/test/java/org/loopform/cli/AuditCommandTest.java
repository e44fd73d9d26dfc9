// plumbing: no published source needed
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class AuditCommandTest {

    @TempDir
    Path dir;

    private Path csv(String text) throws Exception {
        Path p = dir.resolve("loops.csv");
        Files.writeString(p, text);
        return p;
    }

    private static final String GOOD = "tag,form,kc,ti,td,pv_range,output_range,model,process_gain,time_constant,"
            + "dead_time\n"
            + "FIC-1,ideal,0.5,10,0,0..50,0..100,fopdt,1,5 s,1 s\n"
            + "TIC-2,ideal-min,1.5,4,0.5,0..150,0..100,fopdt,1.5,300 s,30 s\n"
            + "PIC-3,ideal,0.8,30,0,0..10,0..100,,,,\n";

    @Test
    void writes_the_four_outputs_in_input_order() throws Exception {
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("audit", csv(GOOD).toString(), "--to", "ideal-pb-repeats", "--scan", "0.5s", "--out",
                out.toString());
        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        assertThat(out.resolve("loops.csv")).exists();
        assertThat(out.resolve("entry-sheet.csv")).exists();
        assertThat(out.resolve("report.html")).exists();
        JsonNode json = new ObjectMapper().readTree(out.resolve("loops.json").toFile());
        assertThat(json.get("loops")).hasSize(3);
        assertThat(json.get("loops").get(0).get("tag").asText()).isEqualTo("FIC-1");
        assertThat(json.get("loops").get(2).get("tag").asText()).isEqualTo("PIC-3");
        assertThat(json.get("loops").get(2).get("design").isNull()).isTrue();
        assertThat(json.get("summary").get("loops").asInt()).isEqualTo(3);
        // PIC-3 has no process model: the summary counts it, and says what its verdict rests on
        assertThat(json.get("summary").get("without_process_model").asInt()).isEqualTo(1);
        assertThat(json.get("summary").get("pass_without_process_model").asInt())
                .isEqualTo(json.get("loops").get(2).get("verdict").asText().equals("pass") ? 1 : 0);
        assertThat(r.out()).contains("1 loop has no process model: only the conversion");
        assertThat(Files.readAllLines(out.resolve("loops.csv")).get(0)).startsWith("tag,verdict,where");
        // the source values as written, each bare number with the source form's unit (ideal: s/repeat, s)
        assertThat(Files.readAllLines(out.resolve("loops.csv")).get(1))
                .contains(",ideal,kc=0.5 %/%; ti=10 s/repeat; td=0 s,");
        // FIC-1: kc 0.5 -> pb 200 %, ti 10 s -> reset 6 repeats/min (pb = 100/kc, reset = 1/ti: common practice)
        assertThat(Files.readString(out.resolve("entry-sheet.csv"))).contains("FIC-1,ideal-pb-repeats,pb,200,%")
                .contains("FIC-1,ideal-pb-repeats,reset,6,repeats/min");
        assertThat(r.out()).contains("Audit of 3 loops").contains("Written to");
    }

    @Test
    void a_bad_row_is_reported_the_others_are_written_and_the_exit_code_is_2() throws Exception {
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("audit", csv(GOOD + "XIC-4,ideal,abc,10,0,,,,,,\nFIC-1,ideal,1,10,0,,,,,,\n").toString(),
                "--to", "ideal", "--scan", "1s", "--out", out.toString());
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.out()).contains("2 bad rows").contains("loops.csv:5").contains("loops.csv:6")
                .contains("duplicate tag FIC-1");
        JsonNode json = new ObjectMapper().readTree(out.resolve("loops.json").toFile());
        assertThat(json.get("loops")).hasSize(5);
        assertThat(json.get("loops").get(3).get("verdict").asText()).isEqualTo("bad_input");
    }

    @Test
    void a_folder_loopform_did_not_write_is_refused_even_with_force_and_an_input_inside_it_too() throws Exception {
        Path out = dir.resolve("out");
        Files.createDirectories(out);
        Files.writeString(out.resolve("keep.txt"), "x");
        Path loops = csv(GOOD);
        CliRun r = CliRun.of("audit", loops.toString(), "--to", "ideal", "--scan", "1s", "--out", out.toString());
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err()).contains("loopform did not write it");
        assertThat(out.resolve("keep.txt")).exists();
        CliRun forced = CliRun.of("audit", loops.toString(), "--to", "ideal", "--scan", "1s", "--out", out.toString(),
                "--force");
        assertThat(forced.exitCode()).isEqualTo(2);
        assertThat(out.resolve("keep.txt")).hasContent("x");
        CliRun inside = CliRun.of("audit", loops.toString(), "--to", "ideal", "--scan", "1s", "--out", dir.toString(),
                "--force");
        assertThat(inside.exitCode()).isEqualTo(2);
        assertThat(inside.err()).contains("holds an input");
        assertThat(loops).exists();
    }

    @Test
    void fail_on_warn_turns_warnings_into_exit_1_and_json_prints_the_summary() throws Exception {
        Path loops = csv("tag,form,kc,ti,td,target_form,target_scan\nTIC-9,ideal,1,40,10,ideal-fixed-n8,1 s\n");
        CliRun lenient = CliRun.of("audit", loops.toString(), "--format", "json");
        CliRun strict = CliRun.of("audit", loops.toString(), "--fail-on", "warn", "--format", "json");
        JsonNode summary = new ObjectMapper().readTree(lenient.out());
        assertThat(summary.get("verdicts").get("warn").asInt()).isEqualTo(1);
        assertThat(lenient.exitCode()).isEqualTo(0);
        assertThat(strict.exitCode()).isEqualTo(1);
    }

    @Test
    void yaml_loop_lists_work_too() throws Exception {
        Path y = dir.resolve("loops.yaml");
        Files.writeString(y, "loops:\n"
                + "  - tag: A-1\n    tuning: {form: ideal, kc: 1, ti: 20, td: 0}\n    target: {form: ideal-min, scan: 1 s}\n"
                + "  - tag: A-2\n    tuning: {form: ideal, kc: 1, ti: 20, td: 0, zz: 3}\n"
                + "    target: {form: ideal-min, scan: 1 s}\n");
        CliRun r = CliRun.of("audit", y.toString());
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.out()).contains("Audit of 2 loops").contains("unknown parameter 'zz'");
    }

    @Test
    void demo_writes_the_report_and_says_where() {
        Path out = dir.resolve("demo");
        CliRun r = CliRun.of("demo", "--out", out.toString());
        assertThat(r.exitCode()).as(r.err()).isEqualTo(0);
        assertThat(out.resolve("report.html")).exists();
        assertThat(r.out()).contains("Open ").contains("report.html").contains("invented");
        CliRun again = CliRun.of("demo", "--out", out.toString());
        assertThat(again.exitCode()).isEqualTo(0);
    }

    @Test
    void a_list_read_from_a_fifo_is_read_whole_and_its_last_value_is_not_cut() throws Exception {
        Path fifo = dir.resolve("pipe.csv");
        org.junit.jupiter.api.Assumptions.assumeTrue(new ProcessBuilder("mkfifo", fifo.toString()).start().waitFor() == 0,
                "mkfifo is available");
        StringBuilder sb = new StringBuilder("tag,form,pb,ti,td,scan\n");
        for (int k = 0; k < 1999; k++) {
            sb.append("TIC-").append(k).append(",series-pb-min,").append(50 + k % 200).append(",2.5,0,1 s\n");
        }
        sb.append("TIC-LAST,series-pb-min,180,2.5,0,1 s\n");
        Thread writer = new Thread(() -> {
            try {
                Files.writeString(fifo, sb);
            } catch (java.io.IOException e) {
                throw new java.io.UncheckedIOException(e);
            }
        });
        writer.start();
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("audit", fifo.toString(), "--to", "series-pb-min", "--out", out.toString(), "--no-report");
        writer.join(10_000);
        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        assertThat(r.out()).startsWith("Audit of 2000 loops");
        // series-pb-min to itself is the identity (pb = 100 / kc both ways: common practice)
        assertThat(Files.readString(out.resolve("entry-sheet.csv"))).contains("TIC-LAST,series-pb-min,pb,180,%");
    }

    @Test
    void bad_rows_go_to_stderr_too_and_an_audit_of_only_bad_rows_writes_no_folder() throws Exception {
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("audit", csv("tag,form,kc,ti,td\nA,ideal,1,5,60,0\nB,ideal,abc,60,0\n").toString(),
                "--to", "ideal", "--scan", "1s", "--out", out.toString());
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err()).contains("loops.csv:2: 6 cells, the header has 5").contains("loops.csv:3: loop B: tuning: kc")
                .contains("nothing was written");
        assertThat(out).doesNotExist();
        assertThat(Files.list(dir).map(p -> p.getFileName().toString())).containsExactly("loops.csv");
    }

    @Test
    void many_bad_rows_are_counted_beyond_the_first_hundred() throws Exception {
        StringBuilder sb = new StringBuilder("tag,form,kc,ti,td\n");
        for (int k = 0; k < 250; k++) {
            sb.append("T-").append(k).append(",ideal,x,60,0\n");
        }
        CliRun r = CliRun.of("audit", csv(sb.toString()).toString(), "--to", "ideal", "--scan", "1s");
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err().lines().filter(l -> l.contains(": kc")).count()).isEqualTo(100);
        assertThat(r.err()).contains("... and 150 more problems; 250 bad rows in all");
    }

    @Test
    void without_out_the_summary_points_to_out_and_names_no_file_it_did_not_write() throws Exception {
        StringBuilder sb = new StringBuilder("tag,form,kc,ti,td\n");
        for (int k = 0; k < 30; k++) {
            sb.append("T-").append(k).append(",ideal,x,60,0\n");
        }
        sb.append("FIC-1,ideal,0.5,10,0\n");
        CliRun r = CliRun.of("audit", csv(sb.toString()).toString(), "--to", "ideal", "--scan", "1s");
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.out()).contains("... and 10 more; stderr shows the first 100; with --out DIR, loops.csv lists")
                .doesNotContain("more in loops.csv").doesNotContain("Written to");
        assertThat(r.err()).doesNotContain("listed in loops.csv");

        Path out = dir.resolve("out");
        CliRun written = CliRun.of("audit", dir.resolve("loops.csv").toString(), "--to", "ideal", "--scan", "1s",
                "--out", out.toString());
        assertThat(written.out()).contains("... and 10 more; every bad row is in loops.csv in " + out);
        assertThat(Files.readString(out.resolve("loops.csv"))).contains("T-29");
    }
}

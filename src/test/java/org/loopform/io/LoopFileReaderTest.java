// plumbing: no published source needed (source: none)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.check.LoopSpec;
import org.loopform.process.FirstOrderPlusDeadTime;

/** Loop files: one block or a list, each field read and each problem placed at its line. */
class LoopFileReaderTest {

    private static final String LOOP = """
            tag: TIC-1
            process: {model: fopdt, gain: 2.0, time_constant: 60 s, dead_time: 10 s}
            tuning: {form: ideal, kc: 1.2, ti: 60, td: 4, n: 10, scan: 1 s}
            target: {form: ideal-pb-repeats, scan: 0.5 s}
            ranges: {pv: 0..150, output: 0..100}
            """;

    @Test
    void one_block_is_read_field_by_field(@TempDir Path dir) throws IOException {
        Path f = dir.resolve("l.yaml");
        Files.writeString(f, LOOP);
        LoopSpec s = LoopFileReader.readOne(f, "l.yaml");
        assertThat(s.tag()).isEqualTo("TIC-1");
        assertThat(((FirstOrderPlusDeadTime) s.process()).deadTimeSeconds()).isEqualTo(10.0);
        assertThat(s.sourceForm().id()).isEqualTo("ideal");
        assertThat(s.tuning()).containsEntry("kc", "1.2").doesNotContainKeys("form", "scan");
        assertThat(s.sourceScanSeconds()).isEqualTo(1.0);
        assertThat(s.targetForm().id()).isEqualTo("ideal-pb-repeats");
        assertThat(s.targetScanSeconds()).isEqualTo(0.5);
        assertThat(s.pvRange().high()).isEqualTo(150.0);
        assertThat(s.outputRange().high()).isEqualTo(100.0);
        assertThat(s.where()).isEqualTo("l.yaml:1");
    }

    @Test
    void a_list_holds_several_and_check_takes_one(@TempDir Path dir) throws IOException {
        String two = "loops:\n" + ("  - " + LOOP.replace("\n", "\n    ")).stripTrailing() + "\n"
                + ("  - " + LOOP.replace("TIC-1", "TIC-2").replace("\n", "\n    ")).stripTrailing() + "\n";
        List<LoopSpec> all = LoopFileReader.parseAll(two, "l.yaml");
        assertThat(all).extracting(LoopSpec::tag).containsExactly("TIC-1", "TIC-2");
        Path f = dir.resolve("two.yaml");
        Files.writeString(f, two);
        assertThat(LoopFileReader.readAll(f, "two.yaml")).hasSize(2);
        assertThatThrownBy(() -> LoopFileReader.readOne(f, "two.yaml"))
                .hasMessageContaining("two.yaml:1: expected one loop (got 2)");
        assertThatThrownBy(() -> LoopFileReader.parseAll("loops: []\nextra: 1\n", "l.yaml"))
                .hasMessageContaining("extra: unknown key");
    }

    @Test
    void without_process_or_ranges_those_are_absent() {
        LoopSpec s = LoopFileReader.parseAll("""
                tag: T
                tuning: {form: ideal, kc: 1, ti: 60, td: 0}
                target: {form: ideal}
                """, "l.yaml").get(0);
        assertThat(s.process()).isNull();
        assertThat(s.pvRange()).isNull();
        assertThat(s.sourceScanSeconds()).isNull();
        assertThat(s.targetScanSeconds()).isNull();
    }

    @Test
    void each_problem_is_placed_at_its_line() {
        assertThatThrownBy(() -> LoopFileReader.parseAll("- 1\n", "l.yaml")).hasMessageContaining("a loop file is a mapping");
        assertThatThrownBy(() -> LoopFileReader.parseAll("tag: T\ncolour: red\n", "l.yaml"))
                .hasMessageContaining("l.yaml:2: colour: unknown key");
        assertThatThrownBy(() -> LoopFileReader.parseAll("tag: T\ntarget: {form: ideal}\n", "l.yaml"))
                .hasMessageContaining("l.yaml:1: tuning: required in a loop block");
        assertThatThrownBy(() -> LoopFileReader.parseAll("tag: T\ntuning: {kc: 1}\ntarget: {form: ideal}\n", "l.yaml"))
                .hasMessageContaining("l.yaml:2: tuning: form: required");
        assertThatThrownBy(() -> LoopFileReader.parseAll("tag: T\ntuning: {form: ideal, kc: 1, ti: 60, td: 0}\n", "l.yaml"))
                .hasMessageContaining("target: required");
        assertThatThrownBy(() -> LoopFileReader.parseAll(
                "tag: T\ntuning: {form: ideal, kc: 1, ti: 60, td: 0}\ntarget: {scan: 1 s}\n", "l.yaml"))
                .hasMessageContaining("l.yaml:3: target: form: required");
        assertThatThrownBy(() -> LoopFileReader.parseAll(
                "tag: T\ntuning: {form: ideal, kc: 1, ti: 60, td: 0}\ntarget: {form: ideal, colour: 1}\n", "l.yaml"))
                .hasMessageContaining("target.colour: unknown key");
        assertThatThrownBy(() -> LoopFileReader.parseAll(
                "tag: T\ntuning: {form: ideal, kc: 1, ti: 60, td: 0}\ntarget: {form: ideal}\nranges: {pv: 0..1, in: 0..1}\n",
                "l.yaml")).hasMessageContaining("ranges.in: unknown key");
        assertThatThrownBy(() -> LoopFileReader.parseAll(
                "tag: T\ntuning: {form: nosuchform, kc: 1}\ntarget: {form: ideal}\n", "l.yaml"))
                .hasMessageContaining("l.yaml:2: tuning.form:");
        assertThatThrownBy(() -> LoopFileReader.parseAll(
                "tag: T\ntuning:\n  form: ideal\n  kc: 0\n  ti: 60\n  td: 0\ntarget: {form: ideal}\n", "l.yaml"))
                .hasMessageStartingWith("l.yaml:4: tuning.kc:");
        assertThatThrownBy(() -> LoopFileReader.parseAll(
                "tag: T\ntuning:\n  form: ideal\n  kc: 1\n  ti: 60\n  td: 0\n  zz: 1\ntarget: {form: ideal}\n", "l.yaml"))
                .hasMessageStartingWith("l.yaml:7: tuning.zz: unknown parameter 'zz'");
        assertThatThrownBy(() -> LoopFileReader.parseAll(
                "tag: T\ntuning:\n  form: ideal\n  kc: 1\ntarget: {form: ideal}\n", "l.yaml"))
                .hasMessageStartingWith("l.yaml:3: tuning: missing parameter");
        assertThatThrownBy(() -> LoopFileReader.parseAll(
                "tag: T\ntuning: {form: ideal, kc: 1, ti: 60, td: 0, scan: -1 s}\ntarget: {form: ideal}\n", "l.yaml"))
                .hasMessageContaining("l.yaml:2: tuning.scan:");
    }

    @Test
    void every_bad_block_of_a_list_is_reported_at_once() {
        assertThatThrownBy(() -> LoopFileReader.parseAll("loops:\n  - {tag: A}\n  - {tag: B}\n", "l.yaml"))
                .hasMessageContaining("l.yaml:2: loops[0].tuning: required")
                .hasMessageContaining("l.yaml:3: loops[1].tuning: required");
    }
}

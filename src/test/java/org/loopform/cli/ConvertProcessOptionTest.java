package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code convert --process}: with the process known, a controller acting in the wrong direction
 * fails (a negative process gain needs a direct-acting controller: common practice; negative
 * feedback, Astrom and Murray, Feedback Systems, 2008, ch. 1). The rest is plumbing.
 */
class ConvertProcessOptionTest {

    @TempDir
    Path dir;

    @Test
    void a_reverse_acting_tuning_on_a_negative_gain_process_fails() {
        CliRun r = CliRun.of("convert", "--from", "ideal", "--to", "ideal-pb-repeats", "kc=2", "ti=60", "td=0",
                "--process", "{model: fopdt, gain: -1, time_constant: 60 s, dead_time: 5 s}");
        assertThat(r.exitCode()).isEqualTo(ExitCodes.FAILED_FINDING);
        assertThat(r.out()).contains("[fail] action").contains("must be direct acting");
    }

    @Test
    void a_direct_acting_tuning_on_a_negative_gain_process_passes() throws Exception {
        Path process = Files.writeString(dir.resolve("p.yaml"), "process: {model: integrating, gain: -0.05, dead_time: 5 s}\n");
        CliRun r = CliRun.of("convert", "--from", "ideal-pb-repeats", "--to", "ideal", "pb=200", "reset=0.1", "td=0",
                "action=direct", "--process", process.toString());
        assertThat(r.exitCode()).isEqualTo(ExitCodes.OK);
        assertThat(r.out()).doesNotContain("action:");
    }

    @Test
    void a_process_that_is_neither_mapping_nor_file_is_bad_input() {
        CliRun r = CliRun.of("convert", "--from", "ideal", "--to", "ideal", "kc=2", "ti=60", "td=0", "--process", "fopdt");
        assertThat(r.exitCode()).isEqualTo(ExitCodes.BAD_INPUT);
        assertThat(r.err()).contains("--process").contains("neither an inline mapping");
    }
}

// plumbing: no published source needed (source: none)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.findings.CheckPolicy;

/** A policy file: thresholds by name over the defaults, each refusal located at its key. */
class PolicyFileReaderTest {

    private static final double FAIL = CheckPolicy.DEFAULT.asMap().get("sampling_fail");

    @Test
    void a_threshold_given_replaces_its_default_and_the_others_stay() {
        CheckPolicy p = PolicyFileReader.parse("sampling_fail: " + (FAIL + 1) + "\n", "p.yaml");
        assertThat(p.asMap().get("sampling_fail")).isEqualTo(FAIL + 1);
        assertThat(p.asMap().get("sampling_warn")).isEqualTo(CheckPolicy.DEFAULT.asMap().get("sampling_warn"));
        assertThat(PolicyFileReader.parse("sampling_warn: 0\n", "p.yaml").asMap().get("sampling_warn")).isZero();
    }

    @Test
    void unknown_keys_negative_numbers_and_words_are_refused_at_their_lines() {
        assertThatThrownBy(() -> PolicyFileReader.parse("sampling_fail: 5\ncolour: 3\n", "p.yaml"))
                .hasMessageContaining("p.yaml:2: colour: unknown key");
        assertThatThrownBy(() -> PolicyFileReader.parse("sampling_fail: -1\n", "p.yaml"))
                .hasMessageContaining("p.yaml:1: sampling_fail: must be a number >= 0 (got '-1')");
        assertThatThrownBy(() -> PolicyFileReader.parse("sampling_fail: Infinity\n", "p.yaml"))
                .hasMessageContaining("must be a number >= 0");
        assertThatThrownBy(() -> PolicyFileReader.parse("\nsampling_fail: ten\n", "p.yaml"))
                .hasMessageContaining("p.yaml:2: sampling_fail: must be a number (got 'ten'); write a plain number");
    }

    @Test
    void the_fail_threshold_must_not_be_below_the_warning_one() {
        assertThatThrownBy(() -> PolicyFileReader.parse("sampling_warn: " + (FAIL + 1) + "\n", "p.yaml"))
                .hasMessageContaining("p.yaml:1: sampling_warn: the fail threshold must not be below sampling_warn");
        assertThatThrownBy(() -> PolicyFileReader.parse("sampling_warn: 3\nsampling_fail: 2\n", "p.yaml"))
                .hasMessageContaining("p.yaml:2: sampling_fail: the fail threshold");
        // equal is allowed
        assertThat(PolicyFileReader.parse("sampling_warn: 3\nsampling_fail: 3\n", "p.yaml").asMap().get("sampling_fail"))
                .isEqualTo(3.0);
    }

    @Test
    void a_file_is_read_by_its_path(@TempDir Path dir) throws IOException {
        Path f = dir.resolve("p.yaml");
        Files.writeString(f, "sampling_fail: " + (FAIL + 2) + "\n");
        assertThat(PolicyFileReader.read(f, "p.yaml").asMap().get("sampling_fail")).isEqualTo(FAIL + 2);
    }
}

// plumbing: the fit command's files and options (the fit itself is checked against its sources in identify/); "twice the gain and twice the dead time fail" is common practice
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code fit --plot}, {@code --write-process} and {@code check --process} with fit's file (plumbing). */
class FitCommandTest {

    private static final String BUMP = "examples/records/tic-104-bump.csv";

    @Test
    void plot_draws_the_record_the_fits_and_the_residuals(@TempDir Path dir) throws Exception {
        Path svg = dir.resolve("fit.svg");
        CliRun r = CliRun.of("fit", BUMP, "--pv-range", "0..150", "--out-range", "0..100", "--plot", svg.toString());
        assertThat(r.exitCode()).as(r.err()).isZero();
        String text = Files.readString(svg);
        assertThat(text).contains("written by loopform").contains("recorded PV").contains("fopdt (recommended)")
                .contains("Residuals of the fopdt fit").contains("Recorded controller output");
    }

    @Test
    void plot_with_relay_is_refused_and_writes_nothing(@TempDir Path dir) {
        Path svg = dir.resolve("fit.svg");
        CliRun r = CliRun.of("fit", "examples/records/tic-104-relay.csv", "--relay", "--plot", svg.toString());
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err()).contains("--plot");
        assertThat(svg).doesNotExist();
    }

    @Test
    void the_process_file_carries_intervals_and_check_reads_it(@TempDir Path dir) throws Exception {
        Path p = dir.resolve("process.yaml");
        CliRun fit = CliRun.of("fit", BUMP, "--pv-range", "0..150", "--out-range", "0..100", "--write-process",
                p.toString());
        assertThat(fit.exitCode()).as(fit.err()).isZero();
        assertThat(Files.readString(p)).contains("process:").contains("intervals:").contains("dead_time: ");
        CliRun check = CliRun.of("check", "examples/loops/tic-104.yaml", "--process", p.toString(), "--format", "json");
        assertThat(check.exitCode()).as(check.err()).isIn(0, 1);
        assertThat(check.out()).contains("\"design\"");
        // twice the gain and twice the dead time fail the same tuning (phase margin under 20 deg): --process is used
        CliRun other = CliRun.of("check", "examples/loops/tic-104.yaml", "--process",
                "{model: fopdt, gain: 4, time_constant: 60 s, dead_time: 20 s}");
        assertThat(other.exitCode()).isEqualTo(1);
    }
}

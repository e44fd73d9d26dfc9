package org.loopform.check;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Optional;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.io.LoopFileReader;

/**
 * A check that knows the old controller: a derivative condition the old controller already had is
 * said so (and is info unless the migration makes it worse); a nearest fit is weighted around the
 * loop's crossover when the process is known. The rule of thumb N h / Td of about 0.2 to 0.6 is
 * Astrom and Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 8 (from memory); the rest
 * is arithmetic written out beside each assertion.
 */
@DisplayName("A check that knows the old controller")
class SourceAwareCheckTest {

    @TempDir
    Path dir;

    private CheckResult check(String sourceScan, String targetForm, String targetScan) throws IOException {
        Path file = Files.writeString(dir.resolve("loop.yaml"), "tag: TIC-900\n"
                + "process: {model: fopdt, gain: 1, time_constant: 100 s, dead_time: 10 s}\n"
                + "tuning: {form: ideal, kc: 1, ti: 60, td: 2, n: 10" + (sourceScan == null ? "" : ", scan: " + sourceScan)
                + "}\ntarget: {form: " + targetForm + ", scan: " + targetScan + "}\n"
                + "ranges: {pv: 0..100, output: 0..100}\n");
        return LoopCheck.run(LoopFileReader.readOne(file, file.toString()), CheckPolicy.DEFAULT);
    }

    private static Finding coarseDerivative(CheckResult r) {
        return r.findings().stream().filter(f -> f.topic() == Topic.DERIVATIVE && f.message().contains("N h / Td"))
                .findFirst().orElseThrow();
    }

    /** Td 2 s, N 10, h 1 s: N h / Td = 10 * 1 / 2 = 5 (the filter Td/N = 0.2 s is shorter than one scan). */
    @Test
    void a_coarse_derivative_the_old_controller_already_had_at_the_same_scan_is_info() throws IOException {
        Finding f = coarseDerivative(check("1 s", "ideal", "1 s"));
        assertThat(f.figure()).isCloseTo(5.0, within(1e-6));
        assertThat(f.severity()).isEqualTo(Severity.INFO);
        assertThat(f.message()).contains("old controller had the same condition").contains("does not make it worse");
    }

    /** At a 2 s target scan N h / Td = 10 * 2 / 2 = 10, twice the old 5: worse, so it stays a warning. */
    @Test
    void a_coarse_derivative_the_migration_makes_worse_stays_a_warning() throws IOException {
        Finding f = coarseDerivative(check("1 s", "ideal", "2 s"));
        assertThat(f.figure()).isCloseTo(10.0, within(1e-6));
        assertThat(f.severity()).isEqualTo(Severity.WARN);
        assertThat(f.message()).contains("makes it worse");
    }

    /** Without a sampled source there is no old figure to compare: the finding stands as it is. */
    @Test
    void a_continuous_design_has_no_old_condition() throws IOException {
        Finding f = coarseDerivative(check(null, "ideal", "1 s"));
        assertThat(f.severity()).isEqualTo(Severity.WARN);
        assertThat(f.message()).doesNotContain("old controller");
    }

    /**
     * The same tuning without a process: the controllers are compared up to the Nyquist frequency, where
     * a 0.2 s filter (Td 2 s / N 10) run at a 1 s scan departs far from its continuous law.
     */
    private CheckResult checkWithoutProcess(String sourceScan, String targetScan) throws IOException {
        Path file = Files.writeString(dir.resolve("bare-d.yaml"), "tag: TIC-901\n"
                + "tuning: {form: ideal, kc: 1, ti: 60, td: 2, n: 10" + (sourceScan == null ? "" : ", scan: " + sourceScan)
                + "}\ntarget: {form: ideal, scan: " + targetScan + "}\n");
        return LoopCheck.run(LoopFileReader.readOne(file, file.toString()), CheckPolicy.DEFAULT);
    }

    private static Optional<Finding> discretization(CheckResult r) {
        return r.findings().stream().filter(f -> f.topic() == Topic.DISCRETIZATION
                && f.message().contains("departs from its own continuous law")).findFirst();
    }

    /**
     * The same form, setting, algorithm and scan give the old and the new controller the same pulse
     * law, so the new one departs from its continuous law exactly as the old one did (Td 2 s, N 10 at
     * a 1 s scan: a filter of 0.2 s, far shorter than the scan): said so, and info.
     */
    @Test
    void a_discretization_the_old_controller_had_at_the_same_scan_is_info() throws IOException {
        Finding f = discretization(checkWithoutProcess("1 s", "1 s")).orElseThrow();
        assertThat(f.severity()).isEqualTo(Severity.INFO);
        assertThat(f.message()).contains("old controller had the same condition").contains("does not make it worse");
    }

    /**
     * Twice the old scan departs further over the band both are judged on (to the new Nyquist
     * frequency; the hold's delay h/2 alone doubles): it stays a warning and says the old figure.
     */
    @Test
    void a_discretization_the_migration_makes_worse_stays_a_warning() throws IOException {
        Finding f = discretization(checkWithoutProcess("1 s", "2 s")).orElseThrow();
        assertThat(f.severity()).isEqualTo(Severity.WARN);
        assertThat(f.message()).contains("old controller had the same condition").contains("makes it worse");
    }

    /** A continuous design has no old scan: nothing to compare. */
    @Test
    void a_continuous_design_has_no_old_discretization() throws IOException {
        Finding f = discretization(checkWithoutProcess(null, "1 s")).orElseThrow();
        assertThat(f.severity()).isEqualTo(Severity.WARN);
        assertThat(f.message()).doesNotContain("old controller");
    }

    /**
     * A target with a fixed filter ratio cannot hold n = 10 exactly: its nearest fit is weighted from a
     * decade below to three times the design loop's crossover (with the process known), not around the
     * law's own corners.
     */
    @Test
    void a_nearest_fit_is_weighted_around_the_design_crossover() throws IOException {
        CheckResult r = check(null, "ideal-fixed-n8", "0.1 s");
        assertThat(r.conversion().exact()).isFalse();
        double wc = r.designMargins().crossoverRadPerSecond().getAsDouble();
        assertThat(r.conversion().loopBand().lowRadPerSecond()).isCloseTo(wc / 10, within(1e-3 * wc));
        assertThat(r.conversion().loopBand().highRadPerSecond()).isCloseTo(3 * wc, within(1e-3 * wc));
    }

    /** Without a process model nothing says the loop is stable: the check must say it did not judge it. */
    @Test
    void a_loop_without_a_process_says_its_stability_was_not_checked() throws IOException {
        Path file = Files.writeString(dir.resolve("bare.yaml"), "tag: FIC-900\n"
                + "tuning: {form: ideal, kc: 1, ti: 60, td: 0}\ntarget: {form: ideal, scan: 1 s}\n");
        CheckResult r = LoopCheck.run(LoopFileReader.readOne(file, file.toString()), CheckPolicy.DEFAULT);
        assertThat(r.findings()).anySatisfy(f -> {
            assertThat(f.topic()).isEqualTo(Topic.STABILITY);
            assertThat(f.message()).contains("No process model").contains("were not checked");
        });
    }
}

package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.findings.PolicyKey;

/**
 * Source: plumbing tests ({@code --policy} files, their errors and the help's key list), except
 * the one loop whose margin is derived below.
 */
@DisplayName("loopform check --policy")
class CheckPolicyOptionTest {

    /**
     * Invented loop: FOPDT 1, 10 s, 1 s; ideal PI Kc 5, Ti 10 s cancels the pole, so
     * L = Kc e^(-theta s)/(10 s) with theta about 1 s + h/2 = 1.05 s at a 0.1 s scan
     * (hold delay h/2, Wittenmark, Astrom and Arzen 2002). w180 = (pi/2)/theta = 1.496 rad/s and
     * GM = 10 w180 / Kc = 2.99; PM = 90 - theta Kc/10 (deg) = 60 deg. It passes by default.
     */
    private static final String LOOP = """
            tag: XIC-2
            process: {model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}
            tuning: {form: ideal, kc: 5, ti: 10, td: 0}
            target: {form: ideal, scan: 0.1 s}
            """;

    @TempDir
    Path dir;

    private CliRun check(String policy) throws IOException {
        Path loop = Files.writeString(dir.resolve("loop.yaml"), LOOP);
        Path file = Files.writeString(dir.resolve("policy.yaml"), policy);
        return CliRun.of("check", loop.toString(), "--policy", file.toString());
    }

    @Test
    void a_stricter_gain_margin_fail_threshold_fails_the_loop() throws IOException {
        CliRun plain = CliRun.of("check", Files.writeString(dir.resolve("plain.yaml"), LOOP).toString());
        // GM 2.99 (derived above) is below a fail threshold of 3.5
        CliRun strict = check("gain_margin_warn: 4\ngain_margin_fail: 3.5\n");

        assertThat(plain.exitCode()).as(plain.out() + plain.err()).isEqualTo(0);
        assertThat(strict.exitCode()).as(strict.err()).isEqualTo(1);
        assertThat(strict.out()).contains("verdict: FAIL", "below 3.5 (the fail threshold)");
    }

    /**
     * The same process at a 0.01 s scan with Kc 15: theta about 1.005 s, w180 = (pi/2)/theta =
     * 1.563 rad/s, GM = 10 w180 / Kc = 1.04 and PM = 90 deg - theta Kc/10 rad = 3.6 deg (derived as
     * above). The laxest policy loopform accepts (Ms 10, GM 1.1, PM 5 deg: loopform policy, common
     * practice) still fails it: no policy passes a loop at the edge of instability.
     */
    @Test
    void the_laxest_policy_allowed_still_fails_a_loop_at_the_edge_of_instability() throws IOException {
        Path loop = Files.writeString(dir.resolve("edge.yaml"), LOOP.replace("kc: 5", "kc: 15")
                .replace("scan: 0.1 s", "scan: 0.01 s"));
        Path lax = Files.writeString(dir.resolve("lax.yaml"), """
                ms_warn: 10
                ms_fail: 10
                gain_margin_warn: 1.1
                gain_margin_fail: 1.1
                phase_margin_warn_deg: 5
                phase_margin_fail_deg: 5
                delay_margin_warn_scans: 0
                delay_margin_fail_scans: 0
                """);
        CliRun run = CliRun.of("check", loop.toString(), "--policy", lax.toString());

        assertThat(run.exitCode()).as(run.out() + run.err()).isEqualTo(1);
        assertThat(run.out()).contains("verdict: FAIL", "below 1.1 (the fail threshold)",
                "below 5 deg (the fail threshold)");

        CliRun laxer = check("gain_margin_warn: 1\ngain_margin_fail: 1\n");
        assertThat(laxer.exitCode()).isEqualTo(2);
        assertThat(laxer.err()).contains("policy.yaml:2: gain_margin_fail: must not be below 1.1");
    }

    @Test
    void a_fail_threshold_laxer_than_its_warning_is_exit_2_naming_the_key_and_line() throws IOException {
        CliRun run = check("ms_warn: 2\nphase_margin_fail_deg: 40\n");

        assertThat(run.exitCode()).isEqualTo(2);
        assertThat(run.out()).isEmpty();
        assertThat(run.err()).contains("policy.yaml:2: phase_margin_fail_deg: must not be above phase_margin_warn_deg");
    }

    @Test
    void a_warning_moved_past_the_default_fail_threshold_points_at_the_warning_line() throws IOException {
        CliRun run = check("ms_warn: 3.5\n");

        assertThat(run.exitCode()).isEqualTo(2);
        assertThat(run.err()).contains("policy.yaml:1: ms_fail: must not be below ms_warn", "raise ms_fail");
    }

    @Test
    void a_value_that_is_not_a_number_is_exit_2_naming_the_key() throws IOException {
        CliRun run = check("delay_margin_fail_scans: one\n");

        assertThat(run.exitCode()).isEqualTo(2);
        assertThat(run.err()).contains("policy.yaml:1: delay_margin_fail_scans: must be a number (got 'one')");
    }

    @Test
    void a_negative_value_is_exit_2_naming_the_key() throws IOException {
        CliRun run = check("overshoot_rise_warn_pct: -2\n");

        assertThat(run.exitCode()).isEqualTo(2);
        assertThat(run.err()).contains("policy.yaml:1: overshoot_rise_warn_pct: must be a number >= 0");
    }

    @Test
    void an_unknown_key_is_exit_2() throws IOException {
        CliRun run = check("gain_margin_failure: 1.2\n");

        assertThat(run.exitCode()).isEqualTo(2);
        assertThat(run.err()).contains("gain_margin_failure");
    }

    @Test
    void the_help_lists_every_policy_key_with_its_default() {
        CliRun run = CliRun.of("check", "--help");

        assertThat(run.exitCode()).isEqualTo(0);
        String help = run.out().replaceAll("\\s+", " ");
        for (PolicyKey k : PolicyKey.values()) {
            assertThat(help).contains(k.id() + " = " + org.loopform.units.Numbers.plain(k.defaultValue()) + " "
                    + k.unit() + ": ");
        }
        assertThat(help).contains("gain_margin_fail = 1.5 ratio: as-left gain margin below which the loop fails");
    }
}

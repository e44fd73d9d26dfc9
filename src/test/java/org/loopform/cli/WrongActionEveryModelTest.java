package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * A reverse-acting tuning (positive kc) on a process whose low-frequency gain is negative is positive
 * feedback (Astrom and Murray, Feedback Systems, 2008, ch. 1; direct and reverse action: common
 * practice), for every process model, in {@code convert --process} and in {@code audit}; a process
 * whose gain is positive must not be flagged. The sign is that of the steady-state gain, or of the
 * slope for an integrating process, derived by hand for each invented process below:
 *
 * <ul>
 *   <li>fopdt gain -1, sopdt gain -2: the gain itself;</li>
 *   <li>integrating slope -0.02 %/s per %, with or without a lag: the slope;</li>
 *   <li>tf (s - 1)/(600 s^2 + 70 s + 1): num(0)/den(0) = -1/1, negative although the leading
 *       coefficient is positive (a right-half-plane zero);</li>
 *   <li>tf -0.02/s: an integrator whose slope is -0.02;</li>
 *   <li>tf 1/(-60 s - 1) = -1/(60 s + 1): num(0)/den(0) = 1/(-1) = -1;</li>
 *   <li>tf -1/(-60 s - 1) = 1/(60 s + 1): gain +1, right for a reverse-acting controller;</li>
 *   <li>tf (1 - s)/(600 s^2 + 70 s + 1): num(0)/den(0) = +1, right although the leading coefficient of
 *       the numerator is negative.</li>
 * </ul>
 */
class WrongActionEveryModelTest {

    @TempDir
    Path dir;

    @ParameterizedTest(name = "{0}: wrong action {2}")
    @CsvSource(delimiter = '|', value = {
        "fopdt           | {model: fopdt, gain: -1, time_constant: 60 s, dead_time: 5 s}                   | true",
        "sopdt           | {model: sopdt, gain: -2, time_constant: 30 s, time_constant_2: 10 s, dead_time: 5 s} | true",
        "integrating     | {model: integrating, gain: -0.02, dead_time: 5 s}                              | true",
        "integrating lag | {model: integrating, gain: -0.02, lag: 10 s, dead_time: 5 s}                     | true",
        "tf rhp zero     | {model: tf, num: [1, -1], den: [600, 70, 1], dead_time: 5 s}                     | true",
        "tf integrator   | {model: tf, num: [-0.02], den: [1, 0], dead_time: 5 s}                           | true",
        "tf negative den | {model: tf, num: [1], den: [-60, -1], dead_time: 5 s}                            | true",
        "tf both negative| {model: tf, num: [-1], den: [-60, -1], dead_time: 5 s}                           | false",
        "tf positive dc  | {model: tf, num: [-1, 1], den: [600, 70, 1], dead_time: 5 s}                     | false",
    })
    void convert_and_audit_fail_a_controller_acting_the_wrong_way(String name, String process, boolean wrong)
            throws Exception {
        CliRun convert = CliRun.of("convert", "--from", "ideal", "--to", "ideal-pb-repeats", "kc=0.5", "ti=60", "td=0",
                "--process", process);
        if (wrong) {
            assertThat(convert.exitCode()).as("convert exit").isEqualTo(ExitCodes.FAILED_FINDING);
            assertThat(convert.out()).contains("[fail] action").contains("must be direct acting");
        } else {
            assertThat(convert.out()).doesNotContain("action:");
        }

        Path list = Files.writeString(dir.resolve("loops.yaml"), "# INVENTED EXAMPLE\nloops:\n"
                + "  - tag: XIC-910\n    process: " + process + "\n    tuning: {form: ideal, kc: 0.5, ti: 60, td: 0}\n"
                + "    target: {form: ideal, scan: 1 s}\n");
        Path out = dir.resolve("out");
        CliRun audit = CliRun.of("audit", list.toString(), "--out", out.toString());
        String json = Files.readString(out.resolve("loops.json"));
        if (wrong) {
            assertThat(audit.exitCode()).as("audit exit").isEqualTo(ExitCodes.FAILED_FINDING);
            assertThat(json).contains("\"topic\" : \"action\"").contains("must be direct acting");
        } else {
            assertThat(json).doesNotContain("\"topic\" : \"action\"");
        }
    }
}

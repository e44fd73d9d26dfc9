// plumbing: no published source needed
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.api.Test;

/**
 * Bad process values are bad input (exit 2) named by the user's key, file and line, never by a Java
 * name such as timeConstantSeconds.
 */
@DisplayName("messages about bad process values")
class UserKeysInMessagesTest {

    private static final String JAVA_NAMES = "(?s).*(timeConstantSeconds|deadTimeSeconds|dampingRatio|transferFunction"
            + "|naturalFrequencyRadPerSecond|slopePerSecond|lagSeconds|IllegalArgument).*";

    @TempDir
    Path dir;

    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
        "{model: fopdt, gain: 2, time_constant: -60 s, dead_time: 10 s}|time_constant",
        "{model: fopdt, gain: 2, time_constant: 60 s, dead_time: -1 s}|dead_time",
        "{model: fopdt, gain: 0, time_constant: 60 s}|gain",
        "{model: sopdt, gain: 2, damping: 0, natural_frequency: 0.1, dead_time: 1 s}|damping",
        "{model: sopdt, gain: 2, damping: 0.7, natural_frequency: -0.1}|natural_frequency",
        "{model: sopdt, gain: 2, time_constant: 60 s, time_constant_2: 0 s}|time_constant_2",
        "{model: integrating, gain: 0.01, lag: -3 s}|lag",
        "'{model: tf, num: [1, 0, 0], den: [1, 1]}'|num",
        "'{model: tf, num: [1], den: [0, 0]}'|den"})
    void check_names_the_users_key_and_line(String process, String key) throws Exception {
        Path loop = Files.writeString(dir.resolve("loop.yaml"), "tag: TIC-7\nprocess: " + process
                + "\ntuning: {form: ideal, kc: 1.2, ti: 60, td: 0}\ntarget: {form: ideal, scan: 0.5 s}\n");

        CliRun r = CliRun.of("check", loop.toString());

        assertThat(r.exitCode()).as(r.err()).isEqualTo(2);
        assertThat(r.err()).contains("loop.yaml:2").contains(key).doesNotMatch(JAVA_NAMES);
    }

    @Test
    void an_audit_row_names_its_column_and_line() throws Exception {
        Path list = Files.writeString(dir.resolve("loops.csv"), """
                tag,form,kc,ti,td,model,process_gain,time_constant,dead_time
                FIC-1,ideal,0.5,10,0,fopdt,1,5 s,1 s
                FIC-2,ideal,0.5,10,0,fopdt,1,-5 s,1 s
                FIC-3,ideal,0.5,10,0,fopdt,1,5 s,-1 s
                """);

        CliRun r = CliRun.of("audit", list.toString(), "--to", "ideal", "--scan", "1s");

        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.out()).contains("loops.csv:3: time_constant").contains("loops.csv:4: dead_time")
                .doesNotMatch(JAVA_NAMES);
    }

    @Test
    void a_policy_whose_fail_threshold_is_below_its_warning_names_the_key_and_line() throws Exception {
        Path loop = Files.writeString(dir.resolve("loop.yaml"), "tag: TIC-7\n"
                + "tuning: {form: ideal, kc: 1.2, ti: 60, td: 0}\ntarget: {form: ideal, scan: 0.5 s}\n");
        Path policy = Files.writeString(dir.resolve("policy.yaml"), "ms_warn: 2\nsampling_fail: 0.2\n");

        CliRun r = CliRun.of("check", loop.toString(), "--policy", policy.toString());

        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err()).contains("policy.yaml:2: sampling_fail").contains("sampling_warn");
    }
}

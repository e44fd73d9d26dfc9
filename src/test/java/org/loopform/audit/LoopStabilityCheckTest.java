package org.loopform.audit;

import org.loopform.check.Verdict;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.analysis.Stability;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.io.LoopFileReader;

/**
 * A check never passes a loop that is positive feedback. A controller whose low-frequency gain has
 * the opposite sign of the process's makes a positive-feedback loop (Astrom and Murray, Feedback
 * Systems, 2008, ch. 1; direct and reverse action: common practice); for every process model the
 * check must fail it with an action finding, and decide the target loop's stability from its poles.
 */
@DisplayName("A loop check of a controller acting in the wrong direction")
class LoopStabilityCheckTest {

    @TempDir
    Path dir;

    private CheckResult check(String process, String tuning) throws IOException {
        Path file = Files.writeString(dir.resolve("loop.yaml"), "tag: XIC-900\nprocess: " + process + "\ntuning: "
                + tuning + "\ntarget: {form: ideal, scan: 1 s}\nranges: {pv: 0..100, output: 0..100}\n");
        return LoopCheck.run(LoopFileReader.readOne(file, file.toString()), CheckPolicy.DEFAULT);
    }

    /**
     * Each process has a negative gain (or slope) and the tuning is reverse acting (positive kc):
     * positive feedback. For the self-regulating ones the loop gain at zero frequency is -kc K with
     * kc K >= 1 here, so 1 + L(0) <= 0: a real closed-loop pole in the right half plane (the
     * characteristic function changes sign along the positive real axis), whatever the dynamics.
     */
    @ParameterizedTest(name = "{0}")
    @CsvSource(delimiter = '|', value = {
        "fopdt        | {model: fopdt, gain: -1, time_constant: 60 s, dead_time: 5 s}",
        "sopdt        | {model: sopdt, gain: -2, time_constant: 30 s, time_constant_2: 10 s, dead_time: 3 s}",
        "integrating  | {model: integrating, gain: -0.05, dead_time: 5 s}",
        "tf           | {model: tf, num: [-1.5], den: [20, 1], dead_time: 2 s}",
    })
    void fails_with_an_action_finding_for_every_process_model(String model, String process) throws IOException {
        CheckResult r = check(process, "{form: ideal, kc: 2, ti: 60, td: 0}");
        assertThat(r.verdict()).isEqualTo(Verdict.FAIL);
        assertThat(r.findings()).anySatisfy(f -> {
            assertThat(f.topic()).isEqualTo(Topic.ACTION);
            assertThat(f.severity()).isEqualTo(Severity.FAIL);
            assertThat(f.message()).contains("must be direct acting").contains("reverse acting");
        });
        assertThat(r.targetStability().verdict()).isEqualTo(Stability.UNSTABLE);
        assertThat(r.designStability().verdict()).isEqualTo(Stability.UNSTABLE);
    }

    @Test
    void a_direct_acting_controller_on_a_negative_gain_process_raises_no_action_finding() throws IOException {
        CheckResult r = check("{model: fopdt, gain: -1, time_constant: 60 s, dead_time: 5 s}",
                "{form: ideal-pb-repeats, pb: 50, reset: 1, td: 0, action: direct}");
        assertThat(r.findings()).noneMatch(f -> f.topic() == Topic.ACTION);
        assertThat(r.targetStability().verdict()).isEqualTo(Stability.STABLE);
        assertThat(r.designStability().verdict()).isEqualTo(Stability.STABLE);
    }
}

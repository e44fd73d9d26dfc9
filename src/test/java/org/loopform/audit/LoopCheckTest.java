package org.loopform.audit;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.LoopFileReader;

/**
 * Pins one full check of the example loop TIC-104 (FOPDT 2, 60 s, 10 s; ideal PID carried to
 * ideal-pb-repeats at 0.5 s). The figures are those loopform computed before the check was made
 * faster; they guard against any change to the numbers, however the check is reorganized.
 */
@DisplayName("A loop check of TIC-104")
class LoopCheckTest {

    /** The check is deterministic; this only absorbs printing of the figures to 16 digits. */
    private static final double TOL = 1e-12;

    private static CheckResult check() throws IOException {
        String text = Files.readString(Path.of("examples/loops/tic-104.yaml"));
        return LoopCheck.run(LoopFileReader.parseAll(text, "tic-104.yaml").get(0), CheckPolicy.DEFAULT);
    }

    @Test
    void finds_the_margins_of_both_loops() throws IOException {
        CheckResult r = check();

        assertThat(r.designMargins().phaseMarginDegrees().getAsDouble()).isCloseTo(75.89283997033674, within(TOL));
        assertThat(r.designMargins().gainMargin().getAsDouble()).isCloseTo(4.206794330298586, within(TOL));
        assertThat(r.targetMargins().phaseMarginDegrees().getAsDouble()).isCloseTo(75.36148824711888, within(TOL));
        assertThat(r.targetMargins().gainMargin().getAsDouble()).isCloseTo(4.008956479785742, within(TOL));
        assertThat(r.targetMargins().maximumSensitivity()).isCloseTo(1.3460457569105635, within(TOL));
    }

    @Test
    void runs_both_loops_over_the_horizon_the_crossover_gives() throws IOException {
        CheckResult r = check();

        assertThat(r.targetRun().setpoint().size()).isEqualTo(1573);
        assertThat(r.designRun().load().size()).isEqualTo(7857);
        assertThat(r.referenceStepSeconds()).isEqualTo(0.1);
        assertThat(r.designSetpoint().integralAbsoluteErrorPercentSeconds()).isCloseTo(271.8478250181061, within(TOL));
        assertThat(r.targetSetpoint().integralAbsoluteErrorPercentSeconds()).isCloseTo(264.5737704852146, within(TOL));
        assertThat(r.targetSetpoint().overshootPercent().getAsDouble()).isCloseTo(0.610157346086595, within(TOL));
        assertThat(r.targetLoad().peakDeviationPercent()).isCloseTo(5.082564034171256, within(TOL));
        assertThat(r.targetLoad().settlingTimeSeconds().getAsDouble()).isCloseTo(242.3287813652547, within(TOL));
        assertThat(r.designLoad().outputTravelPercent()).isCloseTo(10.117452880643988, within(TOL));
    }

    @Test
    void compares_the_controllers_and_warns_about_the_spoiled_derivative() throws IOException {
        CheckResult r = check();

        assertThat(r.mismatch().gainDb()).isCloseTo(0.25384045878240913, within(TOL));
        assertThat(r.mismatch().phaseDegrees()).isCloseTo(3.9767695229403217, within(TOL));
        assertThat(r.verdict()).isEqualTo(Verdict.WARN);
        assertThat(r.findings()).singleElement().satisfies(f -> assertThat(f.message()).contains("N h / Td = 1.25"));
    }
}

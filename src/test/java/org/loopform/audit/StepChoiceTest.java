package org.loopform.audit;

import org.loopform.check.Verdict;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.io.LoopFileReader;

/**
 * The steps a check chooses and what it says when the controller output reaches a limit. The
 * form "ideal" has output limits 0..100 % and b = 1 (proportional action on the setpoint); the
 * operating point is 50 % PV and 50 % output; steps are cut to keep the linear loop within 80 %
 * of the room to each limit, never below 1 % (loopform policy, {@code simulate.StepTest}; small steps that
 * keep a bump test linear are common practice). Expected outputs are worked out by hand beside each check.
 */
@DisplayName("step choice and saturation")
class StepChoiceTest {

    private static CheckResult check(String yaml) {
        return LoopCheck.run(LoopFileReader.parseAll(yaml, "steps.yaml").get(0), CheckPolicy.DEFAULT);
    }

    private static List<Finding> limits(CheckResult r) {
        return r.findings().stream().filter(f -> f.topic() == Topic.LIMITS).toList();
    }

    /**
     * FOPDT gain 0.01 %/%, 10 s, 1 s; PI Kc 50, Ti 10 s (loop gain 0.5 e^(-s)/(10 s): GM about 31,
     * stable). To hold the PV 1 % higher the output must rise by 1/0.01 = 100 % of span, but it has
     * only 50 % above the operating point: even the smallest step, 1 %, must saturate the output at
     * 100 %. With the output at most 100 % the PV cannot pass 50 + 0.01 x (100 - 50) = 50.5 %, half
     * of the 1 % step; the run (30 / crossover = 30 / (Kc K / Ti) = 600 s, 60 process time
     * constants) is long enough for it to get there, within the last integral increments that the
     * clamping anti-windup withholds (ki h e = 5 x 0.5 x e with e just over 0.5 %: about 1.3 % of output,
     * 0.013 % of PV; allow 0.015 %).
     */
    @Test
    void a_step_that_needs_more_output_than_the_range_has_saturates_and_says_what_the_pv_reached() {
        CheckResult r = check("tag: XIC-3\nprocess: {model: fopdt, gain: 0.01, time_constant: 10 s, dead_time: 1 s}\n"
                + "tuning: {form: ideal, kc: 50, ti: 10, td: 0}\ntarget: {form: ideal, scan: 0.5 s}\n");

        assertThat(r.steps().setpointStepPercent()).isEqualTo(1.0);
        assertThat(limits(r)).anySatisfy(f -> {
            assertThat(f.severity()).isEqualTo(Severity.WARN);
            assertThat(f.message()).contains("The 1 % setpoint step saturates the controller output at 100 %",
                    "% of the way to its 51 % setpoint", "smallest loopform tries (1 %)");
        });
        var sp = r.targetRun().setpoint();
        assertThat(sp.processValuePercent(sp.size() - 1)).isBetween(50.5 - 0.015, 50.5 + 1e-9);
        assertThat(r.verdict()).isNotEqualTo(Verdict.PASS);
    }

    /**
     * P-only, Kc 5, FOPDT 1, 10 s, 1 s (GM about 3.3, stable): a setpoint step of S moves the
     * output at once by Kc S, and the PV does not move for the 1 s dead time, so the 10 % step puts
     * the output at 50 + 50 = 100 %, on its limit. The linear output's largest rise is that kick,
     * 50 points; 80 % of the 50 points of room is 40, so the step becomes 10 x 40/50 = 8 %, whose
     * kick (40 points, to 90 %) stays off the limit.
     */
    @Test
    void a_step_whose_proportional_kick_reaches_the_limit_is_cut_to_stay_linear() {
        CheckResult r = check("tag: XIC-4\nprocess: {model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}\n"
                + "tuning: {form: ideal, kc: 5, ti: 0, td: 0}\ntarget: {form: ideal, scan: 0.1 s}\n");

        assertThat(r.steps().setpointStepPercent()).isCloseTo(8.0, within(1e-12));
        assertThat(r.steps().loadStepPercent()).isEqualTo(10.0);
        assertThat(r.targetRun().setpoint().controllerOutputPercent(0)).isCloseTo(90.0, within(1e-9));
        assertThat(limits(r)).singleElement().satisfies(f -> {
            assertThat(f.severity()).isEqualTo(Severity.INFO);
            assertThat(f.message()).contains("A 10 % setpoint step would drive the controller output beyond its"
                    + " range of 0..100 % (without limits the output would reach 100 %)", "uses a 8 % setpoint step");
        });
    }

    @Test
    void the_steps_used_are_stated_in_text_and_json() {
        CheckResult r = check("tag: XIC-4\nprocess: {model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}\n"
                + "tuning: {form: ideal, kc: 5, ti: 0, td: 0}\ntarget: {form: ideal, scan: 0.1 s}\n");

        assertThat(org.loopform.report.CheckReport.text(r)).contains("Steps of 8 % (setpoint) and 10 % at the process"
                + " input (load)");
        assertThat(org.loopform.report.CheckReport.json(r)).contains("\"setpoint_pct\" : 8.0", "\"load_pct\" : 10.0");
    }

    @Test
    void a_loop_whose_steps_stay_off_the_limits_keeps_the_10_percent_steps() {
        // FOPDT 1, 10 s, 1 s; PI Kc 1, Ti 10 s: the kick is 10 points and the final output change
        // 10 points (gain 1): far from either limit.
        CheckResult r = check("tag: XIC-5\nprocess: {model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}\n"
                + "tuning: {form: ideal, kc: 1, ti: 10, td: 0}\ntarget: {form: ideal, scan: 0.1 s}\n");

        assertThat(r.steps().setpointStepPercent()).isEqualTo(10.0);
        assertThat(r.steps().loadStepPercent()).isEqualTo(10.0);
        assertThat(limits(r)).isEmpty();
    }
}

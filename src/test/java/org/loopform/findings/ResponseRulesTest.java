package org.loopform.findings;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import java.util.Map;
import java.util.OptionalDouble;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.StepMetrics;

/**
 * The response-change rules against hand-made step figures. The thresholds are the policy
 * defaults (loopform policy, common practice; {@link PolicyKey}): overshoot 50 % and 2 points of
 * the step worse, settling 50 % and 2 scans longer, IAE 25 % more, load peak 25 % and 1 % of the
 * load step more. Each case below works the rule out by hand in its comment.
 */
@DisplayName("response-change rules")
class ResponseRulesTest {

    private static final double SCAN_SECONDS = 1.0;
    private static final double LOAD_STEP_PERCENT = 10.0;

    private static final LoopMargins STABLE = RobustnessRulesTest.margins(5, 60, 20, 1.3);

    /** Setpoint figures: IAE 800 %*s, the given overshoot and settling; load: IAE 700 %*s, peak 2.6 %. */
    private static StepMetrics setpoint(double overshootPercent, Double settlingSeconds) {
        return setpoint(800, overshootPercent, settlingSeconds);
    }

    private static StepMetrics setpoint(double iae, double overshootPercent, Double settlingSeconds) {
        return new StepMetrics(iae, OptionalDouble.of(overshootPercent),
                settlingSeconds == null ? OptionalDouble.empty() : OptionalDouble.of(settlingSeconds), 10, 12);
    }

    private static StepMetrics load(double iae, double peakPercent) {
        return new StepMetrics(iae, OptionalDouble.empty(), OptionalDouble.of(300), peakPercent, 10);
    }

    private static List<Finding> compare(StepMetrics designSp, StepMetrics targetSp, StepMetrics designLoad,
                                         StepMetrics targetLoad, CheckPolicy policy) {
        return ResponseRules.evaluate(new ResponseRules.Inputs(true, designSp, targetSp, designLoad,
                targetLoad, SCAN_SECONDS, 1000, LOAD_STEP_PERCENT), policy);
    }

    private static List<Finding> setpointOnly(StepMetrics design, StepMetrics target) {
        return compare(design, target, load(700, 2.6), load(700, 2.6), CheckPolicy.DEFAULT);
    }

    @Test
    void equal_responses_raise_nothing() {
        assertThat(setpointOnly(setpoint(1, 238.0), setpoint(1, 238.0))).isEmpty();
    }

    @Test
    void a_tiny_overshoot_that_triples_is_not_flagged() {
        // 0.1 % -> 0.3 % of the step: 200 % more, but only 0.2 points, under the 2-point absolute part
        assertThat(setpointOnly(setpoint(0.1, 238.0), setpoint(0.3, 238.0))).isEmpty();
    }

    @Test
    void an_overshoot_from_1_to_3_8_percent_is_flagged_with_both_figures() {
        // 1 % -> 3.8 %: 280 % more (> 50 %) and 2.8 points (> 2)
        assertThat(setpointOnly(setpoint(1, 238.0), setpoint(3.8, 238.0))).singleElement().satisfies(f -> {
            assertThat(f.topic()).isEqualTo(Topic.RESPONSE);
            assertThat(f.severity()).isEqualTo(Severity.WARN);
            assertThat(f.figure()).isEqualTo(3.8);
            assertThat(f.threshold()).isEqualTo(3.0); // max(1 x 1.5, 1 + 2)
            assertThat(f.message()).contains("1 % of the step as found, 3.8 % as left");
        });
    }

    @Test
    void a_large_overshoot_a_little_larger_is_not_flagged() {
        // 20 % -> 24 %: 4 points but only 20 % more, under the 50 % relative part
        assertThat(setpointOnly(setpoint(20, 500.0), setpoint(24, 500.0))).isEmpty();
    }

    @Test
    void settling_from_238_to_481_s_is_flagged() {
        // 481 / 238 = 2.02: 102 % longer (> 50 %) and 243 s (> 2 scans of 1 s)
        assertThat(setpointOnly(setpoint(1, 238.0), setpoint(1, 481.0))).singleElement().satisfies(f -> {
            assertThat(f.topic()).isEqualTo(Topic.RESPONSE);
            assertThat(f.unit()).isEqualTo("s");
            assertThat(f.message()).contains("after 238 s as found, 481 s as left (102 % longer)");
        });
    }

    @Test
    void settling_just_under_and_over_half_as_long_again() {
        // 238 x 1.5 = 357 s
        assertThat(setpointOnly(setpoint(1, 238.0), setpoint(1, 356.0))).isEmpty();
        assertThat(setpointOnly(setpoint(1, 238.0), setpoint(1, 358.0))).hasSize(1);
    }

    @Test
    void settling_a_scan_longer_on_a_fast_loop_is_the_scan_s_resolution_not_a_change() {
        // 1.0 s -> 2.5 s is 150 % longer, but 1.5 s is under 2 scans of 1 s
        assertThat(setpointOnly(setpoint(1, 1.0), setpoint(1, 2.5))).isEmpty();
    }

    @Test
    void a_target_that_never_settles_where_the_design_does_is_flagged() {
        assertThat(setpointOnly(setpoint(1, 238.0), setpoint(1, null))).singleElement().satisfies(f ->
                assertThat(f.message()).contains("does not settle within 2 % of the setpoint step in the 1000 s",
                        "as-found loop settles in 238 s"));
    }

    @Test
    void iae_of_either_step_flagged_past_a_quarter_more() {
        // setpoint 800 -> 990 %*s: 23.75 % more, not flagged; 800 -> 1010: 26.25 %, flagged
        assertThat(setpointOnly(setpoint(800, 1, 238.0), setpoint(990, 1, 238.0))).isEmpty();
        assertThat(setpointOnly(setpoint(800, 1, 238.0), setpoint(1010, 1, 238.0))).singleElement()
                .satisfies(f -> assertThat(f.message()).contains("setpoint step's integrated absolute error (IAE)"
                        + " rises from 800 %*s as found to 1010 %*s"));
        // load 700 -> 900 %*s: 28.6 % more
        assertThat(compare(setpoint(1, 238.0), setpoint(1, 238.0), load(700, 2.6), load(900, 2.6),
                CheckPolicy.DEFAULT)).singleElement().satisfies(f -> assertThat(f.message())
                .contains("load step's integrated absolute error", "rejects the load less well"));
    }

    @Test
    void load_peak_needs_both_a_quarter_more_and_a_percent_of_the_load_step() {
        StepMetrics sp = setpoint(1, 238.0);
        // 2.6 -> 3.3 % of span: 26.9 % more (> 25 %) and 0.7 points (> 1 % of a 10 % step = 0.1)
        assertThat(compare(sp, sp, load(700, 2.6), load(700, 3.3), CheckPolicy.DEFAULT)).singleElement()
                .satisfies(f -> assertThat(f.message()).contains("peak deviation of 2.6 % of span as found,"
                        + " 3.3 % as left"));
        // 0.04 -> 0.08 %: 100 % more but 0.04 points, under 0.1
        assertThat(compare(sp, sp, load(700, 0.04), load(700, 0.08), CheckPolicy.DEFAULT)).isEmpty();
    }

    @Test
    void a_policy_file_can_loosen_a_rule() {
        CheckPolicy loose = CheckPolicy.DEFAULT.with(Map.of("settling_rise_warn", 1.5));
        // 481 / 238 = 2.02 < 2.5
        assertThat(compare(setpoint(1, 238.0), setpoint(1, 481.0), load(700, 2.6), load(700, 2.6), loose)).isEmpty();
    }

    @Test
    void an_unstable_loop_s_responses_are_not_compared() {
        assertThat(ResponseRules.evaluate(new ResponseRules.Inputs(false, setpoint(1, 238.0),
                setpoint(50, null), load(700, 2.6), load(7000, 26), SCAN_SECONDS, 1000, LOAD_STEP_PERCENT),
                CheckPolicy.DEFAULT)).isEmpty();
    }
}

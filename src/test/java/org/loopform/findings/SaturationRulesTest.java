package org.loopform.findings;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;
import org.loopform.simulate.SampledResponse;
import org.loopform.simulate.StepTest;
import org.loopform.simulate.StepTest.OutputExtremes;

/**
 * The saturation rules on hand-made runs of four samples (operating point 50 % PV, 50 % output,
 * limits 0..100 %). Source: plumbing of the rule's arithmetic; the figures are invented and the
 * expected words follow from them by hand.
 */
class SaturationRulesTest {

    private static final double[] TIMES = {0, 10, 20, 30};

    /** A setpoint run that stays off the limits (output 50..70 %, PV to 60 %). */
    private static final SampledResponse QUIET_SETPOINT = SampledResponse.of(TIMES, new double[] {50, 55, 59, 60},
            new double[] {70, 65, 60, 60});

    @Test
    void a_load_step_that_drives_the_output_to_0_and_leaves_an_offset_is_a_warning() {
        // a 10 % load at the process input needs the output 10 points lower; here it stops at 0 %
        // and the PV ends 2 % above its 50 % setpoint: 2 % is beyond the 2 % x 10 % = 0.2 % band
        SampledResponse load = SampledResponse.of(TIMES, new double[] {50, 53, 52.5, 52}, new double[] {50, 20, 0, 0});
        StepTest steps = StepTest.standard(30);

        assertThat(SaturationRules.evaluate(new SaturationRules.Inputs(steps, steps, QUIET_SETPOINT, load, null, null,
                0, 100))).singleElement().satisfies(f -> {
                    assertThat(f.topic()).isEqualTo(Topic.LIMITS);
                    assertThat(f.severity()).isEqualTo(Severity.WARN);
                    assertThat(f.message()).contains("The 10 % load step saturates the controller output at 0 %",
                            "the PV ended 2 % of span off its setpoint after the 30 s run");
                });
    }

    @Test
    void a_setpoint_step_that_touches_the_limit_but_still_arrives_says_so() {
        // PV 50 -> 59.9 % of a 60 % setpoint: 99 % of the step, within the 2 % settling band
        SampledResponse sp = SampledResponse.of(TIMES, new double[] {50, 56, 59.5, 59.9},
                new double[] {100, 80, 62, 61});
        SampledResponse load = SampledResponse.of(TIMES, new double[] {50, 50.5, 50.2, 50}, new double[] {50, 45, 41,
                40});
        StepTest steps = StepTest.standard(30);

        assertThat(SaturationRules.evaluate(new SaturationRules.Inputs(steps, steps, sp, load, null, null, 0, 100)))
                .singleElement().satisfies(f -> assertThat(f.message()).contains("setpoint step saturates the"
                        + " controller output at 100 %", "the PV still reached its 60 % setpoint within the 30 s run"));
    }

    @Test
    void a_step_made_smaller_is_a_note_with_the_output_the_linear_loop_needed() {
        StepTest standard = StepTest.standard(30);
        StepTest used = standard.scaledToStayWithin(new OutputExtremes(50, 150), new OutputExtremes(40, 50), 0, 100);
        // rise 100 points: 10 x 40/100 = 4 %
        SampledResponse sp = SampledResponse.of(TIMES, new double[] {50, 52, 53.9, 54}, new double[] {70, 62, 59, 58});
        SampledResponse load = SampledResponse.of(TIMES, new double[] {50, 50.5, 50.2, 50}, new double[] {50, 45, 41,
                40});

        assertThat(SaturationRules.evaluate(new SaturationRules.Inputs(standard, used, sp, load,
                new OutputExtremes(50, 150), new OutputExtremes(40, 50), 0, 100))).singleElement().satisfies(f -> {
                    assertThat(f.severity()).isEqualTo(Severity.INFO);
                    assertThat(f.message()).contains("A 10 % setpoint step would drive the controller output beyond"
                            + " its range of 0..100 % (without limits the output would reach 150 %), so the check uses"
                            + " a 4 % setpoint step");
                });
    }
}

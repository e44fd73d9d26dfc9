package org.loopform.simulate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.simulate.StepTest.OutputExtremes;

/**
 * Scaling the standard steps so a linear loop's output stays off its limits (loopform policy:
 * at most 80 % of the room between the 50 % operating output and each limit of 0..100 %, i.e. 40
 * points either way; rounded down to 0.1 %; never below 1 %). A linear loop's output excursion
 * scales with its step, so a 10 % step whose output rose by R points is cut to 10 x 40 / R
 * (common practice: superposition).
 */
class StepTestTest {

    @ParameterizedTest(name = "output {0}..{1} % at 10 % -> {2} %")
    @CsvSource({
            // rise 80 points: 10 x 40/80 = 5 %
            "50, 130, 5.0",
            // fall 80 points: 5 %
            "-30, 50, 5.0",
            // rise 45: 10 x 40/45 = 8.89, rounded down to 8.8 %
            "48, 95, 8.8",
            // both ways, the fall (60) decides: 10 x 40/60 = 6.67 -> 6.6 %
            "-10, 80, 6.6",
            // within 40 points either way: kept
            "15, 89, 10.0",
            // rise 2000 points: 0.2 %, raised to the 1 % floor
            "50, 2050, 1.0"})
    void the_setpoint_step_shrinks_with_the_room_its_output_needs(double lowest, double highest, double expected) {
        StepTest standard = StepTest.standard(100);
        StepTest scaled = standard.scaledToStayWithin(new OutputExtremes(lowest, highest), new OutputExtremes(45, 55),
                0, 100);

        assertThat(scaled.setpointStepPercent()).isCloseTo(expected, within(1e-12));
        assertThat(scaled.loadStepPercent()).isEqualTo(10.0);
        assertThat(scaled.horizonSeconds()).isEqualTo(100);
    }

    @ParameterizedTest(name = "load output {0}..{1} % -> {2} %")
    @CsvSource({"0, 50, 8.0", "40, 50, 10.0"})
    void the_load_step_scales_on_its_own(double lowest, double highest, double expected) {
        // fall 50 points: 10 x 40/50 = 8 %
        StepTest scaled = StepTest.standard(100).scaledToStayWithin(new OutputExtremes(45, 55),
                new OutputExtremes(lowest, highest), 0, 100);

        assertThat(scaled.loadStepPercent()).isCloseTo(expected, within(1e-12));
        assertThat(scaled.setpointStepPercent()).isEqualTo(10.0);
    }

    @ParameterizedTest(name = "{0}..{1} reaches 0..100: {2}")
    @CsvSource({"0, 50, true", "50, 100, true", "0.001, 99.999, false"})
    void output_extremes_reach_a_limit_when_they_touch_it(double lowest, double highest, boolean expected) {
        assertThat(new OutputExtremes(lowest, highest).reaches(0, 100)).isEqualTo(expected);
    }

    @ParameterizedTest(name = "limits {0}..{1} % -> operating output {2} %")
    @CsvSource({
            // 50 % with 10 points of room either way: kept (common practice: a bump test about mid-range)
            "0, 100, 50",
            "40, 60, 50",
            // 50 % outside the limits, or without room for a step: the middle of the limits, (lo + hi) / 2
            "60, 100, 80",
            "0, 40, 20",
            "45, 100, 72.5"
    })
    void the_operating_output_lies_inside_the_output_limits(double low, double high, double expected) {
        StepTest t = StepTest.standard(100, low, high);
        assertThat(t.operatingOutputPercent()).isEqualTo(expected);
        assertThat(t.operatingPvPercent()).isEqualTo(50);
        assertThat(t.setpointStepPercent()).isEqualTo(10);
    }
}

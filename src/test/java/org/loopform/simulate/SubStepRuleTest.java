package org.loopform.simulate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.loopform.lti.TransferFunction;

/**
 * How finely the PV is followed between scans: LoopSimulator's rule (loopform policy, derived by hand here);
 * the bound on a smooth peak read between samples, max|y''| d^2 / 8, is the textbook error of linear
 * interpolation (common practice).
 */
class SubStepRuleTest {

    @Test
    void a_process_without_oscillation_is_followed_on_a_thousandth_of_the_horizon() {
        TransferFunction lag = TransferFunction.ofDescending(new double[] {1}, new double[] {10, 1});
        assertThat(LoopSimulator.subStepSeconds(lag, StepTest.standard(150))).isCloseTo(0.15, within(1e-12));
    }

    /**
     * s^2 + 0.1 s + 4 has poles -0.05 +- i sqrt(3.9975) (quadratic formula), an oscillation of
     * about 2 rad/s: 0.25 rad of it is 0.125 s, finer than 150 s / 1000.
     */
    @Test
    void a_lightly_damped_process_gets_a_quarter_radian_of_its_oscillation_per_sub_step() {
        TransferFunction resonant = TransferFunction.ofDescending(new double[] {4}, new double[] {1, 0.1, 4});
        assertThat(LoopSimulator.subStepSeconds(resonant, StepTest.standard(150)))
                .isCloseTo(0.25 / Math.sqrt(3.9975), within(1e-9));
    }

    /** A very fast oscillation is not chased below horizon / 200000: the cost stays bounded. */
    @Test
    void the_sub_step_has_a_floor() {
        TransferFunction fast = TransferFunction.ofDescending(new double[] {1e8}, new double[] {1, 1, 1e8});
        assertThat(LoopSimulator.subStepSeconds(fast, StepTest.standard(150))).isCloseTo(150.0 / 200_000,
                within(1e-15));
    }
}

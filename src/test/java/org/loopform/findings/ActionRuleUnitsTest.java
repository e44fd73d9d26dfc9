// source: Astrom & Murray, Feedback Systems, 2008, ch. 1 (negative feedback); the low-frequency gains and their units derived by hand below
package org.loopform.findings;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;
import org.loopform.law.PidTerms;

/**
 * The wrong-action finding names the process's low-frequency gain lim s^q G(s) in the unit that
 * q gives it. A reverse-acting PI (p 1, i 0.1/s) on:
 * <ul>
 *   <li>G = -0.001/s^2 (q = 2): s^2 G -> -0.001, in %/s^2 per %;</li>
 *   <li>G = -s/(10 s + 1) (q = -1): G/s -> -1, in % s per % (the PV follows the output's rate);</li>
 *   <li>G = -2/(60 s + 1) (q = 0): -2 %/%; G = -0.02/s (q = 1): -0.02 %/s per %.</li>
 * </ul>
 * In every case the controller's low-frequency gain i = 0.1 has the other sign: positive feedback.
 */
class ActionRuleUnitsTest {

    private static final PidTerms REVERSE_PI = new PidTerms(1, 0.1, 0, 0, 1, 0);

    @Test
    void each_process_order_at_zero_frequency_has_its_own_unit() {
        assertThat(ActionRule.check(REVERSE_PI, -0.001, 2)).hasValueSatisfying(f -> {
            assertThat(f.severity()).isEqualTo(Severity.FAIL);
            assertThat(f.unit()).isEqualTo("%/s^2 per %");
            assertThat(f.message()).contains("a low-frequency process gain of -0.001 %/s^2 per %", "must be direct");
        });
        assertThat(ActionRule.check(REVERSE_PI, -1, -1)).hasValueSatisfying(f -> {
            assertThat(f.unit()).isEqualTo("% s per %");
            assertThat(f.message()).contains("a low-frequency process gain of -1 % s per %");
        });
        assertThat(ActionRule.check(REVERSE_PI, -2, 0)).hasValueSatisfying(f ->
                assertThat(f.message()).contains("a process gain of -2 %/%"));
        assertThat(ActionRule.check(REVERSE_PI, -0.02, 1)).hasValueSatisfying(f ->
                assertThat(f.message()).contains("a process slope of -0.02 %/s per %"));
    }

    @Test
    void the_right_direction_raises_nothing() {
        assertThat(ActionRule.check(REVERSE_PI, 0.001, 2)).isEmpty();
        assertThat(ActionRule.check(REVERSE_PI, 1, -1)).isEmpty();
    }
}

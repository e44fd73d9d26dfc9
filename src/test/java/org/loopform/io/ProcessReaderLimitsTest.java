// source: the definition of a proper transfer function, degree of numerator <= degree of denominator (Astrom & Murray, Feedback Systems, 2008, ch. 8; from memory), the coefficients as written in each test (highest power first), and the natural-frequency limits the refusal itself states (1e-7 rad/s to 1e6 rad/s, the inverse of the time limits)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.loopform.process.GeneralTransferFunction;
import org.loopform.process.ProcessModel;
import org.loopform.process.SecondOrderPlusDeadTime;

/** Process blocks at the edges of what is accepted: equal degrees, a constant denominator, a slow natural frequency. */
class ProcessReaderLimitsTest {

    private static ProcessModel read(String inline) {
        return ProcessReader.fromOption(inline, "--process", null, null);
    }

    // (s + 1) / (10 s + 1): degree 1 over 1, proper (biproper)
    @Test
    void a_numerator_of_the_denominator_s_degree_is_proper() {
        GeneralTransferFunction g = (GeneralTransferFunction) read("{model: tf, num: [1, 1], den: [10, 1]}");
        assertThat(g.transferFunction().numerator().ascending()).containsExactly(1.0, 1.0);
        assertThat(g.transferFunction().denominator().ascending()).containsExactly(1.0, 10.0);
    }

    // 3 / 2: degree 0 over 0, a pure gain, proper
    @Test
    void a_constant_over_a_constant_is_proper() {
        GeneralTransferFunction g = (GeneralTransferFunction) read("{model: tf, num: [3], den: [2]}");
        assertThat(g.transferFunction().denominator().ascending()).containsExactly(2.0);
    }

    // 5e-7 rad/s lies within 1e-7..1e6 rad/s; its period 1 / 5e-7 = 2e6 s
    @Test
    void a_slow_natural_frequency_within_the_stated_limits_is_read() {
        SecondOrderPlusDeadTime s = (SecondOrderPlusDeadTime) read(
                "{model: sopdt, gain: 1, damping: 0.7, natural_frequency: 5e-7}");
        assertThat(s.naturalFrequencyRadPerSecond()).isCloseTo(5e-7, within(1e-22));
    }
}

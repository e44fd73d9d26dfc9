// source: the series-to-ideal relation Ti = Ti' + Td' and Ti = kp / ki (Astrom & Hagglund, PID Controllers, 1995, sec. 3.4), worked by hand below
package org.loopform.scan;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.form.Discretization;
import org.loopform.form.PidSetting;
import org.loopform.form.Structure;

/** The integral time a scan is measured against: the law's, in the ideal form's terms, and h / Ti. */
@DisplayName("scan facts: the integral")
class ScanFactsIntegralTest {

    private static ScanFacts at(PidSetting s, double scanSeconds) {
        return ScanFacts.of(s, Discretization.BACKWARD, scanSeconds);
    }

    // ideal Kc 2, Ti 0.5 s at h = 1 s: h / Ti = 2.
    @Test
    void ideal_integral_time_is_its_own() {
        ScanFacts f = at(new PidSetting(Structure.IDEAL, 2, 0.5, 0, 0, 1, 0), 1.0);

        assertThat(f.integralTimeSeconds()).isEqualTo(0.5);
        assertThat(f.integralStepRatio()).isCloseTo(2.0, within(1e-12));
    }

    // series Kc' 1, Ti' 0.5 s, Td' 0.3 s: the ideal equivalent has Ti = 0.5 + 0.3 = 0.8 s; at h = 1 s, 1.25.
    @Test
    void series_integral_time_is_the_ideal_equivalents() {
        ScanFacts f = at(new PidSetting(Structure.SERIES, 1, 0.5, 0.3, 0.03, 1, 0), 1.0);

        assertThat(f.integralTimeSeconds()).isCloseTo(0.8, within(1e-12));
        assertThat(f.integralStepRatio()).isCloseTo(1.25, within(1e-12));
    }

    // parallel kp 2 %/%, ki 4 /s: Ti = kp / ki = 0.5 s, and the same with both signs turned (direct action).
    @Test
    void parallel_integral_time_is_kp_over_ki() {
        assertThat(at(new PidSetting(Structure.PARALLEL, 2, 4, 0, 0, 1, 0), 1.0).integralTimeSeconds())
                .isCloseTo(0.5, within(1e-12));
        assertThat(at(new PidSetting(Structure.PARALLEL, -2, -4, 0, 0, 1, 0), 1.0).integralTimeSeconds())
                .isCloseTo(0.5, within(1e-12));
    }

    // No integral action (ki 0; ideal Ti infinite): an infinite integral time, h / Ti = 0.
    @Test
    void without_integral_action_the_ratio_is_zero() {
        ScanFacts parallel = at(new PidSetting(Structure.PARALLEL, 2, 0, 0, 0, 1, 0), 1.0);
        ScanFacts ideal = at(new PidSetting(Structure.IDEAL, 2, Double.POSITIVE_INFINITY, 0, 0, 1, 0), 1.0);

        assertThat(parallel.integralTimeSeconds()).isInfinite();
        assertThat(parallel.integralStepRatio()).isZero();
        assertThat(ideal.integralStepRatio()).isZero();
        assertThat(new ScanFacts(1.0, 0, 0, Discretization.BACKWARD).integralStepRatio()).isZero();
    }

    @Test
    void an_integral_time_must_be_positive() {
        assertThatThrownBy(() -> new ScanFacts(1.0, 0, 0, Discretization.BACKWARD, 0.0))
                .hasMessageContaining("integral time must be > 0 s");
        assertThatThrownBy(() -> new ScanFacts(1.0, 0, 0, Discretization.BACKWARD, Double.NaN))
                .hasMessageContaining("integral time must be > 0 s");
        assertThat(new ScanFacts(1.0, 0, 0, Discretization.BACKWARD, Double.MIN_VALUE).integralTimeSeconds())
                .isEqualTo(Double.MIN_VALUE);
    }
}

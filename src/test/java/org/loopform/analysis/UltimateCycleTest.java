// source: hand derivations and textbook examples named beside each check
package org.loopform.analysis;

import org.loopform.lti.FrequencyBand;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

@DisplayName("Ultimate cycle")
class UltimateCycleTest {

    private static final double RELATIVE = 1e-6;
    private static final FrequencyBand BAND = FrequencyBand.of(1e-3, 1e3);

    // Derived exactly: phase -3 atan(w) = -180 deg at w = sqrt(3), |P| = 1/(1 + 3)^(3/2) = 1/8.
    @Test
    void third_order_lag_has_ku_8_and_tu_2pi_over_sqrt3() {
        UltimateCycle cycle = UltimateCycle.of(LoopResponse.of(Loops.lag(3)), BAND);

        assertThat(cycle.ultimateGain()).isCloseTo(8.0, within(8.0 * RELATIVE));
        assertThat(cycle.ultimatePeriodSeconds())
                .isCloseTo(2 * Math.PI / Math.sqrt(3), within(RELATIVE * 2 * Math.PI / Math.sqrt(3)));
    }

    // Derived exactly: a pure dead time K e^(-s L) has |P| = K everywhere and phase -w L, -180 deg at
    // w = pi / L, 3 pi / L, 5 pi / L...: every crossing has Ku = 1 / K, and the loop at that gain
    // oscillates first at the lowest, Tu = 2 L (the classic result for a dead-time process).
    @Test
    void pure_dead_time_has_ku_one_over_k_and_tu_twice_the_dead_time() {
        for (double deadTime : new double[] {1, 7, 0.3}) {
            UltimateCycle cycle = UltimateCycle.of(LoopResponse.of(TransferFunction.gain(2), deadTime),
                    FrequencyBand.of(0.1 / deadTime, 30 / deadTime));

            assertThat(cycle.ultimateGain()).isCloseTo(0.5, within(0.5 * RELATIVE));
            assertThat(cycle.ultimatePeriodSeconds()).isCloseTo(2 * deadTime, within(RELATIVE * 2 * deadTime));
        }
    }

    // Derived exactly: -4 atan(w) = -180 deg at w = 1, |P| = 1/(sqrt 2)^4 = 1/4.
    @Test
    void fourth_order_lag_has_ku_4_and_tu_2pi() {
        UltimateCycle cycle = UltimateCycle.of(LoopResponse.of(Loops.lag(4)), BAND);

        assertThat(cycle.ultimateGain()).isCloseTo(4.0, within(4.0 * RELATIVE));
        assertThat(cycle.ultimatePeriodSeconds()).isCloseTo(2 * Math.PI, within(RELATIVE * 2 * Math.PI));
    }

    // Textbook example: Ogata, Modern Control Engineering, Ziegler-Nichols chapter (from memory):
    // 1/(s (s + 1)(s + 5)) gives Ku = 30 and wu = sqrt(5); derived exactly from the Routh array too.
    @Test
    void integrator_with_two_lags_has_ku_30_and_wu_sqrt5() {
        TransferFunction process = new TransferFunction(Polynomial.ONE, Polynomial.ofDescending(1, 6, 5, 0));

        UltimateCycle cycle = UltimateCycle.of(LoopResponse.of(process), BAND);

        assertThat(cycle.ultimateGain()).isCloseTo(30.0, within(30.0 * RELATIVE));
        assertThat(cycle.ultimateRadPerSecond()).isCloseTo(Math.sqrt(5), within(RELATIVE * Math.sqrt(5)));
        assertThat(cycle.ultimatePeriodSeconds()).isCloseTo(2.80993, within(1e-5));
    }

    // Derived exactly: e^(-s)/(s + 1) reaches -180 deg where w + atan(w) = pi, and Ku = sqrt(1 + w^2).
    @Test
    void first_order_with_dead_time_satisfies_its_phase_condition() {
        UltimateCycle cycle = UltimateCycle.of(LoopResponse.of(Loops.lag(1), 1.0), BAND);

        double w = cycle.ultimateRadPerSecond();
        assertThat(w + Math.atan(w)).isCloseTo(Math.PI, within(1e-8));
        assertThat(cycle.ultimateGain()).isCloseTo(Math.hypot(1, w), within(1e-8));
    }

    @Test
    void first_order_lag_has_no_ultimate_cycle() {
        assertThatThrownBy(() -> UltimateCycle.of(LoopResponse.of(Loops.lag(1)), BAND))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("-180 degrees")
                .hasMessageContaining("1000.0 rad/s");
    }

    @Test
    void record_rejects_a_non_positive_gain() {
        assertThatThrownBy(() -> new UltimateCycle(-1, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("got -1.0");
    }
}

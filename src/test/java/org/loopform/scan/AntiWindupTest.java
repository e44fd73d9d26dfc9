package org.loopform.scan;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.AntiWindup;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;

@DisplayName("Output limits and anti-windup")
class AntiWindupTest {

    private static final double TOL = 1e-9;

    /** PI with K = 0.5, Ti = 1 s, scan 1 s, backward integral: each scan adds 0.5 e to the integral. */
    private static ScanController pi(AlgorithmKind kind, AntiWindup antiWindup) {
        PidSetting s = Setups.ideal(0.5, 1.0, 0.0, 0.0, 1.0, 0.0);
        ScanController c = ScanController.limited(s, FilterPlacement.DERIVATIVE,
                Setups.algorithm(kind, Discretization.BACKWARD, Discretization.BACKWARD, antiWindup, 0.0), 1.0);
        c.reset(90.0, 50.0, 50.0);
        return c;
    }

    /** 21 scans at r = 60, y = 50 (e = 10), then one at y = 70 (e = -10); returns that last output. */
    private static double saturateThenReverse(ScanController c) {
        for (int k = 0; k < 21; k++) {
            assertThat(c.update(60.0, 50.0)).isEqualTo(100.0);
        }
        return c.update(60.0, 70.0);
    }

    // Conditional integration: the integral is not updated while the output is saturated and the
    // error would drive it further (Astrom & Hagglund, PID Controllers: Theory, Design and Tuning,
    // 2nd ed., ISA 1995, section 3.5 - from memory). By hand: the reset leaves I = 90 - K (r - y) = 90;
    // scan 1: P = 5, I = 95, v = 100, not beyond the limit, kept; from scan 2 on the trial
    // v = 5 + 100 = 105 > 100 with a rising increment, so I stays 95. Then e = -10: P = -5,
    // I = 95 - 5 = 90, u = 85.
    @Test
    void clamping_stops_integral_growth_while_saturated() {
        ScanController c = pi(AlgorithmKind.POSITIONAL, AntiWindup.CLAMPING);
        c.update(60.0, 50.0);
        assertThat(c.integralPercent()).isCloseTo(95.0, within(TOL));
        for (int k = 0; k < 20; k++) {
            c.update(60.0, 50.0);
            assertThat(c.integralPercent()).isCloseTo(95.0, within(TOL));
        }
        assertThat(c.update(60.0, 70.0)).isCloseTo(85.0, within(TOL));
    }

    // Whether the limits acted, by the same hand derivation: scan 1 reaches v = 100 exactly (not beyond:
    // nothing acted); scan 2's trial 105 is clamped to the kept integral, v = 100, the limits acted; the
    // reversal's u = 85 is inside (nothing acted). Clipping alone acts too: without anti-windup the
    // second scan writes 100 for v = 105; the velocity form clips its accumulated output likewise.
    @Test
    void the_controller_says_when_its_limits_acted() {
        ScanController clamped = pi(AlgorithmKind.POSITIONAL, AntiWindup.CLAMPING);
        clamped.update(60.0, 50.0);
        assertThat(clamped.limitsActedLastScan()).isFalse();
        clamped.update(60.0, 50.0);
        assertThat(clamped.limitsActedLastScan()).isTrue();
        clamped.update(60.0, 70.0);
        assertThat(clamped.limitsActedLastScan()).isFalse();

        ScanController clipped = pi(AlgorithmKind.POSITIONAL, AntiWindup.NONE);
        clipped.update(60.0, 50.0);
        assertThat(clipped.limitsActedLastScan()).isFalse();
        clipped.update(60.0, 50.0);
        assertThat(clipped.limitsActedLastScan()).isTrue();
        clipped.reset(90.0, 50.0, 50.0);
        assertThat(clipped.limitsActedLastScan()).isFalse();

        ScanController velocity = pi(AlgorithmKind.VELOCITY, AntiWindup.NONE);
        velocity.update(60.0, 50.0);
        assertThat(velocity.limitsActedLastScan()).isFalse();
        velocity.update(60.0, 50.0);
        assertThat(velocity.limitsActedLastScan()).isTrue();
        velocity.track(40.0);
        assertThat(velocity.limitsActedLastScan()).isFalse();
    }

    // Without anti-windup the integral runs on (same source): 90 + 21 x 5 = 195 after the
    // saturated scans; then v = -5 + 195 - 5 = 185, still beyond the limit.
    @Test
    void without_anti_windup_the_integral_winds_up() {
        ScanController c = pi(AlgorithmKind.POSITIONAL, AntiWindup.NONE);
        assertThat(saturateThenReverse(c)).isEqualTo(100.0);
        assertThat(c.unlimitedOutputPercent()).isCloseTo(185.0, within(TOL));
    }

    // The velocity form limits the accumulated output, so nothing winds up (Wittenmark, Astrom &
    // Arzen, "Computer Control: An Overview", IFAC Professional Brief, 2002, the incremental
    // algorithm). By hand: u stays at 100; then du = K (e(k) - e(k-1)) + K h/Ti e(k)
    // = 0.5 (-20) + 0.5 (-10) = -15, u = 85.
    @Test
    void velocity_form_leaves_the_limit_as_soon_as_the_error_reverses() {
        assertThat(saturateThenReverse(pi(AlgorithmKind.VELOCITY, AntiWindup.NONE))).isCloseTo(85.0, within(TOL));
    }

    @Nested
    @DisplayName("back-calculation")
    class BackCalculation {

        // Back-calculation, I <- I + (h/Ti) K e + (h/Tt)(u - v) (docs/references.md 4; Astrom &
        // Hagglund 1995, section 3.5 - from memory). Held at the upper limit u = 100 with constant
        // error e, the integral is steady when the two increments cancel: K h e/Ti + (h/Tt)(100 - v) = 0,
        // so v = 100 + Tt K e/Ti: the unlimited output settles Tt K e/Ti above the limit, closer as Tt
        // shrinks. K = 2, Ti = 10 s, e = 10, P = K e = 20: Tt = 5 s gives v = 110; Tt = 0.5 s gives 101.
        // The stored integral (after this scan's correction) is v - P - K h e/Ti = v - 20 - 0.2.
        @ParameterizedTest(name = "Tt = {0} s: v -> {1} %")
        @CsvSource({"5.0, 110.0", "0.5, 101.0"})
        void the_unlimited_output_settles_just_above_the_limit(double trackingSeconds, double settled) {
            double h = 0.1;
            PidSetting s = Setups.ideal(2.0, 10.0, 0.0, 0.0, 1.0, 0.0);
            ScanController c = ScanController.limited(s, FilterPlacement.DERIVATIVE, Setups.algorithm(
                    AlgorithmKind.POSITIONAL, Discretization.BACKWARD, Discretization.BACKWARD,
                    AntiWindup.BACK_CALCULATION, trackingSeconds), h);
            c.reset(90.0, 60.0, 50.0);
            for (int k = 0; k < 4000; k++) {
                assertThat(c.update(60.0, 50.0)).isBetween(0.0, 100.0);
            }
            assertThat(c.outputPercent()).isEqualTo(100.0);
            assertThat(c.unlimitedOutputPercent()).isCloseTo(settled, within(TOL));
            assertThat(c.integralPercent()).isCloseTo(settled - 20.0 - 0.2, within(TOL));
        }

        // rule of thumb Tt = sqrt(Ti Td), Ti without derivative (docs/references.md 4, from memory)
        @Test
        void tracking_time_defaults_to_the_rule_of_thumb() {
            ScanController pid = ScanController.limited(Setups.ideal(2.0, 10.0, 2.5, 0.25, 1.0, 1.0),
                    FilterPlacement.DERIVATIVE, Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                            Discretization.BACKWARD, AntiWindup.BACK_CALCULATION, 0.0), 0.1);
            ScanController piOnly = ScanController.limited(Setups.ideal(2.0, 10.0, 0.0, 0.0, 1.0, 0.0),
                    FilterPlacement.DERIVATIVE, Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                            Discretization.BACKWARD, AntiWindup.BACK_CALCULATION, 0.0), 0.1);
            // parallel kp = 2, ki = 0.2/s, kd = 5 s: Ti = kp/ki = 10 s, Td = kd/kp = 2.5 s
            ScanController parallel = ScanController.limited(Setups.parallel(2.0, 0.2, 5.0, 0.25, 1.0, 1.0),
                    FilterPlacement.DERIVATIVE, Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                            Discretization.BACKWARD, AntiWindup.BACK_CALCULATION, 0.0), 0.1);
            assertThat(pid.trackingTimeSeconds()).isCloseTo(5.0, within(TOL));
            assertThat(piOnly.trackingTimeSeconds()).isCloseTo(10.0, within(TOL));
            assertThat(parallel.trackingTimeSeconds()).isCloseTo(5.0, within(TOL));
        }
    }

    @Test
    void without_limits_the_output_passes_any_value() {
        PidSetting s = Setups.ideal(0.5, 1.0, 0.0, 0.0, 1.0, 0.0);
        ScanController c = ScanController.unlimited(s, FilterPlacement.DERIVATIVE,
                Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD, Discretization.BACKWARD), 1.0);
        c.reset(90.0, 50.0, 50.0);
        // by hand: u(k) = 0.5 e + 90 + 0.5 e k, e = 10: 100, 105, 110, ...
        for (int k = 1; k <= 5; k++) {
            assertThat(c.update(60.0, 50.0)).isCloseTo(95.0 + 5.0 * k, within(TOL));
        }
        assertThat(c.isLimited()).isFalse();
    }
}

package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * First order with a fractional dead time: dx/dt = -a x + b u(t - tau_total),
 * tau_total = (d' - 1) h + tau', 0 < tau' <= h, sampled as
 * x(k+1) = e^(-a h) x(k) + G0 u(k - d' + 1) + G1 u(k - d'),
 * G0 = (b/a)(1 - e^(-a (h - tau'))), G1 = (b/a) e^(-a (h - tau'))(1 - e^(-a tau'))
 * (Astrom & Wittenmark, Computer-Controlled Systems, ch. 2 - from memory; Wittenmark,
 * "Sampling of a system with a time delay", IEEE TAC, 1985). In loopform's indexing
 * d = d' - 1 whole scans and tau = tau', so G0 is B0 and G1 is B1.
 */
@DisplayName("Zero-order hold of a first-order process with fractional dead time")
class ZeroOrderHoldFirstOrderTest {

    private static final double TOL = 1e-13;

    /** a, b, delay, scan: the published formulas, evaluated here as written. */
    private static double[] published(double a, double b, double delaySeconds, double scanSeconds) {
        int dPrime = (int) Math.ceil(delaySeconds / scanSeconds);
        double tauPrime = delaySeconds - (dPrime - 1) * scanSeconds;
        double g0 = (b / a) * (1 - Math.exp(-a * (scanSeconds - tauPrime)));
        double g1 = (b / a) * Math.exp(-a * (scanSeconds - tauPrime)) * (1 - Math.exp(-a * tauPrime));
        return new double[] {Math.exp(-a * scanSeconds), g0, g1, dPrime - 1};
    }

    private static void assertMatches(SampledStateSpace s, double[] expected) {
        assertThat(s.a()[0][0]).isCloseTo(expected[0], within(TOL));
        assertThat(s.b0()[0]).isCloseTo(expected[1], within(TOL));
        assertThat(s.b1()[0]).isCloseTo(expected[2], within(TOL));
        assertThat(s.delayScans()).isEqualTo((int) expected[3]);
    }

    // a, b, dead time, scan: fractions of a scan across (0, 1), several whole scans, long and short
    // lags, and a stiff one (a h = 200) that needs many squarings
    private static final String CASES = """
            0.5, 1.0, 0.13, 1.0
            0.5, 1.0, 0.5, 1.0
            0.5, 1.0, 0.97, 1.0
            0.2, 0.7, 2.35, 0.5
            3.0, 6.0, 0.07, 0.1
            0.01, 0.02, 7.4, 2.0
            10.0, 5.0, 1.25, 0.3
            200.0, 100.0, 0.33, 1.0
            """;

    @Nested
    @DisplayName("the general matrix-exponential path")
    class GeneralPath {

        @ParameterizedTest(name = "a = {0}, b = {1}, L = {2} s, h = {3} s")
        @CsvSource(textBlock = CASES)
        void gives_the_published_G0_and_G1(double a, double b, double delaySeconds, double scanSeconds) {
            StateSpace model = StateSpace.of(new double[][] {{-a}}, new double[] {b}, new double[] {1.0}, 0.0);
            assertMatches(ZeroOrderHold.of(model, delaySeconds, scanSeconds),
                    published(a, b, delaySeconds, scanSeconds));
        }
    }

    @Nested
    @DisplayName("the closed form")
    class ClosedForm {

        @ParameterizedTest(name = "a = {0}, b = {1}, L = {2} s, h = {3} s")
        @CsvSource(textBlock = CASES)
        void gives_the_published_G0_and_G1(double a, double b, double delaySeconds, double scanSeconds) {
            // K / (1 + s T) is dx/dt = -(1/T) x + (K/T) u
            double timeConstantSeconds = 1 / a;
            double gain = b / a;
            assertMatches(ZeroOrderHold.firstOrder(gain, timeConstantSeconds, delaySeconds, scanSeconds),
                    published(a, b, delaySeconds, scanSeconds));
        }
    }

    @Nested
    @DisplayName("the integrator, the limit a -> 0 of the same formulas")
    class Integrator {

        // G0 -> b (h - tau'), G1 -> b tau' as a -> 0 (limit of the published formulas, derived)
        @ParameterizedTest(name = "b = {0}, L = {1} s, h = {2} s")
        @CsvSource({"0.3, 0.13, 1.0", "2.0, 2.35, 0.5", "0.05, 7.4, 2.0"})
        void closed_form_and_general_path_agree_with_the_limit(double b, double delaySeconds, double scanSeconds) {
            int dPrime = (int) Math.ceil(delaySeconds / scanSeconds);
            double tauPrime = delaySeconds - (dPrime - 1) * scanSeconds;
            double[] expected = {1.0, b * (scanSeconds - tauPrime), b * tauPrime, dPrime - 1};
            assertMatches(ZeroOrderHold.integrator(b, delaySeconds, scanSeconds), expected);
            StateSpace model = StateSpace.of(new double[][] {{0.0}}, new double[] {b}, new double[] {1.0}, 0.0);
            assertMatches(ZeroOrderHold.of(model, delaySeconds, scanSeconds), expected);
        }
    }
}

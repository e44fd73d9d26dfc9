package org.loopform.scan;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;

@DisplayName("The pulse law")
class PulseLawTest {

    private static final double H = 0.1;
    /** Long enough for every filter pole of the cases (at most 0.82 at h = 0.1 s) to die out. */
    private static final int SCANS = 4000;
    private static final double[] OMEGAS = {0.05, 0.7, 3.0, 20.0};
    /** Relative: thousands of summed terms, divided by |1 - e^(-i omega h)| down to 0.005. */
    private static final double REL_TOL = 1e-8;

    static List<Setups.Case> cases() {
        return Setups.allCases();
    }

    @Nested
    @DisplayName("is the transform of what update does")
    class TransformOfUpdate {

        // For a linear time-invariant system at rest the pulse transfer function is the z-transform
        // of its impulse response; (1 - z^-1) C(z) is the transform of the differenced response,
        // which is summable once the integrator's step is differenced away (Astrom & Wittenmark,
        // Computer-Controlled Systems, 3rd ed., 1997, ch. 2 - from memory; common practice)
        @ParameterizedTest
        @MethodSource("org.loopform.scan.PulseLawTest#cases")
        void feedback_and_setpoint_paths(Setups.Case c) {
            ScanController feedback = ScanController.unlimited(c.setting(), c.placement(),
                    c.algorithm(AlgorithmKind.POSITIONAL), H);
            ScanController setpoint = ScanController.unlimited(c.setting(), c.placement(),
                    c.algorithm(AlgorithmKind.POSITIONAL), H);
            double[] gy = new double[SCANS];
            double[] gr = new double[SCANS];
            for (int k = 0; k < SCANS; k++) {
                double impulse = k == 0 ? 1.0 : 0.0;
                gy[k] = -feedback.update(0.0, impulse);
                gr[k] = setpoint.update(impulse, 0.0);
            }
            double[] out = new double[2];
            for (double w : OMEGAS) {
                double[] expected = transformOfDifferenced(gy, w * H);
                feedback.feedbackAt(w, out);
                assertCloseTimesOneMinusZInverse(out, w * H, expected, "C_y at " + w + " rad/s");
                expected = transformOfDifferenced(gr, w * H);
                setpoint.setpointAt(w, out);
                assertCloseTimesOneMinusZInverse(out, w * H, expected, "C_r at " + w + " rad/s");
            }
        }

        /** sum over k of (g(k) - g(k-1)) e^(-i theta k). */
        private double[] transformOfDifferenced(double[] g, double theta) {
            double re = 0;
            double im = 0;
            double previous = 0;
            for (int k = 0; k < g.length; k++) {
                double dg = g[k] - previous;
                re += dg * Math.cos(theta * k);
                im -= dg * Math.sin(theta * k);
                previous = g[k];
            }
            return new double[] {re, im};
        }

        private void assertCloseTimesOneMinusZInverse(double[] c, double theta, double[] expected, String what) {
            // (1 - e^(-i theta)) = (1 - cos theta) + i sin theta
            double ar = 1 - Math.cos(theta);
            double ai = Math.sin(theta);
            double re = c[0] * ar - c[1] * ai;
            double im = c[0] * ai + c[1] * ar;
            double scale = Math.hypot(expected[0], expected[1]);
            assertThat(re).as(what + " (re)").isCloseTo(expected[0], within(REL_TOL * scale));
            assertThat(im).as(what + " (im)").isCloseTo(expected[1], within(REL_TOL * scale));
        }
    }

    @Nested
    @DisplayName("runs the difference equations written out by hand")
    class HandWrittenRecursions {

        private static final double TOL = 1e-10;

        // Wittenmark, Astrom & Arzen, "Computer Control: An Overview", IFAC Professional Brief, 2002,
        // Table 3, Tustin column: I(k) = I(k-1) + (K h/(2 Ti))(e(k) + e(k-1));
        // D(k) = a D(k-1) + b_d (x(k) - x(k-1)), x = c r - y, a = (2Tf - h)/(2Tf + h),
        // b_d = 2 K Td/(2Tf + h) (the b_d form from memory); P = K (b r - y)
        @Test
        void ideal_with_tustin_integral_and_derivative() {
            double k = 1.7;
            double ti = 6.0;
            double td = 1.2;
            double tf = 0.3;
            double b = 0.6;
            double c = 0.4;
            PidSetting s = Setups.ideal(k, ti, td, tf, b, c);
            ScanController controller = ScanController.unlimited(s, FilterPlacement.DERIVATIVE,
                    Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.TRAPEZOIDAL, Discretization.TRAPEZOIDAL), H);
            double a = (2 * tf - H) / (2 * tf + H);
            double bd = 2 * k * td / (2 * tf + H);
            double integral = 0;
            double derivative = 0;
            double e1 = 0;
            double x1 = 0;
            for (int i = 0; i < 300; i++) {
                double r = VelocityFormTest.setpoint(i);
                double y = VelocityFormTest.pv(i);
                double e = r - y;
                double x = c * r - y;
                integral += k * H / (2 * ti) * (e + e1);
                derivative = a * derivative + bd * (x - x1);
                double u = k * (b * r - y) + integral + derivative;
                assertThat(controller.update(r, y)).as("scan %d", i).isCloseTo(u, within(TOL));
                e1 = e;
                x1 = x;
            }
        }

        // series, derivative on the measurement: y' = (1 + Td s)/(1 + Tf s) y with s = (2/h)(z-1)/(z+1)
        // substituted and multiplied out (Tustin, IFAC brief 2002, Table 3):
        // (h + 2Tf) y'(k) = (2Tf - h) y'(k-1) + (h + 2Td) y(k) + (h - 2Td) y(k-1);
        // then u = K (b r - y') + I, I(k) = I(k-1) + (K h/Ti)(r(k) - y'(k)) (backward integral)
        @Test
        void series_with_tustin_lead_lag_and_backward_integral() {
            double k = 1.3;
            double ti = 5.0;
            double td = 1.1;
            double tf = 0.25;
            double b = 0.8;
            ScanController controller = ScanController.unlimited(Setups.series(k, ti, td, tf, b, 0.0),
                    FilterPlacement.DERIVATIVE,
                    Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD, Discretization.TRAPEZOIDAL), H);
            double lead = 0;
            double y1 = 0;
            double integral = 0;
            for (int i = 0; i < 300; i++) {
                double r = VelocityFormTest.setpoint(i);
                double y = VelocityFormTest.pv(i);
                lead = ((2 * tf - H) * lead + (H + 2 * td) * y + (H - 2 * td) * y1) / (H + 2 * tf);
                integral += k * H / ti * (r - lead);
                double u = k * (b * r - lead) + integral;
                assertThat(controller.update(r, y)).as("scan %d", i).isCloseTo(u, within(TOL));
                y1 = y;
            }
        }

        // filter on the measurement, forward differences throughout (s = (z-1)/h, IFAC brief 2002,
        // Table 3): yf(k+1) = (1 - h/Tf) yf(k) + (h/Tf) y(k); the derivative of yf at k is
        // (yf(k+1) - yf(k))/h, known at scan k; I(k) = I(k-1) + (K h/Ti)(r(k-1) - yf(k-1))
        @Test
        void ideal_with_measurement_filter_and_forward_differences() {
            double k = 1.7;
            double ti = 6.0;
            double td = 1.2;
            double tf = 0.3;
            double b = 0.6;
            ScanController controller = ScanController.unlimited(Setups.ideal(k, ti, td, tf, b, 0.0),
                    FilterPlacement.MEASUREMENT,
                    Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.FORWARD, Discretization.FORWARD), H);
            double filtered = 0;
            double integral = 0;
            double previousError = 0;
            for (int i = 0; i < 300; i++) {
                double r = VelocityFormTest.setpoint(i);
                double y = VelocityFormTest.pv(i);
                double next = (1 - H / tf) * filtered + (H / tf) * y;
                integral += k * H / ti * previousError;
                double u = k * (b * r - filtered) + integral - k * td * (next - filtered) / H;
                assertThat(controller.update(r, y)).as("scan %d", i).isCloseTo(u, within(TOL));
                previousError = r - filtered;
                filtered = next;
            }
        }
    }

    @Test
    void rejects_a_frequency_that_is_not_positive() {
        PulseLaw law = PulseLaw.of(Setups.ideal(1, 10, 1, 0.1, 1, 1), FilterPlacement.DERIVATIVE,
                Discretization.BACKWARD, Discretization.BACKWARD, 0.5);
        assertThatThrownBy(() -> law.feedbackAt(0.0, new double[2])).hasMessageContaining("got 0.0 rad/s");
        assertThatThrownBy(() -> PulseLaw.of(Setups.ideal(1, 10, 1, 0.1, 1, 1), FilterPlacement.DERIVATIVE,
                Discretization.BACKWARD, Discretization.BACKWARD, -1)).hasMessageContaining("got -1.0 s");
    }

    /**
     * The setpoint path is the feedback path exactly when the setpoint weights are 1 (b = c = 1 makes
     * C_r = C_y; Astrom and Hagglund, PID Controllers, 1995, section 3.4, set-point weighting - from
     * memory for the section): then the two evaluations agree to the bit, and with b = 0.5 or c = 0 they
     * differ. The mismatch skips the setpoint path on this flag, so a false "same" would hide a mismatch.
     */
    @Test
    void the_setpoint_path_is_the_feedback_path_only_with_unit_weights() {
        PulseLaw same = PulseLaw.of(Setups.ideal(1.3, 10, 1, 0.1, 1, 1), FilterPlacement.DERIVATIVE,
                Discretization.TRAPEZOIDAL, Discretization.BACKWARD, 0.5);
        assertThat(same.setpointPathIsFeedbackPath()).isTrue();
        double[] fb = new double[2];
        double[] sp = new double[2];
        for (double w = 0.01; w < Math.PI / 0.5; w *= 1.7) {
            same.feedbackAt(w, fb);
            same.setpointAt(w, sp);
            assertThat(sp).as("omega %s", w).containsExactly(fb[0], fb[1]);
        }
        for (PidSetting weighted : List.of(Setups.ideal(1.3, 10, 1, 0.1, 0.5, 1), Setups.ideal(1.3, 10, 1, 0.1, 1, 0))) {
            PulseLaw law = PulseLaw.of(weighted, FilterPlacement.DERIVATIVE, Discretization.TRAPEZOIDAL,
                    Discretization.BACKWARD, 0.5);
            assertThat(law.setpointPathIsFeedbackPath()).as("b %s c %s", weighted.b(), weighted.c()).isFalse();
        }
    }
}

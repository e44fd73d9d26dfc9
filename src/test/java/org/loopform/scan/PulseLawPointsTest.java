// source: hand derivations written out beside each check, with the backward-difference integrator J(z) = h z / (z - 1) and derivative D(z) = (z - 1) / ((h + Tf) z - Tf), pole Tf / (Tf + h) (Wittenmark, Astrom & Arzen, "Computer Control: An Overview", IFAC Professional Brief, 2002, Table 3; docs/references.md section 4)
package org.loopform.scan;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;

/**
 * C_y(z) of an ideal PID anywhere in the plane, as the argument principle evaluates it: Kc = 2,
 * Ti = 10 s, Td = 1 s, Tf = 0.1 s, so kp = 2, ki = Kc / Ti = 0.2 /s, kd = Kc Td = 2 s; scan h = 0.5 s;
 * backward differences for both terms, so J(z) = 0.5 z / (z - 1) and D(z) = (z - 1) / (0.6 z - 0.1).
 */
class PulseLawPointsTest {

    private static final double TOL = 1e-12;
    private static final double H = 0.5;

    private static PulseLaw law() {
        return PulseLaw.of(Setups.ideal(2, 10, 1, 0.1, 1, 1), FilterPlacement.DERIVATIVE, Discretization.BACKWARD,
                Discretization.BACKWARD, H);
    }

    private static double[] at(double radiusOffset, double theta) {
        double[] out = new double[2];
        law().feedbackAtRadius(radiusOffset, theta, out);
        return out;
    }

    // z = 2: J = 0.5 * 2 / 1 = 1; D = 1 / (1.2 - 0.1) = 1 / 1.1 = 10/11; C = 2 + 0.2 + 2 * 10/11 = 44.2 / 11
    @Test
    void outside_the_unit_circle_on_the_real_axis() {
        double[] c = at(1.0, 0.0);
        assertThat(c[0]).isCloseTo(44.2 / 11, within(TOL));
        assertThat(c[1]).isCloseTo(0.0, within(TOL));
    }

    // z = -1: J = 0.5 (-1) / (-2) = 0.25; D = (-2) / (-0.6 - 0.1) = 20/7; C = 2 + 0.05 + 40/7
    @Test
    void on_the_unit_circle_at_minus_one() {
        double[] c = at(0.0, Math.PI);
        assertThat(c[0]).isCloseTo(2.05 + 40.0 / 7, within(1e-9));
        assertThat(c[1]).isCloseTo(0.0, within(1e-9));
    }

    // z = i: J = 0.5 i / (i - 1) = 0.25 - 0.25 i;
    // D = (i - 1) / (0.6 i - 0.1) = (i - 1)(-0.6 i - 0.1) / 0.37 = (0.6 + 0.1 - 0.1 i + 0.6 i) / 0.37 = (0.7 + 0.5 i) / 0.37;
    // C = 2 + 0.2 (0.25 - 0.25 i) + 2 (0.7 + 0.5 i) / 0.37 = (2.05 + 1.4 / 0.37) + (1 / 0.37 - 0.05) i
    @Test
    void on_the_unit_circle_at_i_by_both_evaluations() {
        double re = 2.05 + 1.4 / 0.37;
        double im = 1.0 / 0.37 - 0.05;
        double[] c = at(0.0, Math.PI / 2);
        assertThat(c[0]).isCloseTo(re, within(1e-9));
        assertThat(c[1]).isCloseTo(im, within(1e-9));
        // theta = omega h = pi / 2 at omega = pi rad/s
        double[] onCircle = new double[2];
        law().feedbackAt(Math.PI, onCircle);
        assertThat(onCircle[0]).isCloseTo(re, within(1e-9));
        assertThat(onCircle[1]).isCloseTo(im, within(1e-9));
    }

    // z = 0.5 i (radius 0.5, theta = pi/2): J = 0.25 i / (0.5 i - 1) = 0.25 i (-1 - 0.5 i) / 1.25 = (0.125 - 0.25 i) / 1.25
    // D = (0.5 i - 1) / (0.3 i - 0.1) = (0.5 i - 1)(-0.3 i - 0.1) / 0.1 = (0.15 + 0.1 - 0.05 i + 0.3 i) / 0.1 = 2.5 + 2.5 i
    // C = 2 + 0.2 (0.1 - 0.2 i) + 2 (2.5 + 2.5 i) = 7.02 + 4.96 i
    @Test
    void inside_the_unit_circle_off_the_axis() {
        double[] c = at(-0.5, Math.PI / 2);
        assertThat(c[0]).isCloseTo(7.02, within(1e-9));
        assertThat(c[1]).isCloseTo(4.96, within(1e-9));
    }

    // the integrator's pole z = 1 and the filter's z = Tf / (Tf + h) = 0.1 / 0.6 = 1/6
    @Test
    void the_poles_are_the_integrator_s_and_the_filter_s() {
        double[][] poles = law().feedbackPoles();
        assertThat(poles).hasNumberOfRows(2);
        assertThat(poles[0]).containsExactly(1.0, 0.0);
        assertThat(poles[1][0]).isCloseTo(1.0 / 6, within(TOL));
        assertThat(poles[1][1]).isZero();
        // without derivative there is no filter pole: Td = 0
        PulseLaw pi = PulseLaw.of(Setups.ideal(2, 10, 0, 0.1, 1, 1), FilterPlacement.DERIVATIVE,
                Discretization.BACKWARD, Discretization.BACKWARD, H);
        assertThat(pi.feedbackPoles()).hasNumberOfRows(1);
        assertThat(pi.feedbackPoles()[0]).containsExactly(1.0, 0.0);
        assertThat(pi.scanSeconds()).isEqualTo(H);
    }

    // 1 - cos theta = 2 sin^2(theta / 2)
    @ParameterizedTest
    @CsvSource({"0.1", "1e-5", "2.0", "3.0", "-1.0"})
    void one_minus_cos_is_two_sine_squared_of_the_half_angle(double theta) {
        double expected = 2 * Math.pow(Math.sin(theta / 2), 2);
        assertThat(PulseLaw.oneMinusCos(Math.cos(theta), Math.sin(theta))).isCloseTo(expected, within(1e-15 + 1e-12 * expected));
    }
}

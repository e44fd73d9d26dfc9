// source: zero-order-hold sampling maps a continuous pole p to z = e^(p h), and a first-order lag 1/(T s + 1) sampled every h gives H(z) = (1 - a)/(z - a) with a = e^(-h/T) (Astrom & Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 2; docs/references.md section 11); a whole-scan dead time d h multiplies H by z^-d; the values below are worked out by hand beside each check
package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Arrays;
import java.util.Comparator;
import org.junit.jupiter.api.Test;

/** The poles, delay split and off-circle response of sampled processes whose answers are known in closed form. */
class SampledPolesTest {

    private static final double TOL = 1e-12;

    /** 1/(2 s + 1) sampled every 1 s with {@code deadSeconds} of dead time. */
    private static SampledStateSpace lag(double deadSeconds) {
        return ZeroOrderHold.of(TransferFunction.ofDescending(new double[] {1}, new double[] {2, 1}), deadSeconds, 1.0);
    }

    // a = e^(-1/2)
    @Test
    void a_first_order_lag_has_its_one_pole_at_e_to_the_minus_h_over_t() {
        double[][] poles = lag(0).poles();
        assertThat(poles).hasNumberOfRows(1);
        assertThat(poles[0][0]).isCloseTo(Math.exp(-0.5), within(TOL));
        assertThat(poles[0][1]).isZero();
    }

    // z = 2 (radius offset 1, theta 0): H = (1 - a)/(2 - a); with d = 2 scans of dead time, z^-2 = 1/4 more
    @Test
    void off_the_circle_the_response_is_the_rational_function_and_its_delay() {
        double a = Math.exp(-0.5);
        double h = (1 - a) / (2 - a);
        double[] out = new double[4];
        SampledStateSpace plain = lag(0);
        plain.responseAtRadius(1.0, 0.0, plain.newWorkspace(), out);
        assertThat(out[0]).isCloseTo(h, within(TOL));
        assertThat(out[1]).isCloseTo(0, within(TOL));
        SampledStateSpace delayed = lag(2.0);
        delayed.responseAtRadius(1.0, 0.0, delayed.newWorkspace(), out);
        assertThat(out[0]).isCloseTo(h / 4, within(TOL));
        assertThat(out[2]).isCloseTo(h, within(TOL));
        // z = -0.5 (radius offset -0.5, theta pi): H = (1 - a)/(-0.5 - a), z^-2 = 4
        delayed.responseAtRadius(-0.5, Math.PI, delayed.newWorkspace(), out);
        assertThat(out[0]).isCloseTo(4 * (1 - a) / (-0.5 - a), within(1e-9));
        assertThat(out[1]).isCloseTo(0, within(1e-9));
        assertThat(out[2]).isCloseTo((1 - a) / (-0.5 - a), within(1e-9));
    }

    // 2.3 s of dead time at h = 1 s: 2 whole scans and 0.3 s
    @Test
    void a_dead_time_splits_into_whole_scans_and_a_remainder() {
        SampledStateSpace s = lag(2.3);
        assertThat(s.delayScans()).isEqualTo(2);
        assertThat(s.fractionalDelaySeconds()).isCloseTo(0.3, within(1e-12));
        assertThat(s.scanSeconds()).isEqualTo(1.0);
    }

    // 1/((s + 1)(s + 2)) at h = 0.5 s: poles e^(-0.5) and e^(-1)
    @Test
    void two_real_poles_map_one_by_one() {
        SampledStateSpace s = ZeroOrderHold.of(TransferFunction.ofDescending(new double[] {1}, new double[] {1, 3, 2}),
                0, 0.5);
        double[][] poles = s.poles();
        Arrays.sort(poles, Comparator.comparingDouble(p -> p[0]));
        assertThat(poles[0][0]).isCloseTo(Math.exp(-1), within(TOL));
        assertThat(poles[1][0]).isCloseTo(Math.exp(-0.5), within(TOL));
        assertThat(poles[0][1]).isCloseTo(0, within(TOL));
    }

    // 1/(s^2 + 2 s + 5): poles -1 +- 2i, so at h = 0.5 s: e^(-0.5) (cos 1 +- i sin 1)
    @Test
    void a_complex_pair_maps_to_a_pair_on_a_circle_of_radius_e_to_the_minus_half() {
        SampledStateSpace s = ZeroOrderHold.of(TransferFunction.ofDescending(new double[] {1}, new double[] {1, 2, 5}),
                0, 0.5);
        double[][] poles = s.poles();
        Arrays.sort(poles, Comparator.comparingDouble(p -> p[1]));
        double r = Math.exp(-0.5);
        assertThat(poles[0][0]).isCloseTo(r * Math.cos(1), within(TOL));
        assertThat(poles[0][1]).isCloseTo(-r * Math.sin(1), within(TOL));
        assertThat(poles[1][1]).isCloseTo(r * Math.sin(1), within(TOL));
    }
}

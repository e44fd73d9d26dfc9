package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.DoubleRange;
import net.jqwik.api.constraints.Scale;
import org.loopform.process.FirstOrderPlusDeadTime;
import org.loopform.process.ProcessModel;
import org.loopform.process.SecondOrderPlusDeadTime;

/**
 * At low frequency the zero-order hold acts like a time delay of h/2:
 * {@code H0(i w) = h e^(-i w h/2) sin(w h/2)/(w h/2)} (Wittenmark, Astrom &amp; Arzen,
 * "Computer Control: An Overview", IFAC Professional Brief, 2002 - verified), so the pulse
 * transfer function at {@code z = e^(i w h)} is the continuous response lagged by a further
 * w h / 2. Aliased terms add a relative error of order h / T, which the ranges keep small.
 */
class HoldDelayProperties {

    /** Relative phase tolerance: aliasing contributes about h/(6 T) <= 1/120 of w h/2 here. */
    private static final double PHASE_RELATIVE_TOL = 0.03;
    /** Gain: sin(x)/x at x = w h/2 <= 0.05 is within 5e-4 of 1, aliasing adds about as much. */
    private static final double GAIN_TOL = 2e-3;

    @Property(tries = 300, seed = "4711")
    void the_hold_lags_a_first_order_process_by_half_a_scan(
            @ForAll @Scale(6) @DoubleRange(min = 0.2, max = 5) double gain,
            @ForAll @Scale(6) @DoubleRange(min = 1, max = 50) double timeConstantSeconds,
            @ForAll @Scale(6) @DoubleRange(min = 0, max = 20) double deadTimeSeconds,
            @ForAll @Scale(6) @DoubleRange(min = 0.001, max = 0.05) double scanPerTimeConstant,
            @ForAll @Scale(6) @DoubleRange(min = 0.005, max = 0.1) double omegaTimesScan) {
        double scanSeconds = scanPerTimeConstant * timeConstantSeconds;
        assertActsLikeHalfScanDelay(new FirstOrderPlusDeadTime(gain, timeConstantSeconds, deadTimeSeconds),
                scanSeconds, omegaTimesScan / scanSeconds);
    }

    @Property(tries = 200, seed = "4712")
    void the_hold_lags_a_second_order_process_by_half_a_scan(
            @ForAll @Scale(6) @DoubleRange(min = 0.2, max = 5) double gain,
            @ForAll @Scale(6) @DoubleRange(min = 1, max = 50) double firstTimeConstantSeconds,
            @ForAll @Scale(6) @DoubleRange(min = 1, max = 50) double secondTimeConstantSeconds,
            @ForAll @Scale(6) @DoubleRange(min = 0, max = 20) double deadTimeSeconds,
            @ForAll @Scale(6) @DoubleRange(min = 0.001, max = 0.05) double scanPerShorterTimeConstant,
            @ForAll @Scale(6) @DoubleRange(min = 0.005, max = 0.1) double omegaTimesScan) {
        double scanSeconds = scanPerShorterTimeConstant * Math.min(firstTimeConstantSeconds, secondTimeConstantSeconds);
        assertActsLikeHalfScanDelay(
                SecondOrderPlusDeadTime.ofTimeConstants(gain, firstTimeConstantSeconds, secondTimeConstantSeconds, deadTimeSeconds),
                scanSeconds, omegaTimesScan / scanSeconds);
    }

    private static void assertActsLikeHalfScanDelay(ProcessModel model, double scanSeconds, double omega) {
        double[] sampled = model.sampled(scanSeconds).responseAt(omega);
        double[] continuous = new double[2];
        model.responseAt(omega, continuous);
        // ratio = sampled / continuous
        double mag2 = continuous[0] * continuous[0] + continuous[1] * continuous[1];
        double re = (sampled[0] * continuous[0] + sampled[1] * continuous[1]) / mag2;
        double im = (sampled[1] * continuous[0] - sampled[0] * continuous[1]) / mag2;
        double halfScanLagRad = omega * scanSeconds / 2;
        assertThat(Math.atan2(im, re)).isCloseTo(-halfScanLagRad, within(PHASE_RELATIVE_TOL * halfScanLagRad));
        assertThat(Math.hypot(re, im)).isCloseTo(1.0, within(GAIN_TOL));
    }
}

package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.DoubleRange;
import net.jqwik.api.constraints.Scale;
import org.loopform.process.FirstOrderPlusDeadTime;

/**
 * Step-invariance of zero-order-hold sampling: at the sample instants the sampled FOPDT's step
 * response is the continuous one, {@code y(t) = K (1 - e^(-(t - L)/T))} for t > L and 0 before
 * (Astrom &amp; Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 2, ZOH sampling is
 * exact at the sampling instants for a piecewise-constant input - from memory; the FOPDT step
 * response is common practice).
 */
class SampledFirstOrderStepProperties {

    /** 1e-12 relative to the gain: a few hundred steps of a stable recurrence, each adding an ulp or so. */
    private static final double TOL_PER_UNIT_GAIN = 1e-12;
    private static final int MAX_SCANS = 600;

    @Property(tries = 300, seed = "20261201")
    void step_response_at_sample_instants_is_the_continuous_one(
            @ForAll @Scale(6) @DoubleRange(min = 0.01, max = 10) double gainMagnitude,
            @ForAll boolean reverseActing,
            @ForAll @Scale(6) @DoubleRange(min = 0.001, max = 100) double scanSeconds,
            @ForAll @Scale(6) @DoubleRange(min = 0.05, max = 200) double timeConstantInScans,
            @ForAll @Scale(6) @DoubleRange(min = 0, max = 40) double deadTimeInScans) {
        double gain = reverseActing ? -gainMagnitude : gainMagnitude;
        double timeConstantSeconds = timeConstantInScans * scanSeconds;
        double deadTimeSeconds = deadTimeInScans * scanSeconds;
        SampledProcess p = new FirstOrderPlusDeadTime(gain, timeConstantSeconds, deadTimeSeconds)
                .sampled(scanSeconds).newProcess();
        int scans = (int) Math.min(MAX_SCANS, Math.ceil(deadTimeInScans + 5 * timeConstantInScans) + 2);
        double tol = TOL_PER_UNIT_GAIN * Math.max(1.0, gainMagnitude);
        assertThat(p.output()).isZero();
        for (int k = 1; k <= scans; k++) {
            double y = p.step(1.0);
            double sinceDelaySeconds = k * scanSeconds - deadTimeSeconds;
            double expected = sinceDelaySeconds <= 0 ? 0.0 : -gain * Math.expm1(-sinceDelaySeconds / timeConstantSeconds);
            assertThat(y).as("t = %s s", k * scanSeconds).isCloseTo(expected, within(tol));
        }
    }
}

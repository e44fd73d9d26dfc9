package org.loopform.analysis;

import org.loopform.lti.FrequencyBand;

import static org.assertj.core.api.Assertions.assertThat;

import net.jqwik.api.Assume;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.DoubleRange;
import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

/**
 * The maximum sensitivity bounds both margins of a stable loop: GM >= Ms/(Ms - 1) and
 * PM >= 2 arcsin(1/(2 Ms)). Source: Skogestad and Postlethwaite, Multivariable Feedback Control,
 * 2nd ed., 2005, chapter 2 (from memory for the chapter). Checked over random FOPDT loops under
 * ideal PID with filter Td/10, with a fixed seed.
 */
class SensitivityBoundsProperties {

    /** Margins and Ms are each refined to about 1e-9; the bounds are checked with that slack. */
    private static final double SLACK = 1e-7;
    private static final MarginAnalysis ANALYSIS = MarginAnalysis.over(FrequencyBand.of(1e-4, 1e3));

    @Property(tries = 300, seed = "20261201")
    void maximum_sensitivity_bounds_gain_and_phase_margins(
            @ForAll @DoubleRange(min = 0.2, max = 5) double processGain,
            @ForAll @DoubleRange(min = 0.1, max = 10) double timeConstantSeconds,
            @ForAll @DoubleRange(min = 0.05, max = 2) double deadTimeSeconds,
            @ForAll @DoubleRange(min = 0.05, max = 1.5) double aggressiveness,
            @ForAll @DoubleRange(min = 0.2, max = 2) double integralTimeRatio,
            @ForAll @DoubleRange(min = 0, max = 0.6) double derivativeTimeRatio) {
        double kc = aggressiveness * timeConstantSeconds / (processGain * deadTimeSeconds);
        double ti = integralTimeRatio * (timeConstantSeconds + deadTimeSeconds);
        double td = derivativeTimeRatio * deadTimeSeconds;
        TransferFunction process = new TransferFunction(
                Polynomial.constant(processGain), Polynomial.ofAscending(1, timeConstantSeconds));
        LoopResponse loop = LoopResponse.of(Loops.idealPid(kc, ti, td, 10).times(process), deadTimeSeconds);

        LoopMargins margins = ANALYSIS.analyze(loop);
        Assume.that(ContinuousStability.of(Loops.idealPid(kc, ti, td, 10).times(process), deadTimeSeconds, 1e-4)
                .isStable());

        double ms = margins.maximumSensitivity();
        assertThat(ms).isGreaterThan(1);
        margins.gainMargin().ifPresent(gm -> assertThat(gm).isGreaterThanOrEqualTo(ms / (ms - 1) - SLACK));
        margins.phaseMarginDegrees().ifPresent(pm -> assertThat(pm)
                .isGreaterThanOrEqualTo(Math.toDegrees(2 * Math.asin(1 / (2 * ms))) - SLACK));
    }
}

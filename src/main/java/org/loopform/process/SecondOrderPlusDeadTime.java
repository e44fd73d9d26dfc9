package org.loopform.process;

import org.loopform.lti.Polynomial;
import org.loopform.lti.SampledStateSpace;
import org.loopform.lti.TransferFunction;
import org.loopform.lti.ZeroOrderHold;

/**
 * Second order plus dead time (SOPDT) in standard form,
 * {@code G(s) = K e^(-s L) / (T^2 s^2 + 2 zeta T s + 1)}; with real time constants t1, t2 this
 * is {@code K e^(-s L) / ((1 + s t1)(1 + s t2))}, {@code T = sqrt(t1 t2)},
 * {@code zeta = (t1 + t2) / (2 sqrt(t1 t2))} (Seborg, Edgar &amp; Mellichamp, Process Dynamics
 * and Control, 2nd ed., 2004, ch. 5 - from memory). The standard form is held because an
 * underdamped process ({@code zeta < 1}) has no real time constants.
 *
 * @param gain normalized static gain K, % of PV span per % of output span (non-zero)
 * @param timeConstantSeconds T = 1 / natural frequency, seconds, > 0
 * @param dampingRatio zeta, > 0
 * @param deadTimeSeconds dead time L, seconds, >= 0
 */
public record SecondOrderPlusDeadTime(
        double gain, double timeConstantSeconds, double dampingRatio, double deadTimeSeconds)
        implements ProcessModel {

    private static final String NAME = "second order plus dead time";

    public SecondOrderPlusDeadTime {
        Require.finiteNonZero(NAME, "gain", gain);
        Require.positive(NAME, "timeConstantSeconds", timeConstantSeconds, " s");
        Require.positive(NAME, "dampingRatio", dampingRatio, "");
        Require.nonNegative(NAME, "deadTimeSeconds", deadTimeSeconds, " s");
    }

    /** {@code K e^(-s L) / ((1 + s t1)(1 + s t2))}, both time constants in seconds and > 0. */
    public static SecondOrderPlusDeadTime ofTimeConstants(
            double gain, double firstTimeConstantSeconds, double secondTimeConstantSeconds,
            double deadTimeSeconds) {
        Require.positive(NAME, "firstTimeConstantSeconds", firstTimeConstantSeconds, " s");
        Require.positive(NAME, "secondTimeConstantSeconds", secondTimeConstantSeconds, " s");
        double geometricMeanSeconds = Math.sqrt(firstTimeConstantSeconds * secondTimeConstantSeconds);
        double dampingRatio = (firstTimeConstantSeconds + secondTimeConstantSeconds) / (2.0 * geometricMeanSeconds);
        return new SecondOrderPlusDeadTime(gain, geometricMeanSeconds, dampingRatio, deadTimeSeconds);
    }

    /** {@code K wn^2 e^(-s L) / (s^2 + 2 zeta wn s + wn^2)}, wn in rad/s and > 0. */
    public static SecondOrderPlusDeadTime ofNaturalFrequency(
            double gain, double dampingRatio, double naturalFrequencyRadPerSecond, double deadTimeSeconds) {
        Require.positive(NAME, "naturalFrequencyRadPerSecond", naturalFrequencyRadPerSecond, " rad/s");
        return new SecondOrderPlusDeadTime(gain, 1.0 / naturalFrequencyRadPerSecond, dampingRatio, deadTimeSeconds);
    }

    /** Natural frequency 1 / T, rad/s. */
    public double naturalFrequencyRadPerSecond() {
        return 1.0 / timeConstantSeconds;
    }

    @Override
    public TransferFunction rationalPart() {
        double t = timeConstantSeconds;
        return new TransferFunction(
                Polynomial.constant(gain), Polynomial.ofAscending(1.0, 2.0 * dampingRatio * t, t * t));
    }

    @Override
    public void rationalResponseAt(double omegaRadPerSecond, double[] out) {
        // denominator at s = i w: (1 - (w T)^2) + i 2 zeta w T
        double wt = omegaRadPerSecond * timeConstantSeconds;
        double denRe = 1.0 - wt * wt;
        double denIm = 2.0 * dampingRatio * wt;
        double scale = gain / (denRe * denRe + denIm * denIm);
        out[0] = scale * denRe;
        out[1] = -scale * denIm;
    }

    @Override
    public SampledStateSpace sampled(double scanSeconds) {
        return ZeroOrderHold.of(rationalPart(), deadTimeSeconds, scanSeconds);
    }
}

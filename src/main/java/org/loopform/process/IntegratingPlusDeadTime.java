package org.loopform.process;

import org.loopform.lti.Polynomial;
import org.loopform.lti.SampledStateSpace;
import org.loopform.lti.TransferFunction;
import org.loopform.lti.ZeroOrderHold;

/**
 * Integrating process with dead time and an optional lag:
 * {@code G(s) = Kv e^(-s L) / (s (1 + s Tlag))}.
 *
 * @param slopePerSecond Kv, the PV slope per unit output: (% of PV span / s) per % of output span (non-zero)
 * @param deadTimeSeconds dead time L, seconds, >= 0
 * @param lagSeconds Tlag, seconds, >= 0 (0 for a pure integrator with dead time)
 */
public record IntegratingPlusDeadTime(double slopePerSecond, double deadTimeSeconds, double lagSeconds)
        implements ProcessModel {

    private static final String NAME = "integrating plus dead time";

    public IntegratingPlusDeadTime {
        Require.finiteNonZero(NAME, "slopePerSecond", slopePerSecond);
        Require.nonNegative(NAME, "deadTimeSeconds", deadTimeSeconds, " s");
        Require.nonNegative(NAME, "lagSeconds", lagSeconds, " s");
    }

    /** A pure integrator with dead time, no lag. */
    public IntegratingPlusDeadTime(double slopePerSecond, double deadTimeSeconds) {
        this(slopePerSecond, deadTimeSeconds, 0.0);
    }

    @Override
    public TransferFunction rationalPart() {
        return new TransferFunction(Polynomial.constant(slopePerSecond), Polynomial.ofAscending(0.0, 1.0, lagSeconds));
    }

    @Override
    public void rationalResponseAt(double omegaRadPerSecond, double[] out) {
        // denominator at s = i w: i w (1 + i w Tlag) = -w^2 Tlag + i w
        double denRe = -omegaRadPerSecond * omegaRadPerSecond * lagSeconds;
        double denIm = omegaRadPerSecond;
        double scale = slopePerSecond / (denRe * denRe + denIm * denIm);
        out[0] = scale * denRe;
        out[1] = -scale * denIm;
    }

    /** Closed form for the pure integrator; the lagged one goes through the general path. */
    @Override
    public SampledStateSpace sampled(double scanSeconds) {
        if (lagSeconds == 0.0) {
            return ZeroOrderHold.integrator(slopePerSecond, deadTimeSeconds, scanSeconds);
        }
        return ZeroOrderHold.of(rationalPart(), deadTimeSeconds, scanSeconds);
    }
}

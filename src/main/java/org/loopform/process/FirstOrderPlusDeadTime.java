package org.loopform.process;

import org.loopform.lti.Polynomial;
import org.loopform.lti.SampledStateSpace;
import org.loopform.lti.TransferFunction;
import org.loopform.lti.ZeroOrderHold;

/**
 * First order plus dead time (FOPDT): {@code G(s) = K e^(-s L) / (1 + s T)}.
 *
 * @param gain normalized static gain K, % of PV span per % of output span (non-zero)
 * @param timeConstantSeconds time constant T, seconds, > 0
 * @param deadTimeSeconds dead time L, seconds, >= 0
 */
public record FirstOrderPlusDeadTime(double gain, double timeConstantSeconds, double deadTimeSeconds)
        implements ProcessModel {

    private static final String NAME = "first order plus dead time";

    public FirstOrderPlusDeadTime {
        Require.finiteNonZero(NAME, "gain", gain);
        Require.positive(NAME, "timeConstantSeconds", timeConstantSeconds, " s");
        Require.nonNegative(NAME, "deadTimeSeconds", deadTimeSeconds, " s");
    }

    @Override
    public TransferFunction rationalPart() {
        return new TransferFunction(Polynomial.constant(gain), Polynomial.ofAscending(1.0, timeConstantSeconds));
    }

    @Override
    public void rationalResponseAt(double omegaRadPerSecond, double[] out) {
        // K / (1 + i w T) = K (1 - i w T) / (1 + (w T)^2)
        double wt = omegaRadPerSecond * timeConstantSeconds;
        double scale = gain / (1.0 + wt * wt);
        out[0] = scale;
        out[1] = -scale * wt;
    }

    /** Sampled with the closed-form first-order formulas (see {@link ZeroOrderHold#firstOrder}). */
    @Override
    public SampledStateSpace sampled(double scanSeconds) {
        return ZeroOrderHold.firstOrder(gain, timeConstantSeconds, deadTimeSeconds, scanSeconds);
    }
}

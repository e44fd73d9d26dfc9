package org.loopform.process;

import org.loopform.lti.SampledStateSpace;
import org.loopform.lti.TransferFunction;
import org.loopform.lti.ZeroOrderHold;

/**
 * Any proper rational transfer function with dead time, {@code G(s) = N(s) e^(-s L) / D(s)}.
 *
 * @param transferFunction the delay-free part, proper (degree of N at most that of D), N not zero
 * @param deadTimeSeconds dead time L, seconds, >= 0
 */
public record GeneralTransferFunction(TransferFunction transferFunction, double deadTimeSeconds)
        implements ProcessModel {

    private static final String NAME = "general transfer function";

    public GeneralTransferFunction {
        if (transferFunction == null) {
            throw new IllegalArgumentException(NAME + ": transferFunction is required (got null)");
        }
        if (!transferFunction.isProper()) {
            throw new IllegalArgumentException(NAME + ": transferFunction must be proper, numerator degree"
                    + " <= denominator degree (got " + transferFunction + ")");
        }
        if (transferFunction.numerator().isZero()) {
            throw new IllegalArgumentException(NAME + ": numerator must not be zero (got " + transferFunction + ")");
        }
        Require.nonNegative(NAME, "deadTimeSeconds", deadTimeSeconds, " s");
    }

    @Override
    public TransferFunction rationalPart() {
        return transferFunction;
    }

    @Override
    public void rationalResponseAt(double omegaRadPerSecond, double[] out) {
        transferFunction.responseAt(omegaRadPerSecond, out);
    }

    @Override
    public SampledStateSpace sampled(double scanSeconds) {
        return ZeroOrderHold.of(transferFunction, deadTimeSeconds, scanSeconds);
    }
}

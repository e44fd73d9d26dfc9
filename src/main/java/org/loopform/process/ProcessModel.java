package org.loopform.process;

import org.loopform.lti.SampledStateSpace;
import org.loopform.lti.TransferFunction;

/**
 * A linear process model: a delay-free rational part {@code G0(s)} in seconds times a pure dead
 * time, {@code G(s) = G0(s) e^(-s L)}. Gains are normalized: percent of PV span per percent of
 * output span (for an integrating process, percent per second per percent).
 */
public sealed interface ProcessModel
        permits FirstOrderPlusDeadTime, SecondOrderPlusDeadTime, IntegratingPlusDeadTime,
                GeneralTransferFunction {

    /** The delay-free rational part {@code G0(s)}. */
    TransferFunction rationalPart();

    /** The pure dead time L, seconds. */
    double deadTimeSeconds();

    /**
     * Frequency response of the rational part alone at {@code s = i omega}, written into
     * {@code out} as {re, im}. Nothing is allocated.
     */
    void rationalResponseAt(double omegaRadPerSecond, double[] out);

    /**
     * The process sampled through a zero-order hold at the given scan time, exact for any dead
     * time (including a fractional part of a scan).
     */
    SampledStateSpace sampled(double scanSeconds);

    /**
     * Frequency response {@code G0(i omega) e^(-i omega L)}, omega in rad/s, written into
     * {@code out} as {re, im}. Nothing is allocated.
     */
    default void responseAt(double omegaRadPerSecond, double[] out) {
        rationalResponseAt(omegaRadPerSecond, out);
        double delayPhaseRad = -omegaRadPerSecond * deadTimeSeconds();
        double cos = Math.cos(delayPhaseRad);
        double sin = Math.sin(delayPhaseRad);
        double re = out[0];
        double im = out[1];
        out[0] = re * cos - im * sin;
        out[1] = re * sin + im * cos;
    }

    /**
     * How many integrators the rational part has: the exact zero coefficients at the bottom of its
     * denominator, less those of its numerator.
     */
    default int integrators() {
        return lowestPower(rationalPart().denominator().ascending()) - lowestPower(rationalPart().numerator().ascending());
    }

    /**
     * The low-frequency gain {@code lim s^q G0(s)} as s goes to 0, q = {@link #integrators}: the static
     * gain K (%/%) of a self-regulating process, the slope Kv (%/s per %) of an integrating one. Its
     * sign is the process's direction: positive when the PV rises with the output.
     */
    default double lowFrequencyGain() {
        double[] num = rationalPart().numerator().ascending();
        double[] den = rationalPart().denominator().ascending();
        return num[lowestPower(num)] / den[lowestPower(den)];
    }

    private static int lowestPower(double[] ascending) {
        int k = 0;
        while (k < ascending.length - 1 && ascending[k] == 0) {
            k++;
        }
        return k;
    }
}

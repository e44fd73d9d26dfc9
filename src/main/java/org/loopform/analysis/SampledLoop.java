package org.loopform.analysis;

import java.util.List;
import org.apache.commons.math3.complex.Complex;

/**
 * The open loop of a sampled control loop as a function of z anywhere in the plane, for the
 * argument principle: {@code L(z) = R(z) z^-d}, R rational (the controller's pulse law times the
 * sampled process without its whole-scan delay), d the dead time's whole scans.
 */
public interface SampledLoop {

    /**
     * Writes {@code {Re L, Im L, Re R, Im R}} at {@code z = (1 + radiusOffset) e^(i theta)} into
     * {@code out}. The radius is passed as its offset from 1 so that points a hair off the unit
     * circle, next to an integrator's pole at z = 1, keep their precision.
     */
    void at(double radiusOffset, double theta, double[] out);

    /** The open-loop poles of R other than those at z = 0, with multiplicity. */
    List<Complex> openLoopPoles();

    /** d, the whole scans of dead time (the poles at z = 0 that turn the phase fastest). */
    int delayScans();
}

package org.loopform.check;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.loopform.analysis.SampledLoop;
import org.loopform.lti.SampledStateSpace;
import org.loopform.scan.PulseLaw;

/**
 * A controller's feedback pulse law in series with a sampled process, as the stability count sees
 * it: {@code L(z) = C_y(z) H(z)}, H with its whole-scan delay apart. Holds scratch space: one thread.
 */
final class SampledOpenLoop implements SampledLoop {

    private final PulseLaw controller;
    private final SampledStateSpace process;
    private final SampledStateSpace.Workspace work;
    private final double[] c = new double[2];
    private final double[] h = new double[4];
    private final int delayScans;
    private double cachedOffset = Double.NaN;
    private double delayScale;

    SampledOpenLoop(PulseLaw controller, SampledStateSpace process) {
        this.controller = controller;
        this.process = process;
        this.work = process.newWorkspace();
        this.delayScans = process.delayScans();
    }

    @Override
    public void at(double radiusOffset, double theta, double[] out) {
        // one cosine and sine for both factors, and the delay's two
        double cos = Math.cos(theta);
        double sin = Math.sin(theta);
        double oneMinusCos = PulseLaw.oneMinusCos(cos, sin);
        controller.feedbackAtPoint(radiusOffset, cos, sin, oneMinusCos, c);
        process.rationalAtPoint(radiusOffset, cos, sin, oneMinusCos, work, h);
        double rRe = c[0] * h[2] - c[1] * h[3];
        double rIm = c[0] * h[3] + c[1] * h[2];
        if (radiusOffset != cachedOffset) {
            cachedOffset = radiusOffset;
            delayScale = Math.exp(-delayScans * Math.log1p(radiusOffset));
        }
        double delayPhase = -delayScans * theta;
        double dc = Math.cos(delayPhase) * delayScale;
        double ds = Math.sin(delayPhase) * delayScale;
        out[0] = rRe * dc - rIm * ds;
        out[1] = rRe * ds + rIm * dc;
        out[2] = rRe;
        out[3] = rIm;
    }

    @Override
    public List<Complex> openLoopPoles() {
        List<Complex> poles = new ArrayList<>();
        for (double[] p : controller.feedbackPoles()) {
            poles.add(new Complex(p[0], p[1]));
        }
        for (double[] p : process.poles()) {
            poles.add(new Complex(p[0], p[1]));
        }
        return poles;
    }

    @Override
    public int delayScans() {
        return process.delayScans();
    }
}

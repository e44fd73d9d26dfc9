package org.loopform.audit;

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

    SampledOpenLoop(PulseLaw controller, SampledStateSpace process) {
        this.controller = controller;
        this.process = process;
        this.work = process.newWorkspace();
    }

    @Override
    public void at(double radiusOffset, double theta, double[] out) {
        controller.feedbackAtRadius(radiusOffset, theta, c);
        process.responseAtRadius(radiusOffset, theta, work, h);
        out[0] = c[0] * h[0] - c[1] * h[1];
        out[1] = c[0] * h[1] + c[1] * h[0];
        out[2] = c[0] * h[2] - c[1] * h[3];
        out[3] = c[0] * h[3] + c[1] * h[2];
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

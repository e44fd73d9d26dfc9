package org.loopform.analysis;

import org.loopform.law.ControlLaw;
import org.loopform.law.LawDeviation;
import org.loopform.lti.FrequencyBand;
import org.loopform.scan.PulseLaw;

/**
 * How the controller the target runs (its pulse transfer functions on the unit circle) departs
 * from the design law (its continuous frequency response): gain ratio in dB and phase difference
 * in degrees, over both paths, on a log-spaced grid. Under a scan the controller's response is
 * only defined up to the Nyquist frequency pi/h, so the band must stay below it.
 */
public final class ControllerMismatch {

    /** Points on the comparison grid. */
    public static final int GRID_POINTS = 200;

    private ControllerMismatch() {
    }

    /** The largest deviation over {@code band}, both paths. */
    public static LawDeviation over(ControlLaw design, PulseLaw target, FrequencyBand band) {
        return over(design, target, band, false);
    }

    /** The largest deviation over {@code band}, of the feedback path alone or of both paths. */
    public static LawDeviation over(ControlLaw design, PulseLaw target, FrequencyBand band,
                                    boolean feedbackOnly) {
        // the curve's figures point by point, without its arrays; the setpoint path is evaluated
        // only when it is asked for
        double[] w = band.grid(GRID_POINTS);
        double[] a = new double[2];
        double[] b = new double[2];
        double g = 0;
        double p = 0;
        double at = band.lowRadPerSecond();
        // both paths the same in both laws: the setpoint path's figures are the feedback path's
        feedbackOnly = feedbackOnly || samePaths(design, target);
        for (int k = 0; k < w.length; k++) {
            design.feedbackAt(w[k], a);
            target.feedbackAt(w[k], b);
            double gk = Math.abs(gainDb(a, b));
            double pk = Math.abs(phaseDeg(a, b));
            if (!feedbackOnly) {
                design.setpointAt(w[k], a);
                target.setpointAt(w[k], b);
                gk = Math.max(gk, Math.abs(gainDb(a, b)));
                pk = Math.max(pk, Math.abs(phaseDeg(a, b)));
            }
            if (gk > g) {
                g = gk;
                at = w[k];
            }
            p = Math.max(p, pk);
        }
        return new LawDeviation(g, p, at);
    }

    /** The mismatch curves over the band, for plots: gain ratio (dB) and phase difference (deg) per path. */
    public static Curve curve(ControlLaw design, PulseLaw target, FrequencyBand band, int points) {
        double[] w = band.grid(points);
        double[] fg = new double[points];
        double[] fp = new double[points];
        double[] sg = new double[points];
        double[] sp = new double[points];
        double[] a = new double[2];
        double[] b = new double[2];
        boolean samePaths = samePaths(design, target);
        for (int k = 0; k < points; k++) {
            design.feedbackAt(w[k], a);
            target.feedbackAt(w[k], b);
            fg[k] = gainDb(a, b);
            fp[k] = phaseDeg(a, b);
            if (samePaths) {
                sg[k] = fg[k];
                sp[k] = fp[k];
                continue;
            }
            design.setpointAt(w[k], a);
            target.setpointAt(w[k], b);
            sg[k] = gainDb(a, b);
            sp[k] = phaseDeg(a, b);
        }
        return new Curve(w, fg, fp, sg, sp);
    }

    /** Whether each law's setpoint path is its feedback path to the bit, so the setpoint curves repeat the feedback ones. */
    private static boolean samePaths(ControlLaw design, PulseLaw target) {
        return design.setpointPathIsFeedbackPath() && target.setpointPathIsFeedbackPath();
    }

    private static double gainDb(double[] a, double[] b) {
        // 20 log10(|b|/|a|) written with squared magnitudes: no square roots on this hot path
        double ma = a[0] * a[0] + a[1] * a[1];
        double mb = b[0] * b[0] + b[1] * b[1];
        if (ma == 0 && mb == 0) {
            return 0;
        }
        return 10 * Math.log10(mb / ma);
    }

    private static double phaseDeg(double[] a, double[] b) {
        double re = b[0] * a[0] + b[1] * a[1];
        double im = b[1] * a[0] - b[0] * a[1];
        return re == 0 && im == 0 ? 0 : Math.toDegrees(Math.atan2(im, re));
    }

    /** Mismatch curves: frequencies (rad/s) and, per path, gain ratio (dB) and phase difference (deg). */
    public record Curve(double[] omegas, double[] feedbackGainDb, double[] feedbackPhaseDeg, double[] setpointGainDb,
                        double[] setpointPhaseDeg) {
    }
}

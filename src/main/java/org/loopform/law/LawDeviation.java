package org.loopform.law;

import org.loopform.lti.FrequencyBand;

/**
 * How far one law's frequency response strays from another's over a band: the largest gain
 * difference in dB and the largest phase difference in degrees, over the feedback path, the
 * setpoint path or both, with the frequency where the gain difference is largest.
 */
public record LawDeviation(double gainDb, double phaseDegrees, double worstRadPerSecond) {

    public static final LawDeviation NONE = new LawDeviation(0, 0, 0);

    public LawDeviation {
        if (!(gainDb >= 0) || !(phaseDegrees >= 0)) {
            throw new IllegalArgumentException("deviations are magnitudes, >= 0 (got " + gainDb + " dB, "
                    + phaseDegrees + " deg)");
        }
    }

    /** Number of log-spaced points on which laws are compared. */
    static final int GRID_POINTS = 400;

    /** The deviation of {@code actual} from {@code reference} over {@code band}, both paths. */
    public static LawDeviation between(ControlLaw reference, ControlLaw actual, FrequencyBand band) {
        return over(reference, actual, band, true, true);
    }

    /** The deviation of the feedback paths C_y only: what stability and disturbance response see. */
    public static LawDeviation ofFeedback(ControlLaw reference, ControlLaw actual, FrequencyBand band) {
        return over(reference, actual, band, true, false);
    }

    /** The deviation of the setpoint paths C_r only: what setpoint responses see. */
    public static LawDeviation ofSetpoint(ControlLaw reference, ControlLaw actual, FrequencyBand band) {
        return over(reference, actual, band, false, true);
    }

    private static LawDeviation over(ControlLaw reference, ControlLaw actual, FrequencyBand band,
                                     boolean feedback, boolean setpoint) {
        double[] a = new double[2];
        double[] b = new double[2];
        double worstGain = 0;
        double worstPhase = 0;
        double worstAt = band.lowRadPerSecond();
        for (double w : band.grid(GRID_POINTS)) {
            for (int path = 0; path < 2; path++) {
                if (path == 0 && !feedback || path == 1 && !setpoint) {
                    continue;
                }
                if (path == 0) {
                    reference.feedbackAt(w, a);
                    actual.feedbackAt(w, b);
                } else {
                    reference.setpointAt(w, a);
                    actual.setpointAt(w, b);
                }
                double ma = Math.hypot(a[0], a[1]);
                double mb = Math.hypot(b[0], b[1]);
                if (ma == 0 && mb == 0) {
                    continue;
                }
                double gain = (ma == 0 || mb == 0) ? Double.MAX_VALUE : Math.abs(20 * Math.log10(mb / ma));
                // phase of b / a
                double re = b[0] * a[0] + b[1] * a[1];
                double im = b[1] * a[0] - b[0] * a[1];
                double phase = Math.abs(Math.toDegrees(Math.atan2(im, re)));
                if (gain > worstGain) {
                    worstGain = gain;
                    worstAt = w;
                }
                worstPhase = Math.max(worstPhase, phase);
            }
        }
        return new LawDeviation(worstGain, worstPhase, worstAt);
    }
}

package org.loopform.law;

import org.loopform.lti.FrequencyBand;

/** The band of frequencies a tuning itself implies, where two laws are compared. */
public final class TuningBand {

    /** Decades below the lowest and above the highest corner of the law that the band spans. */
    static final double MARGIN_DECADES = 1.0;

    private TuningBand() {
    }

    /**
     * The band the tuning itself implies: one decade below its lowest corner to one decade above
     * its highest (integral corner i/p, derivative corner p/d, filter corner 1/tf), cut at the
     * Nyquist frequency pi/h when a scan time is given. Common practice: the law matters around
     * its corners and the crossover lies between them.
     */
    public static FrequencyBand implied(PidTerms t, double scanSeconds) {
        double low = Double.POSITIVE_INFINITY;
        double high = 0;
        double p = Math.abs(t.p());
        if (t.i() != 0 && p > 0) {
            double corner = Math.abs(t.i()) / p;
            low = Math.min(low, corner);
            high = Math.max(high, corner);
        }
        if (t.d() != 0 && p > 0) {
            double corner = p / Math.abs(t.d());
            low = Math.min(low, corner);
            high = Math.max(high, corner);
        }
        if (t.tf() > 0) {
            double corner = 1.0 / t.tf();
            low = Math.min(low, corner);
            high = Math.max(high, corner);
        }
        if (!(high > 0)) {
            // proportional only, or no proportional term: any band shows the (flat) law
            low = 0.01;
            high = 1.0;
        }
        double scale = Math.pow(10, MARGIN_DECADES);
        low /= scale;
        high *= scale;
        if (scanSeconds > 0) {
            high = Math.min(high, Math.PI / scanSeconds);
            low = Math.min(low, high / 100);
        }
        return new FrequencyBand(low, high);
    }


    /** How far the band where the loop lives reaches beyond the law's outer proportional corners. */
    static final double LIVES_BEYOND_CORNERS = 2.0;
    /** For a PI (PD) law, how far above (below) its one corner the crossover usually lies. */
    static final double LIVES_BEYOND_ONE_CORNER = 10.0;

    /**
     * Where the loop lives when no process says it: from half the lowest to twice the highest of
     * the law's proportional corners (integral corner i/p, derivative corner p/d), without the
     * filter corner 1/tf, which shapes the derivative's high-frequency gain rather than the loop.
     * A PI law's crossover lies above its integral corner and a PD law's below its derivative
     * corner, so a law with one corner gets a decade on that side. Cut at the Nyquist frequency
     * pi/h when a scan time is given. Common practice: a PID loop's crossover lies between its
     * controller zeros or a little beyond them (Astrom and Hagglund 1995, ch. 4 - from memory).
     */
    public static FrequencyBand whereLoopLives(PidTerms t, double scanSeconds) {
        double p = Math.abs(t.p());
        double integralCorner = t.i() != 0 && p > 0 ? Math.abs(t.i()) / p : Double.NaN;
        double derivativeCorner = t.d() != 0 && p > 0 ? p / Math.abs(t.d()) : Double.NaN;
        double low;
        double high;
        if (Double.isFinite(integralCorner) && Double.isFinite(derivativeCorner)) {
            low = Math.min(integralCorner, derivativeCorner) / LIVES_BEYOND_CORNERS;
            high = Math.max(integralCorner, derivativeCorner) * LIVES_BEYOND_CORNERS;
        } else if (Double.isFinite(integralCorner)) {
            low = integralCorner / LIVES_BEYOND_CORNERS;
            high = integralCorner * LIVES_BEYOND_ONE_CORNER;
        } else if (Double.isFinite(derivativeCorner)) {
            low = derivativeCorner / LIVES_BEYOND_ONE_CORNER;
            high = derivativeCorner * LIVES_BEYOND_CORNERS;
        } else {
            return implied(t, scanSeconds);
        }
        if (scanSeconds > 0) {
            high = Math.min(high, Math.PI / scanSeconds);
            low = Math.min(low, high / 10);
        }
        return new FrequencyBand(low, high);
    }
}

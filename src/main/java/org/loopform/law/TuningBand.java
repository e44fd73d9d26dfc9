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

}

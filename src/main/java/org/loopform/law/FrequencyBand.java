package org.loopform.law;

/**
 * The band of frequencies over which two laws are compared, rad/s. Laws that agree over the band
 * that matters for the loop behave alike in it; outside it the loop does not care much.
 */
public record FrequencyBand(double lowRadPerSecond, double highRadPerSecond) {

    /** Decades below the lowest and above the highest corner of the law that the band spans. */
    static final double MARGIN_DECADES = 1.0;

    public FrequencyBand {
        if (!(lowRadPerSecond > 0) || !(highRadPerSecond > lowRadPerSecond) || !Double.isFinite(highRadPerSecond)) {
            throw new IllegalArgumentException("frequency band must have 0 < low < high (got "
                    + lowRadPerSecond + ".." + highRadPerSecond + " rad/s)");
        }
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

    /** {@code count} log-spaced frequencies from low to high inclusive. */
    public double[] grid(int count) {
        double[] w = new double[count];
        double a = Math.log(lowRadPerSecond);
        double b = Math.log(highRadPerSecond);
        for (int k = 0; k < count; k++) {
            w[k] = Math.exp(a + (b - a) * k / (count - 1));
        }
        return w;
    }
}

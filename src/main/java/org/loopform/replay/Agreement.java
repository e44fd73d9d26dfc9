package org.loopform.replay;

/**
 * How closely one output follows another over the scans compared, in percent of the output span:
 * the root-mean-square and the largest difference (and when it happened, seconds from the
 * record's start), Pearson's correlation (null where either output does not move), and the
 * standard deviation of the reference output (how much the record moved it).
 */
public record Agreement(double rmsPercent, double maxPercent, double maxAtSeconds, Double correlation,
                        int comparedScans, double referenceSpreadPercent) {

    /** Outputs whose standard deviation is below this, % of span, have no meaningful correlation. */
    static final double STILL_PERCENT = 1e-6;

    public Agreement {
        if (!(rmsPercent >= 0) || !(maxPercent >= 0) || !Double.isFinite(maxAtSeconds) || comparedScans < 1
                || !(referenceSpreadPercent >= 0) || correlation != null && !Double.isFinite(correlation)) {
            throw new IllegalArgumentException("an agreement needs finite figures over at least one scan (got rms "
                    + rmsPercent + ", max " + maxPercent + ", scans " + comparedScans + ")");
        }
    }

    /**
     * The agreement of {@code replay} with {@code reference} over the scans where {@code compared}
     * holds, or null when none is compared; {@code timeOf} gives scan k's time in seconds.
     */
    static Agreement of(double[] replay, double[] reference, boolean[] compared, java.util.function.IntToDoubleFunction timeOf) {
        int n = 0;
        double sumSq = 0;
        double max = -1;
        int maxAt = -1;
        double sa = 0;
        double sb = 0;
        for (int k = 0; k < replay.length; k++) {
            if (!compared[k]) {
                continue;
            }
            double d = replay[k] - reference[k];
            sumSq += d * d;
            if (Math.abs(d) > max) {
                max = Math.abs(d);
                maxAt = k;
            }
            sa += replay[k];
            sb += reference[k];
            n++;
        }
        if (n == 0) {
            return null;
        }
        double ma = sa / n;
        double mb = sb / n;
        double saa = 0;
        double sbb = 0;
        double sab = 0;
        for (int k = 0; k < replay.length; k++) {
            if (compared[k]) {
                double a = replay[k] - ma;
                double b = reference[k] - mb;
                saa += a * a;
                sbb += b * b;
                sab += a * b;
            }
        }
        double spreadA = Math.sqrt(saa / n);
        double spreadB = Math.sqrt(sbb / n);
        Double correlation = spreadA > STILL_PERCENT && spreadB > STILL_PERCENT
                ? Math.max(-1.0, Math.min(1.0, sab / Math.sqrt(saa * sbb))) : null;
        return new Agreement(Math.sqrt(sumSq / n), max, timeOf.applyAsDouble(maxAt), correlation, n, spreadB);
    }
}

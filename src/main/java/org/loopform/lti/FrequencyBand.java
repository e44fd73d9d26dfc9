package org.loopform.lti;

/**
 * A band of angular frequencies {@code [lowRadPerSecond, highRadPerSecond]}, rad/s, over which
 * laws are compared and loops analysed. Both ends are finite and positive, and the top lies above
 * the bottom.
 */
public record FrequencyBand(double lowRadPerSecond, double highRadPerSecond) {

    public FrequencyBand {
        if (!(lowRadPerSecond > 0) || Double.isInfinite(lowRadPerSecond)) {
            throw new IllegalArgumentException(
                    "band bottom must be finite and > 0 rad/s (got " + lowRadPerSecond + " rad/s)");
        }
        if (!(highRadPerSecond > lowRadPerSecond) || Double.isInfinite(highRadPerSecond)) {
            throw new IllegalArgumentException("band top must be finite and above the bottom "
                    + lowRadPerSecond + " rad/s (got " + highRadPerSecond + " rad/s)");
        }
    }

    /** The band {@code [lowRadPerSecond, highRadPerSecond]}. */
    public static FrequencyBand of(double lowRadPerSecond, double highRadPerSecond) {
        return new FrequencyBand(lowRadPerSecond, highRadPerSecond);
    }

    /**
     * The band from {@code lowRadPerSecond} up to the Nyquist frequency {@code pi / scanSeconds},
     * where the response of a loop sampled every {@code scanSeconds} ends.
     */
    public static FrequencyBand belowNyquist(double lowRadPerSecond, double scanSeconds) {
        if (!(scanSeconds > 0) || Double.isInfinite(scanSeconds)) {
            throw new IllegalArgumentException(
                    "scan time must be finite and > 0 s (got " + scanSeconds + " s)");
        }
        return new FrequencyBand(lowRadPerSecond, Math.PI / scanSeconds);
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

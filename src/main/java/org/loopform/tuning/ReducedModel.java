package org.loopform.tuning;

/**
 * The low-order model a tuning rule reads: a self-regulating process
 * {@code k e^(-theta s) / ((tau1 s + 1)(tau2 s + 1))} ({@code tau2 = 0} for first order), or an
 * integrating one {@code k' e^(-theta s) / (s (tau2 s + 1))} ({@code tau1} is then infinite).
 * Gains are normalized (%/%, or %/s per % for the integrating slope); times in seconds.
 *
 * @param gain k (self-regulating) or k' (integrating), non-zero, its sign the process's direction
 * @param lagSeconds tau1 > 0, or {@code +Infinity} for an integrating process
 * @param secondLagSeconds tau2 >= 0
 * @param deadTimeSeconds theta >= 0 (the effective dead time when reduced)
 * @param how how it was obtained: "as given", or the reduction that made it
 */
public record ReducedModel(double gain, double lagSeconds, double secondLagSeconds, double deadTimeSeconds,
                           String how) {

    public ReducedModel {
        if (!Double.isFinite(gain) || gain == 0) {
            throw new IllegalArgumentException("gain must be finite and non-zero (got " + gain + ")");
        }
        if (!(lagSeconds > 0)) {
            throw new IllegalArgumentException("lag must be > 0 s or infinite (got " + lagSeconds + " s)");
        }
        if (!(secondLagSeconds >= 0) || !Double.isFinite(secondLagSeconds)) {
            throw new IllegalArgumentException("second lag must be finite and >= 0 s (got " + secondLagSeconds + ")");
        }
        if (!(deadTimeSeconds >= 0) || !Double.isFinite(deadTimeSeconds)) {
            throw new IllegalArgumentException("dead time must be finite and >= 0 s (got " + deadTimeSeconds + ")");
        }
    }

    public boolean integrating() {
        return Double.isInfinite(lagSeconds);
    }

    public boolean secondOrder() {
        return secondLagSeconds > 0;
    }
}

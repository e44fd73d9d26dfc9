package org.loopform.form;

import java.util.List;

/**
 * How the target runs the law each scan: positional or velocity; integral and derivative
 * discretization; anti-windup (with tracking time, seconds, 0 meaning the rule of thumb
 * sqrt(Ti Td)); output limits in percent; and the scan times it allows (an explicit list, or a
 * range, seconds). Defaults (common practice): positional, backward differences, clamping, 0..100 %.
 */
public record DiscreteAlgorithm(AlgorithmKind kind, Discretization integral, Discretization derivative,
                                AntiWindup antiWindup, double trackingTimeSeconds,
                                double outputLowPercent, double outputHighPercent,
                                List<Double> allowedScansSeconds, double minScanSeconds, double maxScanSeconds) {

    public DiscreteAlgorithm {
        if (kind == null || integral == null || derivative == null || antiWindup == null) {
            throw new FormException("algorithm needs 'kind', 'integral', 'derivative' and 'anti_windup'");
        }
        if (integral == Discretization.STEP_INVARIANT || integral == Discretization.RAMP_INVARIANT) {
            throw new FormException("algorithm: integral discretization must be forward, backward or trapezoidal"
                    + " (got " + integral.name().toLowerCase(java.util.Locale.ROOT) + ")");
        }
        if (!(trackingTimeSeconds >= 0)) {
            throw new FormException("algorithm: tracking time must be >= 0 s (got " + trackingTimeSeconds + " s)");
        }
        if (!(outputHighPercent > outputLowPercent)) {
            throw new FormException("algorithm: output limits need high > low (got " + outputLowPercent + ".."
                    + outputHighPercent + " %)");
        }
        allowedScansSeconds = List.copyOf(allowedScansSeconds);
        for (double h : allowedScansSeconds) {
            if (!(h > 0)) {
                throw new FormException("algorithm: allowed scan times must be > 0 s (got " + h + " s)");
            }
        }
        if (!(minScanSeconds >= 0) || !(maxScanSeconds >= minScanSeconds)) {
            throw new FormException("algorithm: scan range needs 0 <= min <= max (got " + minScanSeconds + ".."
                    + maxScanSeconds + " s)");
        }
    }

    public static DiscreteAlgorithm defaults() {
        return new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD, Discretization.BACKWARD,
                AntiWindup.CLAMPING, 0.0, 0.0, 100.0, List.of(), 0.0, Double.MAX_VALUE);
    }

    /** True when the target accepts scan time {@code h} seconds. */
    public boolean allowsScan(double scanSeconds) {
        if (!allowedScansSeconds.isEmpty()) {
            for (double h : allowedScansSeconds) {
                if (Math.abs(h - scanSeconds) <= 1e-9 * h) {
                    return true;
                }
            }
            return false;
        }
        return scanSeconds >= minScanSeconds && scanSeconds <= maxScanSeconds;
    }
}

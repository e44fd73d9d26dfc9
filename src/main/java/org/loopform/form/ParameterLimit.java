package org.loopform.form;

/**
 * What a target accepts for one parameter, in the parameter's own unit: the range it takes and
 * the step it stores (resolution). Any of them may be absent (null).
 */
public record ParameterLimit(Double min, Double max, Double resolution) {

    static final ParameterLimit NONE = new ParameterLimit(null, null, null);

    public ParameterLimit {
        if (min != null && !Double.isFinite(min) || max != null && !Double.isFinite(max)) {
            throw new FormException("parameter limits must be finite numbers (got " + min + ".." + max + ")");
        }
        if (min != null && max != null && min > max) {
            throw new FormException("parameter limit min must not exceed max (got " + min + " > " + max + ")");
        }
        if (resolution != null && !(resolution > 0 && Double.isFinite(resolution))) {
            throw new FormException("resolution must be a positive step (got " + resolution + ")");
        }
    }

    /**
     * Significant digits of a value entered where the form names no resolution: the binary noise of
     * the conversion (117.99999999999999) is taken off, nothing the law would feel; outputs print
     * fewer digits. The check runs these values, so the target loop is the converted law itself.
     */
    static final int UNRESOLVED_DIGITS = 12;

    public boolean accepts(double value) {
        return (min == null || value >= min - tolerance(min)) && (max == null || value <= max + tolerance(max));
    }

    private static double tolerance(double bound) {
        // a value printed and read back may differ in its last digit; do not call that a limit breach
        return 1e-12 * Math.max(1.0, Math.abs(bound));
    }

    /**
     * The value as the target stores it: the nearest multiple of the resolution (half away from
     * zero), or {@link #UNRESOLVED_DIGITS} significant digits where the form names no resolution.
     */
    public double round(double value) {
        if (resolution == null) {
            return value == 0 || !Double.isFinite(value) ? value
                    : new java.math.BigDecimal(value).round(new java.math.MathContext(UNRESOLVED_DIGITS)).doubleValue();
        }
        java.math.BigDecimal step = java.math.BigDecimal.valueOf(resolution);
        java.math.BigDecimal steps = java.math.BigDecimal.valueOf(value)
                .divide(step, 0, java.math.RoundingMode.HALF_UP);
        return steps.multiply(step).doubleValue();
    }
}

package org.loopform.form;

import org.loopform.units.TimeUnit;

/**
 * A form's derivative filter: what can be set ({@link FilterKind}), where it acts
 * ({@link FilterPlacement}), the ratio N (fixed, or the default of an adjustable one), and for a
 * time-constant filter its unit and default in that unit.
 */
public record FilterSpec(FilterKind kind, FilterPlacement placement, double ratio, TimeUnit unit, double defaultTime) {

    public FilterSpec {
        if (kind == null || placement == null || unit == null) {
            throw new FormException("filter needs 'kind' and 'placement'");
        }
        if ((kind == FilterKind.FIXED_RATIO || kind == FilterKind.RATIO) && !(ratio > 0 && Double.isFinite(ratio))) {
            throw new FormException("filter: ratio N must be a positive number (got " + ratio + ")");
        }
        if (!(defaultTime >= 0) || !Double.isFinite(defaultTime)) {
            throw new FormException("filter: default time constant must be >= 0 (got " + defaultTime + ")");
        }
    }

    /** The default when a form file says nothing: adjustable N with default 10 on the derivative term (common practice). */
    public static FilterSpec defaults() {
        return new FilterSpec(FilterKind.RATIO, FilterPlacement.DERIVATIVE, 10.0, TimeUnit.SECONDS, 0.0);
    }
}

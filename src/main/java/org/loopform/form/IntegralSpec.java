package org.loopform.form;

import org.loopform.units.TimeUnit;

/**
 * How a form writes integral action: as time, rate, gain or per-scan gain, in which time unit,
 * and which written value turns it off ({@code offValue}: a time at or above it, or a rate or
 * gain equal to it, means no integral action; usually 0).
 */
public record IntegralSpec(IntegralWriting writing, TimeUnit unit, double offValue) {
    public IntegralSpec {
        if (writing == null || unit == null) {
            throw new FormException("integral needs 'as' and 'unit'");
        }
        if (!Double.isFinite(offValue) || offValue < 0) {
            throw new FormException("integral: 'off' must be a value >= 0 (got " + offValue + ")");
        }
    }

    /** True when the written value {@code v} means integral action is off. */
    public boolean isOff(double v) {
        if (writing == IntegralWriting.TIME) {
            return offValue == 0 ? v == 0 : v >= offValue;
        }
        return v == offValue;
    }
}

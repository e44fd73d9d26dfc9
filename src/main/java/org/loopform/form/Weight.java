package org.loopform.form;

/**
 * A setpoint weight (b on proportional, c on derivative action): fixed by the form, or adjustable
 * within [min, max] with a default. c = 0 is "derivative on measurement", b = 0 "proportional on
 * measurement".
 */
public record Weight(double defaultValue, boolean adjustable, double min, double max) {

    public Weight {
        if (!Double.isFinite(defaultValue) || !Double.isFinite(min) || !Double.isFinite(max)) {
            throw new FormException("setpoint weight values must be finite numbers (got default "
                    + defaultValue + ", range " + min + ".." + max + ")");
        }
        if (min > max || defaultValue < min || defaultValue > max) {
            throw new FormException("setpoint weight default " + defaultValue + " must lie within its range "
                    + min + ".." + max);
        }
    }

    public static Weight fixed(double value) {
        return new Weight(value, false, value, value);
    }

    static Weight adjustable(double defaultValue) {
        return new Weight(defaultValue, true, 0.0, 1.0);
    }
}

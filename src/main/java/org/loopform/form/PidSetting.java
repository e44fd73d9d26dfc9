package org.loopform.form;

/**
 * A tuning in one structure's own coordinates, SI seconds and normalized signed gain (%/%,
 * positive = reverse action): what a form's values mean once units, band, basis and action flag
 * are taken off.
 *
 * <ul>
 *   <li>parallel: {@code gain} = kp, {@code integral} = ki in 1/s (0: off), {@code derivative} = kd in s</li>
 *   <li>ideal and series: {@code gain} = Kc, {@code integral} = Ti in s (infinity: off), {@code derivative} = Td in s</li>
 * </ul>
 * {@code filterSeconds} is the derivative filter time constant Tf (0: none); {@code b}, {@code c}
 * are the setpoint weights.
 */
public record PidSetting(Structure structure, double gain, double integral, double derivative,
                         double filterSeconds, double b, double c) {

    public PidSetting {
        if (structure == null) {
            throw new IllegalArgumentException("a setting needs its structure");
        }
        if (!Double.isFinite(gain) || gain == 0) {
            throw new FormException("gain must be a finite, non-zero number (got " + gain + ")");
        }
        if (structure == Structure.PARALLEL) {
            if (!Double.isFinite(integral)) {
                throw new FormException("ki must be finite (got " + integral + ")");
            }
            if (!Double.isFinite(derivative)) {
                throw new FormException("kd must be finite (got " + derivative + ")");
            }
        } else {
            if (!(integral > 0)) {
                throw new FormException("ti must be > 0 s (got " + integral + " s); use the form's 'off' value to turn "
                        + "integral action off");
            }
            if (!(derivative >= 0) || !Double.isFinite(derivative)) {
                throw new FormException("td must be >= 0 s (got " + derivative + " s)");
            }
        }
        if (!(filterSeconds >= 0) || !Double.isFinite(filterSeconds)) {
            throw new FormException("filter time constant must be >= 0 s (got " + filterSeconds + " s)");
        }
        if (!Double.isFinite(b) || !Double.isFinite(c)) {
            throw new FormException("setpoint weights must be finite (got b " + b + ", c " + c + ")");
        }
    }

    public boolean hasIntegral() {
        return structure == Structure.PARALLEL ? integral != 0 : Double.isFinite(integral);
    }

    /** Derivative time Td in seconds (kd / kp for the parallel structure). */
    public double derivativeTimeSeconds() {
        return structure == Structure.PARALLEL ? derivative / gain : derivative;
    }

    public PidSetting withFilterSeconds(double tf) {
        return new PidSetting(structure, gain, integral, derivative, tf, b, c);
    }

    public PidSetting withWeights(double newB, double newC) {
        return new PidSetting(structure, gain, integral, derivative, filterSeconds, newB, newC);
    }
}

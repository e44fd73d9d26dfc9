package org.loopform.form;

import java.util.Optional;
import org.loopform.units.UnitText;

/**
 * How a form writes its proportional action, and everything that follows from it: the
 * parameter's name, meaning and unit text, the explicit units a person may type after it, and
 * the conversion to the structure's gain in %/% and back.
 */
public enum GainWriting {
    /** A gain, output change per error change (parameter {@code kp} or {@code kc}). */
    GAIN {
        @Override
        String name(Structure structure) {
            return structure == Structure.PARALLEL ? "kp" : "kc";
        }

        @Override
        String meaning(Structure structure) {
            return structure == Structure.PARALLEL ? "proportional gain" : "controller gain";
        }

        @Override
        String unit(GainBasis basis) {
            return basis == GainBasis.ENGINEERING ? "out/PV" : "%/%";
        }

        @Override
        Optional<Double> inOwnUnit(String unit, double value) {
            return UnitText.percentPerPercent(unit) ? Optional.of(value) : Optional.empty();
        }

        @Override
        double toGain(String name, double written, double euToPercent) {
            if (written == 0) {
                throw new FormException(name + ": gain must not be 0 (got 0); a controller without "
                        + "proportional action cannot be written in these structures");
            }
            return written * euToPercent;
        }

        @Override
        double fromGain(double gain, boolean signed, double euToPercent) {
            return (signed ? gain : Math.abs(gain)) / euToPercent;
        }
    },
    /** Proportional band in percent, PB = 100 / Kc with Kc in %/% (common practice; parameter {@code pb}). */
    BAND {
        @Override
        String name(Structure structure) {
            return "pb";
        }

        @Override
        String meaning(Structure structure) {
            return "proportional band";
        }

        @Override
        String unit(GainBasis basis) {
            return "%";
        }

        @Override
        Optional<Double> inOwnUnit(String unit, double value) {
            return UnitText.percent(unit) ? Optional.of(value) : Optional.empty();
        }

        @Override
        double toGain(String name, double written, double euToPercent) {
            if (!(written > 0)) {
                throw new FormException("pb: a proportional band must be > 0 % (got " + written + " %); it is "
                        + "100 / gain, so a small band is a high gain");
            }
            return 100.0 / written;
        }

        @Override
        double fromGain(double gain, boolean signed, double euToPercent) {
            return 100.0 / Math.abs(gain);
        }
    };

    /** The parameter a person types. */
    abstract String name(Structure structure);

    /** What the parameter does, as {@code forms show} prints it. */
    abstract String meaning(Structure structure);

    /** The unit text printed beside the value. */
    abstract String unit(GainBasis basis);

    /** A value typed with an explicit {@code unit}, in this writing's own unit; empty when the unit does not fit. */
    abstract Optional<Double> inOwnUnit(String unit, double value);

    /** The written value as a gain in %/% (its sign as written); refuses values that hold no gain. */
    abstract double toGain(String name, double written, double euToPercent);

    /** The written value of {@code gain} (%/%, signed), its sign kept when the form writes {@code signed}. */
    abstract double fromGain(double gain, boolean signed, double euToPercent);

    /** What to type when the unit is not understood. */
    String unitHint() {
        return "; write a bare number";
    }
}

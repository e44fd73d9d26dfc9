package org.loopform.form;

import java.util.Optional;
import java.util.function.DoubleSupplier;
import org.loopform.units.TimeUnit;
import org.loopform.units.UnitText;

/**
 * How a form writes its derivative (rate) action, and everything that follows from it: the
 * parameter's name, meaning and unit text, the explicit units a person may type after it, and the
 * conversion to the structure's coordinate (Td in s, or kd in s before its sign) and back.
 */
public enum DerivativeWriting {
    /** Derivative time Td (ideal and series forms, parameter {@code td}). */
    TIME("td", "derivative time", false) {
        @Override
        String unit(GainBasis basis, TimeUnit time) {
            return time.symbol();
        }

        @Override
        double toCoordinate(double written, TimeUnit unit, double euToPercent, DoubleSupplier scanSeconds) {
            return unit.toSeconds(written);
        }

        @Override
        double fromCoordinate(double coordinate, TimeUnit unit, double euToPercent, DoubleSupplier scanSeconds) {
            return unit.fromSeconds(coordinate);
        }
    },
    /** Derivative gain kd, in time units (parallel forms only, parameter {@code kd}). */
    GAIN("kd", "derivative gain", true) {
        @Override
        String unit(GainBasis basis, TimeUnit time) {
            return basis == GainBasis.ENGINEERING ? "out*" + time.symbol() + "/PV" : time.symbol();
        }

        @Override
        double toCoordinate(double written, TimeUnit unit, double euToPercent, DoubleSupplier scanSeconds) {
            return unit.toSeconds(written) * euToPercent;
        }

        @Override
        double fromCoordinate(double coordinate, TimeUnit unit, double euToPercent, DoubleSupplier scanSeconds) {
            return unit.fromSeconds(coordinate / euToPercent);
        }
    },
    /** Derivative gain per scan, kd divided by the scan time h (parallel forms only, parameter {@code kd}). */
    PER_SCAN("kd", "derivative gain per scan", true) {
        @Override
        String unit(GainBasis basis, TimeUnit time) {
            return basis == GainBasis.ENGINEERING ? "out/PV scans" : "scans";
        }

        @Override
        Optional<Double> inOwnUnit(String unit, double value, TimeUnit own) {
            return UnitText.scans(unit) ? Optional.of(value) : Optional.empty();
        }

        @Override
        String unitHint() {
            return "; write a bare number";
        }

        @Override
        double toCoordinate(double written, TimeUnit unit, double euToPercent, DoubleSupplier scanSeconds) {
            return written * scanSeconds.getAsDouble() * euToPercent;
        }

        @Override
        double fromCoordinate(double coordinate, TimeUnit unit, double euToPercent, DoubleSupplier scanSeconds) {
            return coordinate / euToPercent / scanSeconds.getAsDouble();
        }
    };

    private final String parameter;
    private final String meaning;
    private final boolean parallel;

    DerivativeWriting(String parameter, String meaning, boolean parallel) {
        this.parameter = parameter;
        this.meaning = meaning;
        this.parallel = parallel;
    }

    /** The parameter a person types: {@code td} or {@code kd}. */
    String parameter() {
        return parameter;
    }

    /** What the parameter does, as {@code forms show} prints it. */
    String meaning() {
        return meaning;
    }

    /** True for a parallel gain (kd), which carries the controller's sign; false for a time Td. */
    boolean parallel() {
        return parallel;
    }

    /** The unit text printed beside the value. */
    abstract String unit(GainBasis basis, TimeUnit time);

    /** A value typed with an explicit {@code unit}, in the form's own unit {@code own}; empty when the unit does not fit. */
    Optional<Double> inOwnUnit(String unit, double value, TimeUnit own) {
        return UnitText.time(unit).map(t -> own.fromSeconds(t.toSeconds(value)));
    }

    /** What to type when the unit is not understood. */
    String unitHint() {
        return "; write a time such as 30s or 0.5min";
    }

    /** The written value as Td (s) or |kd| (s, on the percent basis); {@code scanSeconds} is asked only per scan. */
    abstract double toCoordinate(double written, TimeUnit unit, double euToPercent, DoubleSupplier scanSeconds);

    /** The written value of Td or |kd| (s, on the percent basis). */
    abstract double fromCoordinate(double coordinate, TimeUnit unit, double euToPercent, DoubleSupplier scanSeconds);
}

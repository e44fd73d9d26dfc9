package org.loopform.form;

import java.util.Optional;
import java.util.function.DoubleSupplier;
import org.loopform.units.TimeUnit;
import org.loopform.units.UnitText;

/**
 * How a form writes its integral (reset) action, and everything that follows from it: the
 * parameter's name, meaning and unit text, the explicit units a person may type after it, and the
 * conversion to the structure's coordinate and back. The coordinate is ki in 1/s for a parallel
 * structure (before the percent basis and the sign are applied) and Ti in s for ideal and series
 * ones. Reset = 1/Ti, ki = Kc/Ti (common practice).
 */
public enum IntegralWriting {
    /** Integral time Ti, time per repeat (parameter {@code ti}). For parallel forms ki = 1/ti. */
    TIME("ti", "integral time per repeat", false, "; write a time such as 90s or 1.5min") {
        @Override
        String unit(GainBasis basis, TimeUnit time) {
            return time.symbol() + "/repeat";
        }

        @Override
        Optional<Double> inOwnUnit(String unit, double value, TimeUnit own) {
            return UnitText.timePerRepeat(unit).map(t -> own.fromSeconds(t.toSeconds(value)));
        }

        @Override
        double toCoordinate(double written, TimeUnit unit, boolean parallel, DoubleSupplier scanSeconds) {
            return parallel ? 1.0 / unit.toSeconds(written) : unit.toSeconds(written);
        }

        @Override
        double fromCoordinate(double coordinate, TimeUnit unit, boolean parallel, DoubleSupplier scanSeconds) {
            return unit.fromSeconds(parallel ? 1.0 / coordinate : coordinate);
        }
    },
    /** Reset rate, repeats per unit time = 1/Ti (parameter {@code reset}). For parallel forms ki = reset. */
    RATE("reset", "reset rate", false, "; write a rate such as 2/min or 0.05/s") {
        @Override
        String unit(GainBasis basis, TimeUnit time) {
            return "repeats/" + time.symbol();
        }

        @Override
        Optional<Double> inOwnUnit(String unit, double value, TimeUnit own) {
            return perTime(unit, value, own);
        }

        @Override
        double toCoordinate(double written, TimeUnit unit, boolean parallel, DoubleSupplier scanSeconds) {
            return parallel ? written / unit.seconds() : unit.seconds() / written;
        }

        @Override
        double fromCoordinate(double coordinate, TimeUnit unit, boolean parallel, DoubleSupplier scanSeconds) {
            return parallel ? coordinate * unit.seconds() : unit.seconds() / coordinate;
        }
    },
    /** Integral gain ki per unit time (parallel forms only, parameter {@code ki}). */
    GAIN("ki", "integral gain", true, "; write a rate such as 2/min or 0.05/s") {
        @Override
        String unit(GainBasis basis, TimeUnit time) {
            return (basis == GainBasis.ENGINEERING ? "out/PV/" : "1/") + time.symbol();
        }

        @Override
        Optional<Double> inOwnUnit(String unit, double value, TimeUnit own) {
            return perTime(unit, value, own);
        }

        @Override
        double toCoordinate(double written, TimeUnit unit, boolean parallel, DoubleSupplier scanSeconds) {
            return written / unit.seconds();
        }

        @Override
        double fromCoordinate(double coordinate, TimeUnit unit, boolean parallel, DoubleSupplier scanSeconds) {
            return coordinate * unit.seconds();
        }
    },
    /** Integral gain per scan, ki times the scan time h (parallel forms only, parameter {@code ki}). */
    PER_SCAN("ki", "integral gain per scan", true, "; write a bare number") {
        @Override
        String unit(GainBasis basis, TimeUnit time) {
            return basis == GainBasis.ENGINEERING ? "out/PV per scan" : "per scan";
        }

        @Override
        Optional<Double> inOwnUnit(String unit, double value, TimeUnit own) {
            return UnitText.perScan(unit) ? Optional.of(value) : Optional.empty();
        }

        @Override
        double toCoordinate(double written, TimeUnit unit, boolean parallel, DoubleSupplier scanSeconds) {
            return written / scanSeconds.getAsDouble();
        }

        @Override
        double fromCoordinate(double coordinate, TimeUnit unit, boolean parallel, DoubleSupplier scanSeconds) {
            return coordinate * scanSeconds.getAsDouble();
        }
    };

    private final String parameter;
    private final String meaning;
    private final boolean parallelOnly;
    private final String unitHint;

    IntegralWriting(String parameter, String meaning, boolean parallelOnly, String unitHint) {
        this.parameter = parameter;
        this.meaning = meaning;
        this.parallelOnly = parallelOnly;
        this.unitHint = unitHint;
    }

    /** The parameter a person types: {@code ti}, {@code reset} or {@code ki}. */
    String parameter() {
        return parameter;
    }

    /** What the parameter does, as {@code forms show} prints it. */
    String meaning() {
        return meaning;
    }

    /** True for writings only a parallel structure has. */
    boolean parallelOnly() {
        return parallelOnly;
    }

    /** What to type when the unit is not understood. */
    String unitHint() {
        return unitHint;
    }

    /** True for a time: integral action is off at or above the form's off value, and 0 is no time. */
    boolean isTime() {
        return this == TIME;
    }

    /** The unit text printed beside the value. */
    abstract String unit(GainBasis basis, TimeUnit time);

    /** A value typed with an explicit {@code unit}, in the form's own unit {@code own}; empty when the unit does not fit. */
    abstract Optional<Double> inOwnUnit(String unit, double value, TimeUnit own);

    /** The written value as ki (1/s, parallel) or Ti (s); {@code scanSeconds} is asked only for per-scan gains. */
    abstract double toCoordinate(double written, TimeUnit unit, boolean parallel, DoubleSupplier scanSeconds);

    /** The written value of a coordinate ki (1/s, parallel, > 0) or Ti (s, finite). */
    abstract double fromCoordinate(double coordinate, TimeUnit unit, boolean parallel, DoubleSupplier scanSeconds);

    private static Optional<Double> perTime(String unit, double value, TimeUnit own) {
        return UnitText.perTime(unit).map(t -> value * own.seconds() / t.seconds());
    }
}

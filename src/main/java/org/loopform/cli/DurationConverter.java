package org.loopform.cli;

import org.loopform.units.Measure;
import org.loopform.units.TimeUnit;
import org.loopform.units.UnitException;
import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.TypeConversionException;

/** Reads durations such as {@code 0.5s}, {@code 250ms}, {@code 1 min} (a bare number is seconds) into seconds. */
final class DurationConverter implements ITypeConverter<Double> {
    @Override
    public Double convert(String value) {
        try {
            double s = Measure.parseSeconds(value, TimeUnit.SECONDS);
            if (!(s > 0)) {
                throw new TypeConversionException("a duration must be > 0 (got '" + value + "')");
            }
            return s;
        } catch (UnitException e) {
            throw new TypeConversionException(e.getMessage());
        }
    }
}

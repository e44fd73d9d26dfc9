package org.loopform.cli;

import org.loopform.units.Measure;
import org.loopform.units.UnitException;
import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.TypeConversionException;

/** Reads durations such as {@code 0.5s}, {@code 250ms}, {@code 1 min} (a bare number is seconds) into seconds. */
final class DurationConverter implements ITypeConverter<Double> {
    @Override
    public Double convert(String value) {
        try {
            return Measure.parsePositiveSeconds(value);
        } catch (UnitException e) {
            throw new TypeConversionException(e.getMessage());
        }
    }
}

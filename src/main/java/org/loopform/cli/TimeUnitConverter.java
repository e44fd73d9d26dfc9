package org.loopform.cli;

import org.loopform.units.TimeUnit;
import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.TypeConversionException;

/** Reads a time unit ({@code s}, {@code min}, {@code h}) for picocli, saying what was expected. */
final class TimeUnitConverter implements ITypeConverter<TimeUnit> {
    @Override
    public TimeUnit convert(String value) {
        return TimeUnit.parse(value).orElseThrow(() -> new TypeConversionException("expected a time unit: s, min or h"
                + " (got '" + value + "')"));
    }
}

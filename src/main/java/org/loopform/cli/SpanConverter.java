package org.loopform.cli;

import org.loopform.units.Span;
import org.loopform.units.UnitException;
import picocli.CommandLine.ITypeConverter;
import picocli.CommandLine.TypeConversionException;

/** Reads {@code LO..HI} ranges for picocli, saying what was expected. */
final class SpanConverter implements ITypeConverter<Span> {
    @Override
    public Span convert(String value) {
        try {
            return Span.parse(value);
        } catch (UnitException e) {
            throw new TypeConversionException(e.getMessage());
        }
    }
}

package org.loopform.units;

/** A value or unit that cannot be read; its message says what was expected and what was found. */
public class UnitException extends BadInput {
    public UnitException(String message) {
        super(message);
    }
}

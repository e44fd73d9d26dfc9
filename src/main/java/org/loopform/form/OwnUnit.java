package org.loopform.form;

import java.util.Optional;

/** Reads a value typed with an explicit unit into a parameter's own unit; empty when the unit does not fit. */
@FunctionalInterface
interface OwnUnit {
    Optional<Double> convert(String unit, double value);
}

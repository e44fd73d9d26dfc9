package org.loopform.form;

/** What a form lets the user set of its derivative filter. */
public enum FilterKind {
    /** No derivative filter. */
    NONE,
    /** A ratio N fixed by the vendor: Tf = Td / N. */
    FIXED_RATIO,
    /** An adjustable ratio N (parameter {@code n}) with a default: Tf = Td / N. */
    RATIO,
    /** An adjustable filter time constant Tf (parameter {@code tf}). */
    TIME_CONSTANT
}

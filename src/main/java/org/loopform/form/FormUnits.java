package org.loopform.form;

/** The unit labels loopform prints beside each parameter of a form. */
public final class FormUnits {
    private FormUnits() {
    }

    /** The unit label of parameter {@code name} in form {@code f}: see {@link FormDefinition#unitOf}. */
    public static String of(FormDefinition f, String name) {
        return f.unitOf(name);
    }

    /**
     * A value as the user wrote it for parameter {@code name} of form {@code f}, followed by the
     * form's unit when the user wrote a bare number; a value written with its own unit (or a word
     * such as {@code off}) is shown as written.
     */
    public static String asWritten(FormDefinition f, String name, String value) {
        String v = value.trim();
        String unit = f.unitOf(name);
        if (unit.isEmpty()) {
            return v;
        }
        try {
            Double.parseDouble(v);
            return v + " " + unit;
        } catch (NumberFormatException e) {
            return v; // the value carries its own unit, as written
        }
    }
}

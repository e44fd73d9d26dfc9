package org.loopform.form;

/** The unit labels loopform prints beside each parameter of a form. */
public final class FormUnits {
    private FormUnits() {
    }

    /** The unit label of parameter {@code name} in form {@code f}: see {@link FormDefinition#unitOf}. */
    public static String of(FormDefinition f, String name) {
        return f.unitOf(name);
    }
}

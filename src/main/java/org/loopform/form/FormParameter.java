package org.loopform.form;

/**
 * One value a person types into a form: its name ({@code kc}, {@code ti}, ...), the unit it is
 * written in, what it does, and whether it must be given (an optional one has a default).
 */
public record FormParameter(String name, String unit, String meaning, boolean required, Double defaultValue) {
    public FormParameter {
        if (name == null || name.isBlank() || unit == null || meaning == null) {
            throw new IllegalArgumentException("a form parameter needs a name, a unit and a meaning");
        }
    }
}

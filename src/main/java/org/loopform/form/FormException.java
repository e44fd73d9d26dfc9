package org.loopform.form;

/**
 * Bad input about a form or a tuning written in it: an unknown parameter, a missing value,
 * a value out of its domain. Its message says what, where it can, and how to fix it.
 */
public class FormException extends IllegalArgumentException {
    public FormException(String message) {
        super(message);
    }
}

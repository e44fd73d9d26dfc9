package org.loopform.form;

import java.util.List;
import org.loopform.units.BadInput;

/**
 * Bad input about a form or a tuning written in it: an unknown parameter, a missing value,
 * a value out of its domain. Its message says what, where it can, and how to fix it.
 */
public class FormException extends BadInput {

    public FormException(String message) {
        super(message);
    }

    /** Several problems at once, one a line in the message. */
    public FormException(List<String> problems) {
        super(problems);
    }
}

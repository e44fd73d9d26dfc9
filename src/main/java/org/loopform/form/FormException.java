package org.loopform.form;

import java.util.List;

/**
 * Bad input about a form or a tuning written in it: an unknown parameter, a missing value,
 * a value out of its domain. Its message says what, where it can, and how to fix it.
 */
public class FormException extends IllegalArgumentException {
    private final List<String> problems;

    public FormException(String message) {
        super(message);
        this.problems = List.of(message);
    }

    /** Several problems at once, one a line in the message. */
    public FormException(List<String> problems) {
        super(String.join(System.lineSeparator(), problems));
        this.problems = List.copyOf(problems);
    }

    /** Each problem on its own (one for most exceptions). */
    public List<String> problems() {
        return problems;
    }
}

package org.loopform.io;

import java.util.List;

/**
 * A file that cannot be used as it is. Holds every problem found, each already written as
 * {@code file:line: field: requirement (got value); fix.}; the message lists them one a line.
 */
public class InputException extends IllegalArgumentException {
    private final List<String> problems;

    public InputException(List<String> problems) {
        super(String.join(System.lineSeparator(), problems));
        this.problems = List.copyOf(problems);
    }

    public InputException(String problem) {
        this(List.of(problem));
    }

    public List<String> problems() {
        return problems;
    }
}

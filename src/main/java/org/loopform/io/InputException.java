package org.loopform.io;

import java.util.List;
import org.loopform.units.BadInput;

/**
 * A file that cannot be used as it is. Holds every problem found, each already written as
 * {@code file:line: field: requirement (got value); fix.}; the message lists them one a line.
 */
public class InputException extends BadInput {

    public InputException(List<String> problems) {
        super(problems);
    }

    public InputException(String problem) {
        super(problem);
    }
}

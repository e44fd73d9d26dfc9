package org.loopform.audit;

import org.loopform.check.LoopSpec;
import java.util.List;

/**
 * One loop as read from a loop list, in input order: the loop, or the problems that kept it
 * from being read (each already written as {@code file:line: field: message}).
 */
public record LoopRow(int index, String tag, String where, LoopSpec loop, List<String> problems) {
    public LoopRow {
        problems = List.copyOf(problems);
        if (loop == null && problems.isEmpty()) {
            throw new IllegalArgumentException("a row without a loop must say what was wrong with it");
        }
    }

    public static LoopRow of(int index, LoopSpec loop) {
        return new LoopRow(index, loop.tag(), loop.where(), loop, List.of());
    }

    public static LoopRow bad(int index, String tag, String where, List<String> problems) {
        return new LoopRow(index, tag, where, null, problems);
    }

    public boolean ok() {
        return loop != null;
    }
}

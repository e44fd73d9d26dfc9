package org.loopform.audit;

import org.loopform.check.LoopSpec;
import org.loopform.tuning.PublishedTuning;
import java.util.List;

/**
 * One loop as read from a loop list, in input order: the loop, or the problems that kept it
 * from being read (each already written as {@code file:line: field: message}). A new loop whose
 * row names a tuning rule instead of tuning values carries the rule's tuning as published
 * ({@code ruleTuning}); its loop's source form and values are that tuning, so the check converts
 * and checks it like any other. {@code ruleTuning} is null for a row that gives its values.
 */
public record LoopRow(int index, String tag, String where, LoopSpec loop, List<String> problems,
                      PublishedTuning ruleTuning) {
    public LoopRow {
        problems = List.copyOf(problems);
        if (loop == null && problems.isEmpty()) {
            throw new IllegalArgumentException("a row without a loop must say what was wrong with it");
        }
        if (loop == null && ruleTuning != null) {
            throw new IllegalArgumentException("a bad row has no tuning");
        }
    }

    public static LoopRow of(int index, LoopSpec loop) {
        return new LoopRow(index, loop.tag(), loop.where(), loop, List.of(), null);
    }

    /** A new loop tuned by {@code tuning}'s rule: {@code loop} holds the tuning in the rule's published form. */
    public static LoopRow byRule(int index, LoopSpec loop, PublishedTuning tuning) {
        return new LoopRow(index, loop.tag(), loop.where(), loop, List.of(), tuning);
    }

    public static LoopRow bad(int index, String tag, String where, List<String> problems) {
        return new LoopRow(index, tag, where, null, problems, null);
    }

    public boolean ok() {
        return loop != null;
    }

    /** Whether the loop's tuning was computed by a published rule rather than given. */
    public boolean tunedByRule() {
        return ruleTuning != null;
    }
}

package org.loopform.audit;

import java.util.List;
import org.loopform.replay.ReplayResult;

/**
 * What the records said about one audited loop: its replay ({@link Status#REPLAYED}), no record
 * ({@link Status#NO_RECORD}), a record that could not be read or replayed, with its problems
 * ({@link Status#UNREADABLE}, each {@code file:line: field: message}), or a record not used because
 * the loop is new, tuned by rule, so no old controller ran that the record could validate
 * ({@link Status#NOT_USED}).
 */
public record ReplayEvidence(Status status, ReplayResult result, List<String> problems) {

    /** Whether the loop's record was found and replayed. */
    public enum Status {
        REPLAYED, NO_RECORD, UNREADABLE, NOT_USED;

        public String id() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }

    public ReplayEvidence {
        problems = List.copyOf(problems);
        if (status == null || (status == Status.REPLAYED) != (result != null)
                || (status == Status.UNREADABLE) == problems.isEmpty()) {
            throw new IllegalArgumentException("replay evidence: a replayed loop has a result, an unreadable record"
                    + " its problems, and nothing else either (got " + status + ")");
        }
    }

    static ReplayEvidence replayed(ReplayResult r) {
        return new ReplayEvidence(Status.REPLAYED, r, List.of());
    }

    static final ReplayEvidence NONE = new ReplayEvidence(Status.NO_RECORD, null, List.of());

    static final ReplayEvidence NOT_USED = new ReplayEvidence(Status.NOT_USED, null, List.of());

    static ReplayEvidence unreadable(List<String> problems) {
        return new ReplayEvidence(Status.UNREADABLE, null, problems);
    }
}

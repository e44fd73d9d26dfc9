package org.loopform.audit;

import org.loopform.check.CheckResult;
import java.util.List;

/**
 * What the audit made of one row: a check result, or the problems that stopped it; and, when the
 * audit was given records, what the loop's record said ({@code replay}, null otherwise). The
 * replay's findings are already among the result's findings.
 */
public record LoopOutcome(LoopRow row, CheckResult result, List<String> problems, ReplayEvidence replay) {
    public LoopOutcome {
        problems = List.copyOf(problems);
    }

    /** An outcome of an audit without records. */
    public LoopOutcome(LoopRow row, CheckResult result, List<String> problems) {
        this(row, result, problems, null);
    }

    public boolean ok() {
        return result != null;
    }
}

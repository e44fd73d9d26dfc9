package org.loopform.audit;

import org.loopform.check.CheckResult;
import java.util.List;

/** What the audit made of one row: a check result, or the problems that stopped it. */
public record LoopOutcome(LoopRow row, CheckResult result, List<String> problems) {
    public LoopOutcome {
        problems = List.copyOf(problems);
    }

    public boolean ok() {
        return result != null;
    }
}

package org.loopform.audit;

import java.util.List;
import org.loopform.analysis.ControllerMismatch;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.LoopStability;
import org.loopform.analysis.StepMetrics;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.form.Conversion;
import org.loopform.law.LawDeviation;
import org.loopform.simulate.ClosedLoopRun;
import org.loopform.simulate.StepTest;

/**
 * Everything a check found out about one loop: the conversion, the design and target loops'
 * margins and step responses (null without a process model), the controller mismatch, the
 * findings and the verdict. The design loop's continuous reference is simulated on steps of
 * {@code referenceStepSeconds} and twice that, then extrapolated ({@code simulate.Richardson});
 * {@code referenceErrorPercent} is the largest PV change the extrapolation made, % of span: an
 * estimate of the finer run's error, and so a bound on the extrapolated one's. The stabilities
 * are decided from the closed-loop poles (null without a process model). Both are 0 when
 * the design loop runs the source's own algorithm at its own scan (nothing is approximated).
 * {@code steps} are the setpoint and load steps both loops were tested with (null without a
 * process model): the standard ones, or smaller ones that keep the target's output off its limits.
 */
public record CheckResult(LoopSpec loop, double scanSeconds, Conversion conversion,
                          LoopMargins designMargins, LoopMargins targetMargins,
                          StepMetrics designSetpoint, StepMetrics designLoad,
                          StepMetrics targetSetpoint, StepMetrics targetLoad,
                          ClosedLoopRun designRun, ClosedLoopRun targetRun,
                          LawDeviation mismatch, ControllerMismatch.Curve mismatchCurve,
                          double referenceStepSeconds, double referenceErrorPercent,
                          List<Finding> findings, StepTest steps, LoopStability designStability,
                          LoopStability targetStability) {

    public CheckResult {
        findings = List.copyOf(findings);
    }

    public boolean hasProcess() {
        return targetMargins != null;
    }

    /** pass, warn or fail: the worst finding, where info counts as pass. */
    public Verdict verdict() {
        Severity w = Finding.worst(findings);
        return w == Severity.FAIL ? Verdict.FAIL : w == Severity.WARN ? Verdict.WARN : Verdict.PASS;
    }
}

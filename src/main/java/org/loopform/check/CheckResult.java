package org.loopform.check;

import java.util.List;
import java.util.Objects;
import java.util.Optional;
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
 * Everything a check found out about one loop: the conversion, the design and target loops
 * compared ({@link LoopComparison}; absent without a process model), the controller mismatch
 * (the design law against the controller as the target runs it, feedback path) and its curve,
 * the findings and the verdict.
 *
 * <p>The accessors below the components ({@link #designMargins()} ... {@link #targetStability()})
 * are views of the comparison for readers written before it existed: each is null without a
 * process model. New code reads {@link #comparison()}.
 */
public record CheckResult(LoopSpec loop, double scanSeconds, Conversion conversion,
                          Optional<LoopComparison> comparison, LawDeviation mismatch,
                          ControllerMismatch.Curve mismatchCurve, List<Finding> findings) {

    public CheckResult {
        Objects.requireNonNull(loop, "loop");
        Objects.requireNonNull(conversion, "conversion");
        Objects.requireNonNull(comparison, "comparison (Optional.empty() without a process model)");
        Objects.requireNonNull(mismatch, "mismatch");
        findings = List.copyOf(findings);
    }

    public boolean hasProcess() {
        return comparison.isPresent();
    }

    /** pass, warn or fail: the worst finding, where info counts as pass. */
    public Verdict verdict() {
        Severity w = Finding.worst(findings);
        return w == Severity.FAIL ? Verdict.FAIL : w == Severity.WARN ? Verdict.WARN : Verdict.PASS;
    }

    private LoopEvaluation design() {
        return comparison.map(LoopComparison::design).orElse(null);
    }

    private LoopEvaluation target() {
        return comparison.map(LoopComparison::target).orElse(null);
    }

    /** The design loop's margins; null without a process model. */
    public LoopMargins designMargins() {
        return comparison.isPresent() ? design().margins() : null;
    }

    /** The target loop's margins; null without a process model. */
    public LoopMargins targetMargins() {
        return comparison.isPresent() ? target().margins() : null;
    }

    /** The design loop's setpoint step metrics; null without a process model. */
    public StepMetrics designSetpoint() {
        return comparison.isPresent() ? design().setpoint() : null;
    }

    /** The design loop's load step metrics; null without a process model. */
    public StepMetrics designLoad() {
        return comparison.isPresent() ? design().load() : null;
    }

    /** The target loop's setpoint step metrics; null without a process model. */
    public StepMetrics targetSetpoint() {
        return comparison.isPresent() ? target().setpoint() : null;
    }

    /** The target loop's load step metrics; null without a process model. */
    public StepMetrics targetLoad() {
        return comparison.isPresent() ? target().load() : null;
    }

    /** The design loop's run; null without a process model. */
    public ClosedLoopRun designRun() {
        return comparison.isPresent() ? design().run() : null;
    }

    /** The target loop's run; null without a process model. */
    public ClosedLoopRun targetRun() {
        return comparison.isPresent() ? target().run() : null;
    }

    /** The design loop's stability from its closed-loop poles; null without a process model. */
    public LoopStability designStability() {
        return comparison.isPresent() ? design().stability() : null;
    }

    /** The target loop's stability from its closed-loop poles; null without a process model. */
    public LoopStability targetStability() {
        return comparison.isPresent() ? target().stability() : null;
    }

    /** The steps both loops were tested with; null without a process model. */
    public StepTest steps() {
        return comparison.map(LoopComparison::steps).orElse(null);
    }

    /** The design reference run's step, s ({@link LoopComparison#referenceStepSeconds()}); 0 without a process model. */
    public double referenceStepSeconds() {
        return comparison.map(LoopComparison::referenceStepSeconds).orElse(0.0);
    }

    /** The design reference run's error bound, % ({@link LoopComparison#referenceErrorPercent()}); 0 without a process model. */
    public double referenceErrorPercent() {
        return comparison.map(LoopComparison::referenceErrorPercent).orElse(0.0);
    }
}

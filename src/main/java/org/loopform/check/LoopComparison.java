package org.loopform.check;

import java.util.Objects;
import org.loopform.simulate.StepTest;

/**
 * The design loop and the target loop of one check side by side, as far as a process model lets
 * them be evaluated: both {@link LoopEvaluation}s, the steps both were tested with (the standard
 * ones, or smaller ones that keep the target's output off its limits), and how the design loop's
 * continuous reference was simulated: on steps of {@code referenceStepSeconds} and twice that,
 * then extrapolated ({@code simulate.Richardson}); {@code referenceErrorPercent} is the largest PV
 * change the extrapolation made, % of span, a bound on the extrapolated run's error. When the
 * design loop runs the source's own algorithm at its own scan the step is that scan and the error
 * 0 (nothing is approximated).
 */
public record LoopComparison(LoopEvaluation design, LoopEvaluation target, StepTest steps,
                             double referenceStepSeconds, double referenceErrorPercent) {

    public LoopComparison {
        Objects.requireNonNull(design, "design");
        Objects.requireNonNull(target, "target");
        Objects.requireNonNull(steps, "steps");
        if (referenceStepSeconds < 0 || referenceErrorPercent < 0) {
            throw new IllegalArgumentException("reference step and error must be >= 0 (got " + referenceStepSeconds
                    + " s, " + referenceErrorPercent + " %)");
        }
    }

    /** Whether both loops are stable (the response rules compare only stable loops). */
    public boolean bothStable() {
        return design.stability().isStable() && target.stability().isStable();
    }
}

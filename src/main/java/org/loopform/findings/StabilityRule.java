package org.loopform.findings;

import java.util.ArrayList;
import java.util.List;
import org.loopform.analysis.LoopStability;
import org.loopform.analysis.Stability;

/**
 * Closed-loop stability as a finding: an unstable or marginal target loop always fails, whatever
 * its margins say; a design loop that is itself unstable is said, since the old tuning was then no
 * model to keep. Stability is decided from the closed-loop poles ({@code analysis.SampledStability},
 * {@code analysis.ContinuousStability}), never from margins alone.
 */
public final class StabilityRule {

    static final String SOURCE = "Astrom & Murray, Feedback Systems, 2008, ch. 9 (Nyquist criterion);"
            + " Astrom & Wittenmark, Computer-Controlled Systems, 3rd ed., 1997 (sampled loops)";

    private StabilityRule() {
    }

    /** Findings for the design and target loops' stability; empty when both are stable. */
    public static List<Finding> evaluate(LoopStability design, LoopStability target) {
        List<Finding> out = new ArrayList<>();
        if (target.verdict() != Stability.STABLE) {
            Double figure = target.largestPoleMagnitude().isPresent() ? target.largestPoleMagnitude().getAsDouble() : null;
            out.add(new Finding(Topic.STABILITY, Severity.FAIL, figure, figure != null ? 1.0 : null,
                    figure != null ? "|z|" : "", SOURCE, "The as-left loop is " + target.verdict().word()
                    + " as it will run: " + lowerFirst(target.explanation()) + " Do not deploy this tuning."));
        }
        if (design.verdict() != Stability.STABLE) {
            out.add(new Finding(Topic.STABILITY, target.verdict() == Stability.STABLE ? Severity.WARN : Severity.INFO,
                    null, null, "", SOURCE, "The as-found loop (the old tuning as it ran) is " + design.verdict().word()
                    + " with this process model: " + lowerFirst(design.explanation())
                    + " Check the process model and the old tuning."));
        }
        return out;
    }

    /**
     * Said for a loop checked without a process model: a verdict of pass then covers the conversion,
     * the controller as run and the sampling rules only, never the loop's stability.
     */
    public static Finding notJudged() {
        return new Finding(Topic.STABILITY, Severity.INFO, null, null, "", "common practice",
                "No process model: the loop's stability, margins and step responses were not checked, only the"
                        + " conversion, the new controller as it will run and the sampling rules. Give the loop a"
                        + " process (a step-test model, or one from loopform fit) to have them checked.");
    }

    private static String lowerFirst(String s) {
        return s.isEmpty() ? s : Character.toLowerCase(s.charAt(0)) + s.substring(1);
    }
}

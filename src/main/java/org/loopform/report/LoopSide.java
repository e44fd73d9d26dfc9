package org.loopform.report;

import java.util.Objects;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.LoopStability;
import org.loopform.analysis.StepMetrics;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopEvaluation;

/**
 * One side of a check as the figure catalogue ({@link LoopFigure}) reads it: the as-found (design)
 * or as-left (target) loop's margins, stability and step metrics, and the scan it runs at
 * ({@code scanSeconds}, NaN for a loop run continuously).
 */
record LoopSide(LoopMargins margins, LoopStability stability, StepMetrics setpoint, StepMetrics load,
                double scanSeconds) {

    LoopSide {
        Objects.requireNonNull(margins, "margins");
        Objects.requireNonNull(stability, "stability");
        Objects.requireNonNull(setpoint, "setpoint");
        Objects.requireNonNull(load, "load");
    }

    static LoopSide of(LoopEvaluation e, double scanSeconds) {
        return new LoopSide(e.margins(), e.stability(), e.setpoint(), e.load(), scanSeconds);
    }

    /** The as-found loop of a check with a process model: continuous, or at the old controller's scan. */
    static LoopSide design(CheckResult r) {
        return of(r.comparison().orElseThrow().design(), designScanSeconds(r));
    }

    /** The as-left loop of a check with a process model, at the target's scan. */
    static LoopSide target(CheckResult r) {
        return of(r.comparison().orElseThrow().target(), r.scanSeconds());
    }

    /** The scan of the design loop when it runs the source's own algorithm; NaN for the continuous design. */
    static double designScanSeconds(CheckResult r) {
        Double s = r.loop().sourceScanSeconds();
        return s != null ? s : Double.NaN;
    }
}

package org.loopform.tuning;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.OptionalDouble;
import org.loopform.analysis.LoopMargins;

/**
 * A tuning on the corners of a confidence box ({@link RobustCheck}): each corner's parameter values, whether
 * its loop is stable and its margins; the worst figures over the stable corners.
 *
 * @param model  the model kind of the box
 * @param target whether the figures are the target loop's (at the scan) rather than the design loop's
 * @param corners every corner, in enumeration order
 */
public record RobustResult(String model, boolean target, List<Corner> corners) {

    /** One corner: parameter values (gain %/% or %/s per %, times s), stability and margins. */
    public record Corner(Map<String, Double> values, boolean stable, LoopMargins margins) {
        public Corner {
            values = Collections.unmodifiableMap(new LinkedHashMap<>(values));
        }
    }

    public RobustResult {
        corners = List.copyOf(corners);
        if (corners.isEmpty()) {
            throw new IllegalArgumentException("a robust check needs at least one corner");
        }
    }

    public long unstableCorners() {
        return corners.stream().filter(c -> !c.stable()).count();
    }

    /** The largest Ms over the stable corners (NaN when none is stable). */
    public double worstMs() {
        return corners.stream().filter(Corner::stable).mapToDouble(c -> c.margins().maximumSensitivity()).max()
                .orElse(Double.NaN);
    }

    public OptionalDouble worstGainMargin() {
        return corners.stream().filter(Corner::stable).map(c -> c.margins().gainMargin())
                .filter(OptionalDouble::isPresent).mapToDouble(OptionalDouble::getAsDouble).min();
    }

    public OptionalDouble worstPhaseMarginDegrees() {
        return corners.stream().filter(Corner::stable).map(c -> c.margins().phaseMarginDegrees())
                .filter(OptionalDouble::isPresent).mapToDouble(OptionalDouble::getAsDouble).min();
    }

    public OptionalDouble worstDelayMarginSeconds() {
        return corners.stream().filter(Corner::stable).map(c -> c.margins().delayMarginSeconds())
                .filter(OptionalDouble::isPresent).mapToDouble(OptionalDouble::getAsDouble).min();
    }

    /** The corner where Ms is largest (null when none is stable). */
    public Corner worstMsCorner() {
        return corners.stream().filter(Corner::stable)
                .max(java.util.Comparator.comparingDouble(c -> c.margins().maximumSensitivity())).orElse(null);
    }
}

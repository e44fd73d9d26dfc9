package org.loopform.replay;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The old controller's values fitted to the log ({@link TuningFit}): the form and scan they are
 * written in, where the fit started (the listed values or the best explanation), the fitted values
 * as written in the form ({@code tuning}, ready to paste into a loop list), each fitted value with
 * its 95 % interval and unit, how closely the fitted controller reproduces the log, the
 * Levenberg-Marquardt iterations and the residuals' lag-one correlation the intervals allowed for.
 */
public record FittedTuning(String formId, double scanSeconds, String start, Map<String, String> tuning,
                           List<Value> values, Agreement agreement, int iterations, double residualCorrelation) {

    /** One fitted value, its 95 % interval (low..high) and the unit the form writes it in. */
    public record Value(String name, double value, double low, double high, String unit) {
        public Value {
            if (name == null || unit == null || !Double.isFinite(value) || Double.isNaN(low) || Double.isNaN(high)
                    || low > high) {
                throw new IllegalArgumentException("a fitted value needs a name, a unit and low <= high (got " + name
                        + " " + value + " in " + low + ".." + high + ")");
            }
        }

        /** True when {@code x} lies inside the interval. */
        public boolean covers(double x) {
            return low <= x && x <= high;
        }
    }

    public FittedTuning {
        if (formId == null || start == null || tuning == null || values == null || agreement == null
                || !(scanSeconds > 0)) {
            throw new IllegalArgumentException("a fitted tuning needs its form, start, values and figures");
        }
        tuning = Collections.unmodifiableMap(new LinkedHashMap<>(tuning));
        values = List.copyOf(values);
    }

    /** The fitted value named {@code name}, or null. */
    public Value value(String name) {
        return values.stream().filter(v -> v.name().equals(name)).findFirst().orElse(null);
    }
}

package org.loopform.form;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * A tuning as written in one form: numeric values by parameter name, in the form's units and
 * order, and the action setting for forms that keep it apart from the gain (null otherwise).
 */
public record WrittenTuning(Map<String, Double> values, Action action) {
    public WrittenTuning {
        values = Collections.unmodifiableMap(new LinkedHashMap<>(values));
        values.forEach((k, v) -> {
            if (v == null || !Double.isFinite(v)) {
                throw new FormException(k + ": a written value must be a finite number (got " + v + ")");
            }
        });
    }
}

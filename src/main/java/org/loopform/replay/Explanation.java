package org.loopform.replay;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * An alternative reading of the old controller tried against the record, and how well it
 * reproduces the logged output: what it changes ({@code kind}, {@code description}), the form,
 * the values as written in it and its scan time.
 */
public record Explanation(ExplanationKind kind, String description, String formId, Map<String, String> tuning,
                          double scanSeconds, Agreement agreement) {

    public Explanation {
        if (kind == null || description == null || formId == null || tuning == null || agreement == null
                || !(scanSeconds > 0)) {
            throw new IllegalArgumentException("an explanation needs its kind, words, form, tuning, scan and figures");
        }
        tuning = Collections.unmodifiableMap(new LinkedHashMap<>(tuning));
    }
}

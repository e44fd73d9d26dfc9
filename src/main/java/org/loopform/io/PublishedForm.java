package org.loopform.io;

import java.util.LinkedHashMap;
import java.util.Map;
import org.loopform.form.FormDefinition;
import org.loopform.form.Structure;
import org.loopform.tuning.PublishedTuning;
import org.loopform.units.Numbers;

/**
 * The catalog form a rule's tuning is written in as the rule publishes it (ideal or series, no
 * derivative filter), and its values there: what {@code tune} and an audit row tuned by rule both
 * convert from, so the two give the same tuning.
 */
public final class PublishedForm {

    private PublishedForm() {
    }

    /** {@code series} for a rule published in series form (SIMC's PID), else {@code ideal-unfiltered}. */
    public static FormDefinition form(PublishedTuning t, String field) {
        return CatalogLoader.resolve(t.structure() == Structure.SERIES ? "series" : "ideal-unfiltered", field);
    }

    /**
     * {@code kc} (%/%), {@code ti} and {@code td} (seconds, the catalog forms' unit) to twelve
     * significant digits, and {@code n = off} for the series form (the rules publish no filter).
     */
    public static Map<String, String> values(PublishedTuning t) {
        Map<String, String> values = new LinkedHashMap<>();
        values.put("kc", Numbers.significant(t.gain(), 12));
        values.put("ti", Numbers.significant(t.integralTimeSeconds(), 12));
        values.put("td", Numbers.significant(t.derivativeTimeSeconds(), 12));
        if (t.structure() == Structure.SERIES) {
            values.put("n", "off");
        }
        return values;
    }
}

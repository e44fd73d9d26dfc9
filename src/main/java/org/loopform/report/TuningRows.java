package org.loopform.report;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Pairs the parameters of a source tuning with those of its target by the term they set (gain,
 * integral, derivative, filter, setpoint weights, action), so a before/after table can put
 * {@code kc} beside {@code pb} and {@code ti} beside {@code reset}. Names outside the common
 * set get a row of their own.
 */
final class TuningRows {
    private TuningRows() {
    }

    /** One row: the term, the source parameter name and the target parameter name (either may be null). */
    record Row(String term, String source, String target) {
    }

    private static final Map<String, String> TERM_OF = new LinkedHashMap<>();

    static {
        for (String n : List.of("kp", "kc", "pb")) {
            TERM_OF.put(n, "gain");
        }
        for (String n : List.of("ki", "ti", "reset")) {
            TERM_OF.put(n, "integral");
        }
        for (String n : List.of("kd", "td")) {
            TERM_OF.put(n, "derivative");
        }
        for (String n : List.of("n", "tf")) {
            TERM_OF.put(n, "filter");
        }
        TERM_OF.put("b", "weight b");
        TERM_OF.put("c", "weight c");
        TERM_OF.put("action", "action");
    }

    private static final List<String> TERMS = List.of("gain", "integral", "derivative", "filter", "weight b",
            "weight c", "action");

    static List<Row> pair(List<String> sourceNames, List<String> targetNames) {
        List<Row> rows = new ArrayList<>();
        List<String> sources = new ArrayList<>(sourceNames);
        List<String> targets = new ArrayList<>(targetNames);
        for (String term : TERMS) {
            // a form may write one term with two names (n and tf); pair them in order
            List<String> s = take(sources, term);
            List<String> t = take(targets, term);
            for (int k = 0; k < Math.max(s.size(), t.size()); k++) {
                rows.add(new Row(term, k < s.size() ? s.get(k) : null, k < t.size() ? t.get(k) : null));
            }
        }
        sources.forEach(n -> rows.add(new Row(n, n, targets.remove(n) ? n : null)));
        targets.forEach(n -> rows.add(new Row(n, null, n)));
        return rows;
    }

    private static List<String> take(List<String> names, String term) {
        List<String> out = new ArrayList<>();
        names.removeIf(n -> {
            boolean mine = term.equals(TERM_OF.get(n));
            if (mine) {
                out.add(n);
            }
            return mine;
        });
        return out;
    }
}

package org.loopform.io;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Set;
import org.loopform.form.FormException;
import org.loopform.form.ParameterLimit;

/** The {@code limits} section of a form file: per parameter, the range a target accepts and the step it stores. */
final class FormLimitsReader {

    private FormLimitsReader() {
    }

    static Map<String, ParameterLimit> read(YamlNode n, FormFields f) {
        Map<String, ParameterLimit> out = new LinkedHashMap<>();
        if (!n.isMapping()) {
            f.problems.add(n.where() + "expected a mapping from parameter name to {min, max, resolution}");
            return out;
        }
        n.entries().forEach((name, v) -> {
            if (!v.isMapping()) {
                f.problems.add(v.where() + "expected {min: ..., max: ..., resolution: ...}");
                return;
            }
            f.problems.addAll(v.unknownKeys(Set.of("min", "max", "resolution")));
            Map<String, YamlNode> e = v.entries();
            Double min = e.containsKey("min") ? f.number(e.get("min")) : null;
            Double max = e.containsKey("max") ? f.number(e.get("max")) : null;
            Double res = e.containsKey("resolution") ? f.number(e.get("resolution")) : null;
            try {
                out.put(name, new ParameterLimit(min, max, res));
            } catch (FormException ex) {
                f.problems.add(v.where() + ex.getMessage());
            }
        });
        return out;
    }
}

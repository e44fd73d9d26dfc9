package org.loopform.io;

import java.util.Map;
import java.util.Set;
import org.loopform.form.FormException;
import org.loopform.form.Weight;

/** The {@code weights} section of a form file: each setpoint weight fixed (a number) or adjustable ({default, adjustable, min, max}). */
final class FormWeightsReader {

    private FormWeightsReader() {
    }

    static Weight read(YamlNode n, FormFields f) {
        if (n == null) {
            return Weight.fixed(1.0);
        }
        if (n.isScalar()) {
            return Weight.fixed(f.number(n));
        }
        if (!n.isMapping()) {
            f.problems.add(n.where() + "write a fixed weight as a number, or {default: 1, adjustable: true, min: 0, max: 1}");
            return Weight.fixed(1.0);
        }
        f.problems.addAll(n.unknownKeys(Set.of("default", "adjustable", "min", "max")));
        Map<String, YamlNode> e = n.entries();
        double d = e.containsKey("default") ? f.number(e.get("default")) : 1.0;
        boolean adjustable = !e.containsKey("adjustable") || f.bool(e.get("adjustable"));
        double min = e.containsKey("min") ? f.number(e.get("min")) : 0.0;
        double max = e.containsKey("max") ? f.number(e.get("max")) : 1.0;
        try {
            return adjustable ? new Weight(d, true, min, max) : Weight.fixed(d);
        } catch (FormException ex) {
            f.problems.add(n.where() + ex.getMessage());
            return Weight.fixed(1.0);
        }
    }
}

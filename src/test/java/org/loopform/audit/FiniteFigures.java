// plumbing: walks a result for non-finite numbers; no published source needed (source: none)
package org.loopform.audit;

import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import org.loopform.check.LoopSpec;
import java.lang.reflect.RecordComponent;
import java.util.ArrayList;
import java.util.Collection;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import org.loopform.simulate.SampledResponse;
import org.loopform.form.FormDefinition;

/**
 * Every number a check result holds, walked through its records, lists, optionals and responses:
 * the paths of those that are NaN or infinite. An empty {@link OptionalDouble} is an explicit "none"
 * and passes. Form definitions (read from files, checked there) and the loop itself are skipped.
 */
final class FiniteFigures {
    private final List<String> bad = new ArrayList<>();
    private final Map<Object, Boolean> seen = new IdentityHashMap<>();

    private FiniteFigures() {
    }

    /** Paths of the non-finite figures in {@code root}, such as {@code targetMargins.gainMargin = NaN}. */
    static List<String> in(Object root) {
        FiniteFigures f = new FiniteFigures();
        f.walk("result", root);
        return f.bad;
    }

    private void number(String path, double v) {
        // an unfiltered derivative's gain is unlimited at high frequency: +infinity is that figure's
        // documented meaning (form.ConversionNote), worded as "unlimited" by the conversion rules
        if (v == Double.POSITIVE_INFINITY && path.endsWith("HighFrequencyGain")) {
            return;
        }
        if (!Double.isFinite(v)) {
            bad.add(path + " = " + v);
        }
    }

    private void walk(String path, Object o) {
        if (o == null || o instanceof FormDefinition || o instanceof LoopSpec || o instanceof String
                || o instanceof Enum<?> || o instanceof Boolean || o instanceof Integer || o instanceof Long) {
            return;
        }
        if (o instanceof Double d) {
            number(path, d);
            return;
        }
        if (o instanceof OptionalDouble d) {
            if (d.isPresent()) {
                number(path, d.getAsDouble());
            }
            return;
        }
        if (o instanceof double[] a) {
            for (int i = 0; i < a.length; i++) {
                number(path + "[" + i + "]", a[i]);
            }
            return;
        }
        if (seen.put(o, Boolean.TRUE) != null) {
            return;
        }
        if (o instanceof Optional<?> opt) {
            opt.ifPresent(v -> walk(path, v));
        } else if (o instanceof SampledResponse r) {
            walk(path + ".times", r.timesSeconds());
            walk(path + ".pv", r.processValuesPercent());
            walk(path + ".output", r.controllerOutputsPercent());
        } else if (o instanceof Collection<?> c) {
            int i = 0;
            for (Object x : c) {
                walk(path + "[" + i++ + "]", x);
            }
        } else if (o instanceof Map<?, ?> m) {
            m.forEach((k, v) -> walk(path + "[" + k + "]", v));
        } else if (o.getClass().isRecord()) {
            for (RecordComponent rc : o.getClass().getRecordComponents()) {
                try {
                    rc.getAccessor().setAccessible(true);
                    walk(path + "." + rc.getName(), rc.getAccessor().invoke(o));
                } catch (ReflectiveOperationException e) {
                    throw new AssertionError(path + "." + rc.getName() + ": cannot be read", e);
                }
            }
        }
        // other types (process models, laws, polynomials) hold inputs, not figures of the check
    }
}

package org.loopform.tuning;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.LoopStability;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import org.loopform.check.LoopSpec;
import org.loopform.findings.CheckPolicy;
import org.loopform.process.FirstOrderPlusDeadTime;
import org.loopform.process.IntegratingPlusDeadTime;
import org.loopform.process.ProcessModel;
import org.loopform.process.SecondOrderPlusDeadTime;
import org.loopform.units.Span;

/**
 * One tuning checked on every corner of a fit's confidence box (each parameter at its lower or upper
 * 95 % bound: 2^n models), reporting the worst Ms and margins and the corners that are not stable. A
 * box's corners bound neither every model inside it (the margins need not be monotonic in a parameter)
 * nor the real process (the box assumes the model's form is right): the result is a sample of the
 * uncertainty, stated as such. The corners are evaluated exactly as the nominal loop is
 * ({@link LoopCheck}), on the design loop or, when {@code target} is true, the target loop.
 */
public final class RobustCheck {

    private RobustCheck() {
    }

    /** {@code nominal} with its process replaced by each corner of {@code box}. */
    public static RobustResult run(LoopSpec nominal, ConfidenceBox box, CheckPolicy policy, boolean target) {
        List<String> keys = ConfidenceBox.parameters(box.model());
        List<RobustResult.Corner> corners = new ArrayList<>();
        for (int mask = 0; mask < 1 << keys.size(); mask++) {
            Map<String, Double> values = new LinkedHashMap<>();
            for (int i = 0; i < keys.size(); i++) {
                Span s = box.intervals().get(keys.get(i));
                values.put(keys.get(i), (mask >> i & 1) == 0 ? s.low() : s.high());
            }
            LoopSpec loop = new LoopSpec(nominal.tag(), model(box.model(), values), nominal.sourceForm(),
                    nominal.tuning(), nominal.sourceScanSeconds(), nominal.targetForm(), nominal.targetScanSeconds(),
                    nominal.pvRange(), nominal.outputRange(), nominal.where());
            CheckResult r = LoopCheck.run(loop, policy);
            LoopMargins m = target ? r.targetMargins() : r.designMargins();
            LoopStability st = target ? r.targetStability() : r.designStability();
            corners.add(new RobustResult.Corner(values, st.isStable(), m));
        }
        return new RobustResult(box.model(), target, corners);
    }

    static ProcessModel model(String kind, Map<String, Double> v) {
        return switch (kind) {
            case "fopdt" -> new FirstOrderPlusDeadTime(v.get("gain"), v.get("time_constant"), v.get("dead_time"));
            case "sopdt" -> SecondOrderPlusDeadTime.ofTimeConstants(v.get("gain"), v.get("time_constant"),
                    v.get("time_constant_2"), v.get("dead_time"));
            default -> new IntegratingPlusDeadTime(v.get("gain"), v.get("dead_time"));
        };
    }
}

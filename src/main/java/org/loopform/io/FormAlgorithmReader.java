package org.loopform.io;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.AntiWindup;
import org.loopform.form.DiscreteAlgorithm;
import org.loopform.form.Discretization;
import org.loopform.form.FormException;
import org.loopform.units.Span;
import org.loopform.units.UnitException;

/** The {@code algorithm} section of a form file: how the target runs the law each scan (kind, discretizations, anti-windup, output limits, scan times). */
final class FormAlgorithmReader {

    private FormAlgorithmReader() {
    }

    static DiscreteAlgorithm read(YamlNode n, FormFields f) {
        DiscreteAlgorithm d = DiscreteAlgorithm.defaults();
        if (!n.isMapping()) {
            f.problems.add(n.where() + "expected a mapping with kind, integral, derivative, anti_windup, tracking_time, "
                    + "output, scan");
            return d;
        }
        f.problems.addAll(n.unknownKeys(Set.of("kind", "integral", "derivative", "anti_windup", "tracking_time",
                "output", "scan")));
        Map<String, YamlNode> e = n.entries();
        AlgorithmKind kind = f.choice(e.get("kind"), AlgorithmKind.class, d.kind(), "positional", "velocity");
        Discretization integral = f.choice(e.get("integral"), Discretization.class, d.integral(),
                "forward", "backward", "trapezoidal");
        Discretization derivative = f.choice(e.get("derivative"), Discretization.class, d.derivative(),
                "forward", "backward", "trapezoidal", "ramp_invariant", "step_invariant");
        AntiWindup aw = f.choice(e.get("anti_windup"), AntiWindup.class, d.antiWindup(),
                "clamping", "back_calculation", "none");
        double tracking = e.containsKey("tracking_time") ? f.seconds(e.get("tracking_time")) : 0.0;
        double low = d.outputLowPercent();
        double high = d.outputHighPercent();
        if (e.containsKey("output")) {
            try {
                Span s = Span.parse(f.text(e.get("output")));
                low = s.low();
                high = s.high();
            } catch (UnitException ex) {
                f.problems.add(e.get("output").where() + ex.getMessage());
            }
        }
        List<Double> allowed = new ArrayList<>();
        double minScan = d.minScanSeconds();
        double maxScan = d.maxScanSeconds();
        YamlNode scan = e.get("scan");
        if (scan != null) {
            if (!scan.isMapping()) {
                f.problems.add(scan.where() + "write {allowed: [0.1 s, 0.5 s, 1 s]} or {min: 0.1 s, max: 10 s}");
            } else {
                f.problems.addAll(scan.unknownKeys(Set.of("allowed", "min", "max")));
                Map<String, YamlNode> s = scan.entries();
                if (s.containsKey("allowed")) {
                    YamlNode list = s.get("allowed");
                    if (list.isSequence()) {
                        list.items().forEach(item -> allowed.add(f.seconds(item)));
                    } else {
                        f.problems.add(list.where() + "expected a list of scan times such as [0.1 s, 0.5 s, 1 s]");
                    }
                }
                if (s.containsKey("min")) {
                    minScan = f.seconds(s.get("min"));
                }
                if (s.containsKey("max")) {
                    maxScan = f.seconds(s.get("max"));
                }
            }
        }
        try {
            return new DiscreteAlgorithm(kind, integral, derivative, aw, tracking, low, high, allowed, minScan, maxScan);
        } catch (FormException ex) {
            // the record's messages already start with "algorithm: "
            f.problems.add(n.file() + ":" + n.line() + ": " + ex.getMessage());
            return d;
        }
    }
}

package org.loopform.report;

import org.loopform.process.FirstOrderPlusDeadTime;
import org.loopform.process.IntegratingPlusDeadTime;
import org.loopform.process.ProcessModel;
import org.loopform.process.SecondOrderPlusDeadTime;
import org.loopform.units.Numbers;

/** A process model in a few words with its units, for report headers: "FOPDT: gain 2 %/%, T 60 s, L 10 s". */
final class ProcessText {
    private ProcessText() {
    }

    private static String n(double v) {
        return Numbers.significant(v, 4);
    }

    static String of(ProcessModel p) {
        if (p instanceof FirstOrderPlusDeadTime f) {
            return "FOPDT: gain " + n(f.gain()) + " %/%, T " + n(f.timeConstantSeconds()) + " s, L "
                    + n(f.deadTimeSeconds()) + " s";
        }
        if (p instanceof SecondOrderPlusDeadTime s) {
            return "SOPDT: gain " + n(s.gain()) + " %/%, T " + n(s.timeConstantSeconds()) + " s, damping ratio "
                    + n(s.dampingRatio()) + ", L " + n(s.deadTimeSeconds()) + " s";
        }
        if (p instanceof IntegratingPlusDeadTime i) {
            return "integrating: slope " + n(i.slopePerSecond()) + " %/s per %, L " + n(i.deadTimeSeconds()) + " s"
                    + (i.lagSeconds() > 0 ? ", lag " + n(i.lagSeconds()) + " s" : "");
        }
        return "transfer function with L " + n(p.deadTimeSeconds()) + " s";
    }
}

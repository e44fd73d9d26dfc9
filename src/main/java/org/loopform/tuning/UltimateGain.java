package org.loopform.tuning;

import org.loopform.analysis.LoopResponse;
import org.loopform.analysis.UltimateCycle;
import org.loopform.lti.FrequencyBand;
import org.loopform.process.ProcessModel;
import org.loopform.units.BadInput;

/**
 * The ultimate gain and period of a process model: the proportional gain magnitude that puts the
 * loop at the stability limit and the period it then oscillates with ({@link UltimateCycle}, after
 * Ziegler &amp; Nichols 1942). The process's sign is set aside: {@code Ku > 0} always, and the
 * controller's sign follows the process's direction.
 */
public final class UltimateGain {

    /** The band searched, in decades either side of 1 / (dead time + sum of lags). */
    static final double DECADES = 4.0;

    private UltimateGain() {
    }

    public static UltimateCycle of(ProcessModel p) {
        double sign = Math.signum(p.lowFrequencyGain());
        double characteristicSeconds = p.deadTimeSeconds() + lagSum(p);
        double centre = 1 / Math.max(characteristicSeconds, 1e-9);
        LoopResponse response = (w, out) -> {
            p.responseAt(w, out);
            out[0] *= sign;
            out[1] *= sign;
        };
        try {
            return UltimateCycle.of(response, FrequencyBand.of(centre * Math.pow(10, -DECADES),
                    centre * Math.pow(10, DECADES)));
        } catch (IllegalArgumentException e) {
            throw new BadInput("--process: the model's phase never reaches -180 deg, so it has no ultimate gain"
                    + " (a first-order lag without dead time, say); use a model-based rule such as simc");
        }
    }

    /** Sum of the denominator's time constants, approximated by den[1]/den[0] (a1/a0) above any integrator. */
    private static double lagSum(ProcessModel p) {
        double[] den = p.rationalPart().denominator().ascending();
        int k = 0;
        while (k < den.length - 1 && den[k] == 0) {
            k++;
        }
        return k + 1 < den.length ? Math.abs(den[k + 1] / den[k]) : 0;
    }
}

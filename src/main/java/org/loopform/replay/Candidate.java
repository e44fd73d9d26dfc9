package org.loopform.replay;

import java.util.Map;
import org.loopform.form.FormDefinition;
import org.loopform.form.PidSetting;

/** One alternative reading of the old controller, decoded and ready to run. */
record Candidate(ExplanationKind kind, String description, FormDefinition form, Map<String, String> tuning,
                 PidSetting setting, double scanSeconds) {

    /** True when both run the same controller: same algorithm, filter placement, setting and scan. */
    boolean sameControllerAs(Candidate o) {
        return form.algorithm().equals(o.form.algorithm())
                && form.filter().placement() == o.form.filter().placement()
                && close(scanSeconds, o.scanSeconds)
                && setting.structure() == o.setting.structure()
                && close(setting.gain(), o.setting.gain())
                && close(setting.integral(), o.setting.integral())
                && close(setting.derivative(), o.setting.derivative())
                && close(setting.filterSeconds(), o.setting.filterSeconds())
                && close(setting.b(), o.setting.b())
                && close(setting.c(), o.setting.c());
    }

    /** Equal to rounding noise (relative 1e-9), infinities included. */
    private static boolean close(double a, double b) {
        return a == b || Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));
    }
}

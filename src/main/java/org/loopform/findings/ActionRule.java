package org.loopform.findings;

import java.util.Optional;
import org.loopform.law.PidTerms;
import org.loopform.units.Numbers;

/**
 * Controller action against the process's direction. A loop is negative feedback when the
 * controller's low-frequency gain (its integral coefficient, or its proportional one without
 * integral action; positive = reverse acting) has the sign of the process's low-frequency gain (its
 * static gain, or its slope when it integrates). With opposite signs the loop is positive feedback
 * and runs away whatever the tuning's size (Astrom and Murray, Feedback Systems, 2008, ch. 1,
 * feedback; direct and reverse action as the trade uses them: common practice).
 */
public final class ActionRule {

    static final String SOURCE = "Astrom & Murray, Feedback Systems, 2008, ch. 1 (negative feedback); common practice";

    private ActionRule() {
    }

    /**
     * A fail finding when the controller acts in the wrong direction for the process.
     *
     * @param controller the law's terms (signed gain, positive = reverse acting)
     * @param processGain the process's low-frequency gain {@code lim s^q G(s)}: %/% when it
     *        regulates itself (q = 0), %/s per % when it integrates once (q = 1), %/s^q per % for q
     *        integrators, % s^-q per % when it differentiates (q < 0)
     * @param integrators q, the process's integrators less its differentiators at s = 0 (changes
     *        the words and unit only)
     */
    public static Optional<Finding> check(PidTerms controller, double processGain, int integrators) {
        double controllerGain = controller.i() != 0 ? controller.i() : controller.p();
        if (controllerGain == 0 || processGain == 0 || Math.signum(controllerGain) == Math.signum(processGain)) {
            return Optional.empty();
        }
        String unit = switch (integrators) {
            case 0 -> "%/%";
            case 1 -> "%/s per %";
            case -1 -> "% s per %";
            default -> integrators > 1 ? "%/s^" + integrators + " per %" : "% s^" + -integrators + " per %";
        };
        String name = switch (integrators) {
            case 0 -> "a process gain of ";
            case 1 -> "a process slope of ";
            default -> "a low-frequency process gain of ";
        };
        String what = name + Numbers.significant(processGain, 3) + " " + unit;
        String needed = processGain < 0 ? "direct" : "reverse";
        String has = controllerGain < 0 ? "direct" : "reverse";
        return Optional.of(new Finding(Topic.ACTION, Severity.FAIL, processGain, 0.0, unit, SOURCE,
                "The controller acts in the wrong direction for this process: with " + what + " it must be " + needed
                        + " acting, but the tuning is " + has + " acting, so the loop is positive feedback and runs"
                        + " away. Change the controller's action (or check the sign of the process gain)."));
    }
}

package org.loopform.audit;

import org.loopform.check.Verdict;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.io.LoopFileReader;

/**
 * A loop at the edge of instability must fail, not warn. Hand derivation (Astrom and Murray,
 * Feedback Systems, 2008, section 9.3, margins - from memory for the section): FOPDT k = 1,
 * T = 10 s, L = 1 s under an ideal PI with Ti = T = 10 s cancels the process pole, so
 * L(s) = Kc e^(-L s) / (T s). At a 0.1 s scan the zero-order hold adds about h/2 = 0.05 s of
 * delay (Wittenmark, Astrom and Arzen, Computer Control: An Overview, IFAC 2002 - verified), so
 * take the loop delay theta = 1.05 s:
 * <ul>
 *   <li>phase -90 deg - theta w reaches -180 deg at w180 = (pi/2)/theta = 1.496 rad/s; there
 *       |L| = Kc/(T w180), so GM = T w180 / Kc = 14.96/14.25 = 1.050 with Kc = 14.25;</li>
 *   <li>|L| = 1 at wc = Kc/T = 1.425 rad/s, so PM = 90 deg - theta wc (in deg) = 90 - 85.73 = 4.27 deg;</li>
 *   <li>Ms >= 1/|1 + L(i w180)| = 1/(1 - 1/GM) = 21.</li>
 * </ul>
 * The hold's sinc gain (0.9997 at w180) and the backward-difference integral's phase lead of
 * wh/2 on the small integral term move these by well under the tolerances below.
 */
class EdgeOfInstabilityTest {

    @Test
    void a_loop_with_pm_4_deg_and_gm_1_05_fails_on_every_margin() {
        CheckResult r = LoopCheck.run(LoopFileReader.parseAll("tag: XIC-1\n"
                + "process: {model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}\n"
                + "tuning: {form: ideal, kc: 14.25, ti: 10, td: 0}\ntarget: {form: ideal, scan: 0.1 s}\n",
                "edge.yaml").get(0), CheckPolicy.DEFAULT);

        assertThat(r.targetMargins().gainMargin().getAsDouble()).isCloseTo(1.050, within(0.01));
        assertThat(r.targetMargins().phaseMarginDegrees().getAsDouble()).isCloseTo(4.27, within(0.5));
        assertThat(r.targetMargins().maximumSensitivity()).isGreaterThan(20);
        assertThat(r.verdict()).isEqualTo(Verdict.FAIL);
        List<Finding> fails = r.findings().stream()
                .filter(f -> f.topic() == Topic.ROBUSTNESS && f.severity() == Severity.FAIL).toList();
        assertThat(fails).extracting(Finding::message).anySatisfy(m -> assertThat(m).contains("gain margin"))
                .anySatisfy(m -> assertThat(m).contains("phase margin"))
                .anySatisfy(m -> assertThat(m).contains("maximum sensitivity"));
    }
}

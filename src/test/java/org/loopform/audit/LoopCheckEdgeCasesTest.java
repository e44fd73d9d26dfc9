package org.loopform.audit;

import org.loopform.check.Verdict;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.junit.jupiter.api.Test;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.io.LoopFileReader;

/**
 * Loops at the edges: an integrating process, an unstable loop, a controller without integral
 * action. Source: expected values are derived in the comments from the loops' closed-form
 * frequency responses (common practice), solved with Commons Math's Brent solver, not with
 * loopform's margin search.
 */
class LoopCheckEdgeCasesTest {

    private static CheckResult check(String yaml) {
        return LoopCheck.run(LoopFileReader.parseAll(yaml, "edge.yaml").get(0), CheckPolicy.DEFAULT);
    }

    @Test
    void an_integrating_process_under_pi_has_its_design_gain_margin() {
        // L(s) = Kc (1 + 1/(Ti s)) k e^(-L s)/s with Kc = 5, Ti = 600 s, k = 0.01 1/s, L = 5 s.
        // Phase -180 deg + atan(Ti w) - L w crosses -180 deg where atan(Ti w) = L w;
        // there |L| = Kc k sqrt(1 + (Ti w)^2) / (Ti w^2), and GM = 1/|L|.
        double w = new BrentSolver(1e-14).solve(200, x -> Math.atan(600 * x) - 5 * x, 0.01, 1.0);
        double gm = 600 * w * w / (5 * 0.01 * Math.sqrt(1 + 600 * 600 * w * w));
        CheckResult r = check("tag: LIC-1\nprocess: {model: integrating, gain: 0.01, dead_time: 5 s}\n"
                + "tuning: {form: ideal, kc: 5, ti: 600, td: 0}\ntarget: {form: ideal, scan: 1 s}\n");
        assertThat(r.designMargins().phaseCrossoverRadPerSecond().getAsDouble()).isCloseTo(w, within(1e-6 * w));
        assertThat(r.designMargins().gainMargin().getAsDouble()).isCloseTo(gm, within(1e-6 * gm));
    }

    @Test
    void an_unstable_sampled_loop_is_called_unstable_and_fails() {
        // FOPDT 1, 10 s, 1 s under kc = 50, ti = 1 s: the continuous loop's ultimate gain is about 16
        // (phase -180 deg where atan(10 w) + w = pi), so a gain of 50 is far beyond it.
        CheckResult r = check("tag: X4\nprocess: {model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}\n"
                + "tuning: {form: ideal, kc: 50, ti: 1, td: 0}\ntarget: {form: ideal, scan: 1 s}\n");
        assertThat(r.designStability().verdict()).isEqualTo(org.loopform.analysis.Stability.UNSTABLE);
        assertThat(r.verdict()).isEqualTo(Verdict.FAIL);
        assertThat(r.targetStability().verdict()).isEqualTo(org.loopform.analysis.Stability.UNSTABLE);
        assertThat(r.findings()).anySatisfy(f -> {
            assertThat(f.topic()).isEqualTo(Topic.STABILITY);
            assertThat(f.severity()).isEqualTo(Severity.FAIL);
        });
    }

    @Test
    void a_load_behind_a_long_dead_time_is_simulated_until_it_arrives() {
        // A load step at the process input reaches the PV only after the dead time; the run must
        // not be taken as settled while the PV is still at rest. Load 10 % through gain 1: the PV
        // must move (common practice).
        CheckResult r = check("tag: F-9\nprocess: {model: fopdt, gain: 1, time_constant: 2 s, dead_time: 30 s}\n"
                + "tuning: {form: ideal, kc: 0.2, ti: 20, td: 0}\ntarget: {form: ideal, scan: 0.5 s}\n");
        assertThat(r.targetLoad().peakDeviationPercent()).isGreaterThan(5.0);
        assertThat(r.designLoad().peakDeviationPercent()).isGreaterThan(5.0);
    }

    @Test
    void a_controller_without_integral_action_says_its_iae_depends_on_the_horizon() {
        CheckResult r = check("tag: P-1\nprocess: {model: fopdt, gain: 1.5, time_constant: 30 s, dead_time: 3 s}\n"
                + "tuning: {form: ideal, kc: 2, ti: 0, td: 0}\ntarget: {form: ideal, scan: 0.5 s}\n");
        List<String> info = r.findings().stream().filter(f -> f.severity() == Severity.INFO)
                .map(f -> f.message()).toList();
        assertThat(info).anySatisfy(m -> assertThat(m).contains("no integral action").contains("steady offset"));
        // the offset of a P controller on a self-regulating process: r / (1 + Kc K) = 10 / 4 = 2.5 %
        // (common practice); the PV ends that far below the setpoint
        var sp = r.targetRun().setpoint();
        assertThat(60 - sp.processValuePercent(sp.size() - 1)).isCloseTo(2.5, within(0.01));
    }
}

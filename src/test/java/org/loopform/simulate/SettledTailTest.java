package org.loopform.simulate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.AntiWindup;
import org.loopform.form.DiscreteAlgorithm;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;
import org.loopform.form.Structure;
import org.loopform.lti.SampledStateSpace;
import org.loopform.lti.ZeroOrderHold;
import org.loopform.scan.ScanController;

/**
 * When a run's tail is taken as settled instead of simulated (LoopSimulator's rule, loopform policy;
 * the window's length is derived by hand here): only on a loop proven stable, and never before the
 * dead time plus a few scans have passed with the loop quiet.
 */
@DisplayName("Settled tails")
class SettledTailTest {

    /**
     * PI (K = 0.5, Ti = 10 s) on 1/(10 s + 1) with 1 s dead time, scan 0.1 s, horizon 300 s: the
     * controller cancels the lag, the loop gain is 0.05 e^(-s)/s, a closed loop with a time constant
     * of about 20 s (common practice: a cancelling PI leaves an integrator with gain K/Ti); by 300 s
     * it has decayed to e^-15, far inside 1e-5 of the step.
     */
    private static ClosedLoopRun run(boolean provenStable) {
        SampledStateSpace process = ZeroOrderHold.firstOrder(1.0, 10.0, 1.0, 0.1);
        PidSetting pi = new PidSetting(Structure.IDEAL, 0.5, 10.0, 0.0, 0.0, 1.0, 0.0);
        DiscreteAlgorithm algorithm = new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.TRAPEZOIDAL,
                Discretization.BACKWARD, AntiWindup.CLAMPING, 0.0, 0.0, 100.0, List.of(), 0.0, Double.MAX_VALUE);
        ScanController c = ScanController.limited(pi, FilterPlacement.DERIVATIVE, algorithm, 0.1);
        return LoopSimulator.run(c, process, StepTest.standard(300), provenStable);
    }

    @Test
    void a_loop_proven_stable_holds_its_settled_values_to_the_end() {
        SampledResponse sp = run(true).setpoint();
        int n = sp.size();
        // the last tenth of the horizon is the held value, to the bit
        for (int k = n - n / 10; k < n; k++) {
            assertThat(sp.processValuePercent(k)).isEqualTo(sp.processValuePercent(n - 1));
        }
        assertThat(sp.processValuePercent(n - 1)).isCloseTo(60.0, within(1e-4));
    }

    @Test
    void a_loop_not_proven_stable_is_simulated_to_the_end() {
        SampledResponse sp = run(false).setpoint();
        SampledResponse held = run(true).setpoint();
        int n = sp.size();
        // the same loop still creeping toward its setpoint in the last digits: no sample was filled
        assertThat(sp.processValuePercent(n - 1)).isNotEqualTo(sp.processValuePercent(n - 2));
        assertThat(sp.processValuePercent(n - 1)).isCloseTo(held.processValuePercent(n - 1), within(1e-4));
    }

    /**
     * Scan 0.5 s, dead time 30 s, horizon 150 s: a fifteenth of the horizon is 20 scans, the dead
     * time 60 scans; the window is the dead time plus 5 scans, 65.
     */
    @Test
    void the_quiet_window_outlasts_the_dead_time() {
        assertThat(LoopSimulator.quietScans(StepTest.standard(150), 0.5, 30)).isEqualTo(65);
        // without dead time the older rules decide: 150 / 15 / 0.5 = 20 scans
        assertThat(LoopSimulator.quietScans(StepTest.standard(150), 0.5, 0)).isEqualTo(20);
        // and never fewer than 20 scans: 150 / 15 / 5 = 2
        assertThat(LoopSimulator.quietScans(StepTest.standard(150), 5, 0)).isEqualTo(20);
    }
}

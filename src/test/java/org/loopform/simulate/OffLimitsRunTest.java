// source: hand derivations (the proportional kick, the static loop gain), written out beside each check
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
import org.loopform.lti.TransferFunction;
import org.loopform.scan.ScanController;

/**
 * A run kept only while its output stays off the limits (the step choice's first run): cut where the
 * output reaches a limit, otherwise the run between scans itself. The outputs are worked out by hand:
 * a proportional controller with b = 1 answers a setpoint step S at its first scan with a kick of
 * Kc S while the dead time keeps the PV still (common practice).
 */
@DisplayName("A run kept only off the limits")
class OffLimitsRunTest {

    /** P-only (parallel, ki = kd = 0), Kc as given, limits 0..100 %, on 1/(10 s + 1) with 1 s dead time, scan 0.1 s. */
    private static ScanController proportional(double kc) {
        PidSetting p = new PidSetting(Structure.PARALLEL, kc, 0.0, 0.0, 0.0, 1.0, 0.0);
        DiscreteAlgorithm algorithm = new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                Discretization.BACKWARD, AntiWindup.CLAMPING, 0.0, 0.0, 100.0, List.of(), 0.0, Double.MAX_VALUE);
        return ScanController.limited(p, FilterPlacement.DERIVATIVE, algorithm, 0.1);
    }

    private static final TransferFunction LAG = TransferFunction.ofDescending(new double[] {1}, new double[] {10, 1});

    /** Kc 5: the 10 % step kicks the output from 50 % by 50 points, onto its 100 % limit at the first scan. */
    @Test
    void a_run_whose_kick_reaches_the_limit_is_cut() {
        assertThat(LoopSimulator.runBetweenScansOffLimits(proportional(5), LAG, 1.0, 0.1, StepTest.standard(60), 0, 100))
                .isEmpty();
    }

    /**
     * Kc 1: a kick of 10 points, to 60 %; the P-only loop settles with the PV short of its setpoint by
     * S / (1 + Kc K) = 5 points, so the output rests at 50 + Kc x 5 = 55 % (the static loop gain,
     * common practice): far from either limit, so the run is kept, sample for sample the run between scans.
     */
    @Test
    void a_run_that_stays_off_the_limits_is_the_run_between_scans() {
        ClosedLoopRun kept = LoopSimulator.runBetweenScansOffLimits(proportional(1), LAG, 1.0, 0.1,
                StepTest.standard(60), 0, 100).orElseThrow();
        ClosedLoopRun full = LoopSimulator.runBetweenScans(proportional(1), LAG, 1.0, 0.1, StepTest.standard(60), true);

        assertThat(kept.setpoint().controllerOutputPercent(0)).isCloseTo(60.0, within(1e-12));
        assertThat(kept.setpoint().controllerOutputPercent(kept.setpoint().size() - 1)).isCloseTo(55.0, within(0.01));
        assertThat(kept).isEqualTo(full);
    }

    /** The same run with limits 0..59 %: the 60 % kick reaches the high limit. */
    @Test
    void the_limits_given_decide_where_the_run_is_cut() {
        assertThat(LoopSimulator.runBetweenScansOffLimits(proportional(1), LAG, 1.0, 0.1, StepTest.standard(60), 0, 59))
                .isEmpty();
        // and 39..100 %: under the load step the PV rises by less than the 10 points the load alone would
        // give (the output only falls), so the output stays above 50 - Kc x 10 = 40 %
        assertThat(LoopSimulator.runBetweenScansOffLimits(proportional(1), LAG, 1.0, 0.1, StepTest.standard(60), 39, 100))
                .isPresent();
    }

    /**
     * PI (parallel, kp 1, ki 2/s, backward integral: increment ki h e) with clamping, limits 0..61 %: at
     * the first scan of the 10 % setpoint step P = 10, the integral 50 + 0.2 x 10 = 52 would make
     * 62 % > 61 %, so clamping holds it at 50 and the output is 60 %, inside the limit. The PV stays still
     * for the 1 s dead time, so the next scans do the same. The output never reaches 61 %, yet the limits
     * acted and the loop is not linear: the run is cut like one that reaches the limit (hand derivation;
     * conditional integration as anti-windup: Astrom and Hagglund 2006, ch. 3, from memory).
     */
    @Test
    void a_run_whose_integral_clamping_holds_below_the_limit_is_cut_too() {
        PidSetting pi = new PidSetting(Structure.PARALLEL, 1.0, 2.0, 0.0, 0.0, 1.0, 0.0);
        DiscreteAlgorithm algorithm = new DiscreteAlgorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD,
                Discretization.BACKWARD, AntiWindup.CLAMPING, 0.0, 0.0, 61.0, List.of(), 0.0, Double.MAX_VALUE);
        ScanController c = ScanController.limited(pi, FilterPlacement.DERIVATIVE, algorithm, 0.1);
        c.reset(50, 50, 50);
        assertThat(c.update(60, 50)).isCloseTo(60.0, within(1e-12));
        assertThat(c.limitsActedLastScan()).isTrue();
        c.reset(50, 50, 50);
        assertThat(c.update(50, 50)).isCloseTo(50.0, within(1e-12));
        assertThat(c.limitsActedLastScan()).isFalse();

        assertThat(LoopSimulator.runBetweenScansOffLimits(ScanController.limited(pi, FilterPlacement.DERIVATIVE,
                algorithm, 0.1), LAG, 1.0, 0.1, StepTest.standard(60), 0, 61)).isEmpty();
    }
}

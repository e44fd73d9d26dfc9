package org.loopform.audit;

import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.simulate.SampledResponse;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.LoopFileReader;

/**
 * A sampled loop's responses are judged on the continuous PV under the controller's hold, not on
 * the scan instants joined by straight lines. Every expected value comes from
 * {@link HeldPiReference}: the process's own differential equations integrated by Commons Math's
 * Dormand-Prince 8(5,3) under a discrete PI written out by hand (sampling and hold: Astrom &amp;
 * Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 2 - from memory for the section).
 * Metrics as defined in common practice: overshoot is the largest excursion beyond the setpoint in
 * percent of the step, IAE the integral of |setpoint - PV|, settling the last entry into a band of
 * 2 % of the step, the load peak the largest |PV - setpoint|.
 *
 * <p>Tolerances: loopform samples the continuous PV exactly on sub-steps of horizon/1000 with
 * every input switch on the grid, so a peak between two samples is low by at most
 * {@code max|y''| delta^2 / 8}, about 0.003 points of overshoot here; the trapezoid IAE is off by
 * less than 1e-3 of itself. The reference's own integration error is far below both.
 */
@DisplayName("The continuous PV of a sampled loop")
class ContinuousPvTest {

    /** Overshoot and peaks agree within this many points of the step (%), a few times the bound above. */
    private static final double PEAK_POINTS = 0.01;
    /** IAE agrees within this share of itself. */
    private static final double IAE_SHARE = 1e-3;
    /** Settling agrees within this many seconds (linear interpolation between sub-samples). */
    private static final double SETTLING_SECONDS = 0.02;

    /** The example: FOPDT gain 1 %/%, time constant 10 s, dead time 1 s; ideal PI kc 2, ti 8 s; scan 5 s. */
    private static final String EXAMPLE = "tag: EX-1\n"
            + "process: {model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}\n"
            + "tuning: {form: ideal, kc: 2, ti: 8, td: 0}\n"
            + "target: {form: ideal, scan: 5 s}\n"
            + "ranges: {pv: 0..100, output: 0..100}\n";

    private static CheckResult check(String yaml) {
        return LoopCheck.run(LoopFileReader.parseAll(yaml, "continuous-pv.yaml").get(0), CheckPolicy.DEFAULT);
    }

    private static int scans(SampledResponse r, double scanSeconds) {
        return (int) Math.round(r.timeSeconds(r.size() - 1) / scanSeconds);
    }

    @Nested
    @DisplayName("at a slow scan (FOPDT 1, 10 s, 1 s; PI kc 2, ti 8 s; scan 5 s)")
    class SlowScan {

        private final CheckResult r = check(EXAMPLE);
        private final int scans = scans(r.targetRun().setpoint(), 5.0);
        private final HeldPiReference.Figures setpoint = HeldPiReference.run(HeldPiReference.firstOrder(1, 10),
                2, 8, 5, 1, 10, 0, scans, 0.2);

        @Test
        void overshoots_by_what_the_process_does_between_scans_not_by_what_the_scans_see() {
            double continuous = 100 * (setpoint.largestPv() - 10) / 10;
            double atScans = 100 * (setpoint.largestPvAtScans() - 10) / 10;
            // the scan instants understate this loop's overshoot by some 8.6 points (27.9 % against 19.3 %)
            assertThat(continuous - atScans).isGreaterThan(5);
            assertThat(r.targetSetpoint().overshootPercent().getAsDouble()).isCloseTo(continuous, within(PEAK_POINTS));
        }

        @Test
        void integrates_and_settles_on_the_continuous_pv() {
            assertThat(r.targetSetpoint().integralAbsoluteErrorPercentSeconds())
                    .isCloseTo(setpoint.iae(), within(IAE_SHARE * setpoint.iae()));
            assertThat(r.targetSetpoint().settlingTimeSeconds().getAsDouble())
                    .isCloseTo(setpoint.settlingSeconds(), within(SETTLING_SECONDS));
        }

        /**
         * The load reaches the process just after a scan instant, the timing the sampled controller
         * answers latest: here at t = 5 s (the first scan instant at or after the dead time). Derived by
         * hand: the PV rises as 10 (1 - e^(-(t - 5)/10)) %, the controller first sees it at t = 10 s, its
         * correction (kc (1 + h/ti) = 3.25 times 3.93 %, far more than the load) reaches the process at
         * t = 11 s, so the peak is 10 (1 - e^(-0.6)) = 4.512 %. A load that reached the process at the
         * dead time (t = 1 s) would peak at only 10 (1 - e^(-0.5)) = 3.935 %, understating it.
         */
        @Test
        void rejects_a_load_step_with_the_continuous_peak() {
            int loadScans = scans(r.targetRun().load(), 5.0);
            HeldPiReference.Figures load = HeldPiReference.run(HeldPiReference.firstOrder(1, 10), 2, 8, 5, 1, 0, 10,
                    5.0, loadScans, 0.2);
            double peak = Math.max(load.largestPv(), -load.smallestPv());
            assertThat(peak).as("reference against the hand derivation").isCloseTo(10 * (1 - Math.exp(-0.6)),
                    within(1e-6));
            assertThat(peak - load.largestPvAtScans()).as("the scans miss part of the peak").isGreaterThan(0.3);
            assertThat(r.targetLoad().peakDeviationPercent()).isCloseTo(peak, within(PEAK_POINTS));
            assertThat(r.targetLoad().integralAbsoluteErrorPercentSeconds())
                    .isCloseTo(load.iae(), within(IAE_SHARE * load.iae()));
        }

        @Test
        void keeps_the_controller_output_constant_over_each_scan() {
            SampledResponse sp = r.targetRun().setpoint();
            assertThat(sp.size()).as("samples between the scans").isGreaterThan(10 * scans);
            for (int k = 1; k < sp.size(); k++) {
                double t = sp.timeSeconds(k);
                boolean scanInstant = Math.abs(t / 5.0 - Math.rint(t / 5.0)) < 1e-9;
                if (!scanInstant) {
                    assertThat(sp.controllerOutputPercent(k)).isEqualTo(sp.controllerOutputPercent(k - 1));
                }
            }
        }
    }

    /**
     * Two lags 1 %/%, 8 s and 3 s, dead time 4.3 s = 2 scans + 0.3 s at a 2 s scan; PI kc 1, ti 10 s.
     * The input switches 0.3 s into every scan, a corner of the PV that falls between the scans.
     */
    @Test
    void follows_a_dead_time_of_whole_scans_and_a_fraction() {
        CheckResult r = check("tag: EX-2\n"
                + "process: {model: sopdt, gain: 1, time_constant: 8 s, time_constant_2: 3 s, dead_time: 4.3 s}\n"
                + "tuning: {form: ideal, kc: 1, ti: 10, td: 0}\ntarget: {form: ideal, scan: 2 s}\n"
                + "ranges: {pv: 0..100, output: 0..100}\n");
        HeldPiReference.Process p = HeldPiReference.twoLags(1, 8, 3);
        HeldPiReference.Figures sp = HeldPiReference.run(p, 1, 10, 2, 4.3, 10, 0,
                scans(r.targetRun().setpoint(), 2.0), 0.2);
        assertThat(r.targetSetpoint().overshootPercent().getAsDouble())
                .isCloseTo(100 * (sp.largestPv() - 10) / 10, within(PEAK_POINTS));
        assertThat(r.targetSetpoint().integralAbsoluteErrorPercentSeconds())
                .isCloseTo(sp.iae(), within(IAE_SHARE * sp.iae()));
        assertThat(r.targetSetpoint().settlingTimeSeconds().getAsDouble())
                .isCloseTo(sp.settlingSeconds(), within(SETTLING_SECONDS));
        // the load reaches the process just after the scan instant 6 s, the first at or after the dead time
        HeldPiReference.Figures load = HeldPiReference.run(p, 1, 10, 2, 4.3, 0, 10, 6.0,
                scans(r.targetRun().load(), 2.0), 0.2);
        assertThat(r.targetLoad().peakDeviationPercent())
                .isCloseTo(Math.max(load.largestPv(), -load.smallestPv()), within(PEAK_POINTS));
        assertThat(r.targetLoad().integralAbsoluteErrorPercentSeconds())
                .isCloseTo(load.iae(), within(IAE_SHARE * load.iae()));
    }

    /**
     * A design loop that is itself sampled (the source PI at a 5 s scan) is judged on its
     * continuous PV too, so design and target stand on the same footing.
     */
    @Test
    void judges_a_sampled_design_loop_on_its_continuous_pv_too() {
        CheckResult r = check("tag: EX-3\n"
                + "process: {model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}\n"
                + "tuning: {form: ideal, kc: 2, ti: 8, td: 0, scan: 5 s}\n"
                + "target: {form: ideal, scan: 1 s}\n"
                + "ranges: {pv: 0..100, output: 0..100}\n");
        HeldPiReference.Figures design = HeldPiReference.run(HeldPiReference.firstOrder(1, 10), 2, 8, 5, 1, 10, 0,
                scans(r.designRun().setpoint(), 5.0), 0.2);
        assertThat(r.designSetpoint().overshootPercent().getAsDouble())
                .isCloseTo(100 * (design.largestPv() - 10) / 10, within(PEAK_POINTS));
        HeldPiReference.Figures target = HeldPiReference.run(HeldPiReference.firstOrder(1, 10), 2, 8, 1, 1, 10, 0,
                scans(r.targetRun().setpoint(), 1.0), 0.2);
        assertThat(r.targetSetpoint().overshootPercent().getAsDouble())
                .isCloseTo(100 * (target.largestPv() - 10) / 10, within(PEAK_POINTS));
    }
}

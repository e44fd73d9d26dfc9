package org.loopform.report;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.LoopFileReader;
import org.loopform.simulate.SampledResponse;

/**
 * The response plots end when both loops have settled and mark where an output sits at a limit,
 * on loops whose settling and saturation are derived by hand below. The process throughout is
 * first order without dead time, G(s) = K / (T s + 1) with K = 1 and T = 10 s; the PI controller's
 * integral time equals T, so it cancels the process pole and the loop transfer is
 * L(s) = Kc K / (T s): the closed loop is first order with time constant tau = T / (Kc K)
 * (pole cancellation by a PI controller, common practice; Skogestad, "Simple analytic rules for model
 * reduction and PID controller tuning", J. Process Control 13 (2003), chooses Ti = tau1 for the same
 * reason, from memory for the section). The 2 % settling of a first-order response is
 * docs/references.md section 8.
 */
@DisplayName("Loop plots that show the dynamics")
class LoopPlotsDynamicsTest {

    @TempDir
    Path dir;

    private static final double T = 10.0;

    private CheckResult check(double kc, String targetForm, String scan) throws IOException {
        Path file = Files.writeString(dir.resolve("loop.yaml"), "tag: FIC-900\n"
                + "process: {model: fopdt, gain: 1, time_constant: 10 s, dead_time: 0 s}\n"
                + "tuning: {form: ideal, kc: " + kc + ", ti: 10, td: 0}\n"
                + "target: {form: " + targetForm + ", scan: " + scan + "}\n"
                + "ranges: {pv: 0..100, output: 0..100}\n");
        return LoopCheck.run(LoopFileReader.readOne(file, file.toString()), CheckPolicy.DEFAULT);
    }

    @Nested
    @DisplayName("the horizon is chosen from the responses")
    class Horizon {

        /**
         * Kc = 2: tau = 10 / 2 = 5 s. A first-order response to a setpoint step, 1 - e^(-t/tau), stays
         * within 2 % of its step after t = tau ln(1/0.02) = 3.912 tau (the "four time constants" of
         * common practice; Ogata, Modern Control Engineering, 4th ed., 2002, section 5-2, from memory):
         * 19.56 s. The output, u = Kc (T s + 1)/(T s + Kc K) r, jumps to Kc r and decays to r / K with the
         * same e^(-t/tau), so it settles with the PV. The plots run 1.5 times that: 29.34 s, where the check
         * simulates 30 / crossover = 30 / 0.2 = 150 s.
         */
        @Test
        void the_setpoint_panels_end_one_and_a_half_settling_times_after_the_step() throws IOException {
            CheckResult r = check(2, "ideal", "0.05 s");
            double tau = T / 2;
            double settled = tau * Math.log(1 / 0.02);
            double end = LoopPlots.plotHorizonSeconds(r.designRun().setpoint(), r.targetRun().setpoint());
            // the scan (0.05 s) acts as a delay of about half a scan on the as-left loop: allow two scans
            assertThat(end).isBetween(LoopPlots.SETTLED_MARGIN * settled - 0.02,
                    LoopPlots.SETTLED_MARGIN * (settled + 0.1));
            SampledResponse sp = r.targetRun().setpoint();
            assertThat(sp.timeSeconds(sp.size() - 1)).as("the simulated run is much longer").isGreaterThan(4 * end);
        }

        /**
         * A load step d at the process input with the same loop: y = K T s / ((T s + 1)(T s + Kc K)) d/s,
         * that is (K = 1, T = 10, Kc = 2) y(t) = d (e^(-0.1 t) - e^(-0.2 t)). Its peak is where
         * e^(-0.1 t) = 1/2: d/4 at t = 10 ln 2. It stays within 2 % of that peak, d/200, once
         * x - x^2 = 0.005 with x = e^(-0.1 t): x = (1 - sqrt(1 - 0.02)) / 2, t = -10 ln x = 52.93 s. The
         * output, -d (1 - e^(-0.2 t)), settles by 19.56 s, so the PV sets the end: 1.5 * 52.93 s.
         */
        @Test
        void the_load_panels_end_when_the_slower_load_mode_has_died_away() throws IOException {
            CheckResult r = check(2, "ideal", "0.05 s");
            double x = (1 - Math.sqrt(1 - 0.02)) / 2;
            double settled = -T * Math.log(x);
            assertThat(settled).isCloseTo(52.93, within(0.01));
            double end = LoopPlots.plotHorizonSeconds(r.designRun().load(), r.targetRun().load());
            assertThat(end).isBetween(LoopPlots.SETTLED_MARGIN * settled - 0.05,
                    LoopPlots.SETTLED_MARGIN * (settled + 0.2));
        }

        /** The settling time of e^(-t/tau) sampled every 0.01 s: tau ln 50, the band's edge interpolated. */
        @Test
        void a_decaying_exponential_settles_after_ln_50_time_constants() {
            int n = 3001;
            double[] t = new double[n];
            double[] x = new double[n];
            for (int k = 0; k < n; k++) {
                t[k] = 0.01 * k;
                x[k] = 1 - Math.exp(-t[k] / 2.0);
            }
            // the last value, 1 - e^-15, stands in for the final value 1: off by 3e-7 of the step
            assertThat(LoopPlots.settledSeconds(t, x)).isCloseTo(2.0 * Math.log(50), within(1e-3));
        }

        @Test
        void a_run_that_never_moves_is_drawn_whole() {
            // plumbing: nothing settles, so nothing is cut
            SampledResponse.Recorder r = SampledResponse.recorder(10, 1.0);
            for (int k = 0; k < 10; k++) {
                r.add(50, 50);
            }
            assertThat(LoopPlots.plotHorizonSeconds(r.toResponse())).isEqualTo(9.0);
        }
    }

    @Nested
    @DisplayName("saturation is visible")
    class Saturation {

        private Path narrowForm() throws IOException {
            // the catalog's ideal form with output limits 48..52 % (an invented, deliberately narrow range)
            return Files.writeString(dir.resolve("ideal-narrow.yaml"), "id: ideal-narrow\n"
                    + "title: Ideal PID with output limits 48..52 % (invented for a test)\n"
                    + "structure: ideal\n"
                    + "gain: {as: gain, basis: percent, sign: signed}\n"
                    + "integral: {as: time, unit: s, off: 0}\n"
                    + "derivative: {as: time, unit: s}\n"
                    + "filter: {kind: ratio, ratio: 10, placement: derivative}\n"
                    + "algorithm: {output: 48..52}\n");
        }

        /**
         * Kc = 5, Ti = T = 10 s, the target's output limited to 48..52 % about its operating 50 %, scan
         * h = 0.1 s. Any step that moves the output by more than 2 % hits the limit; the check keeps the
         * smallest setpoint step, 1 %: the first scan asks for 50 + 5 * 1 * (1 + h/Ti) = 55.05 % and gets
         * 52 %. While the output sits at 52 %, the process sees +2 % held: y(t) = 2 (1 - e^(-t/T)), and
         * the clamping integral stays where it was, so scan k asks for 50 + 5 (1 + h/Ti)(1 - y(k h)). That
         * drops below 52 % once y(k h) > 1 - 2 / (5 * 1.01) = 0.60396 %, that is t > -T ln(1 - 0.60396 / 2)
         * = 3.595 s: the first scan after it is 3.6 s. So the as-left output sits at the high limit from 0
         * to 3.6 s, and the as-found (the catalog's ideal form, limits 0..100 %, output at most 55 %) never.
         */
        @Test
        void the_stretch_at_the_high_limit_runs_to_the_first_scan_that_asks_for_less() throws IOException {
            CheckResult r = check(5, narrowForm().toString(), "0.1 s");
            assertThat(r.steps().setpointStepPercent()).isEqualTo(1.0);
            double h = 0.1;
            double leaves = -T * Math.log(1 - (1 - 2 / (5 * (1 + h / T))) / 2);
            assertThat(leaves).isCloseTo(3.595, within(0.001));
            double firstScanOff = Math.ceil(leaves / h) * h;

            List<double[]> left = LoopPlots.atLimit(r.targetRun().setpoint(), 48, 52, Double.MAX_VALUE);
            assertThat(left).hasSize(1);
            assertThat(left.get(0)[0]).isEqualTo(0.0);
            assertThat(left.get(0)[1]).isCloseTo(firstScanOff, within(1e-9));
            assertThat(LoopPlots.atLimit(r.designRun().setpoint(), 0, 100, Double.MAX_VALUE)).isEmpty();
        }

        @Test
        void the_output_panel_draws_the_limits_and_marks_the_stretch() throws IOException {
            CheckResult r = check(5, narrowForm().toString(), "0.1 s");
            String panel = LoopPlots.panels(r, SvgPlot.Size.COMPACT).get(1);
            assertThat(panel).contains("Setpoint step: controller output", "output, % of span", "time, s");
            // the as-left limits are drawn (the output reaches 52 %); the as-found 0 and 100 % are named only
            assertThat(count(panel, "class=\"level\"")).isEqualTo(2);
            assertThat(panel).contains("as-left limit 52 %", "off the scale: as-found limit 0 %, as-found limit 100 %");
            // one stretch: a shade and a bar in the as-left colour
            assertThat(count(panel, "class=\"at-limit\"")).isEqualTo(1);
            assertThat(panel).contains("fill=\"" + LoopPlots.TARGET + "\"").contains("at a limit");
        }

        private static int count(String s, String what) {
            Matcher m = Pattern.compile(Pattern.quote(what)).matcher(s);
            int n = 0;
            while (m.find()) {
                n++;
            }
            return n;
        }
    }

    /**
     * Between scans the PV follows the process, not a line between the scan instants. With the
     * Kc = 2 loop at a 2 s scan, the first scan holds the output at 50 + Kc (1 + h/Ti) r = 50 + 2.4 r
     * (the backward integral adds h/Ti = 0.2 of the error at once), so for 0 < t < 2 s the PV is
     * 2.4 r (1 - e^(-t/T)) above its start: the exponential's curve, which a line from 0 to the
     * next scan would miss by 2.4 r (1 - e^(-1/10) - (1 - e^(-2/10))/2) at t = 1 s.
     */
    @Test
    void the_pv_is_drawn_between_the_scans_as_the_process_moves() throws IOException {
        CheckResult r = check(2, "ideal", "2 s");
        SampledResponse sp = r.targetRun().setpoint();
        double step = r.steps().setpointStepPercent();
        int inside = 0;
        for (int k = 0; k < sp.size() && sp.timeSeconds(k) < 2.0 - 1e-9; k++) {
            double t = sp.timeSeconds(k);
            assertThat(sp.processValuePercent(k) - 50).as("PV at %s s", t)
                    .isCloseTo(2.4 * step * (1 - Math.exp(-t / T)), within(1e-9));
            inside++;
        }
        assertThat(inside).as("samples within the first scan").isGreaterThan(5);
        // the plotted as-left PV line (the second) carries those samples: more points than scans in view
        String panel = LoopPlots.panels(r, SvgPlot.Size.STANDARD).get(0);
        assertThat(panel).contains("PV, % of span");
        Matcher m = Pattern.compile("<polyline [^>]*points=\"([^\"]*)\"").matcher(panel);
        assertThat(m.find() && m.find()).isTrue();
        int points = m.group(1).split(" ").length;
        double end = LoopPlots.plotHorizonSeconds(r.designRun().setpoint(), sp);
        assertThat(points).isGreaterThan(3 * (int) Math.ceil(end / 2.0));
    }
}

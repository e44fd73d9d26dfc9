package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;
import org.loopform.form.Structure;
import org.loopform.form.StructureLaw;
import org.loopform.law.ControlLaw;
import org.loopform.law.LawDeviation;
import org.loopform.lti.FrequencyBand;
import org.loopform.scan.PulseLaw;

/**
 * How far the controller a target runs strays from the design law. A proportional controller
 * runs exactly as designed at any scan (it has no dynamics), so its mismatch is the gain ratio
 * alone, 20 log10 of it in dB. The backward-difference integrator is h / (1 - z^-1) at z = e^(i w h)
 * (Franklin, Powell and Workman, Digital Control of Dynamic Systems, 3rd ed., 1998, ch. 6 - from
 * memory), against 1/(i w) in the design law; the expected mismatch is evaluated from those two
 * formulas with complex arithmetic written out here. Settings invented.
 */
class ControllerMismatchTest {

    private static final FrequencyBand BAND = FrequencyBand.of(0.01, 1);

    private static ControlLaw design(PidSetting s) {
        return StructureLaw.toLaw(s, FilterPlacement.DERIVATIVE);
    }

    private static PulseLaw target(PidSetting s, double scanSeconds) {
        return PulseLaw.of(s, FilterPlacement.DERIVATIVE, Discretization.BACKWARD, Discretization.BACKWARD, scanSeconds);
    }

    private static PidSetting p(double gain, double b) {
        return new PidSetting(Structure.IDEAL, gain, Double.POSITIVE_INFINITY, 0, 0, b, 1);
    }

    @Test
    void a_proportional_controller_runs_exactly_as_designed() {
        LawDeviation d = ControllerMismatch.over(design(p(2, 1)), target(p(2, 1), 1), BAND);
        assertThat(d.gainDb()).isCloseTo(0, within(1e-12));
        assertThat(d.phaseDegrees()).isCloseTo(0, within(1e-12));
        assertThat(d.worstRadPerSecond()).isEqualTo(0.01);
    }

    @Test
    void twice_the_gain_is_6_02_db_on_both_paths_found_at_the_band_bottom() {
        LawDeviation d = ControllerMismatch.over(design(p(1, 1)), target(p(2, 1), 1), BAND);
        assertThat(d.gainDb()).isCloseTo(20 * Math.log10(2), within(1e-9));
        assertThat(d.phaseDegrees()).isCloseTo(0, within(1e-9));
        assertThat(d.worstRadPerSecond()).isCloseTo(0.01, within(1e-12));
        // reversed action: a half turn, no gain difference
        LawDeviation r = ControllerMismatch.over(design(p(1, 1)), target(p(-1, 1), 1), BAND);
        assertThat(r.gainDb()).isCloseTo(0, within(1e-9));
        assertThat(r.phaseDegrees()).isCloseTo(180, within(1e-9));
    }

    @Test
    void a_setpoint_weight_that_differs_shows_on_the_setpoint_path_only() {
        // b 0.5 designed, 1 run: C_r doubles (6.02 dB) while C_y is the same
        ControlLaw designed = design(p(2, 0.5));
        PulseLaw run = target(p(2, 1), 1);
        assertThat(ControllerMismatch.over(designed, run, BAND, true).gainDb()).isCloseTo(0, within(1e-12));
        assertThat(ControllerMismatch.over(designed, run, BAND, false).gainDb()).isCloseTo(20 * Math.log10(2), within(1e-9));
        assertThat(ControllerMismatch.over(designed, run, BAND).gainDb()).isCloseTo(20 * Math.log10(2), within(1e-9));
        ControllerMismatch.Curve c = ControllerMismatch.curve(designed, run, BAND, 5);
        assertThat(c.omegas()).hasSize(5);
        assertThat(c.setpointGainDb()[2]).isCloseTo(20 * Math.log10(2), within(1e-9));
        assertThat(c.feedbackGainDb()[2]).isCloseTo(0, within(1e-12));
    }

    @Test
    void a_path_that_is_zero_in_both_has_no_mismatch() {
        // b = 0 and no integral or derivative: C_r = 0 designed and run
        ControllerMismatch.Curve c = ControllerMismatch.curve(design(p(2, 0)), target(p(2, 0), 1), BAND, 3);
        assertThat(c.setpointGainDb()).containsOnly(0.0);
        assertThat(c.setpointPhaseDeg()).containsOnly(0.0);
    }

    @Test
    void a_backward_integrator_strays_from_1_over_s_by_the_textbook_amount() {
        // PI, K 1, Ti 1 s, h 0.5 s. Run: 1 + h/(1 - e^(-i w h)); designed: 1 + 1/(i w) = 1 - i/w
        PidSetting pi = new PidSetting(Structure.IDEAL, 1, 1, 0, 0, 1, 1);
        double h = 0.5;
        FrequencyBand band = FrequencyBand.of(0.05, 2);
        ControllerMismatch.Curve c = ControllerMismatch.curve(design(pi), target(pi, h), band, 7);
        for (int k = 0; k < 7; k++) {
            double w = c.omegas()[k];
            assertThat(c.feedbackGainDb()[k]).as("gain at %s rad/s", w).isCloseTo(textbook(w, h)[0], within(1e-9));
            assertThat(c.feedbackPhaseDeg()[k]).as("phase at %s rad/s", w).isCloseTo(textbook(w, h)[1], within(1e-9));
        }
        // the largest mismatch over the comparison grid, and where it lies
        double worst = 0;
        double worstAt = 0;
        double worstPhase = 0;
        for (double w : band.grid(ControllerMismatch.GRID_POINTS)) {
            double[] t = textbook(w, h);
            if (Math.abs(t[0]) > worst) {
                worst = Math.abs(t[0]);
                worstAt = w;
            }
            worstPhase = Math.max(worstPhase, Math.abs(t[1]));
        }
        LawDeviation d = ControllerMismatch.over(design(pi), target(pi, h), band, true);
        assertThat(d.gainDb()).isCloseTo(worst, within(1e-9));
        assertThat(d.phaseDegrees()).isCloseTo(worstPhase, within(1e-9));
        assertThat(d.worstRadPerSecond()).isCloseTo(worstAt, within(1e-12));
    }

    /** {gain dB, phase deg} of the run PI 1 + h/(1 - e^(-i w h)) over the designed 1 + 1/(i w), K 1, Ti 1 s. */
    private static double[] textbook(double w, double h) {
        // 1 - e^(-i w h) = (1 - cos wh) + i sin wh; h / that = h ((1 - cos) - i sin) / ((1 - cos)^2 + sin^2)
        double re1 = 1 - Math.cos(w * h);
        double im1 = Math.sin(w * h);
        double den = re1 * re1 + im1 * im1;
        double runRe = 1 + h * re1 / den;
        double runIm = -h * im1 / den;
        double desRe = 1;
        double desIm = -1 / w;
        double gainDb = 10 * Math.log10((runRe * runRe + runIm * runIm) / (desRe * desRe + desIm * desIm));
        double phaseDeg = Math.toDegrees(Math.atan2(runIm, runRe) - Math.atan2(desIm, desRe));
        return new double[] {gainDb, phaseDeg};
    }
}

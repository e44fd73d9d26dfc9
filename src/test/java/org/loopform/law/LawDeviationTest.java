package org.loopform.law;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.loopform.lti.FrequencyBand;

/**
 * The largest gain (dB) and phase (degrees) difference between two laws over a band. Gain in dB
 * is 20 log10 of the magnitude ratio and the phase difference is arg(b/a) (common practice, any
 * control text, e.g. Franklin, Powell and Emami-Naeini, Feedback Control of Dynamic Systems, ch.
 * 6). Each expected value is worked out by hand beside its check.
 */
class LawDeviationTest {

    private static final FrequencyBand BAND = FrequencyBand.of(0.1, 10);

    private static ControlLaw law(double p, double i, double pr) {
        return new ControlLaw(new PidTerms(p, i, 0, 0, pr, 0));
    }

    @Test
    void deviations_are_magnitudes() {
        assertThatThrownBy(() -> new LawDeviation(-1, 0, 1)).hasMessageContaining("-1.0 dB");
        assertThatThrownBy(() -> new LawDeviation(0, -2, 1)).hasMessageContaining("-2.0 deg");
        assertThatThrownBy(() -> new LawDeviation(Double.NaN, 0, 1)).hasMessageContaining(">= 0");
        assertThat(new LawDeviation(0, 0, 1).gainDb()).isZero();
    }

    @Test
    void a_law_does_not_deviate_from_itself() {
        ControlLaw a = law(2, 0.5, 1);
        LawDeviation d = LawDeviation.between(a, a, BAND);
        assertThat(d.gainDb()).isZero();
        assertThat(d.phaseDegrees()).isZero();
        assertThat(d.worstRadPerSecond()).isEqualTo(0.1);
    }

    @Test
    void doubling_a_proportional_gain_is_6_02_db_at_every_frequency_reported_at_the_first() {
        // 20 log10 2 = 6.0206 dB; the difference is flat, so the first grid point (the band bottom) is the worst
        LawDeviation d = LawDeviation.between(law(1, 0, 1), law(2, 0, 2), BAND);
        assertThat(d.gainDb()).isCloseTo(20 * Math.log10(2), within(1e-9));
        assertThat(d.phaseDegrees()).isCloseTo(0, within(1e-9));
        assertThat(d.worstRadPerSecond()).isCloseTo(0.1, within(1e-12));
    }

    @Test
    void doubling_a_pi_law_changes_its_gain_and_not_its_phase() {
        // b = 2 a at every frequency: |b/a| = 2 (6.02 dB) and arg(b/a) = 0, although a itself is
        // complex (1 - 1/(i w) has a large imaginary part below w = 1 rad/s)
        LawDeviation d = LawDeviation.between(law(1, 1, 1), law(2, 2, 2), BAND);
        assertThat(d.gainDb()).isCloseTo(20 * Math.log10(2), within(1e-9));
        assertThat(d.phaseDegrees()).isCloseTo(0, within(1e-9));
    }

    @Test
    void reversing_the_action_is_a_180_degree_phase_difference_with_no_gain_difference() {
        LawDeviation d = LawDeviation.between(law(1, 0, 1), law(-1, 0, -1), BAND);
        assertThat(d.gainDb()).isCloseTo(0, within(1e-9));
        assertThat(d.phaseDegrees()).isCloseTo(180, within(1e-9));
    }

    @Test
    void adding_integral_action_deviates_most_at_the_band_bottom() {
        // P = 2 against PI 2 + 2/(i w): ratio 1 - i/w, |1 - i/w| = sqrt(1 + 1/w^2), arg = -atan(1/w).
        // At w = 0.1: 10 log10(101) = 20.043 dB and atan(10) = 84.289 deg
        LawDeviation d = LawDeviation.between(law(2, 0, 2), law(2, 2, 2), BAND);
        assertThat(d.gainDb()).isCloseTo(10 * Math.log10(101), within(1e-9));
        assertThat(d.phaseDegrees()).isCloseTo(Math.toDegrees(Math.atan(10)), within(1e-9));
        assertThat(d.worstRadPerSecond()).isCloseTo(0.1, within(1e-12));
    }

    @Test
    void the_worst_gain_frequency_is_where_the_gain_difference_peaks() {
        // P = 1 against P = 1 with a derivative over a filter is not monotone in general; use a
        // rising one: (1 + 2 s)/(1) against 1 has |1 + 2 i w| largest at the band top, 10 rad/s:
        // 10 log10(1 + 400) = 26.03 dB, phase atan(20) = 87.14 deg
        ControlLaw p = law(1, 0, 1);
        ControlLaw pd = new ControlLaw(new PidTerms(1, 0, 2, 0, 1, 2));
        LawDeviation d = LawDeviation.between(p, pd, BAND);
        assertThat(d.gainDb()).isCloseTo(10 * Math.log10(401), within(1e-9));
        assertThat(d.phaseDegrees()).isCloseTo(Math.toDegrees(Math.atan(20)), within(1e-9));
        assertThat(d.worstRadPerSecond()).isCloseTo(10, within(1e-9));
    }

    @Test
    void feedback_and_setpoint_paths_are_measured_separately() {
        // same C_y = 1; setpoint weight 1 against 0.5: 20 log10 2 = 6.02 dB on C_r only
        ControlLaw a = law(1, 0, 1);
        ControlLaw b = law(1, 0, 0.5);
        assertThat(LawDeviation.ofFeedback(a, b, BAND).gainDb()).isCloseTo(0, within(1e-12));
        assertThat(LawDeviation.ofSetpoint(a, b, BAND).gainDb()).isCloseTo(20 * Math.log10(2), within(1e-9));
        assertThat(LawDeviation.between(a, b, BAND).gainDb()).isCloseTo(20 * Math.log10(2), within(1e-9));
        // and the other way: C_y differs, C_r does not
        ControlLaw c = law(2, 0, 1);
        assertThat(LawDeviation.ofSetpoint(a, c, BAND).gainDb()).isCloseTo(0, within(1e-12));
        assertThat(LawDeviation.ofFeedback(a, c, BAND).gainDb()).isCloseTo(20 * Math.log10(2), within(1e-9));
    }

    @Test
    void a_path_that_is_zero_in_both_laws_is_skipped_and_zero_in_one_is_an_unbounded_deviation() {
        // C_r = 0 in both (pr = dr = 0, no integral): nothing to compare on that path
        ControlLaw a = law(1, 0, 0);
        assertThat(LawDeviation.ofSetpoint(a, law(1, 0, 0), BAND).gainDb()).isZero();
        assertThat(LawDeviation.ofSetpoint(a, law(1, 0, 0), BAND).phaseDegrees()).isZero();
        // C_r = 0 against C_r = 1: no finite dB figure exists
        assertThat(LawDeviation.ofSetpoint(a, law(1, 0, 1), BAND).gainDb()).isEqualTo(Double.MAX_VALUE);
        assertThat(LawDeviation.ofSetpoint(law(1, 0, 1), a, BAND).gainDb()).isEqualTo(Double.MAX_VALUE);
    }
}

package org.loopform.law;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.lti.FrequencyBand;

/**
 * The bands a law implies. The rules are common practice as documented on {@link TuningBand}:
 * corners i/p, p/d and 1/tf (Astrom and Hagglund 1995, ch. 4, the zeros of a PID law - from
 * memory), a decade either side for {@code implied}, a factor of two (ten on the open side of a
 * one-corner law) for {@code whereLoopLives}, and the Nyquist frequency pi/h as the top
 * (Shannon's sampling theorem). Every band below is worked out by hand in its comment.
 */
class TuningBandTest {

    private static final double TOL = 1e-12;

    private static PidTerms terms(double p, double i, double d, double tf) {
        return new PidTerms(p, i, d, tf, p, d);
    }

    private static void assertBand(FrequencyBand band, double low, double high) {
        assertThat(band.lowRadPerSecond()).as("bottom").isCloseTo(low, within(TOL * low));
        assertThat(band.highRadPerSecond()).as("top").isCloseTo(high, within(TOL * high));
    }

    @Nested
    @DisplayName("the band a tuning implies")
    class Implied {

        @Test
        void a_pi_law_spans_a_decade_either_side_of_its_integral_corner() {
            // i/p = 0.5/2 = 0.25 rad/s: [0.025, 2.5]
            assertBand(TuningBand.implied(terms(2, 0.5, 0, 0), 0), 0.025, 2.5);
            // signs do not move a corner: |i|/|p|
            assertBand(TuningBand.implied(terms(-2, -0.5, 0, 0), 0), 0.025, 2.5);
        }

        @Test
        void a_filtered_pid_spans_from_its_lowest_to_its_highest_corner() {
            // i/p = 0.25, p/d = 2/4 = 0.5, 1/tf = 1/0.4 = 2.5: [0.025, 25]
            assertBand(TuningBand.implied(terms(2, 0.5, 4, 0.4), 0), 0.025, 25);
            // derivative corner below the integral one: i/p = 2/2 = 1, p/d = 2/20 = 0.1: [0.01, 10]
            assertBand(TuningBand.implied(terms(2, 2, 20, 0), 0), 0.01, 10);
            // a negative derivative coefficient: p/|d| = 2/4 = 0.5 alone: [0.05, 5]
            assertBand(TuningBand.implied(terms(2, 0, -4, 0), 0), 0.05, 5);
        }

        @Test
        void a_law_with_a_filter_corner_only_spans_a_decade_around_it() {
            // p = 0: no proportional corners; 1/tf = 2: [0.2, 20]
            assertBand(TuningBand.implied(new PidTerms(0, 1, 3, 0.5, 0, 3), 0), 0.2, 20);
        }

        @Test
        void a_flat_law_gets_a_decade_around_0_01_to_1_rad_per_s() {
            // no corner at all: the fallback [0.01, 1] widened a decade each side
            assertBand(TuningBand.implied(terms(1, 0, 0, 0), 0), 0.001, 10);
            // integral without proportional term: still no corner
            assertBand(TuningBand.implied(new PidTerms(0, 1, 0, 0, 0, 0), 0), 0.001, 10);
        }

        @Test
        void a_scan_time_cuts_the_top_at_nyquist_and_keeps_two_decades() {
            // [0.025, 2.5], h = 1 s: pi > 2.5 so nothing changes
            assertBand(TuningBand.implied(terms(2, 0.5, 0, 0), 1), 0.025, 2.5);
            // h = 2 s: top pi/2; bottom min(0.025, (pi/2)/100)
            assertBand(TuningBand.implied(terms(2, 0.5, 0, 0), 2), Math.PI / 200, Math.PI / 2);
        }
    }

    @Nested
    @DisplayName("where the loop lives")
    class WhereLoopLives {

        @Test
        void a_pid_law_lives_from_half_its_lowest_to_twice_its_highest_proportional_corner() {
            // i/p = 0.25, p/d = 0.5: [0.125, 1.0]; the filter corner 1/tf = 10 does not count
            assertBand(TuningBand.whereLoopLives(terms(2, 0.5, 4, 0.1), 0), 0.125, 1.0);
            // corners the other way round: i/p = 1, p/d = 0.1: [0.05, 2]
            assertBand(TuningBand.whereLoopLives(terms(2, 2, 20, 0), 0), 0.05, 2);
        }

        @Test
        void a_pi_law_lives_a_decade_above_its_integral_corner() {
            // i/p = 0.25: [0.125, 2.5]
            assertBand(TuningBand.whereLoopLives(terms(2, 0.5, 0, 0), 0), 0.125, 2.5);
        }

        @Test
        void a_pd_law_lives_a_decade_below_its_derivative_corner() {
            // p/d = 0.5: [0.05, 1.0]
            assertBand(TuningBand.whereLoopLives(terms(2, 0, 4, 0), 0), 0.05, 1.0);
        }

        @Test
        void a_law_without_proportional_corners_falls_back_to_the_implied_band() {
            assertBand(TuningBand.whereLoopLives(terms(1, 0, 0, 0), 0), 0.001, 10);
            // p = 0: neither i/p nor p/d exists; filter corner 1/tf = 2 gives [0.2, 20]
            assertBand(TuningBand.whereLoopLives(new PidTerms(0, 1, 3, 0.5, 0, 3), 0), 0.2, 20);
        }

        @Test
        void a_scan_time_cuts_the_top_at_nyquist_and_keeps_a_decade() {
            // PID [0.125, 1.0], h = 1 s: top min(1, pi) = 1, bottom min(0.125, 1/10) = 0.1
            assertBand(TuningBand.whereLoopLives(terms(2, 0.5, 4, 0), 1), 0.1, 1.0);
            // PI [0.125, 2.5], h = 2 s: top pi/2, bottom min(0.125, pi/20 = 0.157) = 0.125
            assertBand(TuningBand.whereLoopLives(terms(2, 0.5, 0, 0), 2), 0.125, Math.PI / 2);
        }
    }
}

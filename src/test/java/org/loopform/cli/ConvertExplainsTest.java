// source: Astrom & Hagglund, PID Controllers: Theory, Design and Tuning, 2nd ed., ISA 1995, sec. 3.4 (series-ideal relations), worked by hand in the class comment
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;

/**
 * convert as a practitioner reads it: the numbers they know beside the exact ones, and why they
 * differ. Series Kc' = 2, Ti' = 10 s, Td' = 2 s with the default N = 10 into ideal. Textbook
 * (Astrom & Hagglund 1995 sec. 3.4, relations for unfiltered laws): Kc = 2 (1 + 2/10) = 2.4,
 * Ti = 12 s, Td = 20/12 = 1.667 s. Exact with the series filter Tf = Td'/N = 0.2 s kept (derived in
 * form.ExplainedConversionTest): Kc = 2.4 - 0.2 * 0.2 = 2.36, Ti = 2.36/0.2 = 11.8 s,
 * Td = 4/2.36 - 0.2 = 1.49492 s, n = Td/Tf = 7.475. pb 50 %, ti 120 s, td 0.1 h is Kc' 2, Ti' 120 s,
 * Td' 360 s, Tf 36 s: exact with Kc = 8 - 36/60 = 7.4, Ti = 444 s, Td = 720/7.4 - 36 = 61.297 s,
 * n = 1.703 (textbook 8, 480 s, 90 s).
 */
class ConvertExplainsTest {

    @Test
    void series_to_ideal_shows_the_textbook_values_beside_the_exact_ones_and_says_why() {
        CliRun r = CliRun.of("convert", "--from", "series", "--to", "ideal", "kc=2", "ti=10", "td=2");
        assertThat(r.exitCode()).isZero();
        assertThat(r.out()).containsPattern("kc\\s+2\\.36\\s+%/%\\s+2\\.36\\s+2\\.4\\b")
                .containsPattern("ti\\s+11\\.8\\s+s/repeat\\s+11\\.8\\s+12\\b")
                .containsPattern("td\\s+1\\.49492\\s+s\\s+1\\.49492\\s+1\\.667\\b")
                .contains("They differ from the exact values because the old derivative filter enters the conversion")
                .contains("[info] filter: Exact with n = 7.475 instead of ideal's default n = 10")
                .contains("No n was given for series; its default derivative filter ratio N = 10");
    }

    @Test
    void a_band_tuning_that_needs_n_1_7_says_so() {
        CliRun r = CliRun.of("convert", "--from", "series-pb-min", "--to", "ideal", "pb=50%", "ti=120s", "td=0.1h");
        assertThat(r.exitCode()).isZero();
        assertThat(r.out()).doesNotContain("Findings: none")
                .containsPattern("kc\\s+7\\.4\\s+%/%\\s+7\\.4\\s+8\\b")
                .containsPattern("ti\\s+444\\s+s/repeat\\s+444\\s+480\\b")
                .containsPattern("td\\s+61\\.2973\\s+s\\s+61\\.2973\\s+90\\b")
                .contains("Exact with n = 1.703 instead of ideal's default n = 10");
    }

    /** Plumbing: a form's description says how to write "no filter" for an adjustable filter. */
    @Test
    void forms_show_says_how_to_write_no_filter() {
        assertThat(CliRun.of("forms", "show", "ideal").out()).contains("n=off: no filter");
        assertThat(CliRun.of("forms", "show", "ideal-pv-filter").out()).contains("tf=off: no filter");
    }
}

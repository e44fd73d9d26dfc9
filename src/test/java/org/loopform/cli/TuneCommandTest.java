package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;

/** {@code loopform tune} end to end: the rule's values carried through the converter into the target form. */
class TuneCommandTest {

    private static final String K1_T10_L1 = "{model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}";

    private static JsonNode json(String... args) throws Exception {
        CliRun r = CliRun.of(args);
        assertThat(r.exitCode()).as(r.err()).isEqualTo(0);
        return new ObjectMapper().readTree(r.out());
    }

    @Test
    void cohen_coon_pid_reaches_the_target_form() throws Exception {
        // Cohen & Coon 1953, K = 1, T = 10, L = 1: PID (13.583, 2.3623, 0.35714) in the ideal form; in
        // ideal-min the times are in minutes (/60), and the exact conversion keeps the law
        JsonNode n = json("tune", "--process", K1_T10_L1, "--rule", "cohen-coon", "--controller", "pid", "--to",
                "ideal-min", "--format", "json");
        assertThat(n.get("published").get("kc").asDouble()).isCloseTo(13.583, within(1e-3));
        assertThat(n.get("exact").asBoolean()).isTrue();
        assertThat(n.get("parameters").get("ti").asDouble()).isCloseTo(2.3623 / 60, within(1e-5));
        assertThat(n.get("parameters").get("td").asDouble()).isCloseTo(0.35714 / 60, within(1e-6));
        assertThat(n.get("units").get("ti").asText()).contains("min");
        assertThat(n.get("design").get("stability").asText()).isEqualTo("stable");
    }

    @Test
    void simc_series_pid_is_carried_into_the_ideal_form_by_the_textbook_relations() throws Exception {
        // Skogestad 2003: SOPDT k = -2, tau1 = 6, tau2 = 2, theta = 1, tau_c = theta -> series Kc = 6/(-2*2) = -1.5,
        // tauI = min(6, 8) = 6, tauD = 2; series to ideal (Astrom & Hagglund 1995, sec. 3.4): a = 1 + 2/6,
        // Kc = -2, Ti = 8, Td = 1.5
        JsonNode n = json("tune", "--process", "{model: sopdt, gain: -2, time_constant: 6 s, time_constant_2: 2 s,"
                + " dead_time: 1 s}", "--rule", "simc", "--controller", "pid", "--format", "json");
        assertThat(n.get("published").get("structure").asText()).isEqualTo("series");
        assertThat(n.get("parameters").get("kc").asDouble()).isCloseTo(-2, within(1e-9));
        assertThat(n.get("parameters").get("ti").asDouble()).isCloseTo(8, within(1e-9));
        assertThat(n.get("parameters").get("td").asDouble()).isCloseTo(1.5, within(1e-9));
        // derived by hand: the loop is 0.5 e^(-s)/s, crossover 0.5 rad/s, PM = 90 - 28.65 deg, GM = pi
        assertThat(n.get("design").get("phase_margin_deg").asDouble()).isCloseTo(90 - 0.5 * 180 / Math.PI,
                within(1e-3));
        assertThat(n.get("design").get("gain_margin").asDouble()).isCloseTo(Math.PI, within(1e-4));
    }

    @Test
    void ultimate_cycle_from_a_field_test_gives_zn_values_and_no_loop() throws Exception {
        // Ziegler & Nichols 1942: Ku = 8, Tu = 4 s -> PID 4.8, Ti = 2 s, Td = 0.5 s
        JsonNode n = json("tune", "--ultimate", "8,4s", "--rule", "zn-ultimate", "--controller", "pid", "--to",
                "ideal-unfiltered", "--format", "json");
        assertThat(n.get("figures").get("ku").asDouble()).isEqualTo(8.0);
        assertThat(n.get("figures").get("tu_s").asDouble()).isEqualTo(4.0);
        assertThat(n.get("parameters").get("kc").asDouble()).isCloseTo(4.8, within(1e-9));
        assertThat(n.get("parameters").get("ti").asDouble()).isCloseTo(2, within(1e-9));
        assertThat(n.get("parameters").get("td").asDouble()).isCloseTo(0.5, within(1e-9));
        assertThat(n.get("design").isNull()).isTrue();
    }

    @Test
    void with_a_scan_the_whole_check_is_reported() throws Exception {
        JsonNode n = json("tune", "--process", K1_T10_L1, "--rule", "amigo", "--scan", "0.1s", "--format", "json");
        assertThat(n.get("check").get("scan_s").asDouble()).isEqualTo(0.1);
        assertThat(n.get("check").get("target").get("ms").asDouble()).isGreaterThan(1.0);
    }

    @Test
    void text_names_the_rule_its_source_and_the_published_form() {
        CliRun r = CliRun.of("tune", "--process", K1_T10_L1, "--rule", "zn-step", "--controller", "pid");
        assertThat(r.exitCode()).as(r.err()).isEqualTo(0);
        assertThat(r.out()).contains("Ziegler & Nichols").contains("as published (ideal, no derivative filter):"
                + " kc = 12 %/%, ti = 2 s, td = 0.5 s").contains("phase margin");
    }

    /** A new loop has no as-found controller: tune's check names its reference the published law (plumbing of words). */
    @Test
    void the_check_of_a_tuning_compares_with_the_published_law_not_an_as_found_loop() {
        CliRun r = CliRun.of("tune", "--process", K1_T10_L1, "--rule", "simc", "--scan", "0.1s");
        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        assertThat(r.out()).contains("figure                   as published  as-left  unit",
                "new controller as run vs the published law", "Stability: as published ").doesNotContain("as-found");
    }
}

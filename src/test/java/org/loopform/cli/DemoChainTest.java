package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.io.TempDir;

/**
 * The demo's report takes the new loop TIC-104 from its invented bump test to a checked tuning: fitted,
 * tuned by SIMC, carried into the target form and checked, in a section of its own with its figures.
 */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class DemoChainTest {

    private CliRun demo;
    private String section;
    private JsonNode fitted;
    private Path loopsJson;

    @BeforeAll
    void runTheDemoAndFitTheRecord(@TempDir Path dir) throws Exception {
        demo = CliRun.of("demo", "--out", dir.resolve("demo").toString());
        assertThat(demo.exitCode()).as(demo.err()).isEqualTo(0);
        // an FOPDT fit has three uncertain parameters: its box has 2^3 = 8 corners, and the summary line says
        // the worst Ms is the corners' (a sample of the box, not a bound over it)
        assertThat(demo.out()).containsPattern("worst Ms at the 8 corners of the fit's 95 % box [0-9.]+ \\(ratio\\)");
        loopsJson = dir.resolve("demo").resolve("loops.json");
        String html = Files.readString(dir.resolve("demo").resolve("report.html"));
        int start = html.indexOf("<section id=\"chain\"");
        assertThat(start).as("the chain's section").isNotNegative();
        section = html.substring(start, html.indexOf("<h3>4.", start) + 2000);
        // plumbing: the 33 audited loops keep their sections and index lines; the chained loop is apart from them
        assertThat(Pattern.compile("<section class=\"loop ").matcher(html).results().count()).isEqualTo(33);
        assertThat(section).contains("<section class=\"chained pass\" id=\"loop-TIC-104\">");
        CliRun fit = CliRun.of("fit", "examples/records/tic-104-bump.csv", "--pv-range", "0..150", "--out-range",
                "0..100", "--format", "json");
        assertThat(fit.exitCode()).as(fit.err()).isEqualTo(0);
        fitted = new ObjectMapper().readTree(fit.out()).get("models").get(0);
        assertThat(fitted.get("model").asText()).isEqualTo("fopdt");
    }

    private static double number(String text, String regex) {
        Matcher m = Pattern.compile(regex).matcher(text);
        assertThat(m.find()).as(regex).isTrue();
        return Double.parseDouble(m.group(1));
    }

    /**
     * Plumbing: every number in loops.json (the loops with their replay blocks, the chain, the
     * sign-off, the provenance and the summary) carries at most ten significant digits, as the
     * printed JSON of every command does: no binary noise such as 700.8000000000001.
     */
    @Test
    void loops_json_carries_no_binary_noise() throws Exception {
        JsonNode root = new ObjectMapper().readTree(loopsJson.toFile());
        List<String> noisy = new java.util.ArrayList<>();
        collectNoisy(root, "", noisy);
        assertThat(root.get("loops").size()).isEqualTo(33);
        assertThat(root.get("chain")).isNotNull();
        assertThat(noisy).isEmpty();
    }

    private static void collectNoisy(JsonNode n, String path, List<String> noisy) {
        if (n.isContainerNode()) {
            n.fields().forEachRemaining(e -> collectNoisy(e.getValue(), path + "." + e.getKey(), noisy));
            for (int k = 0; n.isArray() && k < n.size(); k++) {
                collectNoisy(n.get(k), path + "[" + k + "]", noisy);
            }
        } else if (n.isFloatingPointNumber()) {
            String digits = new java.math.BigDecimal(n.asText()).unscaledValue().abs().toString()
                    .replaceFirst("0+$", "");
            if (digits.length() > 10) {
                noisy.add(path + " = " + n.asText());
            }
        }
    }

    @Test
    void the_section_shows_the_four_steps_with_the_fit_plot_and_the_loop_plots() {
        assertThat(section).contains("<h2>TIC-104, a new loop: from a bump test to a checked tuning</h2>")
                .contains("<h3>1. The record fitted</h3>").contains("<h3>2. Tuning by a published rule</h3>")
                .contains("<h3>3. Carried into the target form and checked</h3>")
                .contains("<h3>4. Over the fit's uncertainty</h3>").contains("Invented");
        // the fit plot (record, output, residuals) and the checked loop's plots, drawn inline
        assertThat(section).contains("Recorded PV and the fitted models").contains("Residuals of the fopdt fit")
                .contains("Setpoint step: PV");
        assertThat(Pattern.compile("<svg").matcher(section).results().count()).isGreaterThanOrEqualTo(6);
        // every number with its unit, and the rule's source
        assertThat(section).contains("%/%</td>").contains(">s</td>").contains("Skogestad")
                .contains("J. Process Control 13 (2003)").contains("deg</td>");
        assertThat(demo.out()).contains("TIC-104 (a new loop, from the invented bump test")
                .contains("rule simc PI (Skogestad 2003)");
    }

    @Test
    void the_fitted_model_is_the_one_fit_gives_and_its_intervals_hold_the_generators_process() {
        // examples/records/generate.py built the record from FOPDT K = 2 %/%, T = 60 s, L = 10 s
        String table = section.substring(section.indexOf("<table class=\"fit\">"));
        double[][] rows = {
            {number(table, "gain K</th><td class=\"num\">([0-9.]+)"), number(table, "gain K</th>.*?([0-9.]+) \\.\\."),
                number(table, "gain K</th>.*?\\.\\. ([0-9.]+)"), 2},
            {number(table, "time constant T</th><td class=\"num\">([0-9.]+)"),
                number(table, "time constant T</th>.*?([0-9.]+) \\.\\."),
                number(table, "time constant T</th>.*?\\.\\. ([0-9.]+)"), 60},
            {number(table, "dead time L</th><td class=\"num\">([0-9.]+)"),
                number(table, "dead time L</th>.*?([0-9.]+) \\.\\."),
                number(table, "dead time L</th>.*?\\.\\. ([0-9.]+)"), 10}};
        List<String> keys = List.of("gain", "time_constant_s", "dead_time_s");
        for (int k = 0; k < rows.length; k++) {
            String key = keys.get(k);
            assertThat(rows[k][0]).as(key).isCloseTo(fitted.get("parameters").get(key).asDouble(), within(5e-3 * rows[k][3]));
            assertThat(rows[k][3]).as(key + " inside the interval").isBetween(rows[k][1], rows[k][2]);
        }
    }

    @Test
    void the_tuning_is_simcs_pi_of_the_fitted_model_and_the_loop_has_simcs_margins() {
        // Skogestad 2003, SIMC PI for FOPDT with tau_c = theta: Kc = T/(K (tau_c + theta)) = T/(2 K L),
        // tauI = min(T, 4 (tau_c + theta)) = min(T, 8 L); the values fit gives for the record
        double gain = fitted.get("parameters").get("gain").asDouble();
        double lag = fitted.get("parameters").get("time_constant_s").asDouble();
        double dead = fitted.get("parameters").get("dead_time_s").asDouble();
        double kc = number(section, "as published: kc = ([0-9.]+) %/%");
        double ti = number(section, "as published: kc = [0-9.]+ %/%, ti = ([0-9.]+) s");
        assertThat(kc).isCloseTo(lag / (2 * gain * dead), within(1e-4 * kc));
        assertThat(ti).isCloseTo(Math.min(lag, 8 * dead), within(1e-4 * ti));
        // with tauI = T the design loop is e^(-L s)/(2 L s) (hand derivation): crossover 1/(2L), phase margin
        // 90 - 180/(2 pi) = 61.35 deg, gain margin pi = 3.14 (Skogestad 2003 gives GM 3.14, PM 61.4 deg)
        double pm = number(section, "phase margin</th><td class=\"num\">([0-9.]+)</td>");
        double gm = number(section, "gain margin</th><td class=\"num\">([0-9.]+)</td>");
        assertThat(pm).isCloseTo(90 - 180 / (2 * Math.PI), within(0.06));
        assertThat(gm).isCloseTo(Math.PI, within(0.006));
        // carried into the target form (ideal PID, gain and minutes: common practice): the same gain, ti in minutes
        assertThat(section).contains("plant-k7-target").contains("PASS");
        double targetKc = number(section, "<td class=\"sep\">kc</td><td class=\"num\">([0-9.]+)</td>");
        double targetTiMinutes = number(section, "<td class=\"sep\">ti</td><td class=\"num\">([0-9.]+)</td>");
        assertThat(targetKc).isCloseTo(kc, within(1e-4 * kc));
        assertThat(targetTiMinutes).isCloseTo(ti / 60, within(1e-4 * ti / 60));
    }

    @Test
    void the_json_summary_carries_the_chain_as_fit_and_tune_write_it(@TempDir Path dir) throws Exception {
        Path out = dir.resolve("demo-json");
        CliRun json = CliRun.of("demo", "--format", "json", "--out", out.toString());
        assertThat(json.exitCode()).as(json.err()).isEqualTo(0);
        JsonNode chain = new ObjectMapper().readTree(json.out()).get("chain");
        assertThat(chain.get("tag").asText()).isEqualTo("TIC-104");
        assertThat(chain.get("record").asText()).isEqualTo("examples/records/tic-104-bump.csv");
        assertThat(chain.get("origin").asText()).startsWith("Invented");
        // the fit as `fit --format json` writes it for the same record and spans
        assertThat(chain.get("fit").get("models").get(0)).isEqualTo(fitted);
        assertThat(chain.get("fit").get("recommended").asText()).isEqualTo("fopdt");
        // the tuning as `tune` writes it: SIMC PI (Skogestad 2003, tau_c = theta): Kc = T/(2 K L), tauI = min(T, 8 L)
        JsonNode tune = chain.get("tune");
        double gain = fitted.get("parameters").get("gain").asDouble();
        double lag = fitted.get("parameters").get("time_constant_s").asDouble();
        double dead = fitted.get("parameters").get("dead_time_s").asDouble();
        double kc = lag / (2 * gain * dead);
        double tiSeconds = Math.min(lag, 8 * dead);
        assertThat(tune.get("rule").asText()).isEqualTo("simc");
        assertThat(tune.get("published").get("kc").asDouble()).isCloseTo(kc, within(1e-6 * kc));
        assertThat(tune.get("published").get("ti_s").asDouble()).isCloseTo(tiSeconds, within(1e-6 * tiSeconds));
        // carried into the target (ideal, gain and minutes: common practice): the same gain, ti in minutes
        assertThat(tune.get("to").asText()).isEqualTo("plant-k7-target");
        assertThat(tune.get("parameters").get("kc").asDouble()).isCloseTo(kc, within(1e-6 * kc));
        assertThat(tune.get("parameters").get("ti").asDouble()).isCloseTo(tiSeconds / 60, within(1e-6 * tiSeconds));
        assertThat(tune.get("check").get("verdict").asText()).isEqualTo("pass");
        assertThat(tune.get("robust").isObject()).isTrue();
        // the same keys, in the same order, as `tune` prints for that model, target and scan
        String model = "{model: fopdt, gain: " + gain + ", time_constant: " + lag + " s, dead_time: " + dead + " s}";
        CliRun t = CliRun.of("tune", "--process", model, "--rule", "simc", "--to", "examples/plant-k7-target.yaml",
                "--scan", "0.5 s", "--pv-range", "0..150", "--out-range", "0..100", "--format", "json");
        assertThat(t.exitCode()).as(t.err()).isEqualTo(0);
        JsonNode alone = new ObjectMapper().readTree(t.out());
        List<String> keys = new java.util.ArrayList<>();
        tune.fieldNames().forEachRemaining(keys::add);
        List<String> aloneKeys = new java.util.ArrayList<>();
        alone.fieldNames().forEachRemaining(aloneKeys::add);
        keys.remove("robust");
        assertThat(keys).isEqualTo(aloneKeys);
        // the model went to `tune` with the 10 digits JSON keeps, so its values agree to about that
        for (String k : List.of("published", "parameters", "units", "entered")) {
            tune.get(k).fields().forEachRemaining(e -> {
                JsonNode other = alone.get(k).get(e.getKey());
                if (e.getValue().isNumber()) {
                    assertThat(e.getValue().asDouble()).as(k + "." + e.getKey())
                            .isCloseTo(other.asDouble(), within(1e-8 * Math.max(1, Math.abs(other.asDouble()))));
                } else {
                    assertThat(e.getValue()).as(k + "." + e.getKey()).isEqualTo(other);
                }
            });
        }
        // loops.json carries the same chain (its numbers at full precision, the printed summary's at 10 digits)
        JsonNode saved = new ObjectMapper().readTree(out.resolve("loops.json").toFile()).get("chain");
        assertThat(saved.get("tag")).isEqualTo(chain.get("tag"));
        assertThat(saved.get("fit").get("recommended")).isEqualTo(chain.get("fit").get("recommended"));
        assertThat(saved.get("tune").get("check").get("verdict")).isEqualTo(tune.get("check").get("verdict"));
        assertThat(saved.get("tune").get("parameters").get("kc").asDouble()).isCloseTo(kc, within(1e-6 * kc));
    }
}

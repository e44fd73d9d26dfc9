package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.stream.Collectors;
import java.util.stream.DoubleStream;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A new loop in an audit list tuned by rule: the audit computes the rule's tuning exactly as {@code tune}
 * does, converts it and checks it like any other loop, and its outputs say which rule (and its source)
 * gave it; rows that cannot be tuned by their rule are bad rows that say why and how to fix them.
 */
class RuleRowsTest {

    @TempDir
    Path dir;

    private static final ObjectMapper JSON = new ObjectMapper();

    /** Multiplies polynomials given highest power first (written out here, independent of loopform's Polynomial). */
    private static double[] times(double[]... factors) {
        double[] p = {1};
        for (double[] f : factors) {
            double[] q = new double[p.length + f.length - 1];
            for (int i = 0; i < p.length; i++) {
                for (int j = 0; j < f.length; j++) {
                    q[i + j] += p[i] * f[j];
                }
            }
            p = q;
        }
        return p;
    }

    private static String list(double[] p) {
        return DoubleStream.of(p).mapToObj(x -> String.format(Locale.ROOT, "%.17g", x))
                .collect(Collectors.joining(", ", "[", "]"));
    }

    /**
     * Skogestad 2003 (J. Process Control 13:291-309), the paper's worked example of the half rule:
     * g = (-0.3s+1)(0.08s+1)/((2s+1)(s+1)(0.4s+1)(0.2s+1)(0.05s+1)^3), as a loop list's tf block.
     */
    private static String skogestadExample() {
        double[] num = times(new double[] {-0.3, 1}, new double[] {0.08, 1});
        double[] den = times(new double[] {2, 1}, new double[] {1, 1}, new double[] {0.4, 1}, new double[] {0.2, 1},
                new double[] {0.05, 1}, new double[] {0.05, 1}, new double[] {0.05, 1});
        return "{model: tf, num: " + list(num) + ", den: " + list(den) + "}";
    }

    private JsonNode loops(CliRun r, Path out) throws Exception {
        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        return JSON.readTree(Files.readString(out.resolve("loops.json"))).get("loops");
    }

    @Nested
    class SameTuningAsTune {

        @Test
        void simc_on_the_papers_example_gives_the_papers_pi_and_series_pid_and_what_tune_gives() throws Exception {
            String model = skogestadExample();
            Path yaml = dir.resolve("new.yaml");
            Files.writeString(yaml, "loops:\n"
                    + "  - tag: TIC-1\n    process: " + model + "\n    tuning: {rule: simc, controller: pi}\n"
                    + "    target: {form: ideal, scan: 0.05 s}\n"
                    + "  - tag: TIC-2\n    process: " + model + "\n    tuning: {rule: simc, controller: pid}\n"
                    + "    target: {form: ideal, scan: 0.05 s}\n");
            Path out = dir.resolve("out");
            JsonNode loops = loops(CliRun.of("audit", yaml.toString(), "--out", out.toString()), out);

            // Skogestad 2003, worked example: the half rule gives FOPDT k = 1, tau1 = 2.5, theta = 1.47 and PI
            // Kc = 0.85, tauI = 2.5; SOPDT tau1 = 2, tau2 = 1.2, theta = 0.77 and series PID Kc = 1.30, tauI = 2,
            // tauD = 1.2 (the values PublishedRulesTest checks for tune)
            JsonNode pi = loops.get(0).get("tuning_rule");
            assertThat(pi.get("rule").asText()).isEqualTo("simc");
            assertThat(pi.get("source").asText()).contains("Skogestad").contains("2003");
            assertThat(pi.get("published").get("kc").asDouble()).isCloseTo(0.85, within(0.005));
            assertThat(pi.get("published").get("ti_s").asDouble()).isCloseTo(2.5, within(1e-4));
            JsonNode pid = loops.get(1).get("tuning_rule");
            assertThat(pid.get("published").get("structure").asText()).isEqualTo("series");
            assertThat(pid.get("published").get("kc").asDouble()).isCloseTo(1.30, within(0.005));
            assertThat(pid.get("published").get("ti_s").asDouble()).isCloseTo(2.0, within(1e-4));
            assertThat(pid.get("published").get("td_s").asDouble()).isCloseTo(1.2, within(1e-4));

            // the same model and rule through tune: the same published tuning, the same converted values and
            // the same checked loop (loops.json rounds to ten significant digits)
            for (int k = 0; k < 2; k++) {
                String controller = k == 0 ? "pi" : "pid";
                CliRun t = CliRun.of("tune", "--process", model, "--rule", "simc", "--controller", controller, "--to",
                        "ideal", "--scan", "0.05s", "--format", "json");
                assertThat(t.exitCode()).as(t.err()).isIn(0, 1);
                JsonNode tune = JSON.readTree(t.out());
                JsonNode row = loops.get(k);
                for (String key : List.of("kc", "ti_s", "td_s")) {
                    assertThat(row.get("tuning_rule").get("published").get(key).asDouble())
                            .as(controller + " " + key)
                            .isCloseTo(tune.get("published").get(key).asDouble(), within(1e-9));
                }
                tune.get("parameters").fieldNames().forEachRemaining(p ->
                        assertThat(row.get("parameters").get("converted").get(p).asDouble()).as(controller + " " + p)
                                .isCloseTo(tune.get("parameters").get(p).asDouble(), within(1e-8)));
                assertThat(row.get("verdict").asText()).isEqualTo(tune.get("check").get("verdict").asText());
                assertThat(row.get("target").get("ms").asDouble())
                        .isCloseTo(tune.get("check").get("target").get("ms").asDouble(), within(1e-8));
            }
        }

        @Test
        void a_csv_row_tuned_by_simc_reaches_the_target_form_and_every_output_says_so() throws Exception {
            // Skogestad 2003, SIMC PI for FOPDT by hand: k = 2, tau1 = 60 s, theta = 10 s, tau_c = theta:
            // Kc = tau1/(k (tau_c + theta)) = 60/40 = 1.5, tauI = min(tau1, 4 (tau_c + theta)) = min(60, 80) = 60 s.
            // In ideal-pb-repeats (common practice): PB = 100/Kc = 66.667 %, reset = 60/tauI = 1 repeat/min
            Path csv = dir.resolve("new.csv");
            Files.writeString(csv, "tag,rule,controller,model,process_gain,time_constant,dead_time,target_form,"
                    + "target_scan\nTIC-9,simc,pi,fopdt,2,60 s,10 s,ideal-pb-repeats,0.5 s\n");
            Path out = dir.resolve("out");
            JsonNode row = loops(CliRun.of("audit", csv.toString(), "--out", out.toString()), out).get(0);
            assertThat(row.get("parameters").get("converted").get("pb").asDouble()).isCloseTo(100 / 1.5, within(1e-6));
            assertThat(row.get("parameters").get("converted").get("reset").asDouble()).isCloseTo(1, within(1e-9));

            List<String> loopsCsv = Files.readAllLines(out.resolve("loops.csv"), StandardCharsets.UTF_8);
            assertThat(loopsCsv.get(0)).contains("tuning_rule,tuning_rule_source");
            assertThat(loopsCsv.get(1)).contains("simc PI").contains("Skogestad").contains("kc = 1.5 %/%, ti = 60 s");
            String sheet = Files.readString(out.resolve("entry-sheet.csv"));
            assertThat(sheet).contains("rule simc PI (series),kc,1.5,%/%").contains("rule simc PI (series),ti,60,s")
                    .contains("no as-found value");
            String html = Files.readString(out.resolve("report.html"));
            assertThat(html).contains("New loop, tuned by rule <b>simc PI</b>").contains("Skogestad")
                    .contains("kc = 1.5 %/%, ti = 60 s, td = 0 s")
                    .contains("<span class=\"form\">rule simc PI</span> kc = 1.5 %/%, ti = 60 s");
        }
    }

    @Nested
    class BadRows {

        /** Audits a CSV of one header and these rows with the target form ideal; returns stderr. */
        private String badRows(String header, String... rows) throws Exception {
            Path csv = dir.resolve("bad.csv");
            Files.writeString(csv, header + "\n" + String.join("\n", rows) + "\n");
            CliRun r = CliRun.of("audit", csv.toString(), "--to", "ideal", "--scan", "1s", "--out",
                    dir.resolve("out").toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).doesNotContain("Exception");
            return r.err();
        }

        private static final String HEADER = "tag,form,kc,ti,rule,controller,tau_c,lambda,model,process_gain,"
                + "time_constant,dead_time";

        @Test
        void a_rule_and_tuning_values_on_one_row() throws Exception {
            assertThat(badRows(HEADER, "TIC-1,,1.2,60,simc,pi,,,fopdt,2,60 s,10 s"))
                    .contains("bad.csv:2: rule: the row gives both a rule (simc) and tuning values (kc, ti)")
                    .contains("empty kc, ti to tune this new loop by the rule");
        }

        @Test
        void a_rule_and_a_source_form_on_one_row() throws Exception {
            assertThat(badRows(HEADER, "TIC-1,ideal,,,simc,pi,,,fopdt,2,60 s,10 s"))
                    .contains("bad.csv:2: form: a loop tuned by rule simc starts from the form the rule publishes")
                    .contains("empty form");
        }

        @Test
        void a_rule_without_a_process_model() throws Exception {
            assertThat(badRows(HEADER, "TIC-1,,,,simc,pi,,,,,,"))
                    .contains("bad.csv:2: rule: rule simc tunes from the loop's process model, and this row has none")
                    .contains("model, process_gain, time_constant and dead_time").contains("loopform fit");
        }

        @Test
        void a_rule_that_cannot_apply_to_the_model() throws Exception {
            // Cohen & Coon 1953 is published for self-regulating processes; Ziegler & Nichols' step rule
            // divides by the dead time (a = K L / T)
            String err = badRows(HEADER, "TIC-1,,,,cohen-coon,pi,,,integrating,0.01,,10 s",
                    "TIC-2,,,,zn-step,pi,,,fopdt,2,60 s,0 s");
            assertThat(err).contains("bad.csv:2: rule: rule cohen-coon cannot be applied to this loop: is published"
                    + " for self-regulating processes");
            assertThat(err).contains("bad.csv:3: rule: rule zn-step cannot be applied to this loop: needs a dead time");
        }

        @Test
        void simc_on_a_model_without_dead_time_needs_tau_c() throws Exception {
            assertThat(badRows(HEADER, "TIC-1,,,,simc,pi,,,fopdt,2,60 s,0 s"))
                    .contains("bad.csv:2: tau_c: rule simc cannot be applied to this loop: required")
                    .doesNotContain("--tau-c");
        }

        @Test
        void an_option_the_rule_does_not_read_an_unknown_rule_and_a_bad_controller() throws Exception {
            String err = badRows(HEADER, "TIC-1,,,,amigo,pi,5 s,,fopdt,2,60 s,10 s",
                    "TIC-2,,,,simc,pi,,20 s,fopdt,2,60 s,10 s", "TIC-3,,,,skogestad,pi,,,fopdt,2,60 s,10 s",
                    "TIC-4,,,,simc,p,,,fopdt,2,60 s,10 s", "TIC-5,,,,,pid,,,fopdt,2,60 s,10 s",
                    "TIC-6,,,,lambda,pi,,-3 s,fopdt,2,60 s,10 s");
            assertThat(err).contains("bad.csv:2: tau_c: is SIMC's closed-loop time constant, and rule amigo does not"
                    + " read it");
            assertThat(err).contains("bad.csv:3: lambda: is the closed-loop time constant of the lambda and imc rules,"
                    + " and rule simc does not read it");
            assertThat(err).contains("bad.csv:4: rule: unknown rule 'skogestad'; give one of zn-step, zn-ultimate");
            assertThat(err).contains("bad.csv:5: controller: must be pi or pid (got 'p')");
            assertThat(err).contains("bad.csv:6: controller: applies only to a loop tuned by rule, and the rule is"
                    + " missing");
            assertThat(err).contains("bad.csv:7: lambda: must be > 0 s");
        }

        @Test
        void in_a_yaml_list_the_problems_name_the_tuning_keys() throws Exception {
            Path yaml = dir.resolve("bad.yaml");
            Files.writeString(yaml, "loops:\n"
                    + "  - tag: TIC-1\n    process: {model: fopdt, gain: 2, time_constant: 60 s, dead_time: 10 s}\n"
                    + "    tuning: {rule: simc, kc: 1.5}\n    target: {form: ideal, scan: 1 s}\n"
                    + "  - tag: TIC-2\n    tuning: {rule: imc, lambda: 20 s}\n    target: {form: ideal, scan: 1 s}\n");
            CliRun r = CliRun.of("audit", yaml.toString(), "--out", dir.resolve("out").toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("bad.yaml:4: tuning.rule: the row gives both a rule (simc) and tuning values"
                    + " (kc)");
            assertThat(r.err()).contains("bad.yaml:7: tuning.rule: rule imc tunes from the loop's process model")
                    .contains("process: {model: fopdt");
        }

        @Test
        void check_refuses_a_loop_file_tuned_by_rule_and_points_to_tune() throws Exception {
            Path yaml = dir.resolve("one.yaml");
            Files.writeString(yaml, "tag: TIC-1\nprocess: {model: fopdt, gain: 2, time_constant: 60 s, dead_time: 10 s}\n"
                    + "tuning: {rule: simc}\ntarget: {form: ideal, scan: 1 s}\n");
            CliRun r = CliRun.of("check", yaml.toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("one.yaml:3: tuning.rule: a tuning by rule is read in audit loop lists")
                    .contains("loopform tune --process FILE --rule simc");
        }
    }

    @Test
    void the_example_list_of_new_loops_gives_each_rules_published_values() throws Exception {
        Path out = dir.resolve("out");
        JsonNode loops = loops(CliRun.of("audit", "examples/new-loops.csv", "--to", "examples/plant-k7-target.yaml",
                "--out", out.toString()), out);
        double[][] expected = {
            // TIC-104, SIMC PI (Skogestad 2003) by hand: K = 1.998, T = 59.71 s, L = 10.27 s, tau_c = L:
            // Kc = T/(K 2L), tauI = min(T, 8L) = T
            {59.71 / (1.998 * 2 * 10.27), 59.71},
            // FIC-110, AMIGO PI (Astrom & Hagglund 2004) by hand: K = 0.9, T = 4 s, L = 1 s:
            // Kc = 0.15/K + (0.35 - LT/(L+T)^2) T/(K L) = 1.0111, Ti = 0.35 L + 13 L T^2/(T^2 + 12 L T + 7 L^2) = 3.2796 s
            {0.15 / 0.9 + (0.35 - 4.0 / 25) * 4 / 0.9, 0.35 + 13 * 16.0 / (16 + 48 + 7)},
            // LIC-210, SIMC PI for an integrating process (Skogestad 2003, Table 3): k' = 0.01 %/s per %, theta = 8 s,
            // tau_c = 40 s: Kc = 1/(k' (tau_c + theta)) = 2.0833, tauI = 4 (tau_c + theta) = 192 s
            {1 / (0.01 * 48), 192},
            // TIC-320, lambda PI (Astrom & Hagglund 2006 ch. 7, from memory): K = 1.4, T = 360 s, L = 40 s,
            // lambda = 300 s: Kc = T/(K (lambda + L)) = 0.7563, Ti = T = 360 s
            {360 / (1.4 * 340), 360}};
        for (int k = 0; k < expected.length; k++) {
            JsonNode published = loops.get(k).get("tuning_rule").get("published");
            assertThat(published.get("kc").asDouble()).as(loops.get(k).get("tag").asText())
                    .isCloseTo(expected[k][0], within(1e-6 * expected[k][0]));
            assertThat(published.get("ti_s").asDouble()).as(loops.get(k).get("tag").asText())
                    .isCloseTo(expected[k][1], within(1e-6 * expected[k][1]));
        }
        // FIC-110: 3.2796 s is stored to the new controller's 0.01 min as 0.05 min (3 s), which the check reports
        assertThat(loops.get(1).get("verdict").asText()).isEqualTo("warn");
    }

    @Test
    void a_list_of_new_loops_needs_no_form_column() throws Exception {
        // plumbing: the header may give rule instead of form
        Path csv = dir.resolve("new.csv");
        List<String> lines = new ArrayList<>(List.of("tag,rule,model,process_gain,time_constant,dead_time",
                "FIC-1,amigo,fopdt,1,10 s,1 s"));
        Files.write(csv, lines);
        Path out = dir.resolve("out");
        JsonNode row = loops(CliRun.of("audit", csv.toString(), "--to", "ideal", "--scan", "0.1s", "--out",
                out.toString()), out).get(0);
        // Astrom & Hagglund 2004 AMIGO PI at K = 1, T = 10, L = 1, evaluated by hand (as PublishedRulesTest): 2.8236, 6.0769 s
        assertThat(row.get("tuning_rule").get("published").get("kc").asDouble()).isCloseTo(2.8236, within(1e-4));
        assertThat(row.get("tuning_rule").get("published").get("ti_s").asDouble()).isCloseTo(6.0769, within(1e-4));
    }
}

package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.w3c.dom.Document;

/**
 * Source: plumbing tests, except where marked below.
 * {@code loopform check} as a user meets it, through {@link Main#run}: its text and JSON, the
 * SVG plot, exit codes and the messages for bad loop files. The one expected figure comes from
 * the numpy/scipy reference of {@code org.loopform.audit.LoopCheckGoldenTest} (regenerate with
 * {@code python3 src/test/python/write_check_golden.py}); the rest is plumbing and needs no source.
 */
@DisplayName("loopform check")
class CheckCommandTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final List<String> FIGURES = List.of("phase_margin_deg", "gain_margin", "crossover_rad_s", "ms",
            "delay_margin_s", "setpoint", "load");

    /** An invented loop; line numbers matter to the error tests below. */
    private static final String LOOP = """
            tag: TIC-7
            process: {model: fopdt, gain: 2.0, time_constant: 60 s, dead_time: 10 s}
            tuning: {form: ideal, kc: 1.2, ti: 60, td: 4, n: 10}
            target: {form: ideal-pb-repeats, scan: 0.5 s}
            ranges: {pv: 0..150, output: 0..100}
            """;

    @TempDir
    Path dir;

    private Path loopFile(String text) throws IOException {
        return Files.writeString(dir.resolve("loop.yaml"), text);
    }

    private static CliRun check(Object... args) {
        String[] all = new String[args.length + 1];
        all[0] = "check";
        for (int k = 0; k < args.length; k++) {
            all[k + 1] = args[k].toString();
        }
        return CliRun.of(all);
    }

    @Nested
    @DisplayName("prints")
    class Output {

        @Test
        void a_side_by_side_table_and_the_findings_as_text() throws IOException {
            CliRun run = check(loopFile(LOOP));

            assertThat(run.exitCode()).as(run.err()).isEqualTo(0);
            assertThat(run.err()).isEmpty();
            assertThat(run.out()).contains("TIC-7: ideal -> ideal-pb-repeats at a 0.5 s scan", "verdict: WARN",
                    "figure", "as-found", "as-left", "phase margin", "gain margin", "max sensitivity Ms",
                    "delay margin", "setpoint step IAE", "load step peak", "Findings:", "[warn] derivative");
        }

        @Test
        void json_with_the_contract_keys() throws IOException {
            CliRun run = check(loopFile(LOOP), "--format", "json");

            assertThat(run.exitCode()).as(run.err()).isEqualTo(0);
            JsonNode json = JSON.readTree(run.out());
            assertThat(json.get("tag").asText()).isEqualTo("TIC-7");
            assertThat(json.get("verdict").asText()).isEqualTo("warn");
            assertThat(json.get("parameters").get("entered").has("pb")).isTrue();
            for (String loop : List.of("design", "target")) {
                JsonNode figures = json.get(loop);
                assertThat(figures.isObject()).as(loop).isTrue();
                for (String key : FIGURES) {
                    assertThat(figures.has(key)).as(loop + "." + key).isTrue();
                }
                assertThat(figures.get("phase_margin_deg").isNumber()).isTrue();
                for (String key : List.of("iae", "overshoot_pct", "settling_s")) {
                    assertThat(figures.get("setpoint").has(key)).as(loop + ".setpoint." + key).isTrue();
                }
                for (String key : List.of("iae", "peak")) {
                    assertThat(figures.get("load").get(key).isNumber()).as(loop + ".load." + key).isTrue();
                }
            }
            JsonNode finding = json.get("findings").get(0);
            for (String key : List.of("topic", "severity", "figure", "threshold", "unit", "source", "message")) {
                assertThat(finding.has(key)).as("finding." + key).isTrue();
            }
            assertThat(finding.get("topic").asText()).isEqualTo("derivative");
        }

        /**
         * A new form whose output cannot reach 50 % (limits 60..100 %) is tested about the middle of its
         * limits, (60 + 100) / 2 = 80 %, instead of failing to start (common practice: a bump test about
         * an output the controller can hold).
         */
        @Test
        void a_form_whose_output_limits_leave_out_50_percent_is_tested_about_their_middle() throws IOException {
            Path form = Files.writeString(dir.resolve("high.yaml"), """
                    id: ideal-high-output
                    title: Ideal PID with its output limited to 60..100 % (invented)
                    structure: ideal
                    gain: {as: gain, basis: percent, sign: signed}
                    integral: {as: time, unit: s, off: 0}
                    derivative: {as: time, unit: s}
                    filter: {kind: ratio, ratio: 10, placement: derivative}
                    algorithm: {output: 60..100}
                    """);
            CliRun run = check(loopFile(LOOP.replace("form: ideal-pb-repeats", "form: " + form)));

            assertThat(run.exitCode()).as(run.err()).isIn(0, 1);
            assertThat(run.err()).doesNotContain("internal error");
            assertThat(run.out()).contains("about 50 % PV and 80 % output");
        }

        /** Without dead time a first-order loop under PI never reaches -180 deg: no phase crossover, no gain margin. */
        @Test
        void a_missing_figure_as_json_null() throws IOException {
            Path file = loopFile("""
                    tag: FIC-8
                    process: {model: fopdt, gain: 1.0, time_constant: 10 s}
                    tuning: {form: ideal, kc: 2, ti: 10, td: 0}
                    target: {form: ideal, scan: 0.1 s}
                    """);
            JsonNode json = JSON.readTree(check(file, "--format", "json").out());

            assertThat(json.get("design").has("gain_margin")).isTrue();
            assertThat(json.get("design").get("gain_margin").isNull()).isTrue();
            assertThat(json.get("design").get("phase_margin_deg").isNumber()).isTrue();
        }

        /** The design phase margin is the numpy/scipy reference's (check-golden.csv, 1e-4 deg as in LoopCheckGoldenTest). */
        @Test
        void design_and_target_figures_the_reference_agrees_with() throws Exception {
            Path file = Path.of(CheckCommandTest.class.getResource("/org/loopform/audit/golden-fopdt-pi-fractional.yaml")
                    .toURI());
            JsonNode json = JSON.readTree(check(file, "--format", "json").out());

            String[] design = goldenRow("golden-fopdt-pi-fractional.yaml", "design");
            String[] target = goldenRow("golden-fopdt-pi-fractional.yaml", "target");
            assertThat(json.get("design").get("phase_margin_deg").asDouble())
                    .isCloseTo(Double.parseDouble(design[4]), within(1e-4));
            assertThat(json.get("target").get("phase_margin_deg").asDouble())
                    .isCloseTo(Double.parseDouble(target[4]), within(1e-4));
        }

        @Test
        void exit_code_1_when_a_finding_fails() throws IOException {
            // h wc = 40 s x 0.038 rad/s = 1.5 rad, beyond the sampling rule's 1 rad (policy default)
            CliRun run = check(loopFile(LOOP), "--scan", "40s", "--format", "json");

            assertThat(run.exitCode()).isEqualTo(1);
            assertThat(JSON.readTree(run.out()).get("verdict").asText()).isEqualTo("fail");
        }

        @Test
        void no_process_model_gives_null_loops_and_a_controller_mismatch() throws IOException {
            Path file = loopFile(LOOP.replace("process: {model: fopdt, gain: 2.0, time_constant: 60 s, dead_time: 10 s}\n",
                    ""));
            CliRun run = check(file, "--format", "json");

            assertThat(run.exitCode()).as(run.err()).isEqualTo(0);
            JsonNode json = JSON.readTree(run.out());
            assertThat(json.get("design").isNull()).isTrue();
            assertThat(json.get("target").isNull()).isTrue();
            assertThat(json.get("controller_mismatch").get("gain_db").isNumber()).isTrue();
        }

        // ti 0.2 min/repeat typed as 0.2 into a form in seconds: 0.2 s at a 0.5 s scan, h / Ti = 2.5.
        // Without a process the conversion alone would pass; the integral shorter than a scan warns
        // (common practice: an integral time of several scans at least).
        @Test
        void without_a_model_an_integral_shorter_than_the_scan_is_not_a_pass() throws IOException {
            Path file = loopFile(LOOP.replace("process: {model: fopdt, gain: 2.0, time_constant: 60 s, dead_time: 10 s}\n",
                    "").replace("ti: 60", "ti: 0.2"));
            CliRun run = check(file, "--format", "json");

            assertThat(run.exitCode()).as(run.err()).isEqualTo(0);
            JsonNode json = JSON.readTree(run.out());
            assertThat(json.get("verdict").asText()).isEqualTo("warn");
            assertThat(json.get("findings").toString()).contains("h / Ti = 2.5");
            assertThat(check(file).out()).contains("verdict: WARN (no process model: stability not checked)");
        }
    }

    @Nested
    @DisplayName("--plot")
    class Plot {

        @Test
        void writes_a_well_formed_svg() throws Exception {
            Path svg = dir.resolve("tic-7.svg");
            CliRun run = check(loopFile(LOOP), "--plot", svg);

            assertThat(run.exitCode()).as(run.err()).isEqualTo(0);
            assertThat(run.out()).contains("Plot written to " + svg);
            DocumentBuilderFactory factory = DocumentBuilderFactory.newInstance();
            factory.setNamespaceAware(true);
            Document doc = factory.newDocumentBuilder().parse(svg.toFile());
            assertThat(doc.getDocumentElement().getLocalName()).isEqualTo("svg");
            assertThat(doc.getDocumentElement().getNamespaceURI()).isEqualTo("http://www.w3.org/2000/svg");
            assertThat(doc.getElementsByTagNameNS("*", "title").getLength()).isPositive();
        }

        @Test
        void leaves_json_on_stdout_alone() throws IOException {
            CliRun run = check(loopFile(LOOP), "--plot", dir.resolve("p.svg"), "--format", "json");

            assertThat(JSON.readTree(run.out()).get("tag").asText()).isEqualTo("TIC-7");
            assertThat(dir.resolve("p.svg")).exists();
        }

        @Test
        void refuses_to_overwrite_the_loop_file() throws IOException {
            Path file = loopFile(LOOP);
            CliRun run = check(file, "--plot", file);

            assertThat(run.exitCode()).isEqualTo(2);
            assertThat(run.out()).isEmpty();
            assertThat(run.err()).contains("input file");
            assertThat(Files.readString(file)).isEqualTo(LOOP);
        }
    }

    @Nested
    @DisplayName("rejects a bad loop file with exit 2, its line and field, and nothing on stdout")
    class BadLoopFile {

        /**
         * A form named by a relative path is read from the loop file's folder only: a file of that name
         * reached from the current folder (the tests run in the project folder, where
         * examples/plant-k7-target.yaml exists) is refused with the path to write instead (common
         * practice: paths in a file are relative to that file, so it means the same wherever it is run).
         */
        @Test
        void a_form_path_is_read_from_the_loop_files_folder_never_from_the_current_folder() throws IOException {
            Path sub = Files.createDirectories(dir.resolve("sub"));
            Path loop = Files.writeString(sub.resolve("loop.yaml"),
                    LOOP.replace("form: ideal-pb-repeats", "form: examples/plant-k7-target.yaml"));
            CliRun run = check(loop);
            assertThat(run.exitCode()).isEqualTo(2);
            assertThat(run.err()).contains("loop.yaml:4: target.form:", "is not in " + sub.toAbsolutePath().normalize(),
                    "not from the current folder");
            assertThat(run.out()).isEmpty();

            Files.copy(Path.of("examples/plant-k7-target.yaml"), dir.resolve("k7.yaml"));
            CliRun beside = check(Files.writeString(sub.resolve("loop2.yaml"),
                    LOOP.replace("form: ideal-pb-repeats", "form: ../k7.yaml")));
            assertThat(beside.exitCode()).as(beside.err()).isIn(0, 1);
            assertThat(beside.out()).contains("TIC-7: ideal -> plant-k7-target");
        }

        /** Each row: what to replace in LOOP, its replacement, the line and the field the message must name. */
        @ParameterizedTest(name = "{4}")
        @CsvSource(delimiter = '|', textBlock = """
                tag: TIC-7\\n                     |                                   | 1 | tag                    | missing tag
                ranges:                          | colour: red\\nranges:              | 5 | colour                 | unknown key
                model: fopdt                     | model: fopdtx                      | 2 | process.model          | unknown model
                gain: 2.0,                       |                                    | 2 | process.gain           | missing gain
                time_constant: 60 s              | time_constant: 60 fortnights       | 2 | process.time_constant  | bad time unit
                form: ideal-pb-repeats           | form: ideal-pb-repeat              | 4 | target.form            | unknown form id
                ', scan: 0.5 s'                  |                                    | 1 | target.scan            | missing target scan
                pv: 0..150                       | pv: 150..0                         | 5 | ranges.pv              | bad range
                n: 10                            | n: 10, zz: 3                       | 3 | tuning.zz              | unknown parameter
                kc: 1.2                          | kc: twelve                         | 3 | tuning.kc              | bad tuning value
                ti: 60                           | ti: -60                            | 3 | tuning.ti              | negative integral time
                'target: {'                      | 'target: ['                        | 4 | not valid YAML         | malformed YAML
                """)
        void names_file_line_and_field(String find, String replace, int line, String field, String caseName)
                throws IOException {
            String text = LOOP.replace(find.replace("\\n", "\n"), replace == null ? "" : replace.replace("\\n", "\n"));
            assertThat(text).as("the case edits the loop").isNotEqualTo(LOOP);
            CliRun run = check(loopFile(text));

            assertThat(run.exitCode()).as(run.err()).isEqualTo(2);
            assertThat(run.out()).isEmpty();
            assertThat(run.err()).contains("loop.yaml:" + line + ": ").contains(field);
            assertThat(run.err()).doesNotContain("\tat org.loopform");
        }

        @Test
        void a_bad_sweep_range() throws IOException {
            CliRun run = check(loopFile(LOOP), "--sweep-scan", "5s..1s");

            assertThat(run.exitCode()).isEqualTo(2);
            assertThat(run.out()).isEmpty();
            assertThat(run.err()).contains("--sweep-scan").contains("5s..1s");
        }
    }

    private static String[] goldenRow(String file, String which) throws IOException {
        try (BufferedReader in = new BufferedReader(new InputStreamReader(
                CheckCommandTest.class.getResourceAsStream("/org/loopform/audit/check-golden.csv"),
                StandardCharsets.UTF_8))) {
            return in.lines().map(l -> l.split(",", -1)).filter(f -> f[0].equals(file) && f[1].equals(which))
                    .findFirst().orElseThrow();
        }
    }
}

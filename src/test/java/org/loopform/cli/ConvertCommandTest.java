package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import java.util.TreeSet;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * {@code loopform convert} as a user meets it, through {@link Main#run}. The few expected numbers
 * are unit relations worked by hand (common practice): PB = 100 / Kc in percent, reset = 1 / Ti in
 * repeats per unit time, 1 min = 60 s. Everything else here is plumbing and needs no source.
 */
class ConvertCommandTest {

    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Set<String> KEYS = Set.of("from", "to", "exact", "parameters", "units", "entered",
            "deviation", "findings", "loop_deviation", "assumptions");
    private static final double TOL = 1e-9;

    @TempDir
    Path dir;

    private static CliRun convert(String... args) {
        String[] all = new String[args.length + 1];
        all[0] = "convert";
        System.arraycopy(args, 0, all, 1, args.length);
        return CliRun.of(all);
    }

    private Path form(String name, String limits) throws Exception {
        Path p = dir.resolve(name + ".yaml");
        Files.writeString(p, """
                id: %s
                title: A made-up ideal target with limits, seconds
                structure: ideal
                integral: {as: time, unit: s, off: 0}
                derivative: {as: time, unit: s}
                limits: %s
                """.formatted(name, limits));
        return p;
    }

    private static Set<String> keys(JsonNode n) {
        Set<String> k = new TreeSet<>();
        n.fieldNames().forEachRemaining(k::add);
        return k;
    }

    @Nested
    @DisplayName("a good conversion")
    class Good {

        @Test
        void text_output_gives_values_with_their_units() {
            CliRun r = convert("--from", "ideal", "--to", "ideal-pb-repeats", "kc=1.25", "ti=60", "td=6");
            assertThat(r.exitCode()).isZero();
            assertThat(r.err()).isEmpty();
            assertThat(r.out()).contains("From ideal").contains("To   ideal-pb-repeats")
                    .contains("%/%").contains("s/repeat").contains("repeats/min").contains("min")
                    .contains("Exact");
            // by hand: PB = 100 / 1.25 = 80 %; reset = 1 / (60 s) = 1 repeat/min; td = 6 s = 0.1 min
            assertThat(r.out().lines().filter(l -> l.trim().startsWith("pb ")).findFirst())
                    .hasValueSatisfying(l -> assertThat(l).contains("80").contains("%"));
            assertThat(r.out().lines().filter(l -> l.trim().startsWith("reset ")).findFirst())
                    .hasValueSatisfying(l -> assertThat(l).contains("1").contains("repeats/min"));
        }

        @Test
        void json_has_exactly_the_contract_keys_for_a_signed_target() throws Exception {
            CliRun r = convert("--from", "ideal-min", "--to", "ideal", "kc=2", "ti=1.5", "td=0.25",
                    "--format", "json");
            assertThat(r.exitCode()).isZero();
            JsonNode n = JSON.readTree(r.out());
            assertThat(keys(n)).containsExactlyInAnyOrderElementsOf(KEYS);
            assertThat(n.get("from").asText()).isEqualTo("ideal-min");
            assertThat(n.get("exact").asBoolean()).isTrue();
            // by hand: 1.5 min = 90 s, 0.25 min = 15 s; the gain is unchanged between ideal forms
            assertThat(n.get("parameters").get("kc").asDouble()).isCloseTo(2.0, within(TOL));
            assertThat(n.get("parameters").get("ti").asDouble()).isCloseTo(90.0, within(TOL));
            assertThat(n.get("parameters").get("td").asDouble()).isCloseTo(15.0, within(TOL));
            assertThat(n.get("units").get("ti").asText()).isEqualTo("s/repeat");
            assertThat(keys(n.get("deviation"))).containsExactlyInAnyOrder("gain_db", "phase_deg");
            assertThat(n.get("findings").isArray()).isTrue();
        }

        @Test
        void json_adds_action_for_a_target_with_an_action_flag() throws Exception {
            CliRun r = convert("--from", "ideal", "--to", "ideal-pb-repeats", "kc=-1.25", "ti=60", "td=6",
                    "--format", "json");
            assertThat(r.exitCode()).isZero();
            JsonNode n = JSON.readTree(r.out());
            Set<String> expected = new TreeSet<>(KEYS);
            expected.add("action");
            assertThat(keys(n)).isEqualTo(expected);
            // a negative signed gain is direct action; by hand PB = 100 / 1.25 = 80 %
            assertThat(n.get("action").asText()).isEqualTo("direct");
            assertThat(n.get("parameters").get("pb").asDouble()).isCloseTo(80.0, within(TOL));
            assertThat(n.get("units").get("pb").asText()).isEqualTo("%");
        }

        @Test
        void a_value_may_carry_its_own_unit() throws Exception {
            CliRun r = convert("--from", "ideal", "--to", "ideal-min", "kc=1", "ti=2min", "td=0.5min",
                    "--format", "json");
            assertThat(r.exitCode()).isZero();
            JsonNode p = JSON.readTree(r.out()).get("parameters");
            // by hand: 2 min written in a seconds form is still 2 min in a minutes form
            assertThat(p.get("ti").asDouble()).isCloseTo(2.0, within(TOL));
            assertThat(p.get("td").asDouble()).isCloseTo(0.5, within(TOL));
        }
    }

    @Nested
    @DisplayName("limits and resolution of the target")
    class LimitsAndResolution {

        @Test
        void a_value_beyond_the_targets_limits_is_a_failing_limits_finding_with_exit_1() throws Exception {
            Path target = form("made-up-limited", "{kc: {max: 5}}");
            CliRun r = convert("--from", "ideal", "--to", target.toString(), "kc=8", "ti=60", "td=0",
                    "--format", "json");
            assertThat(r.exitCode()).isEqualTo(1);
            JsonNode findings = JSON.readTree(r.out()).get("findings");
            List<JsonNode> limits = new ArrayList<>();
            findings.forEach(f -> {
                if (f.get("topic").asText().equals("limits")) {
                    limits.add(f);
                }
            });
            assertThat(limits).singleElement().satisfies(f -> {
                assertThat(f.get("severity").asText()).isEqualTo("fail");
                assertThat(f.get("figure").asDouble()).isCloseTo(8.0, within(TOL));
                assertThat(f.get("threshold").asDouble()).isCloseTo(5.0, within(TOL));
                assertThat(f.get("message").asText()).contains("kc");
            });
        }

        @Test
        void a_value_within_the_limits_passes() throws Exception {
            Path target = form("made-up-limited", "{kc: {max: 5}}");
            CliRun r = convert("--from", "ideal", "--to", target.toString(), "kc=4", "ti=60", "td=0");
            assertThat(r.exitCode()).isZero();
        }

        @Test
        void entered_values_are_rounded_to_the_targets_resolution() throws Exception {
            Path target = form("made-up-coarse", "{kc: {resolution: 0.1}, ti: {resolution: 1}}");
            CliRun r = convert("--from", "ideal-min", "--to", target.toString(), "kc=1.234", "ti=1.26", "td=0",
                    "--format", "json");
            JsonNode n = JSON.readTree(r.out());
            // by hand: ti = 1.26 min = 75.6 s, stored as 76 s at a 1 s step; kc 1.234 stored as 1.2
            assertThat(n.get("parameters").get("ti").asDouble()).isCloseTo(75.6, within(1e-9));
            assertThat(n.get("entered").get("ti").asDouble()).isEqualTo(76.0);
            assertThat(n.get("parameters").get("kc").asDouble()).isCloseTo(1.234, within(TOL));
            assertThat(n.get("entered").get("kc").asDouble()).isCloseTo(1.2, within(1e-12));
        }
    }

    @Nested
    @DisplayName("bad input exits 2 with a clear message and nothing on stdout")
    class BadInput {

        // plumbing: no published source needed
        @ParameterizedTest(name = "{0}")
        @CsvSource(delimiter = '|', textBlock = """
                unknown source form    | --from nope --to ideal kc=1 ti=60 td=0                  | unknown form 'nope'
                unknown target form    | --from ideal --to nope kc=1 ti=60 td=0                  | ideal-pb-repeats
                unknown parameter      | --from ideal --to ideal kc=1 ti=60 td=0 zz=3            | it expects kc (%/%), ti (s/repeat), td (s)
                missing parameter      | --from ideal --to ideal kc=1 ti=60                      | missing parameter 'td'
                unknown unit           | --from ideal --to ideal kc=1 ti=60furlong td=0          | unknown unit 'furlong'
                malformed pair         | --from ideal --to ideal kc1 ti=60 td=0                  | NAME=VALUE
                empty value            | --from ideal --to ideal kc= ti=60 td=0                  | NAME=VALUE
                duplicate name         | --from ideal --to ideal kc=1 KC=2 ti=60 td=0            | kc: given twice
                no ranges              | --from ideal --to parallel-eu kc=1 ti=60 td=0           | --pv-range and --out-range
                no output range        | --from ideal --to parallel-eu kc=1 ti=60 td=0 --pv-range 0..150 | give --out-range
                no pv range            | --from parallel-eu --to ideal kp=1 ki=0 kd=0 --out-range 0..100 | give --pv-range
                no scan                | --from ideal --to parallel-scan kc=1 ti=60 td=0         | --scan
                bad range text         | --from ideal --to parallel-eu kc=1 ti=60 td=0 --pv-range 0-150 --out-range 0..100 | LOW..HIGH
                reversed range         | --from ideal --to parallel-eu kc=1 ti=60 td=0 --pv-range 150..0 --out-range 0..100 | high > low
                negative band          | --from ideal-pb-repeats --to ideal pb=-40 reset=1 td=0  | must be > 0 %
                zero band              | --from ideal-pb-repeats --to ideal pb=0 reset=1 td=0    | must be > 0 %
                action on signed form  | --from ideal --to ideal kc=1 ti=60 td=0 action=direct   | sign the gain
                bad action word        | --from ideal-pb-repeats --to ideal pb=50 reset=1 td=0 action=sideways | reverse or direct
                negative ti            | --from ideal --to ideal kc=1 ti=-60 td=0                | must be >= 0
                zero scan              | --from ideal --to parallel-scan kc=1 ti=60 td=0 --scan 0 | must be > 0
                bad format             | --from ideal --to ideal kc=1 ti=60 td=0 --format xml    | text, json
                no values              | --from ideal --to ideal                                 | NAME=VALUE
                """)
        void exits_2(String what, String args, String message) {
            CliRun r = convert(args.trim().split("\\s+"));
            assertThat(r.exitCode()).as(what).isEqualTo(2);
            assertThat(r.out()).as(what).isEmpty();
            assertThat(r.err()).as(what).contains(message).doesNotContain("Exception").doesNotContain("\tat ");
        }

        // plumbing: no published source needed
        @Test
        void an_unknown_form_lists_every_catalog_id() {
            CliRun r = convert("--to", "nope", "--from", "ideal", "kc=1", "ti=60", "td=0");
            assertThat(r.err()).contains("--to").contains("ideal, ideal-2dof").contains("series-pv-derivative");
        }
    }

    @Nested
    @DisplayName("help and version")
    class HelpAndVersion {

        // plumbing: no published source needed
        @ParameterizedTest
        @CsvSource({"--help", "--version", "convert --help", "forms --help"})
        void exit_0_and_print_on_stdout(String args) {
            CliRun r = CliRun.of(args.split(" "));
            assertThat(r.exitCode()).isZero();
            assertThat(r.out()).isNotBlank();
            assertThat(r.err()).isEmpty();
        }

        // plumbing: no published source needed
        @Test
        void convert_help_formats_cleanly_with_a_percent_sign_in_its_text() {
            java.io.PrintStream saved = System.err;
            java.io.ByteArrayOutputStream warnings = new java.io.ByteArrayOutputStream();
            CliRun r;
            try {
                // picocli reports a help text it cannot format on the process's stderr
                System.setErr(new java.io.PrintStream(warnings, true));
                r = CliRun.of("convert", "--help");
            } finally {
                System.setErr(saved);
            }
            assertThat(warnings.toString()).doesNotContain("Could not format");
            assertThat(r.out()).contains("pb=40%.");
        }

        @Test
        void version_names_loopform() {
            assertThat(CliRun.of("--version").out()).contains("loopform");
        }
    }
}

// source: plumbing (the README's and examples/README.md's commands run as written); record values from examples/records/generate.py (numpy, independent of loopform)
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;

/**
 * The commands the README and {@code examples/README.md} show run as written, from the repository root, and
 * the invented example records say what {@code examples/records/generate.py} built into them.
 */
class ExamplesTest {

    /** Options whose value is a file or folder the command writes (removed again after the run). */
    private static final Set<String> OUTPUT_OPTIONS = Set.of("--write-process", "--plot", "--out");

    /** {@code ./loopform ...} lines inside the fenced code blocks of {@code file}, in document order. */
    static List<String> commands(Path file) throws IOException {
        List<String> found = new ArrayList<>();
        boolean fenced = false;
        for (String line : Files.readAllLines(file, StandardCharsets.UTF_8)) {
            if (line.startsWith("```")) {
                fenced = !fenced;
            } else if (fenced && line.startsWith("./loopform ")) {
                found.add(line.substring("./loopform ".length()).trim());
            }
        }
        return found;
    }

    /** Splits a command line as a POSIX shell would for these commands: blanks, and double or single quotes. */
    static List<String> words(String line) {
        List<String> out = new ArrayList<>();
        StringBuilder w = new StringBuilder();
        char quote = 0;
        boolean inWord = false;
        for (char c : line.toCharArray()) {
            if (quote != 0) {
                if (c == quote) {
                    quote = 0;
                } else {
                    w.append(c);
                }
            } else if (c == '"' || c == '\'') {
                quote = c;
                inWord = true;
            } else if (Character.isWhitespace(c)) {
                if (inWord) {
                    out.add(w.toString());
                    w.setLength(0);
                    inWord = false;
                }
            } else {
                w.append(c);
                inWord = true;
            }
        }
        if (inWord) {
            out.add(w.toString());
        }
        return out;
    }

    @Test
    @DisplayName("every ./loopform command shown in README.md and examples/README.md runs as written (exit 0 or 1)")
    void documented_commands_run_as_written() throws IOException {
        List<String> lines = new ArrayList<>(commands(Path.of("README.md")));
        List<String> examples = commands(Path.of("examples", "README.md"));
        assertThat(examples).as("examples/README.md's commands, the audit of its loop list among them")
                .anyMatch(l -> l.startsWith("audit examples/plant-k7-loops.csv"));
        lines.addAll(examples);
        // the demo writes ./loopform-demo and is run by AuditCommandTest into a temporary folder
        lines.removeIf(l -> l.equals("demo"));
        assertThat(lines).as("commands found in the READMEs").hasSizeGreaterThanOrEqualTo(6);
        List<Path> written = new ArrayList<>();
        try {
            for (String line : lines) {
                List<String> args = words(line);
                for (int k = 0; k + 1 < args.size(); k++) {
                    if (OUTPUT_OPTIONS.contains(args.get(k))) {
                        Path p = Path.of(args.get(k + 1));
                        assertThat(p).as("'" + line + "' would write " + p + ", which exists: remove it").doesNotExist();
                        written.add(p);
                    }
                }
                CliRun r = CliRun.of(args.toArray(String[]::new));
                assertThat(r.exitCode()).as(line + "\n" + r.err()).isIn(0, 1);
                assertThat(r.err()).as(line).doesNotContain("Exception");
            }
        } finally {
            for (Path p : written) {
                if (Files.isDirectory(p)) {
                    try (var s = Files.list(p)) {
                        for (Path f : s.toList()) {
                            Files.delete(f);
                        }
                    }
                }
                Files.deleteIfExists(p);
            }
        }
    }

    @Test
    void the_shell_splitting_keeps_quoted_mappings_whole() {
        // plumbing: the tokenizer the test above relies on
        assertThat(words("tune --process \"{model: fopdt, gain: 1}\" --rule simc"))
                .containsExactly("tune", "--process", "{model: fopdt, gain: 1}", "--rule", "simc");
    }

    @Nested
    @DisplayName("the invented records hold what their generator put in")
    class Records {

        private JsonNode json(int exit, String... args) throws IOException {
            CliRun r = CliRun.of(args);
            assertThat(r.exitCode()).as(r.err()).isEqualTo(exit);
            return new ObjectMapper().readTree(r.out());
        }

        @Test
        @DisplayName("the TIC-104 bump test (K = 2 %/%, T = 60 s, L = 10 s by generate.py) fits FOPDT close to them, inside its intervals")
        void bump_test_recovers_the_generating_model() throws IOException {
            JsonNode n = json(0, "fit", "examples/records/tic-104-bump.csv", "--pv-range", "0..150", "--out-range",
                    "0..100", "--format", "json");
            assertThat(n.get("recommended").asText()).isEqualTo("fopdt");
            JsonNode fopdt = n.get("models").get(0);
            assertThat(fopdt.get("model").asText()).isEqualTo("fopdt");
            JsonNode p = fopdt.get("parameters");
            assertThat(p.get("gain").asDouble()).isCloseTo(2, org.assertj.core.data.Percentage.withPercentage(1));
            assertThat(p.get("time_constant_s").asDouble()).isCloseTo(60, org.assertj.core.data.Percentage.withPercentage(2));
            assertThat(p.get("dead_time_s").asDouble()).isCloseTo(10, org.assertj.core.data.Percentage.withPercentage(5));
            double[] truth = {2, 60, 10};
            String[] keys = {"gain", "time_constant_s", "dead_time_s"};
            for (int k = 0; k < keys.length; k++) {
                assertThat(truth[k]).as(keys[k]).isBetween(fopdt.get("low").get(keys[k]).asDouble(),
                        fopdt.get("high").get(keys[k]).asDouble());
            }
        }

        @Test
        @DisplayName("the TIC-104 relay test gives a period near the true ultimate period and a Ku below the true one")
        void relay_test_is_near_the_ultimate_cycle() throws IOException {
            // true ultimate cycle of 2 e^(-10 s)/(60 s + 1): atan(60 w) + 10 w = pi -> w = 0.16703 rad/s,
            // Tu = 37.62 s, Ku = sqrt(1 + (60 w)^2)/2 = 5.036 (hand derivation, solved with scipy's brentq);
            // the relay's describing function reads a lower Ku on a lag-dominant process, whose PV is nearly a
            // triangle (Astrom & Hagglund 1984 state the approximation), and the hysteresis lengthens the period
            JsonNode n = json(0, "fit", "examples/records/tic-104-relay.csv", "--relay", "--pv-range", "0..150",
                    "--out-range", "0..100", "--format", "json");
            assertThat(n.get("tu_s").asDouble()).isBetween(37.62, 37.62 * 1.2);
            assertThat(n.get("ku").asDouble()).isBetween(0.6 * 5.036, 5.036);
        }

        @Test
        @DisplayName("replay refutes FIC-105's listed reset, explains it as seconds for minutes, and confirms the others")
        void replay_finds_the_reset_typed_in_the_wrong_unit() throws IOException {
            JsonNode n = json(1, "replay", "examples/records/replay", "--list", "examples/records/replay-loops.csv",
                    "--to", "examples/plant-k7-target.yaml", "--format", "json");
            JsonNode loops = n.get("loops");
            assertThat(loops).hasSize(3);
            assertThat(loops.get(0).get("tag").asText()).isEqualTo("FIC-105");
            assertThat(loops.get(0).get("as_found_verdict").asText()).isEqualTo("refuted");
            JsonNode best = loops.get(0).get("explanations").get(0);
            assertThat(best.get("kind").asText()).isEqualTo("units");
            assertThat(best.get("description").asText()).isEqualTo("ti is 15 s, not min");
            // the log is rounded to 4 decimals: the true controller reproduces it to well under 0.01 % of span
            assertThat(best.get("agreement").get("rms_pct").asDouble()).isLessThan(0.01);
            assertThat(loops.get(1).get("as_found_verdict").asText()).isEqualTo("reproduced");
            assertThat(loops.get(2).get("as_found_verdict").asText()).isEqualTo("reproduced");
        }
    }
}

// source: GNU Octave control package 3.4.0 (margin, pole, isstable, feedback, c2d 'zoh') on Octave 7.3.0, golden written by src/test/octave/write_octave_golden.m
package org.loopform.audit;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;
import static org.assertj.core.data.Percentage.withPercentage;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.net.URISyntaxException;
import java.net.URL;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.loopform.cli.Main;

/**
 * The target (sampled) loop of every invented loop under {@code src/test/resources/octave/loops/}
 * through {@code loopform check FILE --format json}, against a second general-purpose reference:
 * GNU Octave's control package, in {@code octave/golden.csv}. Regenerate both with
 * {@code octave --no-gui --quiet src/test/octave/write_octave_golden.m} from the repository root
 * (Debian packages {@code octave} and {@code octave-control}); the test itself needs no Octave.
 *
 * <p>Each loop's dead time is a whole number of scans, so the package's {@code c2d(P, h, 'zoh')}
 * times {@code z^-d} is the exact sampled process; the target's backward-difference ideal PID is
 * written out in the script (Wittenmark, Astrom and Arzen, "Computer Control: An Overview", IFAC
 * Professional Brief, 2002, Table 3). The script computes with Octave's own functions:
 * <ul>
 *   <li>{@code stability} and {@code largest_pole_magnitude}: {@code pole(feedback(L, 1))} and
 *       {@code isstable} - compared exactly and to {@link #POLE_RELATIVE};</li>
 *   <li>{@code margin(L)}: gain margin, phase margin and their frequencies ({@code octave_*}
 *       columns).</li>
 * </ul>
 * The package's {@code margin} follows a definition that is not loopform's in places (it returns
 * the lower gain margin when none lies above 1, writes a negative phase margin as 180 + arg L in
 * (0, 360] deg, takes the smallest signed phase margin over several crossovers, returns 180 deg with
 * no gain crossover, and loses unit-circle roots near z = 1 and, at times, z = -1). So the script
 * also writes the exact definitions (after Astrom and Murray, Feedback Systems, 2008, section 9.3;
 * Astrom and Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 7 - from memory for the
 * sections) on the frequency response of the same Octave transfer function, and says per row in
 * {@code gm_definition} / {@code pm_definition} which one applies: {@code margin} (loopform must
 * equal Octave's margin), {@code margin-360} (equal to Octave's phase margin less 360 deg) or
 * {@code exact} (the exact column, the reason in {@code note}). loopform is never bent to the
 * library's definition.
 */
@DisplayName("loopform's sampled-loop stability and margins agree with GNU Octave's control package")
class OctaveCrossCheckTest {

    /**
     * Octave's margin() takes its crossings from roots() unpolished: about 4e-8 relative here, 8e-7 on the
     * crossover of resonance-02, whose two gain crossovers lie 1.6 % apart (the exact column agrees with
     * loopform there to 5e-10).
     */
    private static final double MARGIN_RELATIVE = 1e-6;
    /** The exact columns are refined by fzero to about 1e-9 relative; loopform states 1e-6 on crossings. */
    private static final double EXACT_RELATIVE = 1e-6;
    /** Eigenvalues of a well-separated closed-loop polynomial of degree at most 25: about 1e-12. */
    private static final double POLE_RELATIVE = 1e-8;
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final String ROOT = "/octave/";

    /** One golden row ("" where the quantity does not exist). */
    record Row(String file, String klass, Map<String, String> cells) {
        String get(String key) {
            String value = cells.get(key);
            assertThat(value).as("%s: golden column %s", file, key).isNotNull();
            return value;
        }

        @Override
        public String toString() {
            return file + " (" + klass + ")";
        }
    }

    static List<Row> rows() {
        try (InputStream in = OctaveCrossCheckTest.class.getResourceAsStream(ROOT + "golden.csv")) {
            assertThat(in).as("octave/golden.csv").isNotNull();
            BufferedReader reader = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8));
            String[] header = reader.readLine().split(",", -1);
            List<Row> rows = new ArrayList<>();
            for (String line = reader.readLine(); line != null; line = reader.readLine()) {
                if (line.isBlank()) {
                    continue;
                }
                // the last column, the note, is quoted and may hold commas
                String[] cells = line.split(",", header.length);
                assertThat(cells).as("golden line %s", line).hasSize(header.length);
                Map<String, String> map = new LinkedHashMap<>();
                for (int k = 0; k < header.length; k++) {
                    map.put(header[k], cells[k].replaceAll("^\"|\"$", ""));
                }
                rows.add(new Row(cells[0], cells[1], map));
            }
            return rows;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    @Test
    void the_golden_file_holds_every_kind_of_loop_the_check_is_for() {
        List<Row> rows = rows();
        assertThat(rows).hasSizeBetween(20, 40);
        assertThat(rows.stream().map(Row::klass).distinct()).contains("band-edge", "several-crossovers",
                "resonance", "integrator", "conditionally-stable", "unstable-sampled", "positive-feedback", "high-n");
        assertThat(rows).as("stable and unstable loops").anyMatch(r -> r.get("stability").equals("stable"))
                .anyMatch(r -> r.get("stability").equals("unstable"));
        assertThat(rows).as("a gain margin at the phase crossover z = -1")
                .anyMatch(r -> r.get("nyquist_phase_crossover").equals("1") && !r.get("gain_margin").isEmpty()
                        && Math.abs(Double.parseDouble(r.get("gain_margin_rad_s")) * scanSeconds(r) - Math.PI) < 1e-12);
        assertThat(rows).as("loops with several gain crossovers")
                .anyMatch(r -> Integer.parseInt(r.get("gain_crossovers")) >= 3);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("rows")
    void the_target_loop_agrees(Row row) throws Exception {
        JsonNode target = check(row).get("target");
        assertThat(target).as("%s: target figures", row).isNotNull();
        List<String> problems = new ArrayList<>();

        String stability = row.get("stability");
        if (!stability.equals(target.path("stability").asText())) {
            problems.add("stability: Octave isstable " + stability + ", loopform " + target.path("stability"));
        }
        compare(target, "largest_pole_magnitude", Double.parseDouble(row.get("largest_pole_magnitude")),
                POLE_RELATIVE, "Octave max |pole(feedback(L, 1))|", problems);

        // gain margin: Octave's margin() where its definition is loopform's, else the exact column
        if (row.get("gm_definition").equals("margin") && !row.get("octave_gain_margin").equals("Inf")) {
            compare(target, "gain_margin", Double.parseDouble(row.get("octave_gain_margin")), MARGIN_RELATIVE,
                    "Octave margin()", problems);
        } else {
            expect(target, "gain_margin", row.get("gain_margin"), EXACT_RELATIVE, problems);
        }
        expect(target, "lower_gain_margin", row.get("lower_gain_margin"), EXACT_RELATIVE, problems);

        // phase margin and its crossover
        switch (row.get("pm_definition")) {
            case "margin" -> {
                compare(target, "phase_margin_deg", Double.parseDouble(row.get("octave_phase_margin_deg")),
                        MARGIN_RELATIVE, "Octave margin()", problems);
                compare(target, "crossover_rad_s", Double.parseDouble(row.get("octave_crossover_rad_s")),
                        MARGIN_RELATIVE, "Octave margin()", problems);
            }
            case "margin-360" -> {
                compare(target, "phase_margin_deg", Double.parseDouble(row.get("octave_phase_margin_deg")) - 360,
                        MARGIN_RELATIVE, "Octave margin() - 360 deg", problems);
                compare(target, "crossover_rad_s", Double.parseDouble(row.get("octave_crossover_rad_s")),
                        MARGIN_RELATIVE, "Octave margin()", problems);
            }
            default -> {
                expect(target, "phase_margin_deg", row.get("phase_margin_deg"), EXACT_RELATIVE, problems);
                expect(target, "crossover_rad_s", row.get("crossover_rad_s"), EXACT_RELATIVE, problems);
            }
        }
        // delay_margin_s is not compared: the golden's column is PM / wc of the response, which is the
        // least extra dead time only for whole extra scans; loopform now gives the exact one, with the
        // process sampled again at fractional extra dead times, which the package's c2d cannot do (the
        // script's own note); numpy's closed-loop eigenvalues check it in StabilityCrossCheckTest,
        // CrossingGoldenTest, LoopCheckGoldenTest and check.SampledDelayMarginTest
        assertThat(problems).as("%s disagrees with Octave (%s)", row, row.get("note")).isEmpty();
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("rows")
    void where_octave_margin_applies_it_equals_the_exact_definition(Row row) {
        // the golden's two columns are independent computations in the script (margin()'s polynomial
        // roots, and sign changes of the frequency response refined by fzero); where the script says
        // margin() applies they must agree, or the golden itself is wrong
        // (1e-4 percent = 1e-6 relative, margin()'s own accuracy here)
        if (row.get("gm_definition").equals("margin") && !row.get("gain_margin").isEmpty()) {
            assertThat(Double.parseDouble(row.get("octave_gain_margin")))
                    .isCloseTo(Double.parseDouble(row.get("gain_margin")),
                            withPercentage(1e-4));
        }
        if (!row.get("pm_definition").equals("exact")) {
            double shift = row.get("pm_definition").equals("margin-360") ? 360 : 0;
            double exact = Double.parseDouble(row.get("phase_margin_deg"));
            assertThat(Double.parseDouble(row.get("octave_phase_margin_deg")) - shift)
                    .isCloseTo(exact, within(1e-6 * Math.max(Math.abs(exact), 1)));
        }
    }

    private static JsonNode check(Row row) throws IOException {
        Path file = resource("loops/" + row.file());
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(new String[] {"check", file.toString(), "--format", "json"}, new PrintWriter(out),
                new PrintWriter(err));
        assertThat(code).as("%s: exit code; stderr: %s", row, err).isIn(0, 1);
        assertThat(err.toString()).as("%s: stderr (a stack trace is a bug)", row).doesNotContain("Exception");
        return JSON.readTree(out.toString());
    }

    /** Compares a figure with the golden cell: "" means the quantity does not exist, so loopform's must be null. */
    private static void expect(JsonNode figures, String key, String cell, double relative, List<String> problems) {
        if (cell.isEmpty()) {
            JsonNode got = figures.get(key);
            if (got == null || !got.isNull()) {
                problems.add(key + ": does not exist (exact definition), loopform " + text(got));
            }
            return;
        }
        compare(figures, key, Double.parseDouble(cell), relative, "exact definition", problems);
    }

    private static void compare(JsonNode figures, String key, double want, double relative, String source,
                                List<String> problems) {
        JsonNode got = figures.get(key);
        if (got != null && got.isNull() && !key.equals("largest_pole_magnitude") && unstable(figures)) {
            return;
        }
        if (got == null || !got.isNumber()) {
            problems.add(key + ": " + source + " " + want + ", loopform " + text(got));
            return;
        }
        double have = got.asDouble();
        double scale = key.equals("phase_margin_deg") ? Math.max(Math.abs(want), 1.0) : Math.abs(want);
        if (!(Math.abs(have - want) <= relative * scale)) {
            problems.add(key + ": " + source + " " + want + ", loopform " + have + " (relative error "
                    + String.format("%.3g", Math.abs(have - want) / scale) + ")");
        }
    }

    /**
     * On a loop loopform finds unstable (the stability itself is compared first) its margins describe
     * no robustness and may be left null; a number it does give must still agree.
     */
    private static boolean unstable(JsonNode figures) {
        return figures.path("stability").asText().equals("unstable");
    }

    private static double scanSeconds(Row row) {
        // the loop file's target line, written by the script: "target: {form: ideal, scan: H s}"
        try {
            String text = Files.readString(resource("loops/" + row.file()));
            String scan = text.replaceAll("(?s).*scan: ([0-9.eE+-]+) s}.*", "$1");
            return Double.parseDouble(scan);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static String text(JsonNode n) {
        return n == null ? "missing" : n.isNull() ? "null" : n.asText();
    }

    private static Path resource(String name) {
        URL url = OctaveCrossCheckTest.class.getResource(ROOT + name);
        assertThat(url).as("test resource %s", ROOT + name).isNotNull();
        try {
            return Path.of(url.toURI());
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }
}

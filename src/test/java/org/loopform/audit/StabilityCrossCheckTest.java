package org.loopform.audit;

import static org.assertj.core.api.Assertions.assertThat;

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
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.loopform.cli.Main;

/**
 * Every invented loop under {@code src/test/resources/crosscheck/loops/} through {@code loopform
 * check FILE --format json}, against the independent numpy/scipy reference in
 * {@code crosscheck/golden.csv} (regenerate both with
 * {@code python3 src/test/python/write_stability_crosscheck.py} from the repository root; its
 * docstring gives the method and its accuracy).
 *
 * <p>Sources of the reference: the Nyquist criterion by the argument principle and the gain,
 * phase and delay margins and Ms after Astrom and Murray, Feedback Systems, 2008, ch. 9-10; the
 * sampled loop (zero-order hold with fractional dead time by state augmentation, closed-loop
 * poles of the pulse transfer functions, margins on the unit circle up to z = -1) after Astrom and
 * Wittenmark, Computer-Controlled Systems, 3rd ed., 1997 (from memory for the section numbers);
 * the target's backward-difference PID after Wittenmark, Astrom and Arzen, "Computer Control: An
 * Overview", IFAC Professional Brief, 2002, Table 3.
 *
 * <p>Per loop, for {@code design} and {@code target}:
 * <ul>
 *   <li>{@code stability} exactly ({@code stable}, {@code unstable} or {@code marginal});</li>
 *   <li>{@code target.largest_pole_magnitude} to {@link #RELATIVE};</li>
 *   <li>{@code gain_margin}, {@code lower_gain_margin}, {@code phase_margin_deg},
 *       {@code delay_margin_s} and {@code ms} to {@link #RELATIVE} where the reference has them (the
 *       target's delay margin, the least extra dead time from the eigenvalues, to
 *       {@link #SAMPLED_DELAY_MARGIN_RELATIVE})
 *       (the phase margin relative to max(|PM|, 1 deg)); {@code null} where the reference says
 *       the quantity does not exist (no phase crossover on that side of 1, no gain crossover).
 *       A key that is missing is a failure.</li>
 * </ul>
 * On a loop the reference finds unstable a {@code null} margin is accepted (its margins describe
 * no robustness; the verdict is carried by {@code stability}), but a number must still agree. On a
 * marginal loop only the stability is compared.
 */
@DisplayName("loopform check agrees with the independent stability and margin reference on every cross-check loop")
class StabilityCrossCheckTest {

    /** The reference is good to about 1e-10; loopform states 1e-6 relative on crossing frequencies. */
    private static final double RELATIVE = 1e-6;
    /**
     * A sampled loop's delay margin is where F(delta), the margin in scans of the loop sampled at dead
     * time L + delta (crossings good to 1e-6), reaches a whole number: a gentle slope of F in delta
     * widens that error (up to 2.3e-6 seen on these loops), so it gets ten times the room.
     */
    private static final double SAMPLED_DELAY_MARGIN_RELATIVE = 1e-5;
    /**
     * Above 3 scans loopform keeps the reading PM / wc (check.SampledDelayMargin.MAX_EXACT_SCANS): on these
     * loops every reading of 3 scans or more lay within 0.8 % of the reference's exact margin (from the
     * closed-loop eigenvalues), so it gets 1 %.
     */
    private static final double READ_DELAY_MARGIN_RELATIVE = 0.01;
    private static final double EXACT_DELAY_MARGIN_BELOW_SCANS = 3;
    private static final List<String> MARGINS = List.of("gain_margin", "lower_gain_margin", "phase_margin_deg",
            "delay_margin_s", "ms");
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final String ROOT = "/crosscheck/";

    /** One golden row: the reference figures of the design or the target loop ("" where none). */
    record Reference(String file, String klass, String loop, Map<String, String> figures) {
        String get(String key) {
            return figures.getOrDefault(key, "");
        }
    }

    /** Both rows of one loop file. */
    record Case(String file, String klass, Reference design, Reference target) {
        @Override
        public String toString() {
            return file + " (" + klass + ")";
        }
    }

    static Stream<Case> loops() {
        Map<String, Reference[]> byFile = new LinkedHashMap<>();
        for (Reference r : read()) {
            Reference[] pair = byFile.computeIfAbsent(r.file(), f -> new Reference[2]);
            pair["design".equals(r.loop()) ? 0 : 1] = r;
        }
        return byFile.values().stream().map(p -> new Case(p[0].file(), p[0].klass(), p[0], p[1]));
    }

    @Test
    void the_golden_file_holds_every_special_class() {
        List<Reference> rows = read();
        assertThat(rows).hasSizeGreaterThan(400);
        assertThat(rows.stream().map(Reference::klass).distinct()).contains("several-crossovers", "resonance",
                "integrator", "conditionally-stable", "band-edge", "unstable-sampled", "positive-feedback",
                "negative-gain-direct", "high-n", "marginal");
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("loops")
    void design_and_target_agree(Case c) throws Exception {
        Path file = resource("loops/" + c.file());
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(new String[] {"check", file.toString(), "--format", "json"}, new PrintWriter(out),
                new PrintWriter(err));
        assertThat(code).as("%s: exit code; stderr: %s", c, err).isIn(0, 1);
        assertThat(err.toString()).as("%s: stderr (a stack trace is a bug)", c).doesNotContain("Exception");
        JsonNode json = JSON.readTree(out.toString());
        List<String> problems = new ArrayList<>();
        compare(json.get("design"), c.design(), problems);
        compare(json.get("target"), c.target(), problems);
        assertThat(problems).as("%s disagrees with the reference", c).isEmpty();
    }

    private static void compare(JsonNode figures, Reference ref, List<String> problems) {
        String where = ref.loop() + ".";
        if (figures == null || figures.isNull()) {
            problems.add(where + ": missing");
            return;
        }
        String stability = ref.get("stability");
        JsonNode got = figures.get("stability");
        if (got == null || !stability.equals(got.asText())) {
            problems.add(where + "stability: reference " + stability + ", loopform " + text(got));
        }
        if (stability.equals("marginal")) {
            return;
        }
        if (ref.loop().equals("target")) {
            number(figures, "largest_pole_magnitude", ref.get("largest_pole_magnitude"), false, where, problems);
        }
        boolean unstable = stability.equals("unstable");
        for (String key : MARGINS) {
            number(figures, key, ref.get(key), unstable, where, problems);
        }
    }

    private static void number(JsonNode figures, String key, String expected, boolean nullAllowed, String where,
                               List<String> problems) {
        JsonNode got = figures.get(key);
        if (got == null) {
            problems.add(where + key + ": missing (reference " + (expected.isEmpty() ? "null" : expected) + ")");
            return;
        }
        if (expected.isEmpty()) {
            if (!got.isNull()) {
                problems.add(where + key + ": reference null (does not exist), loopform " + got.asText());
            }
            return;
        }
        double want = Double.parseDouble(expected);
        if (got.isNull() || !got.isNumber()) {
            if (!(nullAllowed && got.isNull())) {
                problems.add(where + key + ": reference " + want + ", loopform " + text(got));
            }
            return;
        }
        double have = got.asDouble();
        double scale = key.equals("phase_margin_deg") ? Math.max(Math.abs(want), 1.0) : Math.abs(want);
        JsonNode scans = figures.get("delay_margin_scans");
        boolean read = scans != null && scans.isNumber() && scans.asDouble() > EXACT_DELAY_MARGIN_BELOW_SCANS;
        double relative = where.startsWith("target") && key.equals("delay_margin_s")
                ? (read ? READ_DELAY_MARGIN_RELATIVE : SAMPLED_DELAY_MARGIN_RELATIVE) : RELATIVE;
        if (!(Math.abs(have - want) <= relative * scale)) {
            problems.add(where + key + ": reference " + want + ", loopform " + have + " (relative error "
                    + String.format("%.3g", Math.abs(have - want) / scale) + ")");
        }
    }

    private static String text(JsonNode n) {
        return n == null ? "missing" : n.isNull() ? "null" : n.asText();
    }

    private static Path resource(String name) {
        URL url = StabilityCrossCheckTest.class.getResource(ROOT + name);
        assertThat(url).as("test resource %s", ROOT + name).isNotNull();
        try {
            return Path.of(url.toURI());
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }

    private static List<Reference> read() {
        try (InputStream in = StabilityCrossCheckTest.class.getResourceAsStream(ROOT + "golden.csv")) {
            assertThat(in).as("crosscheck/golden.csv").isNotNull();
            BufferedReader reader = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8));
            String[] header = reader.readLine().split(",", -1);
            List<Reference> rows = new ArrayList<>();
            for (String line = reader.readLine(); line != null; line = reader.readLine()) {
                if (line.isBlank()) {
                    continue;
                }
                String[] cells = line.split(",", -1);
                Map<String, String> figures = new LinkedHashMap<>();
                for (int k = 3; k < header.length; k++) {
                    figures.put(header[k], cells[k]);
                }
                rows.add(new Reference(cells[0], cells[1], cells[2], figures));
            }
            return rows;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}

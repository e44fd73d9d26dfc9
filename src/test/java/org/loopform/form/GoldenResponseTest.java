package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.loopform.findings.ConversionRules;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.TestFactory;
import org.loopform.io.CatalogLoader;
import org.loopform.law.ControlLaw;
import org.loopform.units.Span;

/**
 * Source: scipy.signal.freqs as an independent reference library, on the textbook definitions.
 * Converted laws against an independent evaluation. The golden file holds frequency responses
 * of PID laws built by scipy.signal.freqs from each structure's textbook definition (Astrom &
 * Hagglund, PID Controllers: Theory, Design and Tuning, 2nd ed., ISA 1995, sec. 3.4), written by
 * {@code python3 src/test/python/write_conversion_golden.py}. Each case is converted into every
 * catalog form; where loopform says the conversion is exact, the target values, read back
 * through the target's units, must give the golden response to 1e-9 relative.
 */
class GoldenResponseTest {

    private static final double RELATIVE = 1e-9;
    private static final WritingContext CONTEXT = new WritingContext(new Span(0, 200), new Span(0, 100), 0.5);

    record Point(double omega, double re, double im) {
    }

    record Case(String id, String structure, double a, double b, double c, double n, List<Point> points) {
    }

    static List<Case> cases() throws IOException {
        Map<String, Case> byId = new LinkedHashMap<>();
        try (var in = GoldenResponseTest.class.getResourceAsStream("pid-frequency-response.csv");
             var r = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8))) {
            r.readLine();
            String line;
            while ((line = r.readLine()) != null) {
                String[] f = line.split(",");
                Case c = byId.computeIfAbsent(f[0], k -> new Case(f[0], f[1], Double.parseDouble(f[2]),
                        Double.parseDouble(f[3]), Double.parseDouble(f[4]), Double.parseDouble(f[5]),
                        new ArrayList<>()));
                c.points().add(new Point(Double.parseDouble(f[6]), Double.parseDouble(f[7]), Double.parseDouble(f[8])));
            }
        }
        return List.copyOf(byId.values());
    }

    private static Map<String, String> sourceValues(Case c) {
        Map<String, String> m = new LinkedHashMap<>();
        boolean parallel = c.structure().equals("parallel");
        m.put(parallel ? "kp" : "kc", Double.toString(c.a()));
        m.put(parallel ? "ki" : "ti", Double.toString(c.b()));
        m.put(parallel ? "kd" : "td", Double.toString(c.c()));
        m.put("n", Double.toString(c.n()));
        return m;
    }

    private static void assertMatches(ControlLaw law, Case c, String what) {
        double[] h = new double[2];
        for (Point p : c.points()) {
            law.feedbackAt(p.omega(), h);
            double err = Math.hypot(h[0] - p.re(), h[1] - p.im());
            double size = Math.hypot(p.re(), p.im());
            assertThat(err).as("%s at %s rad/s", what, p.omega()).isLessThanOrEqualTo(RELATIVE * size);
        }
    }

    @TestFactory
    Stream<DynamicTest> every_exact_conversion_keeps_the_golden_response() throws IOException {
        List<DynamicTest> tests = new ArrayList<>();
        for (Case c : cases()) {
            FormDefinition source = CatalogLoader.bundled().find(c.structure()).orElseThrow();
            tests.add(DynamicTest.dynamicTest(c.id() + " as written in " + source.id(), () -> {
                PidSetting s = FormCodec.decode(source, sourceValues(c), CONTEXT, "source");
                assertMatches(StructureLaw.toLaw(s, source.filter().placement()), c, "source law");
            }));
            for (FormDefinition target : CatalogLoader.bundled().all()) {
                tests.add(DynamicTest.dynamicTest(c.id() + " -> " + target.id(), () -> {
                    Conversion conv = Converter.convert(source, sourceValues(c), target, CONTEXT);
                    if (!conv.exact()) {
                        assertThat(ConversionRules.findings(conv)).as("an inexact conversion says why").isNotEmpty();
                        return;
                    }
                    PidSetting back = FormCodec.decode(target, FormCodec.asText(conv.parameters()), CONTEXT, "target");
                    assertMatches(StructureLaw.toLaw(back, target.filter().placement()), c, target.id());
                }));
            }
        }
        return tests.stream();
    }
}

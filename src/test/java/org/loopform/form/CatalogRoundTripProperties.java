package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import java.util.Map;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.statistics.Statistics;
import org.loopform.io.CatalogLoader;
import org.loopform.law.ControlLaw;
import org.loopform.units.Span;

/**
 * Round trips over the catalog. A conversion is exact when the target law equals the source law
 * as rational functions (Astrom & Hagglund, PID Controllers: Theory, Design and Tuning, 2nd ed.,
 * ISA 1995, sec. 3.4: the parameterizations describe the same controller); then converting back
 * must restore the source values, and the frequency responses must agree at any frequency.
 * Fixed seeds keep failures reproducible.
 */
class CatalogRoundTripProperties {

    private static final List<FormDefinition> FORMS = CatalogLoader.bundled().all();
    private static final WritingContext CONTEXT = new WritingContext(new Span(0, 250), new Span(0, 100), 0.25);

    record Tuning(double kc, double tiSeconds, double tdSeconds, double n) {
    }

    @Provide
    Arbitrary<Tuning> idealTunings() {
        return Combinators.combine(
                Arbitraries.doubles().between(0.05, 20).flatMap(k -> Arbitraries.of(k, -k)),
                Arbitraries.doubles().between(1, 3000),
                Arbitraries.doubles().between(0, 0.24),
                Arbitraries.doubles().between(4, 25)).as((k, ti, tdShare, n) -> new Tuning(k, ti, ti * tdShare, n));
    }

    @Provide
    Arbitrary<FormDefinition> forms() {
        return Arbitraries.of(FORMS);
    }

    private static Map<String, String> ideal(Tuning t) {
        return Map.of("kc", Double.toString(t.kc()), "ti", Double.toString(t.tiSeconds()),
                "td", Double.toString(t.tdSeconds()), "n", Double.toString(t.n()));
    }

    @Property(tries = 300, seed = "20261201")
    void a_to_b_to_a_restores_the_values_where_exact(@ForAll("idealTunings") Tuning t, @ForAll("forms") FormDefinition a,
                                                     @ForAll("forms") FormDefinition b) {
        FormDefinition ideal = CatalogLoader.bundled().find("ideal").orElseThrow();
        Conversion toA = Converter.convert(ideal, ideal(t), a, CONTEXT);
        Map<String, String> inA = FormCodec.asText(toA.parameters());
        Conversion toB = toA.exact() ? Converter.convert(a, inA, b, CONTEXT) : null;
        Statistics.label("round trip").collect(toB != null && toB.exact() ? "exact both ways" : "inexact");
        Statistics.label("round trip").coverage(check -> check.check("exact both ways").percentage(p -> p > 30));
        if (toB == null || !toB.exact()) {
            return;
        }
        Conversion backToA = Converter.convert(b, FormCodec.asText(toB.parameters()), a, CONTEXT);
        assertThat(backToA.exact()).isTrue();
        toA.parameters().values().forEach((name, value) -> {
            double back = backToA.parameters().values().get(name);
            assertThat(Math.abs(back - value)).as("%s via %s", name, b.id())
                    .isLessThanOrEqualTo(1e-9 * Math.max(Math.abs(value), 1e-300) + 1e-300);
        });
        assertThat(backToA.parameters().action()).isEqualTo(toA.parameters().action());
    }

    @Property(tries = 300, seed = "4242")
    void a_converted_law_has_the_source_response_at_any_frequency(@ForAll("idealTunings") Tuning t,
                                                                 @ForAll("forms") FormDefinition target,
                                                                 @ForAll("omegas") double omega) {
        FormDefinition ideal = CatalogLoader.bundled().find("ideal").orElseThrow();
        Conversion c = Converter.convert(ideal, ideal(t), target, CONTEXT);
        Statistics.label("conversion").collect(c.exact() ? "exact" : "inexact");
        Statistics.label("conversion").coverage(check -> check.check("exact").percentage(p -> p > 50));
        if (!c.exact()) {
            return;
        }
        PidSetting back = FormCodec.decode(target, FormCodec.asText(c.parameters()), CONTEXT, "target");
        ControlLaw law = StructureLaw.toLaw(back, target.filter().placement());
        double[] expected = new double[2];
        double[] actual = new double[2];
        c.sourceLaw().feedbackAt(omega, expected);
        law.feedbackAt(omega, actual);
        assertThat(Math.hypot(actual[0] - expected[0], actual[1] - expected[1]))
                .isLessThanOrEqualTo(1e-9 * Math.hypot(expected[0], expected[1]));
        c.sourceLaw().setpointAt(omega, expected);
        law.setpointAt(omega, actual);
        assertThat(Math.hypot(actual[0] - expected[0], actual[1] - expected[1]))
                .isLessThanOrEqualTo(1e-9 * Math.hypot(expected[0], expected[1]));
    }

    @net.jqwik.api.Example
    void every_catalog_pair_round_trips_where_exact() {
        // one tuning through all 16 x 16 pairs, so that no pair is left to chance
        FormDefinition ideal = CatalogLoader.bundled().find("ideal").orElseThrow();
        Tuning t = new Tuning(1.7, 240, 30, 10);
        int exactPairs = 0;
        for (FormDefinition a : FORMS) {
            Conversion toA = Converter.convert(ideal, ideal(t), a, CONTEXT);
            if (!toA.exact()) {
                continue;
            }
            for (FormDefinition b : FORMS) {
                Conversion toB = Converter.convert(a, FormCodec.asText(toA.parameters()), b, CONTEXT);
                if (!toB.exact()) {
                    continue;
                }
                exactPairs++;
                Conversion back = Converter.convert(b, FormCodec.asText(toB.parameters()), a, CONTEXT);
                assertThat(back.exact()).as("%s -> %s -> %s", a.id(), b.id(), a.id()).isTrue();
                toA.parameters().values().forEach((name, value) -> assertThat(
                        Math.abs(back.parameters().values().get(name) - value))
                        .as("%s via %s", name, b.id()).isLessThanOrEqualTo(1e-9 * Math.abs(value) + 1e-300));
            }
        }
        // the forms with a filter ratio, a filter time constant and plain units all write this law
        assertThat(exactPairs).isGreaterThan(60);
    }

    @Provide
    Arbitrary<Double> omegas() {
        return Arbitraries.doubles().between(-5, 3).map(x -> Math.pow(10, x));
    }
}

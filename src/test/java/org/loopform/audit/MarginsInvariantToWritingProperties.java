package org.loopform.audit;

import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import org.loopform.check.LoopSpec;
import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.OptionalDouble;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.statistics.Statistics;
import org.loopform.analysis.LoopMargins;
import org.loopform.findings.CheckPolicy;
import org.loopform.form.Conversion;
import org.loopform.form.Converter;
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.WritingContext;
import org.loopform.io.CatalogLoader;
import org.loopform.process.FirstOrderPlusDeadTime;
import org.loopform.units.Span;

/**
 * The margins of a loop depend on its control law, not on how the law is written: the same ideal
 * PID written exactly in every catalog form that can hold it (gain or band, time or repeats, seconds
 * or minutes, ideal, series or parallel) gives the same design and target margins, to 1e-9
 * relative. The design loop is the continuous law (no source scan); the target is one form at one
 * scan. Loop margins are functions of the loop transfer function alone (Astrom and Murray,
 * Feedback Systems, 2nd ed., 2021, sec. 10.3 - from memory for the section), so any difference is
 * a units or structure slip.
 */
class MarginsInvariantToWritingProperties {

    private static final double RELATIVE = 1e-9;
    private static final Span PV = new Span(0, 250);
    private static final Span OUT = new Span(0, 100);
    private static final FormDefinition IDEAL = CatalogLoader.bundled().find("ideal").orElseThrow();

    record Case(double processGain, double lagSeconds, double deadSeconds, double aggressiveness, double tiShare,
                double tdShare, double n, String target, double scanSeconds) {
    }

    @Provide
    Arbitrary<Case> cases() {
        Arbitrary<double[]> process = Combinators.combine(
                Arbitraries.doubles().between(0.2, 5).ofScale(6).flatMap(k -> Arbitraries.of(k, -k)),
                Arbitraries.doubles().between(1, 600).ofScale(6),
                Arbitraries.doubles().between(0.5, 60).ofScale(6)).as((k, lag, dead) -> new double[] {k, lag, dead});
        return Combinators.combine(process,
                Arbitraries.doubles().between(0.1, 1.5).ofScale(6),
                Arbitraries.doubles().between(0.3, 2).ofScale(6),
                Arbitraries.oneOf(Arbitraries.just(0.0), Arbitraries.doubles().between(0.02, 0.25).ofScale(6)),
                Arbitraries.doubles().between(4, 20).ofScale(6),
                Arbitraries.of("ideal", "series", "parallel", "ideal-pb-repeats"),
                Arbitraries.doubles().between(0.1, 2).ofScale(6))
                .as((p, a, tiShare, tdShare, n, target, scan) -> new Case(p[0], p[1], p[2], a, tiShare, tdShare, n,
                        target, scan));
    }

    @Property(tries = 10, seed = "20261204")
    void the_same_law_in_any_form_has_the_same_margins(@ForAll("cases") Case c) {
        double kc = Math.signum(c.processGain()) * c.aggressiveness() * c.lagSeconds()
                / (Math.abs(c.processGain()) * c.deadSeconds());
        double ti = c.tiShare() * (c.lagSeconds() + c.deadSeconds());
        Map<String, String> ideal = Map.of("kc", Double.toString(kc), "ti", Double.toString(ti),
                "td", Double.toString(c.tdShare() * ti), "n", Double.toString(c.n()));
        WritingContext ctx = new WritingContext(PV, OUT, c.scanSeconds());
        FormDefinition target = CatalogLoader.bundled().find(c.target()).orElseThrow();
        var process = new FirstOrderPlusDeadTime(c.processGain(), c.lagSeconds(), c.deadSeconds());

        List<String> writings = new ArrayList<>();
        List<CheckResult> results = new ArrayList<>();
        for (FormDefinition form : CatalogLoader.bundled().all()) {
            Conversion written = Converter.convert(IDEAL, ideal, form, ctx);
            if (!written.exact() || form.needsScan()) {
                continue; // the form cannot hold this law exactly, or its design loop is sampled
            }
            LoopSpec loop = new LoopSpec("SAME-LAW", process, form, FormCodec.asText(written.parameters()), null,
                    target, c.scanSeconds(), PV, OUT, "property");
            writings.add(form.id());
            results.add(LoopCheck.run(loop, CheckPolicy.DEFAULT));
        }
        Statistics.label("writings").collect(writings.size() >= 6 ? "6 or more" : writings.size() + "");
        assertThat(writings).hasSizeGreaterThanOrEqualTo(4);
        CheckResult first = results.get(0);
        for (int i = 1; i < results.size(); i++) {
            String as = writings.get(i) + " against " + writings.get(0);
            assertSame("design " + as, results.get(i).designMargins(), first.designMargins());
            assertSame("target " + as, results.get(i).targetMargins(), first.targetMargins());
        }
    }

    private static void assertSame(String what, LoopMargins a, LoopMargins b) {
        close(what + ": gain margin", a.gainMargin(), b.gainMargin());
        close(what + ": lower gain margin", a.lowerGainMargin(), b.lowerGainMargin());
        close(what + ": phase margin", a.phaseMarginDegrees(), b.phaseMarginDegrees());
        close(what + ": crossover", a.crossoverRadPerSecond(), b.crossoverRadPerSecond());
        close(what + ": phase crossover", a.phaseCrossoverRadPerSecond(), b.phaseCrossoverRadPerSecond());
        close(what + ": delay margin", a.delayMarginSeconds(), b.delayMarginSeconds());
        close(what + ": Ms", OptionalDouble.of(a.maximumSensitivity()), OptionalDouble.of(b.maximumSensitivity()));
    }

    private static void close(String what, OptionalDouble a, OptionalDouble b) {
        assertThat(a.isPresent()).as(what + " present").isEqualTo(b.isPresent());
        if (a.isPresent()) {
            double x = a.getAsDouble();
            double y = b.getAsDouble();
            assertThat(Math.abs(x - y)).as(what + ": %s vs %s", x, y)
                    .isLessThanOrEqualTo(RELATIVE * Math.max(Math.abs(x), Math.abs(y)));
        }
    }
}

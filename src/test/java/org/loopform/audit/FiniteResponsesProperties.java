package org.loopform.audit;

import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import org.loopform.check.LoopSpec;
import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import java.util.Locale;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.statistics.Statistics;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.CatalogLoader;
import org.loopform.io.LoopFileReader;
import org.loopform.units.BadInput;

/**
 * For every loop the readers accept, a check's every figure is finite or an explicit "none" (an
 * empty optional): margins, step metrics, the simulated PV and output of both loops, the controller
 * mismatch. Random loops range from sluggish to violently unstable (a gain up to 50 times the
 * process's inverse gain), over every bundled target form and scans from 0.05 s to 20 s. A loop the
 * reader or the check refuses with {@link BadInput} is outside the contract and is counted, not
 * checked. "Finite" is the contract of the outputs (JSON has no NaN); common practice, no source.
 */
class FiniteResponsesProperties {

    private static final List<String> TARGETS = CatalogLoader.bundled().ids();

    record Loop(String process, double kc, double tiSeconds, double tdSeconds, double n, String target,
                double scanSeconds) {
        String yaml() {
            return String.format(Locale.ROOT, """
                    tag: RANDOM-1
                    process: %s
                    tuning: {form: ideal, kc: %s, ti: %s, td: %s, n: %s}
                    target: {form: %s, scan: %s s}
                    ranges: {pv: 0..200, output: 0..100}
                    """, process, kc, tiSeconds, tdSeconds, n, target, scanSeconds);
        }
    }

    @Provide
    Arbitrary<String> processes() {
        Arbitrary<Double> gain = Arbitraries.doubles().between(0.05, 20).ofScale(6).flatMap(k -> Arbitraries.of(k, -k));
        Arbitrary<Double> lag = Arbitraries.doubles().between(0.1, 3000).ofScale(6);
        Arbitrary<Double> dead = Arbitraries.doubles().between(0, 300).ofScale(6);
        Arbitrary<String> fopdt = Combinators.combine(gain, lag, dead).as((k, t, d) -> String.format(Locale.ROOT,
                "{model: fopdt, gain: %s, time_constant: %s s, dead_time: %s s}", k, t, d));
        Arbitrary<String> sopdt = Combinators.combine(gain, lag, lag, dead).as((k, t1, t2, d) -> String.format(
                Locale.ROOT, "{model: sopdt, gain: %s, time_constant: %s s, time_constant_2: %s s, dead_time: %s s}",
                k, t1, t2, d));
        Arbitrary<String> resonant = Combinators.combine(gain, Arbitraries.doubles().between(0.05, 2).ofScale(6),
                Arbitraries.doubles().between(0.001, 5).ofScale(6), dead).as((k, z, w, d) -> String.format(Locale.ROOT,
                "{model: sopdt, gain: %s, damping: %s, natural_frequency: %s rad/s, dead_time: %s s}", k, z, w, d));
        Arbitrary<String> integrating = Combinators.combine(Arbitraries.doubles().between(1e-4, 1).ofScale(6)
                .flatMap(k -> Arbitraries.of(k, -k)), dead).as((k, d) -> String.format(Locale.ROOT,
                "{model: integrating, gain: %s, dead_time: %s s}", k, d));
        return Arbitraries.oneOf(fopdt, sopdt, resonant, integrating);
    }

    @Provide
    Arbitrary<Loop> loops() {
        return Combinators.combine(processes(),
                Arbitraries.doubles().between(0.01, 50).ofScale(6).flatMap(k -> Arbitraries.of(k, -k)),
                Arbitraries.doubles().between(0.5, 5000).ofScale(6),
                Arbitraries.doubles().between(0, 1).ofScale(6),
                Arbitraries.doubles().between(2, 30).ofScale(6),
                Arbitraries.of(TARGETS),
                Arbitraries.doubles().between(0.05, 20).ofScale(6))
                .as((p, kc, ti, tdShare, n, target, scan) -> new Loop(p, kc, ti, ti * tdShare, n, target, scan));
    }

    @Property(tries = 20, seed = "20261203")
    void every_figure_of_an_accepted_loop_is_finite_or_none(@ForAll("loops") Loop loop) {
        CheckResult result;
        try {
            result = LoopCheck.run(LoopFileReader.parseAll(loop.yaml(), "random.yaml").get(0), CheckPolicy.DEFAULT);
        } catch (BadInput refused) {
            Statistics.label("loop").collect("refused as bad input");
            return;
        }
        Statistics.label("loop").collect(result.targetStability() != null && !result.targetStability().isStable()
                ? "accepted, target unstable" : "accepted");
        assertThat(FiniteFigures.in(result)).as(loop.yaml()).isEmpty();
    }
}

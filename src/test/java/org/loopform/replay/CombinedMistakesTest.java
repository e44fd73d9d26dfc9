package org.loopform.replay;

import static org.assertj.core.api.Assertions.assertThat;
import static org.loopform.replay.LoopReplayTest.loop;
import static org.loopform.replay.LoopReplayTest.replay;
import static org.loopform.replay.LoopReplayTest.values;

import org.junit.jupiter.api.Test;
import org.loopform.findings.Severity;

/**
 * Two deliberate mistakes in one list entry, on records written by {@link TrueLoop} (a known
 * controller on a known process, independent of loopform's controller code): no single reading
 * reproduces the log, the pair that undoes both does, to the log's rounding, and ranks first.
 */
class CombinedMistakesTest {

    /**
     * The controller really ran reverse acting (gain 2 %/%) with its integral time at 40 s; the list
     * says direct (kc -2) and 40 minutes.
     */
    @Test
    void minutes_taken_for_seconds_and_the_opposite_action_are_found_together() {
        TrueLoop plant = new TrueLoop();
        plant.tiSeconds = 40;
        plant.tdSeconds = 0;
        plant.n = 0;
        plant.run();
        ReplayResult r = replay(loop("ideal-min", values("kc", "-2", "ti", "40", "td", "0"), 1.0), plant.trend());
        assertThat(r.asFoundSeverity()).isEqualTo(Severity.FAIL);
        Explanation best = r.explanations().get(0);
        assertThat(best.kind()).as(r.explanations().toString()).isEqualTo(ExplanationKind.COMBINED);
        assertThat(best.description()).contains("ti is 40 s, not min").contains("opposite action");
        assertThat(best.agreement().rmsPercent()).isLessThan(LoopReplayTest.ROUNDING_PCT);
        // the same PI written in another seconds form with the action flipped ties with it and ranks after it
        assertThat(r.explanations()).allSatisfy(e -> assertThat(e.kind()).isEqualTo(ExplanationKind.COMBINED));
    }

    /** A gain typed into the band column and the old scan listed as 1 s where it was 2 s (series PID). */
    @Test
    void a_gain_typed_as_a_band_and_the_wrong_scan_are_found_together() {
        TrueLoop plant = new TrueLoop();
        plant.structure = TrueLoop.Structure.SERIES;
        plant.gain = 2; // a band of 100/2 = 50 % (PB = 100/Kc, docs/references.md sec. 2)
        plant.tiSeconds = 60;
        plant.tdSeconds = 10;
        plant.scanSeconds = 2;
        plant.run();
        // series-pb-min: pb 2 (the gain typed into the band column), ti 1 min, td 1/6 min, filter N = 10 as run
        ReplayResult r = replay(loop("series-pb-min", values("pb", "2", "ti", "1", "td", "0.1666666666667"), 1.0),
                plant.trend());
        assertThat(r.asFoundSeverity()).isEqualTo(Severity.FAIL);
        Explanation best = r.explanations().get(0);
        assertThat(best.kind()).as(r.explanations().toString()).isEqualTo(ExplanationKind.COMBINED);
        assertThat(best.description()).contains("pb 2 is a gain").contains("scan 2 s");
        assertThat(best.agreement().rmsPercent()).isLessThan(LoopReplayTest.ROUNDING_PCT);
    }

    /** One mistake alone is explained by itself: pairs are not tried, and none outranks it. */
    @Test
    void a_single_mistake_is_not_explained_by_a_pair() {
        TrueLoop plant = new TrueLoop().run();
        ReplayResult r = replay(loop("ideal", values("kc", "-2", "ti", "60", "td", "6"), 1.0), plant.trend());
        assertThat(r.explanations()).noneMatch(e -> e.kind() == ExplanationKind.COMBINED);
        assertThat(r.explanations().get(0).kind()).isEqualTo(ExplanationKind.ACTION);
    }
}

package org.loopform.replay;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.loopform.form.WritingContext;
import org.loopform.units.Span;

/**
 * An explanation's words show values as the rest of the report does (six significant digits, with
 * their unit), while the reading it runs keeps the value as written (plumbing of the words; the
 * arithmetic is a unit swap: 3.27957746479 s taken as minutes).
 */
class ExplanationDigitsTest {

    @Test
    void a_long_value_is_shown_to_six_digits_with_its_unit_and_run_in_full() {
        WritingContext ctx = new WritingContext(new Span(0, 40), new Span(0, 100), 0.25);
        List<Candidate> c = CandidateSearch.alternatives(LoopReplayTest.form("ideal"),
                LoopReplayTest.values("kc", "1.01111111111", "ti", "3.27957746479", "td", "0"), ctx, 0.25,
                LoopReplayTest.CATALOG);
        Candidate minutes = c.stream().filter(x -> x.kind() == ExplanationKind.UNITS
                && x.description().startsWith("ti is ")).findFirst().orElseThrow();
        assertThat(minutes.description()).isEqualTo("ti is 3.27958 min, not s");
        // the reading itself: 3.27957746479 min = 196.7746478874 s, kept to twelve digits
        assertThat(Double.parseDouble(minutes.tuning().get("ti"))).isCloseTo(196.7746478874,
                org.assertj.core.api.Assertions.within(1e-8));
        assertThat(c).allSatisfy(x -> assertThat(x.description()).doesNotContain("3.2795774")
                .doesNotContain("1.0111111"));
    }
}

package org.loopform.replay;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.report.ReplayReport;

/**
 * A record whose output does not move cannot tell controllers apart. Hand derivation: with the
 * setpoint equal to the PV at every scan the error is zero, so a PI controller started bumpless at
 * the logged output adds {@code Kc (e_k - e_{k-1}) + Kc h/Ti e_k = 0} each scan (the
 * incremental form of the PI law u = Kc (e + (1/Ti) integral e dt), hand derivation) and holds the logged output whatever
 * its Kc and Ti: the listed controller and one ten times stronger both match it exactly.
 */
class QuietRecordTest {

    /** 600 s of record, logged each second: setpoint = PV = {@code level}, output held at 26.7 %. */
    static Trend still(double level) {
        double[] t = new double[601];
        double[] sp = new double[t.length];
        double[] pv = new double[t.length];
        double[] out = new double[t.length];
        for (int k = 0; k < t.length; k++) {
            t[k] = k;
            sp[k] = level;
            pv[k] = level;
            out[k] = 26.7;
        }
        return new Trend(new Signal("setpoint", t, sp), new Signal("pv", t, pv), new Signal("output", t, out), null,
                null);
    }

    static ReplayResult replay(String kc, String ti, Trend trend) {
        return LoopReplayTest.replay(LoopReplayTest.loop("ideal", LoopReplayTest.values("kc", kc, "ti", ti, "td", "0"),
                1.0), trend);
    }

    @Test
    void a_still_record_matches_any_controller_so_the_verdict_is_not_confirmed_never_reproduced() {
        ReplayResult listed = replay("2", "60", still(40));
        ReplayResult other = replay("20", "6", still(40));
        // the hand derivation: both hold the logged output exactly
        assertThat(listed.asFound().rmsPercent()).isLessThan(1e-9);
        assertThat(other.asFound().rmsPercent()).isLessThan(1e-9);
        assertThat(listed.quietRecord()).isTrue();
        assertThat(listed.asFoundVerdict()).isEqualTo(AsFoundVerdict.NOT_CONFIRMED);
        assertThat(listed.asFoundSeverity()).isEqualTo(Severity.WARN);
        assertThat(listed.findings()).noneSatisfy(f -> assertThat(f.message()).contains("reproduces the logged output"));
        assertThat(listed.findings()).anySatisfy(f -> {
            assertThat(f.topic()).isEqualTo(Topic.REPLAY);
            assertThat(f.severity()).isEqualTo(Severity.WARN);
            assertThat(f.message()).contains("As found: not confirmed").contains("confirms neither");
        });
        // nor an explanation that would ask to change the list on the strength of a still record
        assertThat(listed.findings()).noneSatisfy(f -> assertThat(f.message()).startsWith("Best explanation"));
        assertThat(listed.findings()).noneSatisfy(f -> assertThat(f.message()).startsWith("None of the"));
        // the rounding noise of a constant's standard deviation prints as 0, not 1.35E-13
        assertThat(listed.findings()).noneSatisfy(f -> assertThat(f.message()).containsPattern("\\dE-\\d"));
    }

    @Test
    void every_output_says_not_confirmed() {
        ReplayResult r = replay("2", "60", still(40));
        assertThat(ReplayReport.text(r)).contains("-> not confirmed (the logged output hardly moves")
                .doesNotContain("-> reproduced").doesNotContain("Best explanations");
        assertThat(ReplayReport.json(r)).contains("\"as_found_verdict\" : \"not_confirmed\"")
                .contains("\"quiet_record\" : true");
        assertThat(org.loopform.report.ReplayCsv.csv(java.util.List.of(r), java.util.List.of()))
                .contains(",not_confirmed,").doesNotContain("reproduced");
    }

    @Test
    void a_still_output_that_the_listed_controller_would_have_moved_still_refutes_it() {
        // the PV steps 5 units of 150 below the setpoint at 100 s while the logged output stays put: a PI
        // with kc 2 moves its output by at least kc x 5/150 x 100 = 6.7 % of span at once (proportional kick)
        Trend quiet = still(40);
        double[] pv = new double[601];
        double[] t = new double[601];
        for (int k = 0; k < t.length; k++) {
            t[k] = k;
            pv[k] = k < 100 ? 40 : 35;
        }
        Trend refuting = new Trend(quiet.setpoint(), new Signal("pv", t, pv), quiet.output(), null, null);
        ReplayResult r = replay("2", "60", refuting);
        assertThat(r.quietRecord()).isTrue();
        assertThat(r.asFoundVerdict()).isEqualTo(AsFoundVerdict.REFUTED);
    }
}

package org.loopform.replay;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.check.LoopSpec;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.form.FormDefinition;
import org.loopform.io.CatalogLoader;
import org.loopform.units.Span;

/**
 * Replays records written by {@link TrueLoop}, which simulates a known controller on a known
 * process with noise independently of loopform's controller code: the true controller must
 * reproduce the logged output to the log's rounding, and each deliberate mistake in the loop list
 * must be refuted with the right explanation ranked first.
 */
class LoopReplayTest {

    static final List<FormDefinition> CATALOG = CatalogLoader.bundled().all();

    static FormDefinition form(String id) {
        return CatalogLoader.bundled().find(id).orElseThrow();
    }

    static LoopSpec loop(String form, Map<String, String> tuning, double scanSeconds) {
        return new LoopSpec("TIC-1", null, form(form), tuning, scanSeconds, form("ideal-pb-repeats"), scanSeconds,
                new Span(0, TrueLoop.PV_SPAN), new Span(0, 100), "test");
    }

    static Map<String, String> values(String... kv) {
        Map<String, String> m = new LinkedHashMap<>();
        for (int k = 0; k < kv.length; k += 2) {
            m.put(kv[k], kv[k + 1]);
        }
        return m;
    }

    static ReplayResult replay(LoopSpec loop, Trend trend) {
        return LoopReplay.run(loop, trend, CATALOG, CheckPolicy.DEFAULT);
    }

    /**
     * Rounding bound: the log keeps 4 decimals, so PV and setpoint differ from what the controller
     * read by at most 5e-5 units of 150, and the output by 5e-5 %; through a gain of 2 and the
     * derivative's Td/h = 6 that is far below 0.01 % of span (hand estimate).
     */
    static final double ROUNDING_PCT = 0.01;

    @Nested
    @DisplayName("the true controller")
    class TrueController {

        @Test
        void ideal_pid_reproduces_the_logged_output_to_rounding() {
            TrueLoop plant = new TrueLoop().run();
            ReplayResult r = replay(loop("ideal", values("kc", "2", "ti", "60", "td", "6"), 1.0), plant.trend());
            assertThat(r.asFound().rmsPercent()).isLessThan(ROUNDING_PCT);
            assertThat(r.asFound().correlation()).isGreaterThan(0.999);
            assertThat(r.asFoundSeverity()).isEqualTo(Severity.INFO);
            assertThat(replayWarnings(r)).isEmpty();
        }

        @Test
        void series_pid_reproduces_the_logged_output_to_rounding() {
            TrueLoop plant = new TrueLoop();
            plant.structure = TrueLoop.Structure.SERIES;
            plant.tdSeconds = 10;
            plant.run();
            ReplayResult r = replay(loop("series", values("kc", "2", "ti", "60", "td", "10"), 1.0), plant.trend());
            assertThat(r.asFound().rmsPercent()).isLessThan(ROUNDING_PCT);
        }

        @Test
        void manual_periods_are_tracked_and_the_return_to_automatic_is_bumpless() {
            TrueLoop plant = new TrueLoop();
            plant.manualFrom = 400;
            plant.manualTo = 600;
            plant.run();
            LoopSpec listed = loop("ideal", values("kc", "2", "ti", "60", "td", "6"), 1.0);
            ReplayResult r = replay(listed, plant.trend());
            assertThat(r.asFound().rmsPercent()).isLessThan(ROUNDING_PCT);
            // 1501 scans, 200 in manual, 3 of warm-up (five filter time constants, 5 x 6/10 s, at a 1 s scan)
            assertThat(r.asFound().comparedScans()).isEqualTo(1501 - 200 - 3);
            // the same record without its mode column: the operator's output is taken for the controller's
            Trend noMode = new Trend(plant.trend().setpoint(), plant.trend().pv(), plant.trend().output(), null, null);
            assertThat(replay(listed, noMode).asFound().rmsPercent()).isGreaterThan(1.0);
        }
    }

    @Nested
    @DisplayName("each mistake in the list is refuted and explained")
    class Mistakes {

        @Test
        void minutes_listed_for_seconds() {
            TrueLoop plant = new TrueLoop().run();
            ReplayResult r = replay(loop("ideal-min", values("kc", "2", "ti", "60", "td", "6"), 1.0), plant.trend());
            assertRefutedAndExplained(r, ExplanationKind.UNITS, "are in s, not min");
        }

        @Test
        void wrong_form_series_listed_as_ideal() {
            TrueLoop plant = new TrueLoop();
            plant.structure = TrueLoop.Structure.SERIES;
            // Ti' close to Td', where series and ideal part most: a = 1 + Td'/Ti' = 1.5 (Astrom & Hagglund 1995, sec. 3.4)
            plant.tiSeconds = 20;
            plant.tdSeconds = 10;
            plant.run();
            ReplayResult r = replay(loop("ideal", values("kc", "2", "ti", "20", "td", "10"), 1.0), plant.trend());
            assertRefutedAndExplained(r, ExplanationKind.FORM, "form series ");
        }

        @Test
        void wrong_action() {
            TrueLoop plant = new TrueLoop().run();
            ReplayResult r = replay(loop("ideal", values("kc", "-2", "ti", "60", "td", "6"), 1.0), plant.trend());
            assertRefutedAndExplained(r, ExplanationKind.ACTION, "opposite action");
        }

        @Test
        void missing_filter() {
            TrueLoop plant = new TrueLoop();
            plant.n = 0;
            plant.run();
            ReplayResult r = replay(loop("ideal", values("kc", "2", "ti", "60", "td", "6"), 1.0), plant.trend());
            assertRefutedAndExplained(r, ExplanationKind.FILTER, "no derivative filter");
        }

        @Test
        void wrong_scan() {
            TrueLoop plant = new TrueLoop();
            plant.scanSeconds = 2;
            plant.run();
            ReplayResult r = replay(loop("ideal", values("kc", "2", "ti", "60", "td", "6"), 1.0), plant.trend());
            assertRefutedAndExplained(r, ExplanationKind.SCAN, "scan 2 s");
        }
    }

    @Test
    void compressed_record_gives_its_finding() {
        TrueLoop plant = new TrueLoop().run();
        // deadband compression of 1.5 % of span on the PV and 1 % on the output (common practice in historians)
        Trend compressed = plant.compressed(0.015 * TrueLoop.PV_SPAN, 1.0);
        assertThat(compressed.pv().medianIntervalSeconds()).isGreaterThan(2.0);
        ReplayResult r = replay(loop("ideal", values("kc", "2", "ti", "60", "td", "6"), 1.0), compressed);
        assertThat(r.findings()).anySatisfy(f -> {
            assertThat(f.topic()).isEqualTo(Topic.REPLAY);
            assertThat(f.message()).contains("coarse for the scan");
        });
    }

    static void assertRefutedAndExplained(ReplayResult r, ExplanationKind kind, String words) {
        assertThat(r.asFoundSeverity()).isNotEqualTo(Severity.INFO);
        Explanation best = r.explanations().get(0);
        assertThat(best.kind()).as(r.explanations().toString()).isEqualTo(kind);
        assertThat(best.description()).contains(words);
        assertThat(best.agreement().rmsPercent()).isLessThan(ROUNDING_PCT);
        if (r.explanations().size() > 1) {
            assertThat(r.explanations().get(1).agreement().rmsPercent()).isGreaterThan(best.agreement().rmsPercent());
        }
    }

    static List<Finding> replayWarnings(ReplayResult r) {
        return r.findings().stream().filter(f -> f.topic() == Topic.REPLAY && f.severity() != Severity.INFO).toList();
    }
}

// plumbing: every catalogue figure reaches every output; no published source needed (source: none)
package org.loopform.report;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.StringWriter;
import java.util.Arrays;
import java.util.List;
import java.util.Set;
import java.util.stream.Collectors;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.audit.LoopOutcome;
import org.loopform.audit.LoopRow;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import org.loopform.check.LoopSpec;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.LoopFileReader;

/**
 * Plumbing: every figure of the catalogue ({@link LoopFigure}) reaches every output (the text
 * table, the HTML table, the JSON of both loops, loops.csv), so a figure added to the catalogue
 * needs no other change. No figure value is checked here; the figures' own tests check them.
 */
@DisplayName("The figure catalogue")
class LoopFigureCatalogueTest {

    /**
     * An invented loop, stable as found and as left, that has a lower gain margin on both sides (an
     * integrating process with a lag under PID: conditionally stable, as the cross-check's
     * conditionally-stable-01 loop, whose stability and lower gain margin the numpy reference in
     * src/test/python/write_stability_crosscheck.py confirms), so the one figure shown only where a
     * loop has it is shown, and a sampled design loop (the old controller's own scan, so the delay
     * margin in scans has a figure on both sides). The loop used before, a target at an 8 s scan,
     * is unstable as left: its figures are now left out, so it no longer shows every figure.
     */
    private static final String LOOP = String.join("\n",
            "tag: TIC-901",
            "process: {model: integrating, gain: 0.1, lag: 10 s, dead_time: 0.1 s}",
            "tuning: {form: ideal, kc: 2, ti: 5, td: 8, n: 10, scan: 0.05 s}",
            "target: {form: ideal-pb-repeats, scan: 0.1 s}",
            "ranges: {pv: 0..150, output: 0..100}", "");

    /**
     * The figures loops.csv leaves out: its columns were kept byte for byte when the catalogue was
     * built. Any other figure, and every figure added, must have its columns.
     */
    private static final Set<LoopFigure> NOT_IN_CSV = Set.of(LoopFigure.SETPOINT_SETTLING,
            LoopFigure.LOAD_OUTPUT_TRAVEL);

    private static CheckResult check() {
        LoopSpec loop = LoopFileReader.parseAll(LOOP, "invented.yaml").get(0);
        return LoopCheck.run(loop, CheckPolicy.DEFAULT);
    }

    private static final CheckResult RESULT = check();

    @Test
    void the_sample_loop_shows_the_figure_kept_for_loops_that_have_it() {
        // otherwise the tests below would not see the lower gain margin row, nor any figure at all
        assertThat(RESULT.designStability().isStable()).isTrue();
        assertThat(RESULT.targetStability().isStable()).isTrue();
        assertThat(RESULT.targetMargins().lowerGainMargin()).isPresent();
        assertThat(LoopFigure.LOWER_GAIN_MARGIN.shown(LoopSide.design(RESULT), LoopSide.target(RESULT))).isTrue();
    }

    @Nested
    @DisplayName("every figure appears")
    class EveryFigure {

        @Test
        void in_the_text_table_with_its_unit() {
            List<String> lines = CheckReport.text(RESULT).lines().toList();
            for (LoopFigure f : LoopFigure.values()) {
                assertThat(lines).as(f.name()).anySatisfy(line -> {
                    assertThat(line.trim()).startsWith(f.label() + "  ");
                    assertThat(line.trim()).endsWith(" " + f.unit());
                });
            }
        }

        @Test
        void in_the_html_table_with_its_unit() throws IOException {
            StringWriter w = new StringWriter();
            HtmlLoopSection.write(w, new LoopOutcome(LoopRow.of(0, RESULT.loop()), RESULT, List.of()), false);
            String html = w.toString();
            for (LoopFigure f : LoopFigure.values()) {
                assertThat(html).as(f.name()).containsPattern("<tr><th>" + java.util.regex.Pattern.quote(f.label())
                        + "</th><td class=\"num\">[^<]*</td><td class=\"num\">[^<]*</td><td class=\"unit\">"
                        + java.util.regex.Pattern.quote(Html.esc(f.unit())) + "</td></tr>");
            }
        }

        @Test
        void in_the_json_of_both_loops() {
            ObjectNode n = CheckReport.node(RESULT);
            for (String side : List.of("design", "target")) {
                for (LoopFigure f : LoopFigure.values()) {
                    String object = f.group().jsonObject();
                    JsonNode holder = object == null ? n.get(side) : n.get(side).get(object);
                    assertThat(holder.has(f.jsonKey())).as(side + " " + f.name()).isTrue();
                }
            }
        }

        @Test
        void in_loops_csv_except_the_two_left_out_when_the_catalogue_was_built() {
            Set<String> columns = Set.copyOf(AuditRows.LOOP_COLUMNS);
            for (LoopFigure f : LoopFigure.values()) {
                List<String> own = LoopFigure.csvColumns(List.of(f));
                if (NOT_IN_CSV.contains(f)) {
                    assertThat(own).as(f.name()).isEmpty();
                } else {
                    assertThat(own).as(f.name()).isNotEmpty();
                    assertThat(columns).as(f.name()).containsAll(own);
                }
            }
            // a figure's cells line up with its columns
            LoopOutcome o = new LoopOutcome(LoopRow.of(0, RESULT.loop()), RESULT, List.of());
            assertThat(AuditRows.loopRow(o)).hasSameSizeAs(AuditRows.LOOP_COLUMNS);
        }
    }

    /**
     * loops.csv's columns as published before the catalogue existed: readers find them by name or
     * by place, so each keeps its place relative to the others, and a figure added to the
     * catalogue only inserts its columns (after {@code target_delay_margin_scans}).
     */
    private static final List<String> PUBLISHED_COLUMNS = List.of("tag", "verdict", "where", "source_form",
            "source_values", "target_form", "scan_s", "exact", "converted", "entered", "deviation_gain_db",
            "deviation_phase_deg", "design_pm_deg", "target_pm_deg", "design_gm", "target_gm", "design_crossover_rad_s",
            "target_crossover_rad_s", "design_ms", "target_ms", "design_delay_margin_s", "target_delay_margin_s",
            "design_sp_iae_pct_s", "target_sp_iae_pct_s", "design_sp_overshoot_pct", "target_sp_overshoot_pct",
            "design_load_iae_pct_s", "target_load_iae_pct_s", "design_load_peak_pct", "target_load_peak_pct",
            "mismatch_gain_db", "mismatch_phase_deg", "fails", "warns", "findings", "design_lower_gm", "target_lower_gm",
            "target_delay_margin_scans", "design_margin_notes", "target_margin_notes", "problems");

    /** A loop's JSON keys in the order README.md's "check" section publishes them. */
    private static final List<String> PUBLISHED_KEYS = List.of("phase_margin_deg", "gain_margin", "crossover_rad_s",
            "ms", "delay_margin_s", "lower_gain_margin", "delay_margin_scans", "gain_margin_note", "phase_margin_note",
            "delay_margin_note", "stability", "stability_test", "unstable_poles", "largest_pole_magnitude", "setpoint",
            "load");

    @Test
    void published_csv_columns_keep_their_order_and_problems_stays_last() {
        List<String> columns = AuditRows.LOOP_COLUMNS;
        assertThat(columns).containsSubsequence(PUBLISHED_COLUMNS);
        assertThat(columns.get(columns.size() - 1)).isEqualTo("problems");
        List<String> added = columns.stream().filter(c -> !PUBLISHED_COLUMNS.contains(c)).toList();
        if (!added.isEmpty()) {
            assertThat(columns.indexOf(added.get(0))).isGreaterThan(columns.indexOf("target_delay_margin_scans"));
        }
    }

    @Test
    void published_json_keys_keep_their_order() {
        List<String> keys = new java.util.ArrayList<>();
        CheckReport.node(RESULT).get("target").fieldNames().forEachRemaining(keys::add);
        assertThat(keys).containsSubsequence(PUBLISHED_KEYS);
    }

    @Test
    void keys_are_unique_within_each_output() {
        assertThat(AuditRows.LOOP_COLUMNS).doesNotHaveDuplicates();
        assertThat(Arrays.stream(LoopFigure.values()).map(LoopFigure::label).collect(Collectors.toList()))
                .doesNotHaveDuplicates();
        for (LoopFigure.Group g : LoopFigure.Group.values()) {
            assertThat(LoopFigure.inGroup(g).stream().map(LoopFigure::jsonKey).toList()).doesNotHaveDuplicates();
        }
    }
}

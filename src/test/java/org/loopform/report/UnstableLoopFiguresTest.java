package org.loopform.report;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.io.StringWriter;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.audit.LoopOutcome;
import org.loopform.audit.LoopRow;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import org.loopform.check.LoopSpec;
import org.loopform.check.Verdict;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.LoopFileReader;

/**
 * A loop that is not stable shows no margin, Ms or response figure in any output: classical
 * margins are figures of safety only for a stable closed loop (Astrom & Murray, Feedback Systems,
 * 2008, ch. 9-10, from memory for the sections; docs/references.md section 6), and the responses of
 * a loop that runs away are held only by its output limits.
 *
 * <p>The invented loop is positive feedback: a reverse-acting PI (form ideal: a positive gain is reverse acting) on a process of gain -0.9 %/%.
 * Hand derivation of its instability: with u = -C(s) y and y = P(s) u, the closed loop's poles are
 * the roots of 1 + L(s), L = C P. On the positive real axis L(s) = kc (1 + 1/(ti s)) (-0.9) e^(-theta s)
 * / (tau s + 1) is real, tends to minus infinity as s -> 0+ (the integrator) and to 0 as s -> infinity,
 * so 1 + L(s) changes sign there and has a real root s > 0: a closed-loop pole in the right half
 * plane (intermediate value theorem; the sampled loop likewise on the real axis z > 1). Both loops
 * are therefore unstable, whatever the scan.
 */
@DisplayName("An unstable loop's figures are left out of every output")
class UnstableLoopFiguresTest {

    private static final String LOOP = String.join("\n",
            "tag: TIC-902",
            "process: {model: fopdt, gain: -0.9, time_constant: 120 s, dead_time: 10 s}",
            "tuning: {form: ideal, kc: 1.5, ti: 60 s, td: 0}",
            "target: {form: ideal-pb-repeats, scan: 1 s}",
            "ranges: {pv: 0..100, output: 0..100}", "");

    private static final CheckResult RESULT =
            LoopCheck.run(LoopFileReader.parseAll(LOOP, "invented.yaml").get(0), CheckPolicy.DEFAULT);

    @Test
    void both_loops_are_unstable_and_the_verdict_still_fails() {
        assertThat(RESULT.designStability().isStable()).isFalse();
        assertThat(RESULT.targetStability().isStable()).isFalse();
        assertThat(RESULT.verdict()).isEqualTo(Verdict.FAIL);
    }

    @Test
    void the_catalogue_reads_every_figure_as_not_stable() {
        for (LoopSide side : List.of(LoopSide.design(RESULT), LoopSide.target(RESULT))) {
            for (LoopFigure f : LoopFigure.values()) {
                assertThat(f.read(side)).as(f.name()).isInstanceOf(LoopFigure.Reading.NotStable.class);
                assertThat(f.text(side)).as(f.name()).isEqualTo("unstable");
                assertThat(f.csvCell(side)).as(f.name()).isEmpty();
            }
        }
    }

    @Test
    void the_text_table_prints_unstable_for_each_figure_and_names_both_loops() {
        String text = CheckReport.text(RESULT);
        for (LoopFigure f : List.of(LoopFigure.GAIN_MARGIN, LoopFigure.MAX_SENSITIVITY, LoopFigure.DELAY_MARGIN,
                LoopFigure.SETPOINT_IAE, LoopFigure.LOAD_PEAK)) {
            assertThat(text).containsPattern("\\Q" + f.label() + "\\E +unstable +unstable +\\Q" + f.unit() + "\\E");
        }
        assertThat(text).contains("the as-found loop is unstable and the as-left loop is unstable")
                .contains("margins, Ms and responses are left out");
    }

    @Test
    void the_html_table_prints_unstable_and_names_both_loops() throws IOException {
        StringWriter w = new StringWriter();
        HtmlLoopSection.write(w, new LoopOutcome(LoopRow.of(0, RESULT.loop()), RESULT, List.of()), false);
        String html = w.toString();
        assertThat(html).contains("<tr><th>gain margin</th><td class=\"num\">unstable</td><td class=\"num\">unstable</td>")
                .contains("<tr><th>max sensitivity Ms</th><td class=\"num\">unstable</td>")
                .contains("the as-found loop is unstable and the as-left loop is unstable");
    }

    @Test
    void the_json_holds_null_for_every_figure_and_its_notes_say_why() {
        ObjectNode n = CheckReport.node(RESULT);
        for (String side : List.of("design", "target")) {
            for (LoopFigure f : LoopFigure.values()) {
                String object = f.group().jsonObject();
                JsonNode holder = object == null ? n.get(side) : n.get(side).get(object);
                assertThat(holder.get(f.jsonKey()).isNull()).as(side + " " + f.name()).isTrue();
            }
            assertThat(n.get(side).get("stability").asText()).isEqualTo("unstable");
            assertThat(n.get(side).get("gain_margin_note").asText()).contains("unstable");
        }
    }

    @Test
    void a_scan_sweep_prints_unstable_instead_of_margins_at_every_scan() {
        LoopSpec loop = LoopFileReader.parseAll(LOOP, "invented.yaml").get(0);
        String text = SweepReport.text(org.loopform.check.ScanSweep.run(loop, 0.5, 4, CheckPolicy.DEFAULT));
        // unstable at every scan (see the class comment): PM, GM, Ms and IAE all read "unstable"
        List<String> rows = text.lines().filter(l -> l.trim().matches("^[0-9.]+ .*")).toList();
        assertThat(rows).isNotEmpty().allSatisfy(l -> assertThat(l).containsPattern(
                "unstable +unstable +unstable +unstable +fail"));
    }

    @Test
    void loops_csv_leaves_every_figure_blank_and_its_notes_say_why() {
        LoopOutcome o = new LoopOutcome(LoopRow.of(0, RESULT.loop()), RESULT, List.of());
        List<String> row = AuditRows.loopRow(o);
        List<String> columns = AuditRows.LOOP_COLUMNS;
        for (String c : LoopFigure.csvColumns(List.of(LoopFigure.values()))) {
            assertThat(row.get(columns.indexOf(c))).as(c).isEmpty();
        }
        assertThat(row.get(columns.indexOf("design_margin_notes"))).contains("unstable");
        assertThat(row.get(columns.indexOf("target_margin_notes"))).contains("unstable");
    }
}

package org.loopform.report;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayDeque;
import java.util.Deque;
import java.util.List;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.audit.LoopOutcome;

// plumbing: no published source needed (HTML structure, escaping and layout of loopform's own report)
@DisplayName("The HTML audit report")
class HtmlReportTest {

    static List<LoopOutcome> outcomes;
    static String withPlots;
    static String withoutPlots;

    @BeforeAll
    static void audit() throws Exception {
        outcomes = SampleAudit.outcomes();
        withPlots = SampleAudit.document(outcomes, true);
        withoutPlots = SampleAudit.document(outcomes, false);
    }

    static LoopOutcome outcome(String tag) {
        return outcomes.stream().filter(o -> o.row().tag().equals(tag)).findFirst().orElseThrow();
    }

    @Nested
    @DisplayName("is one well-formed, self-contained document")
    class Document {
        @Test
        void opens_and_closes_html_head_and_body() {
            assertThat(withPlots).startsWith("<!DOCTYPE html>").contains("<meta charset=\"utf-8\">")
                    .contains("<style>").endsWith("</html>\n");
        }

        @Test
        void has_balanced_tags_with_plots_and_without() {
            assertBalanced(withPlots);
            assertBalanced(withoutPlots);
        }

        @Test
        void fetches_nothing_and_runs_only_the_inline_filter_script() {
            assertThat(withPlots).doesNotContain(" src=", "<link", "@import", "url(", "href=\"http");
            assertThat(withPlots.split("<script", -1)).hasSize(2);
            assertThat(withPlots).contains("<script>\n" + HtmlIndex.FILTER_SCRIPT + "</script>");
        }

        @Test
        void has_one_section_per_row_with_a_unique_id() {
            Matcher m = Pattern.compile("<section class=\"loop[^\"]*\" id=\"([^\"]+)\"").matcher(withPlots);
            Set<String> ids = new java.util.HashSet<>();
            int n = 0;
            while (m.find()) {
                n++;
                ids.add(m.group(1));
            }
            assertThat(n).isEqualTo(outcomes.size());
            assertThat(ids).hasSize(n);
        }
    }

    @Nested
    @DisplayName("carries the cautions")
    class CautionsBox {
        @Test
        void states_the_short_caution_and_expands_it() {
            assertThat(withPlots).contains("class=\"cautions\"", Html.esc(Cautions.SHORT))
                    .contains("management-of-change", "in manual", "simulation",
                            "Safety instrumented functions are out of scope", "licensed engineering practice");
        }
    }

    @Nested
    @DisplayName("summary")
    class Summary {
        @Test
        void has_the_verdict_bar_and_tables() {
            assertThat(withPlots).contains("<section id=\"summary\">", "class=\"verdict-bar\"",
                    "<table id=\"verdict-counts\"", "<table id=\"topic-counts\"", "<table id=\"worst\"");
        }

        @Test
        void links_every_worst_loop_to_a_section_that_exists() {
            Matcher m = Pattern.compile("<a href=\"#([^\"]+)\">").matcher(withPlots);
            int links = 0;
            while (m.find()) {
                links++;
                assertThat(withPlots).contains("id=\"" + m.group(1) + "\"");
            }
            assertThat(links).isPositive();
        }

        @Test
        void lists_bad_rows_with_file_and_line() {
            LoopOutcome bad = outcome("TIC-900");
            assertThat(bad.ok()).isFalse();
            String where = bad.problems().get(0).replaceFirst("^(\\S+?:\\d+): .*$", "$1");
            assertThat(withPlots).contains("Rows not checked", "<li><b>" + Html.esc(where) + "</b>: ");
        }
    }

    @Nested
    @DisplayName("loop sections")
    class Sections {
        @Test
        void escape_a_tag_that_looks_like_markup() throws Exception {
            String s = SampleAudit.section(outcome("<TIC-1&2>"), true);
            assertThat(s).contains("<h2>&lt;TIC-1&amp;2&gt;</h2>").doesNotContain("<TIC-1", "&2>");
            assertThat(s).contains("id=\"" + Html.loopAnchor("<TIC-1&2>") + "\"");
            assertThat(Html.loopAnchor("<TIC-1&2>")).matches("[A-Za-z0-9_-]+");
            assertBalanced(s);
        }

        @Test
        void give_every_figure_row_a_unit() throws Exception {
            String s = SampleAudit.section(outcome("TIC-104"), false);
            Matcher rows = Pattern.compile("<tr><th>([^<]+)</th><td class=\"num\">[^<]*</td><td class=\"num\">"
                    + "[^<]*</td><td class=\"unit\">([^<]*)</td></tr>").matcher(s);
            int n = 0;
            while (rows.find()) {
                n++;
                assertThat(rows.group(2)).as(rows.group(1)).isNotBlank();
            }
            assertThat(n).isEqualTo(12); // eleven figures and the delay margin in scans
        }

        @Test
        void show_the_tuning_before_and_after_with_units() throws Exception {
            LoopOutcome o = outcome("TIC-104");
            String s = SampleAudit.section(o, false);
            assertThat(s).contains("Tuning, as-found (old) and as-left (new)", "old: " + o.result().conversion().from().id(),
                    "new: " + o.result().conversion().to().id());
            o.result().conversion().parameters().values().keySet().forEach(k -> assertThat(s)
                    .contains("<td class=\"sep\">" + k + "</td>")
                    .contains("<td class=\"unit\">" + Html.esc(org.loopform.form.FormUnits.of(
                            o.result().conversion().to(), k)) + "</td>"));
        }

        @Test
        void say_each_finding_with_its_figure_threshold_and_source() throws Exception {
            LoopOutcome o = outcome("FIC-201");
            String s = SampleAudit.section(o, false);
            o.result().findings().forEach(f -> {
                assertThat(s).contains(Html.esc(f.message()));
                if (!f.source().isEmpty()) {
                    assertThat(s).contains("source: " + Html.esc(f.source()));
                }
            });
            assertThat(s).contains("<span class=\"badge fail\">FAIL</span>");
        }

        @Test
        void draw_plots_only_when_asked_and_keep_lines_short() throws Exception {
            LoopOutcome o = outcome("TIC-104");
            String plotted = SampleAudit.section(o, true);
            assertThat(SampleAudit.section(o, false)).doesNotContain("<svg", "<polyline");
            Matcher m = Pattern.compile("<polyline [^>]*points=\"([^\"]*)\"").matcher(plotted);
            int lines = 0;
            while (m.find()) {
                lines++;
                assertThat(m.group(1).split(" ").length).isLessThanOrEqualTo(SvgPlot.Size.COMPACT.maxPoints() + 2);
            }
            assertThat(lines).isEqualTo(2 * LoopPlots.panels(o.result()).size());
        }

        @Test
        void say_so_when_there_is_no_process_model() throws Exception {
            String s = SampleAudit.section(outcome("PIC-12"), false);
            assertThat(s).contains("No process model").doesNotContain("Loop as-found (old) and as-left (new)");
        }

        @Test
        void give_a_bad_row_a_short_section_with_its_problems() throws Exception {
            LoopOutcome bad = outcome("TIC-900");
            String s = SampleAudit.section(bad, true);
            assertThat(s).contains("NOT CHECKED", "id=\"" + Html.rowAnchor(bad.row().index()) + "\"")
                    .doesNotContain("<svg");
            bad.problems().forEach(p -> assertThat(s).contains(Html.esc(p)));
        }
    }

    private static final Set<String> VOID = Set.of("meta", "br", "hr", "img", "input", "link", "col", "wbr");
    private static final Pattern TAG = Pattern.compile("<(/?)([A-Za-z][A-Za-z0-9]*)\\b[^>]*?(/?)>");

    /** Every element that opens closes, in order; void elements and self-closed SVG elements aside. */
    static void assertBalanced(String html) {
        String body = html.replaceAll("(?s)<style>.*?</style>", "").replaceFirst("<!DOCTYPE html>", "");
        assertThat(body).doesNotContain("<!--");
        Deque<String> open = new ArrayDeque<>();
        Matcher m = TAG.matcher(body);
        while (m.find()) {
            String name = m.group(2).toLowerCase(java.util.Locale.ROOT);
            if (VOID.contains(name) || !m.group(3).isEmpty()) {
                continue;
            }
            if (m.group(1).isEmpty()) {
                open.push(name);
            } else {
                assertThat(open).as("closing </%s> at %d", name, m.start()).isNotEmpty();
                assertThat(open.pop()).as("closing </%s> at %d", name, m.start()).isEqualTo(name);
            }
        }
        assertThat(open).as("elements left open").isEmpty();
        // no stray markup characters outside tags: every '<' starts a tag we matched
        assertThat(body.replaceAll(TAG.pattern(), "")).doesNotContain("<");
    }
}

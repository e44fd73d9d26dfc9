// plumbing: the report's index and print rules; no published source needed (source: none)
package org.loopform.report;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.loopform.audit.LoopOutcome;

/** The report's index of loops and its filter box: pure plumbing (markup), no figure of the main job. */
class HtmlIndexTest {

    @Test
    void every_loop_has_one_index_line_linking_to_its_section() throws Exception {
        List<LoopOutcome> outcomes = SampleAudit.outcomes();
        String doc = SampleAudit.document(outcomes, false);
        String index = doc.substring(doc.indexOf("<table id=\"loop-index\""), doc.indexOf("</table>",
                doc.indexOf("<table id=\"loop-index\"")));
        for (LoopOutcome o : outcomes) {
            String anchor = o.ok() ? Html.loopAnchor(o.result().loop().tag()) : Html.rowAnchor(o.row().index());
            assertThat(index).contains("href=\"#" + anchor + "\"");
            assertThat(doc).contains("id=\"" + anchor + "\"");
        }
        assertThat(index.split("<tr class=").length - 1).isEqualTo(outcomes.size());
    }

    @Test
    void the_filter_is_an_inline_script_and_nothing_is_fetched() throws Exception {
        String doc = SampleAudit.document(SampleAudit.outcomes(), false);
        assertThat(doc).contains("<input id=\"filter\"").contains("<script>\n(function ()")
                .doesNotContain("<script src").doesNotContain("src=\"http").doesNotContain("href=\"http");
    }

    @Test
    void printed_pages_carry_the_title_the_fingerprint_and_page_numbers() throws Exception {
        String doc = SampleAudit.document(SampleAudit.outcomes(), false);
        assertThat(doc).contains("@top-left { content: \"" + SampleAudit.INFO.title() + "\"")
                .contains("inputs " + SampleAudit.INFO.shortFingerprint())
                .contains("counter(page) \" of \" counter(pages)");
    }

    @Test
    void a_title_cannot_break_out_of_the_css_string() {
        AuditInfo info = new AuditInfo("a\"} body{x:y} </style><script>", "in", "now", "s");
        assertThat(HtmlStyle.pageBoxes(info)).doesNotContain("</style>").doesNotContain("\"}");
    }
}

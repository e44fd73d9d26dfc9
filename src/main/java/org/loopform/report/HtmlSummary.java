package org.loopform.report;

import java.io.IOException;
import java.io.Writer;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.loopform.audit.AuditSummary;
import org.loopform.check.Verdict;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;

/**
 * The top of the HTML report: what was audited, the cautions, and the summary (loops by verdict
 * as a bar and a table, findings by topic and severity, the worst loops with links to their
 * sections, and the rows that could not be checked).
 */
final class HtmlSummary {
    private HtmlSummary() {
    }

    /** Bad rows listed in the summary; the rest are in their sections, so the summary stays short. */
    static final int BAD_ROWS_LISTED = 200;

    private static final Pattern LOCATION = Pattern.compile("^(\\S+?:\\d+): (.*)$", Pattern.DOTALL);

    static void writeHeader(Writer w, AuditSummary s, AuditInfo info) throws IOException {
        w.write("<header class=\"report\"><h1>" + Html.esc(info.title()) + "</h1>\n<dl class=\"meta\">"
                + "<dt>input</dt><dd>" + Html.esc(info.input()) + "</dd>"
                + "<dt>written</dt><dd>" + Html.esc(info.generatedAt()) + "</dd>"
                + "<dt>settings</dt><dd>" + Html.esc(info.settings()) + "</dd>"
                + "<dt>loops</dt><dd>" + s.loops() + " loops read: " + s.checked() + " checked, " + s.badRowCount()
                + " not checked</dd></dl></header>\n");
    }

    static void writeCautions(Writer w) throws IOException {
        w.write("<aside class=\"cautions\" role=\"note\"><h2>Before you use any of this</h2>\n<p>"
                + Html.esc(Cautions.SHORT) + "</p>\n<ul>\n"
                + "<li><b>Review and management of change.</b> Every value here is a proposal. Have it reviewed and"
                + " approved under your site's management-of-change procedure before it goes into a controller.</li>\n"
                + "<li><b>Test first.</b> Enter new values with the loop in manual, or try them in a simulation or on a"
                + " test controller first. Watch the loop closely the first time it runs in automatic, and keep the"
                + " old values at hand to go back.</li>\n"
                + "<li><b>Safety instrumented functions are out of scope.</b> Do not use this report for safety"
                + " instrumented functions, interlocks or any loop that a safety case relies on.</li>\n"
                + "<li><b>The figures are only as good as the input.</b> They come from the process models and form"
                + " files given; a wrong model or form gives wrong figures that look just as tidy. A pass means the"
                + " checks found nothing, not that the loop is safe.</li>\n"
                + "<li><b>Site procedures come first.</b> Site procedures, local codes and licensed engineering"
                + " practice take precedence over anything in this report.</li>\n"
                + "</ul></aside>\n");
    }

    static void writeSummary(Writer w, AuditSummary s) throws IOException {
        StringBuilder sb = new StringBuilder("<section id=\"summary\"><h2>Summary</h2>\n<div class=\"cols\">\n<div>");
        sb.append("<h3>Loops by verdict</h3>\n").append(VerdictBar.svg(s));
        sb.append("<table id=\"verdict-counts\" class=\"summary\"><thead><tr><th>verdict</th>"
                + "<th class=\"num\">loops</th><th class=\"num\">share</th></tr></thead><tbody>\n");
        int total = Math.max(1, s.loops());
        for (Verdict v : new Verdict[] {Verdict.FAIL, Verdict.WARN, Verdict.PASS}) {
            verdictRow(sb, "<span class=\"badge " + v.id() + "\">" + v.id().toUpperCase(Locale.ROOT) + "</span>",
                    s.count(v), total);
        }
        verdictRow(sb, "<span class=\"badge bad\">NOT CHECKED</span>", s.badRowCount(), total);
        sb.append("<tr class=\"total\"><th>all</th><td class=\"num\">").append(s.loops())
                .append(" loops</td><td class=\"num\">100 %</td></tr>\n</tbody></table>\n<p class=\"note\">")
                .append(s.exactConversions()).append(" of ").append(s.checked())
                .append(" checked loops convert exactly; the others take the nearest setting the target can hold."
                        + "</p></div>\n");
        sb.append("<div><h3>Findings by topic and severity</h3>\n");
        Map<Topic, int[]> byTopic = s.byTopic();
        if (byTopic.isEmpty()) {
            sb.append("<p>No findings.</p>\n");
        } else {
            sb.append("<table id=\"topic-counts\" class=\"summary\"><thead><tr><th>topic</th><th class=\"num\">fail"
                    + "</th><th class=\"num\">warn</th><th class=\"num\">info</th></tr></thead><tbody>\n");
            int[] sums = new int[Severity.values().length];
            byTopic.forEach((t, c) -> {
                sb.append("<tr><th>").append(t.id()).append("</th>");
                for (Severity sev : new Severity[] {Severity.FAIL, Severity.WARN, Severity.INFO}) {
                    sums[sev.ordinal()] += c[sev.ordinal()];
                    sb.append("<td class=\"num\">").append(c[sev.ordinal()]).append("</td>");
                }
                sb.append("</tr>\n");
            });
            sb.append("<tr class=\"total\"><th>all (findings)</th>");
            for (Severity sev : new Severity[] {Severity.FAIL, Severity.WARN, Severity.INFO}) {
                sb.append("<td class=\"num\">").append(sums[sev.ordinal()]).append("</td>");
            }
            sb.append("</tr>\n</tbody></table>\n<p class=\"note\">Counts of findings; a loop may have several.</p>\n");
        }
        sb.append("</div>\n</div>\n");
        if (!s.assumptions().isEmpty()) {
            sb.append("<h3>Assumed where the loop list did not say</h3>\n<ul id=\"assumptions\">\n");
            s.assumptions().forEach((a, n) -> sb.append("<li>").append(n).append(n == 1 ? " loop: " : " loops: ")
                    .append(Html.esc(a)).append("</li>\n"));
            sb.append("</ul>\n");
        }
        writeWorst(sb, s.worst(), s.count(Verdict.FAIL) + s.count(Verdict.WARN));
        writeBadRows(sb, s.badRows(), s.badRowProblemCount());
        sb.append("</section>\n");
        w.write(sb.toString());
    }

    private static void verdictRow(StringBuilder sb, String label, int n, int total) {
        sb.append("<tr><th>").append(label).append("</th><td class=\"num\">").append(n)
                .append("</td><td class=\"num\">").append(Html.fig(100.0 * n / total, 3)).append(" %</td></tr>\n");
    }

    private static void writeWorst(StringBuilder sb, List<AuditSummary.Worst> worst, int notPassing) {
        sb.append("<h3>Worst loops first</h3>\n");
        if (worst.isEmpty()) {
            sb.append("<p>Every checked loop passed.</p>\n");
            return;
        }
        if (notPassing > worst.size()) {
            sb.append("<p class=\"note\">The ").append(worst.size()).append(" worst of ").append(notPassing)
                    .append(" loops that warn or fail; every loop has its section below, in input order.</p>\n");
        }
        sb.append("<table id=\"worst\" class=\"summary\"><thead><tr><th>tag</th><th>verdict</th>"
                + "<th class=\"num\">fail findings</th><th class=\"num\">warn findings</th><th>worst finding</th></tr>"
                + "</thead><tbody>\n");
        for (AuditSummary.Worst x : worst) {
            String v = x.verdict().id();
            sb.append("<tr><th><a href=\"#").append(Html.loopAnchor(x.tag())).append("\">").append(Html.esc(x.tag()))
                    .append("</a></th><td><span class=\"badge ").append(v).append("\">")
                    .append(v.toUpperCase(Locale.ROOT)).append("</span></td><td class=\"num\">").append(x.fails())
                    .append("</td><td class=\"num\">").append(x.warns()).append("</td><td>")
                    .append(Html.esc(x.headline())).append("</td></tr>\n");
        }
        sb.append("</tbody></table>\n");
    }

    private static void writeBadRows(StringBuilder sb, List<String> problems, long total) {
        if (problems.isEmpty()) {
            return;
        }
        sb.append("<h3>Rows not checked</h3>\n<ul class=\"badrows\">\n");
        for (String p : problems.subList(0, Math.min(problems.size(), BAD_ROWS_LISTED))) {
            Matcher m = LOCATION.matcher(p);
            sb.append("<li>").append(m.matches() ? "<b>" + Html.esc(m.group(1)) + "</b>: " + Html.esc(m.group(2))
                    : Html.esc(p)).append("</li>\n");
        }
        sb.append("</ul>\n");
        if (total > Math.min(problems.size(), BAD_ROWS_LISTED)) {
            sb.append("<p class=\"note\">").append(total - Math.min(problems.size(), BAD_ROWS_LISTED))
                    .append(" more problems are listed in their rows' sections below.</p>\n");
        }
    }
}

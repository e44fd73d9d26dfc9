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
import org.loopform.audit.InputFile;
import org.loopform.audit.SignOff;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.PolicyKey;
import org.loopform.findings.Severity;
import org.loopform.units.Numbers;
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
        SignOff so = info.signOff();
        StringBuilder sb = new StringBuilder("<header class=\"report\"><h1>").append(Html.esc(info.title()))
                .append("</h1>\n<dl class=\"meta\">");
        meta(sb, "change", so.change().isEmpty() ? null : so.change());
        meta(sb, "revision", so.revision().isEmpty() ? null : so.revision());
        meta(sb, "loop list", info.input());
        meta(sb, "written", info.generatedAt());
        meta(sb, "loopform", info.version());
        meta(sb, "settings", info.settings());
        meta(sb, "loops", s.loops() + " loops read: " + s.checked() + " checked, " + s.badRowCount() + " not checked");
        sb.append("<dt>input fingerprint</dt><dd><code class=\"fingerprint\">").append(info.fingerprint())
                .append("</code> <span class=\"note\">(SHA-256 over the files listed under Provenance)</span></dd>");
        sb.append("</dl>\n");
        writeSignOff(sb, so);
        sb.append("</header>\n");
        w.write(sb.toString());
    }

    private static void meta(StringBuilder sb, String name, String value) {
        if (value != null) {
            sb.append("<dt>").append(Html.esc(name)).append("</dt><dd>").append(Html.esc(value)).append("</dd>");
        }
    }

    /** Prepared, checked, approved: the names given, or blank lines to sign on paper; signature and date always by hand. */
    private static void writeSignOff(StringBuilder sb, SignOff so) {
        sb.append("<table id=\"signoff\" class=\"signoff\"><caption>Sign-off</caption>\n<thead><tr><th></th>"
                + "<th>name</th><th>signature</th><th>date</th></tr></thead><tbody>\n");
        signRow(sb, "prepared by", so.preparedBy());
        signRow(sb, "checked by", so.checkedBy());
        signRow(sb, "approved by", so.approvedBy());
        sb.append("<tr><th>change</th><td class=\"sign\">").append(Html.esc(so.change()))
                .append("</td><th>revision</th><td class=\"sign\">").append(Html.esc(so.revision()))
                .append("</td></tr>\n</tbody></table>\n");
    }

    private static void signRow(StringBuilder sb, String role, String name) {
        sb.append("<tr><th>").append(role).append("</th><td class=\"sign\">").append(Html.esc(name))
                .append("</td><td class=\"sign\"></td><td class=\"sign date\"></td></tr>\n");
    }

    /** Every input file with its SHA-256, and the policy in force with each threshold's unit. */
    static void writeProvenance(Writer w, AuditInfo info) throws IOException {
        StringBuilder sb = new StringBuilder("<section id=\"provenance\"><h2>Provenance</h2>\n");
        if (info.inputs().isEmpty()) {
            sb.append("<p class=\"note\">No input files were listed for this report.</p>\n");
        } else {
            sb.append("<table id=\"inputs\" class=\"summary\"><caption>Input files, as read</caption><thead><tr>"
                    + "<th>role</th><th>file</th><th>SHA-256</th></tr></thead><tbody>\n");
            for (InputFile f : info.inputs()) {
                sb.append("<tr><th>").append(Html.esc(f.role())).append("</th><td class=\"file\">")
                        .append(Html.esc(f.name())).append("</td><td>").append(f.fingerprinted() ? "<code class=\"fingerprint\">"
                        + f.sha256() + "</code>" : "not fingerprinted: not a regular file (a pipe is read once)")
                        .append("</td></tr>\n");
            }
            sb.append("</tbody></table>\n");
        }
        sb.append("<details class=\"policy\"><summary>Policy in force (").append(policyWords(info.policy()))
                .append(")</summary>\n<table id=\"policy\" class=\"summary\"><thead><tr><th>key</th>"
                        + "<th class=\"num\">value</th><th>unit</th><th class=\"num\">default</th></tr></thead><tbody>\n");
        for (PolicyKey k : PolicyKey.values()) {
            double v = info.policy().get(k);
            boolean changed = v != k.defaultValue();
            sb.append("<tr").append(changed ? " class=\"changed\"" : "").append("><th>").append(k.id())
                    .append("</th><td class=\"num\">").append(Numbers.plain(v)).append("</td><td class=\"unit\">")
                    .append(Html.esc(k.unit())).append("</td><td class=\"num\">").append(Numbers.plain(k.defaultValue()))
                    .append("</td></tr>\n");
        }
        sb.append("</tbody></table></details>\n</section>\n");
        w.write(sb.toString());
    }

    private static String policyWords(CheckPolicy p) {
        long changed = java.util.Arrays.stream(PolicyKey.values()).filter(k -> p.get(k) != k.defaultValue()).count();
        return changed == 0 ? "the defaults" : changed + (changed == 1 ? " threshold differs" : " thresholds differ")
                + " from the defaults";
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
                .append(" checked loops convert exactly; the others take the nearest setting the new form can hold."
                        + (s.withoutProcess() > 0 ? " " + Html.esc(AuditRows.noProcessSentence(s)) : "")
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

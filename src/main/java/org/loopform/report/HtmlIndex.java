package org.loopform.report;

import java.io.IOException;
import java.io.Reader;
import java.io.Writer;
import java.util.Comparator;
import java.util.Locale;
import java.util.stream.Collectors;
import org.loopform.audit.LoopOutcome;
import org.loopform.check.CheckResult;
import org.loopform.findings.Finding;
import org.loopform.form.Conversion;
import org.loopform.form.FormCodec;
import org.loopform.form.FormUnits;

/**
 * The report's index of every loop, one line each, in input order: tag (a link to its section),
 * verdict, the old form and values, the new form and the values to enter, and the worst finding.
 * A filter box above it (an inline script, nothing fetched) hides the lines that do not match; in
 * print it is a compact table of several dozen loops a page.
 */
final class HtmlIndex {
    private HtmlIndex() {
    }

    /** Characters of the worst finding shown in a line; its section has the whole text. */
    private static final int HEADLINE_CHARS = 110;

    /** The index line of one loop (rendered as the audit streams). */
    static String row(LoopOutcome o) {
        StringBuilder sb = new StringBuilder();
        if (!o.ok()) {
            String name = o.row().tag() == null || o.row().tag().isBlank() ? "row " + (o.row().index() + 1)
                    : o.row().tag();
            sb.append("<tr class=\"bad\"><th><a href=\"#").append(Html.rowAnchor(o.row().index())).append("\">")
                    .append(Html.esc(name)).append("</a></th><td><span class=\"badge bad\">NOT CHECKED</span></td>"
                            + "<td colspan=\"2\"></td><td>").append(Html.esc(shorten(String.join("; ", o.problems()))))
                    .append("</td></tr>\n");
            return sb.toString();
        }
        CheckResult r = o.result();
        Conversion c = r.conversion();
        String v = r.verdict().id();
        // a new loop tuned by rule: the rule and its values as published stand where the old tuning would
        String oldForm = o.row().tunedByRule() ? "rule " + RuleTuningText.title(o.row().ruleTuning()) : c.from().id();
        String oldValues = o.row().tunedByRule() ? RuleTuningText.values(o.row().ruleTuning())
                : r.loop().tuning().entrySet().stream().map(e -> e.getKey() + " "
                + FormUnits.asWritten(c.from(), e.getKey(), e.getValue())).collect(Collectors.joining(", "));
        StringBuilder newValues = new StringBuilder();
        c.entered().values().forEach((k, x) -> {
            if (newValues.length() > 0) {
                newValues.append(", ");
            }
            newValues.append(k).append(' ').append(c.refusal(k) != null ? "do not enter"
                    : FormCodec.show(c.to(), k, x, 6) + " " + FormUnits.of(c.to(), k));
        });
        if (c.entered().action() != null) {
            newValues.append(", action ").append(c.entered().action().id());
        }
        String worst = r.findings().stream().max(Comparator.comparing(Finding::severity))
                .filter(f -> f.severity() != org.loopform.findings.Severity.INFO)
                .map(f -> f.topic().id() + ": " + f.message()).orElse("");
        sb.append("<tr class=\"").append(v).append("\"><th><a href=\"#").append(Html.loopAnchor(r.loop().tag()))
                .append("\">").append(Html.esc(r.loop().tag())).append("</a></th><td><span class=\"badge ").append(v)
                .append("\">").append(v.toUpperCase(Locale.ROOT)).append("</span></td><td><span class=\"form\">")
                .append(Html.esc(oldForm)).append("</span> ").append(Html.esc(oldValues))
                .append("</td><td><span class=\"form\">").append(Html.esc(c.to().id())).append("</span> ")
                .append(Html.esc(newValues.toString())).append("</td><td>").append(Html.esc(shorten(worst)))
                .append("</td></tr>\n");
        return sb.toString();
    }

    private static String shorten(String s) {
        return s.length() <= HEADLINE_CHARS ? s : s.substring(0, HEADLINE_CHARS - 3) + "...";
    }

    /** The index: a filter box, then the table of every loop read from {@code rows}. */
    static void write(Writer w, int loops, Reader rows) throws IOException {
        w.write("<section id=\"index\"><h2>Every loop at a glance</h2>\n<p class=\"filter\"><label for=\"filter\">"
                + "Find a loop:</label> <input id=\"filter\" type=\"search\" placeholder=\"tag, verdict, form or finding\""
                + " autocomplete=\"off\"> <span id=\"filter-count\" class=\"note\">" + loops + " loops</span></p>\n"
                + "<table id=\"loop-index\" class=\"index\"><thead><tr><th>tag</th><th>verdict</th>"
                + "<th>as-found (old): form, values</th><th>as-left (new): form, values to enter</th>"
                + "<th>worst finding</th></tr></thead><tbody>\n");
        rows.transferTo(w);
        w.write("</tbody></table>\n</section>\n<script>\n" + FILTER_SCRIPT + "</script>\n");
    }

    /** Hides the index lines that do not contain every word typed (case ignored); no library, nothing fetched. */
    static final String FILTER_SCRIPT = """
            (function () {
              var box = document.getElementById('filter');
              var count = document.getElementById('filter-count');
              var rows = document.querySelectorAll('#loop-index tbody tr');
              box.addEventListener('input', function () {
                var words = box.value.toLowerCase().split(/\\s+/).filter(function (x) { return x.length > 0; });
                var shown = 0;
                rows.forEach(function (tr) {
                  var text = tr.textContent.toLowerCase();
                  var hit = words.every(function (x) { return text.indexOf(x) >= 0; });
                  tr.hidden = !hit;
                  if (hit) { shown++; }
                });
                count.textContent = shown + ' of ' + rows.length + ' loops';
              });
            })();
            """;
}

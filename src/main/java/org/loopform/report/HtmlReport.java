package org.loopform.report;

import java.io.IOException;
import java.io.Reader;
import java.io.Writer;
import org.loopform.audit.AuditSummary;
import org.loopform.audit.LoopOutcome;

/**
 * The audit report as one self-contained HTML file (inline CSS and SVG, one inline filter script,
 * nothing fetched from anywhere): the header and cautions, the summary, then a section per loop in input
 * order. Sections are written as the audit streams ({@link #writeLoopSection}) and joined under
 * the summary at the end ({@link #writeDocument}), so memory stays bounded.
 */
public final class HtmlReport {
    private HtmlReport() {
    }

    /**
     * One loop's section: verdict, values before and after, design and target figures, findings
     * in plain words and, if {@code withPlots}, its plots (kept small: a few hundred points a line).
     * A row that could not be checked gets a short section with its problems.
     */
    public static void writeLoopSection(Writer w, LoopOutcome o, boolean withPlots) throws IOException {
        HtmlLoopSection.write(w, o, withPlots);
    }

    /** One loop's line in the report's index (tag, verdict, old and new values, worst finding). */
    public static String indexRow(LoopOutcome o) {
        return HtmlIndex.row(o);
    }

    /**
     * The whole document: head with sign-off and provenance, cautions, summary, the index of every
     * loop read from {@code index}, then the sections read from {@code sections}.
     */
    public static void writeDocument(Writer out, AuditSummary summary, AuditInfo info, Reader index, Reader sections)
            throws IOException {
        writeDocument(out, summary, info, index, sections, "");
    }

    /**
     * As {@link #writeDocument(Writer, AuditSummary, AuditInfo, Reader, Reader)}, with {@code chain} (a
     * rendered {@link ChainSection}, or empty) between the summary and the index of loops.
     */
    public static void writeDocument(Writer out, AuditSummary summary, AuditInfo info, Reader index, Reader sections,
                                     String chain) throws IOException {
        out.write("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
                + "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n<title>"
                + Html.esc(info.title()) + "</title>\n<style>\n" + HtmlStyle.CSS + HtmlStyle.pageBoxes(info)
                + "</style>\n</head>\n<body>\n");
        HtmlSummary.writeHeader(out, summary, info);
        HtmlSummary.writeCautions(out);
        HtmlSummary.writeSummary(out, summary);
        HtmlReplaySection.writeSummary(out, summary.replay());
        out.write(chain);
        HtmlIndex.write(out, summary.loops(), index);
        HtmlSummary.writeProvenance(out, info);
        out.write("<main id=\"loops\">\n<h2 class=\"loops\">Loops, in input order</h2>\n");
        sections.transferTo(out);
        out.write("</main>\n<footer><p>Written by loopform. " + Html.esc(Cautions.SHORT) + "</p></footer>\n"
                + "</body>\n</html>\n");
    }
}

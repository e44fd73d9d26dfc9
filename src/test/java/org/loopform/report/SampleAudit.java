package org.loopform.report;

import java.io.BufferedReader;
import java.io.BufferedWriter;
import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.net.URISyntaxException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.loopform.audit.Audit;
import org.loopform.audit.AuditSummary;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopOutcome;
import org.loopform.audit.LoopRow;
import org.loopform.check.Verdict;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.LoopFileReader;

/**
 * Runs the invented sample loop list through the real audit and writes the HTML report the way
 * the audit command does: sections streamed to a temporary file, then joined under the summary.
 * Plots go to loops that warn or fail, up to {@link #PLOT_CAP}.
 */
final class SampleAudit {
    static final String RESOURCE = "sample-loops.yaml";
    static final int PLOT_CAP = 50;
    static final AuditInfo INFO = new AuditInfo("Loop audit: sample loops", RESOURCE, "2025-01-01 12:00 UTC",
            "policy default; 1 thread");

    private SampleAudit() {
    }

    static Path loopFile() {
        try {
            return Path.of(SampleAudit.class.getResource(RESOURCE).toURI());
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }

    static List<LoopRow> rows() {
        // shown relative to the working directory, which also lets a loop name a form file beside the list
        Path shown = Path.of("").toAbsolutePath().relativize(loopFile());
        return LoopFileReader.rows(loopFile(), shown.toString(), LoopDefaults.NONE);
    }

    /** The outcomes in input order, kept in memory (fine for a handful of loops). */
    static List<LoopOutcome> outcomes() {
        List<LoopOutcome> out = new ArrayList<>();
        Audit.run(rows().iterator(), CheckPolicy.DEFAULT, 1, out::add);
        return out;
    }

    /** The whole report, written to {@code target}, streaming the sections through a temporary file. */
    static void writeReport(Path target) throws IOException {
        Path sections = Files.createTempFile("loopform-sections", ".html");
        try {
            AuditSummary summary;
            StringBuilder index = new StringBuilder();
            try (BufferedWriter w = Files.newBufferedWriter(sections, StandardCharsets.UTF_8)) {
                int[] plotted = {0};
                summary = Audit.run(rows().iterator(), CheckPolicy.DEFAULT, 1, o -> {
                    boolean plots = o.ok() && o.result().verdict() != Verdict.PASS && plotted[0] < PLOT_CAP;
                    if (plots) {
                        plotted[0]++;
                    }
                    index.append(HtmlReport.indexRow(o));
                    section(w, o, plots);
                });
            }
            Files.createDirectories(target.toAbsolutePath().getParent());
            try (BufferedReader r = Files.newBufferedReader(sections, StandardCharsets.UTF_8);
                 BufferedWriter out = Files.newBufferedWriter(target, StandardCharsets.UTF_8)) {
                HtmlReport.writeDocument(out, summary, INFO, new java.io.StringReader(index.toString()), r);
            }
        } finally {
            Files.deleteIfExists(sections);
        }
    }

    /** The whole report as a string, every checked loop with plots if {@code plots}. */
    static String document(List<LoopOutcome> outcomes, boolean plots) throws IOException {
        AuditSummary summary = new AuditSummary();
        StringWriter sections = new StringWriter();
        StringBuilder index = new StringBuilder();
        for (LoopOutcome o : outcomes) {
            summary.add(o);
            index.append(HtmlReport.indexRow(o));
            HtmlReport.writeLoopSection(sections, o, plots);
        }
        StringWriter out = new StringWriter();
        HtmlReport.writeDocument(out, summary, INFO, new java.io.StringReader(index.toString()),
                new java.io.StringReader(sections.toString()));
        return out.toString();
    }

    static String section(LoopOutcome o, boolean plots) throws IOException {
        StringWriter w = new StringWriter();
        HtmlReport.writeLoopSection(w, o, plots);
        return w.toString();
    }

    private static void section(Writer w, LoopOutcome o, boolean plots) {
        try {
            HtmlReport.writeLoopSection(w, o, plots);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}

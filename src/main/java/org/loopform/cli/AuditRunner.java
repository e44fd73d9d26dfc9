package org.loopform.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.ZonedDateTime;
import java.time.format.DateTimeFormatter;
import java.util.Iterator;
import java.util.List;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import me.tongfei.progressbar.ProgressBarStyle;
import org.loopform.audit.Audit;
import org.loopform.audit.AuditSummary;
import org.loopform.audit.LoopRow;
import org.loopform.audit.Verdict;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Severity;
import org.loopform.io.AuditOutput;
import org.loopform.report.AuditInfo;
import org.loopform.report.AuditRows;
import org.loopform.report.Json;

/** Runs an audit for the audit and demo commands: progress on a terminal, outputs, summary, exit code. */
final class AuditRunner {
    private AuditRunner() {
    }

    private static void spec(PrintWriter out) {
        out.println("No loops were found in the input: it needs a header row and one loop a row (CSV), or a"
                + " 'loops:' list (YAML).");
        out.flush();
    }

    record Settings(String inputName, Path out, boolean force, boolean html, CheckPolicy policy, Severity failOn,
                    OutputFormat format, int threads, List<Path> inputs, String settingsText, long expectedRows) {
    }

    static int run(Iterator<LoopRow> rows, Settings s, PrintWriter out) {
        AuditOutput output = s.out() == null ? null : AuditOutput.create(s.out(), s.force(), s.html(), s.inputs());
        ProgressBar bar = System.console() != null && System.getenv("CI") == null ? new ProgressBarBuilder()
                .setTaskName("checking").setInitialMax(s.expectedRows()).setStyle(ProgressBarStyle.ASCII)
                .setUnit(" loops", 1).continuousUpdate().build() : null;
        AuditSummary summary;
        try {
            boolean html = output != null && output.html();
            summary = Audit.run(rows, s.policy(), s.threads(),
                    o -> output == null ? null : AuditOutput.render(o, html), (o, rendered) -> {
                        if (output != null) {
                            output.accept(o, rendered);
                        }
                        if (bar != null) {
                            bar.step();
                        }
                    });
            if (output != null) {
                output.finish(summary, new AuditInfo("loopform migration audit", s.inputName(),
                        ZonedDateTime.now().withNano(0).format(DateTimeFormatter.ISO_OFFSET_DATE_TIME), s.settingsText()));
            }
        } finally {
            if (bar != null) {
                bar.close();
            }
            if (output != null) {
                output.close();
            }
        }
        String folder = output == null ? null : output.folder().toString();
        if (s.format() == OutputFormat.json) {
            var n = AuditRows.summaryJson(summary);
            if (folder != null) {
                n.put("out", folder);
            }
            out.print(Json.write(n));
        } else {
            out.print(AuditRows.summaryText(summary, folder));
        }
        out.flush();
        if (summary.badRowCount() > 0) {
            return ExitCodes.BAD_INPUT;
        }
        if (summary.loops() == 0) {
            spec(out);
            return ExitCodes.BAD_INPUT;
        }
        Verdict w = summary.worstVerdict();
        boolean failed = w == Verdict.FAIL || s.failOn() == Severity.WARN && w == Verdict.WARN;
        return failed ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
    }
}

package org.loopform.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.ZonedDateTime;
import java.time.format.DateTimeFormatter;
import java.util.Iterator;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.loopform.audit.InputFile;
import org.loopform.audit.SignOff;
import org.loopform.io.CatalogLoader;
import java.util.function.LongSupplier;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import me.tongfei.progressbar.ProgressBarStyle;
import org.loopform.audit.Audit;
import org.loopform.audit.AuditSummary;
import org.loopform.audit.LoopRow;
import org.loopform.check.Verdict;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Severity;
import org.loopform.io.AuditOutput;
import org.loopform.report.AuditInfo;
import org.loopform.report.AuditRendering;
import org.loopform.report.HtmlReport;
import org.loopform.report.AuditRows;
import org.loopform.report.Json;
import org.loopform.report.AuditReplayRows;
import org.loopform.audit.AuditRecords;

/** Runs an audit for the audit and demo commands: progress on a terminal, outputs, summary, exit code. */
final class AuditRunner {
    private AuditRunner() {
    }

    /** Date, time, offset and zone: {@code 2026-03-01 14:05:09 +01:00 (Europe/Berlin)}. */
    private static final DateTimeFormatter WRITTEN_AT = DateTimeFormatter.ofPattern("yyyy-MM-dd HH:mm:ss xxx '('VV')'");

    /**
     * When the record was written: now, in the machine's zone; or, when the environment sets
     * {@code SOURCE_DATE_EPOCH} (seconds since 1970-01-01 UTC, the reproducible-builds.org
     * specification), that instant in UTC, so two runs on the same inputs write the same bytes.
     */
    static String writtenAt(String sourceDateEpoch) {
        java.time.Instant fixed = sourceDate(sourceDateEpoch);
        if (fixed == null) {
            return ZonedDateTime.now().withNano(0).format(WRITTEN_AT);
        }
        return fixed.atZone(java.time.ZoneId.of("UTC")).format(WRITTEN_AT);
    }

    /** The instant {@code SOURCE_DATE_EPOCH} names, or null when it is unset or blank; a bad value is bad input. */
    static java.time.Instant sourceDate(String sourceDateEpoch) {
        if (sourceDateEpoch == null || sourceDateEpoch.isBlank()) {
            return null;
        }
        long seconds;
        try {
            seconds = Long.parseLong(sourceDateEpoch.strip());
        } catch (NumberFormatException e) {
            seconds = -1;
        }
        if (seconds < 0 || seconds > 253_402_300_799L) {
            throw new org.loopform.units.BadInput("the environment variable SOURCE_DATE_EPOCH is '" + sourceDateEpoch
                    + "': it must be a whole number of seconds since 1970-01-01 00:00:00 UTC (unset it to use the clock)");
        }
        return java.time.Instant.ofEpochSecond(seconds);
    }

    private static void spec(PrintWriter err, String input) {
        err.println("loopform: " + input + ": no loops were found; a loop list needs a header row and one loop a row"
                + " (CSV), or a 'loops:' list (YAML)");
        err.flush();
    }

    /**
     * What one audit run needs: {@code inputs} are the files it must never write into, {@code files}
     * the fingerprinted inputs for the provenance (form files read by path are added at the end).
     */
    record Settings(String inputName, Path out, boolean force, boolean html, CheckPolicy policy, Severity failOn,
                    OutputFormat format, int threads, List<Path> inputs, String settingsText, Progress progress,
                    SignOff signOff, List<InputFile> files, long formReadMark, AuditRecords records) {

        /** Settings of an audit without records. */
        Settings(String inputName, Path out, boolean force, boolean html, CheckPolicy policy, Severity failOn,
                 OutputFormat format, int threads, List<Path> inputs, String settingsText, Progress progress,
                 SignOff signOff, List<InputFile> files, long formReadMark) {
            this(inputName, out, force, html, policy, failOn, format, threads, inputs, settingsText, progress, signOff,
                    files, formReadMark, null);
        }

        /** The same settings with {@code r} as the audit's records. */
        Settings withRecords(AuditRecords r) {
            return new Settings(inputName, out, force, html, policy, failOn, format, threads, inputs, settingsText,
                    progress, signOff, files, formReadMark, r);
        }
    }

    /**
     * How far through its input the audit is: bytes read of a known size (a CSV file; a pipe has no
     * size and shows bytes only), or loops counted with no total (the bundled demo). The input is
     * never read a second time to find its length.
     */
    record Progress(String unit, long unitSize, long total, LongSupplier position) {
        static Progress bytes(long size, LongSupplier bytesRead) {
            return new Progress(" MB", 1 << 20, size, bytesRead);
        }

        static final Progress UNKNOWN = new Progress(" loops", 1, -1, null);
    }

    static int run(Iterator<LoopRow> rows, Settings s, PrintWriter out, PrintWriter err) {
        return run(rows, s, out, err, "", null);
    }

    /**
     * As {@link #run(Iterator, Settings, PrintWriter, PrintWriter)}, with {@code chain} (HTML) under the
     * report's summary and {@code chainData} (null: none) as the {@code chain} key of loops.json and of
     * the printed JSON summary.
     */
    static int run(Iterator<LoopRow> rows, Settings s, PrintWriter out, PrintWriter err, String chain,
                   org.loopform.report.ChainSection.Chain chainData) {
        String reproducibleTime = System.getenv("SOURCE_DATE_EPOCH");
        writtenAt(reproducibleTime); // a bad value is refused before anything is written
        AuditOutput output = s.out() == null ? null : AuditOutput.create(s.out(), s.force(), s.html(), s.inputs(),
                AuditReplayRows.loopColumns(s.records() != null), AuditRows.ENTRY_COLUMNS)
                .fixTimes(sourceDate(reproducibleTime));
        Progress progress = s.progress();
        ProgressBar bar = System.console() != null && System.getenv("CI") == null ? new ProgressBarBuilder()
                .setTaskName("checking").setInitialMax(progress.total()).setStyle(ProgressBarStyle.ASCII)
                .setUnit(progress.unit(), progress.unitSize()).continuousUpdate().build() : null;
        BadRowLog badRows = new BadRowLog(err);
        AuditSummary summary;
        try {
            boolean html = output != null && output.html();
            summary = Audit.run(rows, s.policy(), s.threads(), s.records(),
                    o -> output == null ? null : AuditRendering.render(o, html), (o, r) -> {
                        if (output != null) {
                            output.accept(r.loopRow(), r.entryRows(), r.json(), r.section(), r.sectionWithPlots(), r.indexRow(),
                                    r.entryCells());
                        }
                        badRows.accept(o);
                        badRows.acceptRecord(o);
                        if (bar != null) {
                            if (progress.position() != null) {
                                bar.stepTo(Math.max(0, progress.position().getAsLong()));
                            } else {
                                bar.step();
                            }
                        }
                    });
            badRows.finish();
            if (summary.replay() != null && !summary.replay().unmatchedRecords().isEmpty()) {
                err.println("loopform: " + AuditReplayRows.withoutLoopWords(summary.replay()));
                err.flush();
            }
            if (output != null && summary.checked() == 0) {
                // every row was bad (or there were none): no folder of empty results; close() removes the temporary one
                err.println("loopform: no loop could be checked, so nothing was written to " + s.out());
                err.flush();
            } else if (output != null) {
                List<InputFile> files = new ArrayList<>(s.files());
                if (s.records() != null) {
                    files.addAll(s.records().source().filesRead());
                }
                for (InputFile f : CatalogLoader.formFilesReadSince(s.formReadMark())) {
                    if (files.stream().noneMatch(x -> x.name().equals(f.name()) && x.sha256().equals(f.sha256()))) {
                        files.add(f);
                    }
                }
                AuditInfo info = new AuditInfo("loopform migration audit", s.inputName(),
                        writtenAt(reproducibleTime), s.settingsText(), s.signOff(),
                        VersionProvider.version(), files, s.policy());
                Map<String, ObjectNode> more = new LinkedHashMap<>();
                // every number as the printed JSON has it: no binary noise (117.99999999999999)
                more.put("signoff", Json.tidy(AuditRows.signOffJson(info)));
                more.put("provenance", Json.tidy(AuditRows.provenanceJson(info)));
                if (chainData != null) {
                    more.put("chain", Json.tidy(org.loopform.report.ChainSection.json(chainData)));
                }
                output.finish(Json.tidy(AuditRows.summaryJson(summary)), more, (doc, index, sections) ->
                        HtmlReport.writeDocument(doc, summary, info, index, sections, chain));
            }
        } finally {
            if (bar != null) {
                bar.close();
            }
            if (output != null) {
                output.close();
            }
        }
        String folder = output == null || summary.checked() == 0 ? null : output.folder().toString();
        if (chainData != null && s.format() == OutputFormat.json) {
            out.print(org.loopform.report.ChainSection.summaryJsonText(summary, folder, chainData));
        } else {
            out.print(s.format().renderer().auditSummary(summary, folder));
        }
        out.flush();
        if (summary.badRowCount() > 0 || summary.replay() != null && summary.replay().unreadable() > 0) {
            return ExitCodes.BAD_INPUT;
        }
        if (summary.loops() == 0) {
            spec(err, s.inputName());
            return ExitCodes.BAD_INPUT;
        }
        Verdict w = summary.worstVerdict();
        boolean failed = w == Verdict.FAIL || s.failOn() == Severity.WARN && w == Verdict.WARN;
        return failed ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
    }
}

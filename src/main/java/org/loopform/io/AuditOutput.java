package org.loopform.io;

import com.fasterxml.jackson.core.JsonEncoding;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedWriter;
import java.io.IOException;
import java.io.Reader;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.Collection;
import java.util.Comparator;
import java.util.List;
import java.util.stream.Stream;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVPrinter;
import org.loopform.audit.AuditSummary;
import org.loopform.audit.LoopOutcome;
import org.loopform.audit.Verdict;
import org.loopform.report.AuditInfo;
import org.loopform.report.AuditRows;
import org.loopform.report.HtmlReport;

/**
 * Writes an audit's output folder as the results stream in: {@code loops.csv}, {@code loops.json},
 * {@code entry-sheet.csv} and, unless turned off, {@code report.html}. Everything goes into a
 * temporary folder beside the target first and is moved into place whole at {@link #finish}, so
 * a failed or interrupted audit leaves nothing half-written; an existing non-empty folder is
 * only replaced with {@code force}, and never when it holds an input.
 */
public final class AuditOutput implements AutoCloseable {

    /** Loops that warn or fail get plots in the report, up to this many (the report stays light). */
    public static final int PLOTTED_LOOPS = 100;

    private static final ObjectMapper MAPPER = new ObjectMapper();

    private final Path target;
    private final Path temp;
    private final boolean force;
    private final boolean html;
    private final CSVPrinter loopsCsv;
    private final CSVPrinter entrySheet;
    private final JsonGenerator json;
    private final Writer sections;
    private int plotted;
    private boolean finished;

    private AuditOutput(Path target, boolean force, boolean html) throws IOException {
        this.target = target;
        this.force = force;
        this.html = html;
        Path parent = target.getParent();
        Files.createDirectories(parent);
        this.temp = Files.createTempDirectory(parent, "." + target.getFileName() + ".tmp-");
        this.loopsCsv = new CSVPrinter(Files.newBufferedWriter(temp.resolve("loops.csv"), StandardCharsets.UTF_8),
                CSVFormat.RFC4180.builder().setHeader(AuditRows.LOOP_COLUMNS.toArray(String[]::new)).get());
        this.entrySheet = new CSVPrinter(Files.newBufferedWriter(temp.resolve("entry-sheet.csv"),
                StandardCharsets.UTF_8), CSVFormat.RFC4180.builder().setHeader(AuditRows.ENTRY_COLUMNS
                .toArray(String[]::new)).get());
        this.json = MAPPER.getFactory().createGenerator(temp.resolve("loops.json").toFile(), JsonEncoding.UTF8);
        json.useDefaultPrettyPrinter();
        json.writeStartObject();
        json.writeArrayFieldStart("loops");
        this.sections = html ? Files.newBufferedWriter(temp.resolve(".sections.html"), StandardCharsets.UTF_8) : null;
    }

    /**
     * Opens the output folder {@code out}. Refuses (exit 2) when it exists and is not empty without
     * {@code force}, or when any of {@code inputs} lies inside it.
     */
    public static AuditOutput create(Path out, boolean force, boolean html, Collection<Path> inputs) {
        Path abs = out.toAbsolutePath().normalize();
        for (Path in : inputs) {
            if (in != null && in.toAbsolutePath().normalize().startsWith(abs)) {
                throw new InputException(out + ": the output folder holds an input (" + in + "); choose another --out");
            }
        }
        if (Files.isRegularFile(abs)) {
            throw new InputException(out + ": is a file; --out needs a folder");
        }
        if (!force && Files.isDirectory(abs) && !isEmpty(abs)) {
            throw new InputException(out + ": the folder exists and is not empty; add --force to replace it, or"
                    + " choose another --out");
        }
        try {
            return new AuditOutput(abs, force, html);
        } catch (IOException e) {
            throw new InputException(out + ": cannot be written (" + e.getMessage() + ")");
        }
    }

    private static boolean isEmpty(Path dir) {
        try (Stream<Path> s = Files.list(dir)) {
            return s.findAny().isEmpty();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /**
     * One loop's output, rendered off the writing thread: its loops.csv row, its entry-sheet rows,
     * its loops.json element, and its report section without plots and (for loops that warn or
     * fail) with them. Rendering is the costly part; writing is then a copy.
     */
    public record Rendered(List<String> loopRow, List<List<String>> entryRows, String json, String section,
                           String sectionWithPlots) {
    }

    /** Renders {@code o}'s output; safe to call from any thread. */
    public static Rendered render(LoopOutcome o, boolean html) {
        try {
            String json = MAPPER.writerWithDefaultPrettyPrinter().writeValueAsString(AuditRows.loopJson(o));
            String plain = null;
            String plotted = null;
            if (html) {
                java.io.StringWriter w = new java.io.StringWriter();
                HtmlReport.writeLoopSection(w, o, false);
                plain = w.toString();
                if (o.ok() && o.result().verdict() != Verdict.PASS) {
                    java.io.StringWriter p = new java.io.StringWriter();
                    HtmlReport.writeLoopSection(p, o, true);
                    plotted = p.toString();
                }
            }
            return new Rendered(AuditRows.loopRow(o), AuditRows.entryRows(o), json, plain, plotted);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot render the audit output", e);
        }
    }

    /** Whether this output writes the HTML report (and so wants sections rendered). */
    public boolean html() {
        return html;
    }

    /** Writes one loop's rows (call in input order). */
    public void accept(LoopOutcome o) {
        accept(o, render(o, html));
    }

    /** Writes one loop's rendered rows (call in input order). */
    public void accept(LoopOutcome o, Rendered r) {
        try {
            loopsCsv.printRecord(r.loopRow());
            for (List<String> row : r.entryRows()) {
                entrySheet.printRecord(row);
            }
            json.writeRawValue(r.json());
            if (sections != null) {
                if (r.sectionWithPlots() != null && plotted < PLOTTED_LOOPS) {
                    plotted++;
                    sections.write(r.sectionWithPlots());
                } else {
                    sections.write(r.section());
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the audit output", e);
        }
    }

    /** Writes the summary and the report, then moves the folder into place. */
    public void finish(AuditSummary summary, AuditInfo info) {
        try {
            json.writeEndArray();
            json.writeFieldName("summary");
            MAPPER.writeTree(json, AuditRows.summaryJson(summary));
            json.writeEndObject();
            json.close();
            loopsCsv.close();
            entrySheet.close();
            if (sections != null) {
                sections.close();
                Path sectionFile = temp.resolve(".sections.html");
                try (Writer out = new BufferedWriter(Files.newBufferedWriter(temp.resolve("report.html"),
                        StandardCharsets.UTF_8)); Reader in = Files.newBufferedReader(sectionFile, StandardCharsets.UTF_8)) {
                    HtmlReport.writeDocument(out, summary, info, in);
                }
                Files.delete(sectionFile);
            }
            moveIntoPlace();
            finished = true;
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the audit output", e);
        }
    }

    private void moveIntoPlace() throws IOException {
        Path old = null;
        if (Files.exists(target)) {
            if (!force && !isEmpty(target)) {
                throw new InputException(target + ": the folder appeared while the audit ran; add --force");
            }
            old = target.resolveSibling("." + target.getFileName() + ".old-" + System.nanoTime());
            Files.move(target, old, StandardCopyOption.ATOMIC_MOVE);
        }
        Files.move(temp, target, StandardCopyOption.ATOMIC_MOVE);
        try {
            // a temporary folder is private to its owner; the finished one reads like any other
            Files.setPosixFilePermissions(target, java.nio.file.attribute.PosixFilePermissions.fromString("rwxr-xr-x"));
        } catch (UnsupportedOperationException e) {
            // not a POSIX file system: leave the platform's default
        }
        if (old != null) {
            deleteTree(old);
        }
    }

    /** The folder the output goes to. */
    public Path folder() {
        return target;
    }

    @Override
    public void close() {
        if (!finished) {
            try {
                json.close();
                loopsCsv.close();
                entrySheet.close();
                if (sections != null) {
                    sections.close();
                }
            } catch (IOException e) {
                // closing a half-written output that is about to be deleted
            }
            deleteTree(temp);
        }
    }

    private static void deleteTree(Path dir) {
        if (!Files.exists(dir)) {
            return;
        }
        try (Stream<Path> s = Files.walk(dir)) {
            s.sorted(Comparator.reverseOrder()).forEach(p -> {
                try {
                    Files.delete(p);
                } catch (IOException e) {
                    throw new UncheckedIOException(e);
                }
            });
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

}

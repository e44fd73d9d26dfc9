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
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.Optional;
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
 * {@code entry-sheet.csv}, unless turned off {@code report.html}, and loopform's marker
 * ({@value OutputFolder#MARKER}). Everything goes into a temporary folder beside the target first
 * and is moved into place whole at {@link #finish}, so a failed or interrupted audit leaves nothing
 * half-written; the temporary folder is removed on failure, on SIGTERM or Ctrl-C (a shutdown hook),
 * and, if the process was killed outright, by the next run writing beside it.
 *
 * <p>Nothing loopform did not write is ever deleted or replaced: an existing folder is replaced
 * only when it is empty, or when it holds loopform's marker and nothing but the files the marker
 * lists, unchanged (with {@code force}); never when an input (reached through links) lies inside it.
 */
public final class AuditOutput implements AutoCloseable {

    /** Loops that warn or fail get plots in the report, up to this many (the report stays light). */
    public static final int PLOTTED_LOOPS = 100;

    private static final ObjectMapper MAPPER = new ObjectMapper();

    private final Path shown;
    private final Path target;
    private final Path temp;
    private final boolean force;
    private final boolean html;
    private final List<Path> inputs;
    private final Thread cleanup;
    private final CSVPrinter loopsCsv;
    private final CSVPrinter entrySheet;
    private final JsonGenerator json;
    private final Writer sections;
    private int plotted;
    private boolean finished;
    private boolean abandoned;

    private AuditOutput(Path shown, Path target, boolean force, boolean html, List<Path> inputs) throws IOException {
        this.shown = shown;
        this.target = target;
        this.force = force;
        this.html = html;
        this.inputs = inputs;
        Path parent = target.getParent();
        OutputFolder.sweepStale(parent);
        this.temp = Files.createDirectory(parent.resolve(OutputFolder.scratchName(target, "tmp")));
        this.cleanup = new Thread(this::abandon, "loopform-output-cleanup");
        Runtime.getRuntime().addShutdownHook(cleanup);
        try {
            OutputFolder.markWriting(temp);
            this.loopsCsv = new CSVPrinter(Files.newBufferedWriter(temp.resolve("loops.csv"), StandardCharsets.UTF_8),
                    CSVFormat.RFC4180.builder().setHeader(AuditRows.LOOP_COLUMNS.toArray(String[]::new)).get());
            this.entrySheet = new CSVPrinter(Files.newBufferedWriter(temp.resolve("entry-sheet.csv"),
                    StandardCharsets.UTF_8), CSVFormat.RFC4180.builder().setHeader(AuditRows.ENTRY_COLUMNS
                    .toArray(String[]::new)).get());
            this.json = MAPPER.getFactory().createGenerator(temp.resolve("loops.json").toFile(), JsonEncoding.UTF8);
            json.useDefaultPrettyPrinter();
            json.writeStartObject();
            json.writeArrayFieldStart("loops");
            this.sections = html ? Files.newBufferedWriter(temp.resolve(".sections.html"), StandardCharsets.UTF_8)
                    : null;
        } catch (IOException | RuntimeException e) {
            abandon();
            Runtime.getRuntime().removeShutdownHook(cleanup);
            throw e;
        }
    }

    /**
     * Opens the output folder {@code out}. Refuses (exit 2) when any of {@code inputs} lies inside it
     * (both compared through links), when it is a file or a link to nothing, and when it exists, is not
     * empty and is not loopform's own; replaces loopform's own only with {@code force}.
     */
    public static AuditOutput create(Path out, boolean force, boolean html, Collection<Path> inputs) {
        Path target = real(out);
        List<Path> realInputs = new ArrayList<>();
        for (Path in : inputs) {
            if (in != null) {
                realInputs.add(real(in));
            }
        }
        checkReplaceable(out, target, force, realInputs);
        try {
            Files.createDirectories(target.getParent());
        } catch (IOException e) {
            throw new InputException(out + ": cannot be created (" + OutputFolder.reason(e) + " in "
                    + out.toAbsolutePath().normalize().getParent() + "); check the folder above it exists and is"
                    + " writable, or choose another --out");
        }
        try {
            return new AuditOutput(out, target, force, html, List.copyOf(realInputs));
        } catch (IOException e) {
            throw new InputException(out + ": cannot be written (" + OutputFolder.reason(e) + "); check the folder"
                    + " above it is writable and has free space, or choose another --out");
        }
    }

    /**
     * {@code p} with every link resolved: its real path when it exists, else its nearest existing
     * ancestor's real path with the rest appended. A link to nothing is an error.
     */
    private static Path real(Path p) {
        Path abs = p.toAbsolutePath().normalize();
        if (Files.isSymbolicLink(abs) && !Files.exists(abs)) {
            String to;
            try {
                to = Files.readSymbolicLink(abs).toString();
            } catch (IOException e) {
                to = "a path that cannot be read";
            }
            throw new InputException(p + ": is a link to " + to + ", which does not exist; create what it points to,"
                    + " or give another path");
        }
        Path existing = abs;
        Path rest = abs.getFileSystem().getPath("");
        while (existing != null && !Files.exists(existing)) {
            rest = existing.getFileName().resolve(rest);
            existing = existing.getParent();
        }
        if (existing == null) {
            return abs;
        }
        try {
            return existing.toRealPath().resolve(rest).normalize();
        } catch (IOException e) {
            return abs;
        }
    }

    private static void checkReplaceable(Path out, Path target, boolean force, List<Path> inputs) {
        for (Path in : inputs) {
            if (in.startsWith(target)) {
                throw new InputException(out + ": the output folder holds an input (" + in + "); choose another --out");
            }
        }
        if (Files.exists(target) && !Files.isDirectory(target)) {
            throw new InputException(out + ": is a file; --out needs a folder (choose another --out)");
        }
        if (!Files.isDirectory(target)) {
            return;
        }
        try {
            if (isEmpty(target)) {
                return;
            }
            Optional<List<String>> foreign = OutputFolder.foreignEntries(target);
            if (foreign.isEmpty()) {
                throw new InputException(out + ": the folder exists and loopform did not write it (it has no "
                        + OutputFolder.MARKER + " marker); loopform never replaces a folder it did not write: choose"
                        + " another --out, or empty the folder yourself");
            }
            if (!foreign.get().isEmpty()) {
                throw new InputException(out + ": the folder holds files loopform did not write or that were changed"
                        + " since (" + String.join(", ", foreign.get().subList(0, Math.min(5, foreign.get().size())))
                        + (foreign.get().size() > 5 ? ", ..." : "") + "); move them out, or choose another --out");
            }
            if (!force) {
                throw new InputException(out + ": the folder holds an earlier loopform output; add --force to replace"
                        + " it, or choose another --out");
            }
        } catch (IOException e) {
            throw new InputException(out + ": cannot be read (" + OutputFolder.reason(e) + "); check its permissions,"
                    + " or choose another --out");
        }
    }

    private static boolean isEmpty(Path dir) throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.findAny().isEmpty();
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
            throw cannotWrite(e);
        }
    }

    private InputException cannotWrite(IOException e) {
        return new InputException(shown + ": cannot be written (" + OutputFolder.reason(e) + "); check the disk has"
                + " free space and the folder is writable; nothing was written there");
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
            OutputFolder.markFinished(temp);
            moveIntoPlace();
        } catch (IOException e) {
            throw cannotWrite(e);
        }
    }

    private synchronized void moveIntoPlace() throws IOException {
        if (abandoned) {
            throw new InputException(shown + ": not written; loopform was stopped while writing it");
        }
        // the folder may have changed while the audit ran: check it again just before replacing it
        checkReplaceable(shown, target, force, inputs);
        Path old = null;
        if (Files.isDirectory(target) && isEmpty(target)) {
            Files.delete(target); // an empty folder holds nothing to lose (and fails here if that changed)
        } else if (Files.exists(target)) {
            old = target.resolveSibling(OutputFolder.scratchName(target, "old"));
            Files.move(target, old, StandardCopyOption.ATOMIC_MOVE);
        }
        try {
            Files.move(temp, target, StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException e) {
            if (old != null) {
                Files.move(old, target, StandardCopyOption.ATOMIC_MOVE);
            }
            throw e;
        }
        finished = true;
        try {
            // a temporary folder is private to its owner; the finished one reads like any other
            Files.setPosixFilePermissions(target, java.nio.file.attribute.PosixFilePermissions.fromString("rwxr-xr-x"));
        } catch (UnsupportedOperationException e) {
            // not a POSIX file system: leave the platform's default
        }
        if (old != null && !OutputFolder.removeOwn(old)) {
            // checked above, so only a change in the last instant leads here: keep what is there
            throw new InputException(shown + ": written; the earlier output was kept in " + old + " because"
                    + " something in it changed while loopform replaced it");
        }
    }

    /** Removes the temporary folder unless the output was moved into place (shutdown hook, failures). */
    private synchronized void abandon() {
        if (finished || abandoned) {
            return;
        }
        abandoned = true;
        try {
            OutputFolder.removeFiles(temp);
        } catch (IOException e) {
            // a file may still be open for writing: try once more after closing what we hold
            closeQuietly();
            try {
                OutputFolder.removeFiles(temp);
            } catch (IOException again) {
                // nothing more to do; the next run beside it sweeps it
            }
        }
    }

    /** The folder the output goes to, as the user named it (made absolute). */
    public Path folder() {
        return shown.toAbsolutePath().normalize();
    }

    @Override
    public void close() {
        if (!finished) {
            closeQuietly();
            abandon();
        }
        try {
            Runtime.getRuntime().removeShutdownHook(cleanup);
        } catch (IllegalStateException e) {
            // the JVM is shutting down: the hook is running or has run
        }
    }

    private void closeQuietly() {
        for (java.io.Closeable c : new java.io.Closeable[] {json, loopsCsv, entrySheet, sections}) {
            try {
                if (c != null) {
                    c.close();
                }
            } catch (IOException | RuntimeException e) {
                // closing a half-written output that is about to be deleted
            }
        }
    }
}

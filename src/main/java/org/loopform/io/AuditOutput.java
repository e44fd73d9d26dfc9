package org.loopform.io;

import com.fasterxml.jackson.core.JsonEncoding;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedWriter;
import java.io.IOException;
import java.io.Reader;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVPrinter;
import com.fasterxml.jackson.databind.JsonNode;

/**
 * Writes an audit's output folder as the results stream in: {@code loops.csv}, {@code loops.json},
 * {@code entry-sheet.csv} and {@code entry-sheet.xlsx}, unless turned off {@code report.html}, and loopform's marker
 * ({@value OutputFolder#MARKER}). Everything goes into a temporary folder beside the target first
 * and is moved into place whole at {@link #finish}, so a failed or interrupted audit leaves nothing
 * half-written; the temporary folder is removed on failure, on SIGTERM or Ctrl-C (a shutdown hook),
 * and, if the process was killed outright, by the next run writing beside it.
 *
 * <p>Nothing loopform did not write is ever deleted or replaced: an existing folder is replaced
 * only when it is empty, or when it holds loopform's marker and nothing but the files the marker
 * lists, unchanged (with {@code force}); never when an input (reached through links) lies inside it.
 *
 * <p>It writes what it is given and renders nothing: the rows, JSON elements and report sections
 * come rendered ({@code report.AuditRendering}), the report document through a {@link DocumentWriter}.
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
    /** The highest folder above the target that this run created (null: none), removed again on failure. */
    private final Path createdFolders;
    private final Thread cleanup;
    private final CSVPrinter loopsCsv;
    private final CSVPrinter entrySheet;
    private final JsonGenerator json;
    private final Writer sections;
    private final Writer index;
    private final java.io.OutputStream xlsxFile;
    private final EntrySheetXlsx xlsx;
    private int plotted;
    /** The time written into the entry sheet's workbook (null: the clock's, as the xlsx writer takes it). */
    private java.time.Instant fixedTime;
    private boolean finished;
    private boolean abandoned;

    /**
     * Writes {@code when} as the entry sheet workbook's creation time and its zip entries' times, so that
     * the whole folder is the same bytes on every run (the audit passes {@code SOURCE_DATE_EPOCH}).
     */
    public AuditOutput fixTimes(java.time.Instant when) {
        this.fixedTime = when;
        return this;
    }

    /** Writes the report document around its index lines and loop sections, read from {@code index} and {@code sections}. */
    @FunctionalInterface
    public interface DocumentWriter {
        void write(Writer out, Reader index, Reader sections) throws IOException;
    }

    private AuditOutput(Path shown, Path target, boolean force, boolean html, List<Path> inputs, Path createdFolders,
                        List<String> loopColumns, List<String> entryColumns) throws IOException {
        this.shown = shown;
        this.createdFolders = createdFolders;
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
                    CSVFormat.RFC4180.builder().setHeader(loopColumns.toArray(String[]::new)).get());
            this.entrySheet = new CSVPrinter(Files.newBufferedWriter(temp.resolve("entry-sheet.csv"),
                    StandardCharsets.UTF_8), CSVFormat.RFC4180.builder().setHeader(entryColumns
                    .toArray(String[]::new)).get());
            this.json = MAPPER.getFactory().createGenerator(temp.resolve("loops.json").toFile(), JsonEncoding.UTF8);
            json.useDefaultPrettyPrinter();
            json.writeStartObject();
            json.writeArrayFieldStart("loops");
            this.sections = html ? Files.newBufferedWriter(temp.resolve(".sections.html"), StandardCharsets.UTF_8)
                    : null;
            this.xlsxFile = new java.io.BufferedOutputStream(Files.newOutputStream(temp.resolve("entry-sheet.xlsx")));
            this.xlsx = new EntrySheetXlsx(xlsxFile, entryColumns, "loopform entry sheet");
            this.index = html ? Files.newBufferedWriter(temp.resolve(".index.html"), StandardCharsets.UTF_8) : null;
        } catch (IOException | RuntimeException e) {
            abandon();
            Runtime.getRuntime().removeShutdownHook(cleanup);
            throw e;
        }
    }

    /**
     * Opens the output folder {@code out}. Refuses (exit 2) when any of {@code inputs} lies inside it
     * (both compared through links), when it is a file or a link to nothing, and when it exists, is not
     * empty and is not loopform's own; replaces loopform's own only with {@code force}. The CSV files
     * get {@code loopColumns} and {@code entryColumns} as their headers.
     */
    public static AuditOutput create(Path out, boolean force, boolean html, Collection<Path> inputs,
                                     List<String> loopColumns, List<String> entryColumns) {
        Path target = OutputFolder.real(out);
        List<Path> realInputs = new ArrayList<>();
        for (Path in : inputs) {
            if (in != null) {
                realInputs.add(OutputFolder.real(in));
            }
        }
        OutputFolder.checkReplaceable(out, target, force, realInputs);
        Path created = null;
        for (Path p = target.getParent(); p != null && !Files.exists(p); p = p.getParent()) {
            created = p;
        }
        try {
            Files.createDirectories(target.getParent());
        } catch (IOException e) {
            throw new InputException(out + ": cannot be created (" + OutputFolder.reason(e) + " in "
                    + out.toAbsolutePath().normalize().getParent() + "); check the folder above it exists and is"
                    + " writable, or choose another --out");
        }
        try {
            return new AuditOutput(out, target, force, html, List.copyOf(realInputs), created, loopColumns, entryColumns);
        } catch (IOException e) {
            removeCreated(target.getParent(), created);
            throw new InputException(out + ": cannot be written (" + OutputFolder.reason(e) + "); check the folder"
                    + " above it is writable and has free space, or choose another --out");
        }
    }

    /** Whether this output writes the HTML report (and so wants sections rendered). */
    public boolean html() {
        return html;
    }

    /**
     * Writes one loop's rendered output (call in input order): its loops.csv row, its entry-sheet
     * rows (for the CSV, made safe; {@code entryCells} plain, for the workbook), its loops.json element, and its report section, with plots ({@code sectionWithPlots},
     * null when the loop wants none) while fewer than {@link #PLOTTED_LOOPS} loops have them.
     */
    public void accept(List<String> loopRow, List<List<String>> entryRows, String loopJson, String section,
                       String sectionWithPlots, String indexRow, List<List<String>> entryCells) {
        try {
            loopsCsv.printRecord(loopRow);
            for (List<String> row : entryRows) {
                entrySheet.printRecord(row);
            }
            for (List<String> row : entryCells) {
                xlsx.row(row);
            }
            json.writeRawValue(loopJson);
            if (index != null && indexRow != null) {
                index.write(indexRow);
            }
            if (sections != null) {
                if (sectionWithPlots != null && plotted < PLOTTED_LOOPS) {
                    plotted++;
                    sections.write(sectionWithPlots);
                } else {
                    sections.write(section);
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

    /**
     * Writes {@code summary} as loops.json's summary, each of {@code more} as a key of its own beside
     * it (the sign-off and provenance), and the report through {@code document}, then moves the folder
     * into place.
     */
    public void finish(JsonNode summary, java.util.Map<String, ? extends JsonNode> more, DocumentWriter document) {
        try {
            json.writeEndArray();
            for (var e : more.entrySet()) {
                json.writeFieldName(e.getKey());
                MAPPER.writeTree(json, e.getValue());
            }
            json.writeFieldName("summary");
            MAPPER.writeTree(json, summary);
            json.writeEndObject();
            json.close();
            loopsCsv.close();
            entrySheet.close();
            xlsx.finish();
            xlsxFile.close();
            if (fixedTime != null) {
                ReproducibleXlsx.fixTimes(temp.resolve("entry-sheet.xlsx"), fixedTime);
            }
            if (sections != null) {
                sections.close();
                index.close();
                Path sectionFile = temp.resolve(".sections.html");
                Path indexFile = temp.resolve(".index.html");
                try (Writer out = new BufferedWriter(Files.newBufferedWriter(temp.resolve("report.html"),
                        StandardCharsets.UTF_8)); Reader in = Files.newBufferedReader(sectionFile, StandardCharsets.UTF_8);
                     Reader idx = Files.newBufferedReader(indexFile, StandardCharsets.UTF_8)) {
                    document.write(out, idx, in);
                }
                Files.delete(sectionFile);
                Files.delete(indexFile);
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
        // the folder may have changed while the audit ran: swapIn checks it again just before replacing it
        OutputFolder.swapIn(shown, temp, target, force, inputs);
        finished = true;
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
        removeCreated(target.getParent(), createdFolders);
    }

    /** Removes the empty folders from {@code dir} up to {@code top} that a failed run created. */
    private static void removeCreated(Path dir, Path top) {
        if (top == null) {
            return;
        }
        for (Path p = dir; p != null && p.startsWith(top); p = p.getParent()) {
            try {
                Files.deleteIfExists(p); // only an empty folder can be deleted: anything put there stays
            } catch (IOException e) {
                return;
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
        for (java.io.Closeable c : new java.io.Closeable[] {json, loopsCsv, entrySheet, sections, index, xlsxFile}) {
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

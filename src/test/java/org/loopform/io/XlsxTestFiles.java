// plumbing: no published source needed (writes test workbooks)
package org.loopform.io;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Enumeration;
import java.util.function.Consumer;
import java.util.function.UnaryOperator;
import java.util.zip.ZipEntry;
import java.util.zip.ZipFile;
import java.util.zip.ZipOutputStream;
import org.dhatim.fastexcel.Workbook;
import org.dhatim.fastexcel.Worksheet;

/**
 * Writes xlsx workbooks for tests with fastexcel's writer (a program other than the reader under
 * test), and edits a written sheet's XML where the writer cannot go (a formula with a stored result).
 */
public final class XlsxTestFiles {

    private XlsxTestFiles() {
    }

    /** A workbook with one sheet named {@code sheet}, filled by {@code fill}. */
    public static Path write(Path file, String sheet, Consumer<Worksheet> fill) throws IOException {
        return write(file, wb -> fill.accept(wb.newWorksheet(sheet)));
    }

    /** A workbook filled by {@code fill} (which adds its sheets). */
    public static Path write(Path file, WorkbookFill fill) throws IOException {
        try (OutputStream out = Files.newOutputStream(file)) {
            Workbook wb = new Workbook(out, "loopform-test", "1.0");
            fill.accept(wb);
            wb.finish();
        }
        return file;
    }

    /** Fills a workbook. */
    public interface WorkbookFill {
        void accept(Workbook wb) throws IOException;
    }

    /**
     * A CSV text as a sheet, from row {@code firstRow} (0 is row 1): a cell that reads as a plain
     * number (digits, a point, an exponent) becomes a number cell, any other a text cell, an empty
     * one no cell.
     */
    public static void csvRows(Worksheet ws, int firstRow, String csv) {
        String[] lines = csv.split("\n");
        for (int r = 0; r < lines.length; r++) {
            String[] cells = lines[r].split(",", -1);
            for (int c = 0; c < cells.length; c++) {
                String v = cells[c].trim();
                if (v.isEmpty()) {
                    continue;
                }
                if (v.matches("[-+]?(\\d+\\.?\\d*|\\.\\d+)([eE][-+]?\\d+)?")) {
                    ws.value(firstRow + r, c, Double.parseDouble(v));
                } else {
                    ws.value(firstRow + r, c, v);
                }
            }
        }
    }

    /** Rewrites the XML of the first sheet ({@code xl/worksheets/sheet1.xml}) of a written workbook. */
    public static void editSheet(Path file, UnaryOperator<String> edit) throws IOException {
        editPart(file, "xl/worksheets/sheet1.xml", edit);
    }

    /** Rewrites the XML of the part {@code part} (say {@code xl/styles.xml}) of a written workbook. */
    public static void editPart(Path file, String part, UnaryOperator<String> edit) throws IOException {
        Path tmp = file.resolveSibling(file.getFileName() + ".tmp");
        try (ZipFile in = new ZipFile(file.toFile());
             ZipOutputStream out = new ZipOutputStream(Files.newOutputStream(tmp))) {
            for (Enumeration<? extends ZipEntry> e = in.entries(); e.hasMoreElements(); ) {
                ZipEntry entry = e.nextElement();
                byte[] bytes = in.getInputStream(entry).readAllBytes();
                if (entry.getName().equals(part)) {
                    bytes = edit.apply(new String(bytes, StandardCharsets.UTF_8)).getBytes(StandardCharsets.UTF_8);
                }
                out.putNextEntry(new ZipEntry(entry.getName()));
                out.write(bytes);
                out.closeEntry();
            }
        }
        Files.move(tmp, file, java.nio.file.StandardCopyOption.REPLACE_EXISTING);
    }
}

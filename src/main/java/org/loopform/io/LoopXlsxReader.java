package org.loopform.io;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Locale;
import java.util.NoSuchElementException;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.dhatim.fastexcel.reader.CellAddress;
import org.dhatim.fastexcel.reader.ReadableWorkbook;
import org.dhatim.fastexcel.reader.ReadingOptions;
import org.dhatim.fastexcel.reader.Row;
import org.dhatim.fastexcel.reader.Sheet;
import org.dhatim.fastexcel.reader.SheetVisibility;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;

/**
 * Reads a loop list from one sheet of an xlsx workbook, one loop a row, streaming the sheet's rows
 * (a long sheet needs no more memory than a short one, beyond the workbook's shared strings). The
 * columns, units and checks are those of a CSV loop list ({@link LoopListRows}); each cell is read
 * as the text a CSV file would hold there ({@link XlsxCell}). The header is the first row, among
 * the sheet's first {@value #HEADER_SEARCH_ROWS}, whose cells name the columns {@code tag} and
 * {@code form} (or {@code rule}, for a list of new loops); rows above it (titles, notes) are skipped, and so are empty rows and rows of merged
 * title cells below it. Every message names the cell: {@code loops.xlsx:Loops!C7: ti: ...}.
 *
 * <p>The sheet is the one named (or numbered from 1) by {@code sheet}, or else the first visible
 * sheet that has such a header. A file that is no xlsx workbook (text, an old .xls, a workbook
 * protected by a password, a damaged zip) stops at once with what to do.
 */
public final class LoopXlsxReader implements Iterator<LoopRow>, AutoCloseable {

    /** How far down a sheet the header is looked for: title rows above it are few. */
    static final int HEADER_SEARCH_ROWS = 100;
    private static final Pattern PLAIN_SHEET_NAME = Pattern.compile("[A-Za-z_][A-Za-z0-9_.]*");

    private final String name;
    private final ReadableWorkbook workbook;
    private final Sheet sheet;
    private final int sheetCount;
    private final String sheetRef;
    private final Stream<Row> stream;
    private final Iterator<Row> sheetRows;
    private final int headerRow;
    private final LoopListRows rows;
    private final XlsxMerges merges;
    private final int tagColumn;
    private LoopRow pending;
    private int lastRow;
    private int index;
    /** How many row elements of the sheet have been read (the header's and those above it included). */
    private int place;

    private LoopXlsxReader(String name, ReadableWorkbook workbook, Sheet sheet, int sheetCount, Stream<Row> stream,
                           Iterator<Row> sheetRows, Row header, int headerRow, int place, Path folder,
                           LoopDefaults defaults, XlsxMerges merges) {
        this.name = name;
        this.workbook = workbook;
        this.sheet = sheet;
        this.sheetCount = sheetCount;
        this.sheetRef = ref(sheet.getName());
        this.stream = stream;
        this.sheetRows = sheetRows;
        this.headerRow = headerRow;
        this.place = place;
        this.lastRow = headerRow;
        this.merges = merges;
        List<String> raw = new ArrayList<>();
        for (int k = 0; k < header.getCellCount(); k++) {
            XlsxCell c = XlsxCell.of(header.getCell(k), false);
            raw.add(c.bad() ? "" : c.text());
        }
        List<String> columns = LoopListRows.header(raw, at(headerRow, 0), k -> at(headerRow, k),
                LoopXlsxReader::letter);
        this.rows = new LoopListRows(name, folder, defaults, columns, LoopXlsxReader::letter);
        this.tagColumn = columns.indexOf("tag");
    }

    /**
     * Opens the workbook at {@code path} and finds its loop list: the sheet {@code sheetChoice} (a
     * name, or a number from 1; null for the first sheet with a loop-list header) and its header.
     */
    public static LoopXlsxReader open(Path path, String shownName, String sheetChoice, LoopDefaults defaults) {
        TextInput.check(path, shownName);
        if (!Files.isRegularFile(path)) {
            throw new InputException(shownName + ": an xlsx workbook must be read from a file (a pipe cannot be);"
                    + " save it to a file and give its path");
        }
        switch (WorkbookBytes.of(path, shownName)) {
            case EMPTY -> throw new InputException(shownName + ": the file is empty; an xlsx workbook is a zip archive"
                    + " saved by a spreadsheet program: save the loop list as an Excel workbook (.xlsx)");
            case TEXT -> throw new InputException(shownName + ": is text, not an xlsx workbook (a CSV file named"
                    + " .xlsx?); name a CSV loop list .csv, or save the list from the spreadsheet program as an Excel"
                    + " workbook (.xlsx)");
            case OLD_XLS -> throw new InputException(shownName + ": is an Excel 97-2003 workbook (.xls), which"
                    + " loopform does not read; save it as an Excel workbook (.xlsx), or save the sheet as CSV");
            case ENCRYPTED -> throw new InputException(shownName + ": is protected by a password (encrypted), so its"
                    + " sheets cannot be read; save a copy without the password (as .xlsx) and give that file");
            case ZIP -> {
                // an xlsx workbook, or another zip: the workbook reader tells them apart
            }
        }
        ReadableWorkbook workbook;
        try {
            workbook = new ReadableWorkbook(path.toFile(), new ReadingOptions(true, true));
        } catch (IOException | RuntimeException e) {
            throw notAWorkbook(shownName, e);
        }
        try {
            return find(path, shownName, workbook, sheetChoice, defaults);
        } catch (RuntimeException e) {
            closeQuietly(workbook);
            throw e;
        }
    }

    private static LoopXlsxReader find(Path path, String name, ReadableWorkbook workbook, String choice,
                                       LoopDefaults defaults) {
        List<Sheet> sheets;
        try {
            sheets = workbook.getSheets().toList();
        } catch (RuntimeException e) {
            throw notAWorkbook(name, e);
        }
        if (sheets.isEmpty()) {
            throw new InputException(name + ": the workbook has no sheet; put the loop list on a sheet");
        }
        for (int k = 0; k < sheets.size(); k++) {
            String sheetName = sheets.get(k).getName();
            if (sheetName == null || sheetName.isBlank()) {
                // the workbook's part lists a sheet without its name: no formula, no person and no --sheet can name it
                throw new InputException(name + ": sheet " + (k + 1) + " of " + sheets.size() + " has no name in the"
                        + " workbook; the workbook is damaged: open it in a spreadsheet program and save it again, or"
                        + " save the sheet as CSV");
            }
        }
        Path folder = path.toAbsolutePath().getParent();
        if (choice != null) {
            Sheet s = chosen(name, sheets, choice);
            Opened o = header(path, name, workbook, s);
            if (o == null) {
                throw new InputException(name + ":" + ref(s.getName()) + ": no header row with the columns tag and"
                        + " form (or rule) in the sheet's first " + HEADER_SEARCH_ROWS + " rows; put a header row (tag, form,"
                        + " kc, ti, td...) above the loops" + (sheets.size() > 1 ? ", or choose another sheet with"
                        + " --sheet (sheets: " + names(sheets) + ")" : ""));
            }
            return o.reader(name, sheets.size(), path, folder, defaults);
        }
        for (Sheet s : sheets) {
            if (s.getVisibility() != SheetVisibility.VISIBLE) {
                continue; // a hidden sheet is not the list a person sees
            }
            Opened o = header(path, name, workbook, s);
            if (o != null) {
                return o.reader(name, sheets.size(), path, folder, defaults);
            }
        }
        throw new InputException(name + ": no visible sheet has a loop-list header (a row naming the columns tag and"
                + " form, or tag and rule, in its first " + HEADER_SEARCH_ROWS + " rows; sheets: " + names(sheets) + "); add a header"
                + " row above the loops, or choose the sheet with --sheet NAME");
    }

    /** A sheet opened at its header row. */
    private record Opened(ReadableWorkbook workbook, Sheet sheet, Stream<Row> stream, Iterator<Row> rows, Row header,
                          int headerRow, int place, XlsxMerges merges) {
        LoopXlsxReader reader(String name, int sheetCount, Path path, Path folder, LoopDefaults defaults) {
            try {
                return new LoopXlsxReader(name, workbook, sheet, sheetCount, stream, rows, header, headerRow, place,
                        folder, defaults, merges);
            } catch (RuntimeException e) {
                stream.close();
                throw e;
            }
        }
    }

    private static Sheet chosen(String name, List<Sheet> sheets, String choice) {
        String c = choice.trim();
        for (Sheet s : sheets) {
            if (s.getName().equals(c)) {
                return s;
            }
        }
        List<Sheet> caseless = sheets.stream().filter(s -> s.getName().equalsIgnoreCase(c)).toList();
        if (caseless.size() == 1) {
            return caseless.get(0);
        }
        if (c.matches("\\d{1,9}")) {
            int n = Integer.parseInt(c);
            if (n >= 1 && n <= sheets.size()) {
                return sheets.get(n - 1);
            }
        }
        throw new InputException(name + ": --sheet " + choice + ": no such sheet; the workbook's sheets are "
                + names(sheets) + " (give a name, or a number from 1 to " + sheets.size() + ")");
    }

    /** The sheet's rows opened and read down to its header, or null (and closed) when it has none near the top. */
    private static Opened header(Path path, String name, ReadableWorkbook workbook, Sheet s) {
        // first the pass that finds merged titles and refuses cells beyond the last column
        XlsxMerges merges = XlsxMerges.of(path, s.getId(), name, s.getName());
        Stream<Row> stream;
        try {
            stream = s.openStream();
        } catch (IOException | RuntimeException e) {
            throw damaged(name, s.getName(), 0, e);
        }
        Iterator<Row> it = stream.iterator();
        int last = 0;
        int place = 0;
        try {
            while (it.hasNext()) {
                Row r = it.next();
                last = merges.rowNumber(++place, r.getRowNum());
                if (last > HEADER_SEARCH_ROWS) {
                    break;
                }
                if (isHeader(r)) {
                    return new Opened(workbook, s, stream, it, r, last, place, merges);
                }
            }
        } catch (RuntimeException e) {
            stream.close();
            throw damaged(name, s.getName(), last, e, merges);
        }
        stream.close();
        return null;
    }

    private static boolean isHeader(Row r) {
        boolean tag = false;
        boolean form = false;
        for (int k = 0; k < r.getCellCount(); k++) {
            XlsxCell c = XlsxCell.of(r.getCell(k), false);
            String t = c.bad() ? "" : c.text().trim().toLowerCase(Locale.ROOT);
            tag |= t.equals("tag");
            form |= t.equals("form") || t.equals(RuleCells.RULE); // a list of new loops gives a rule instead
        }
        return tag && form;
    }

    /** The sheet read (its name), for telling the user which was used. */
    public String sheetName() {
        return sheet.getName();
    }

    /** Where the list was found, for a note: {@code sheet 'Loops' (2 of 3), header in row 3}. */
    public String description() {
        return "sheet '" + sheet.getName() + "' (" + (sheet.getIndex() + 1) + " of " + sheetCount + "), header in row "
                + headerRow;
    }

    @Override
    public boolean hasNext() {
        while (pending == null) {
            Row r;
            try {
                if (!sheetRows.hasNext()) {
                    return false;
                }
                r = sheetRows.next();
            } catch (RuntimeException e) {
                // the library reads the file as it goes: a damaged sheet surfaces here
                throw damaged(name, sheet.getName(), lastRow, e, merges);
            }
            lastRow = merges.rowNumber(++place, r.getRowNum());
            pending = row(r, lastRow);
        }
        return true;
    }

    @Override
    public LoopRow next() {
        if (!hasNext()) {
            throw new NoSuchElementException();
        }
        LoopRow r = pending;
        pending = null;
        return r;
    }

    /** One sheet row as a loop row, or null for an empty row or a row of merged title cells. */
    private LoopRow row(Row r, int rowNum) {
        int width = Math.max(rows.columns().size(), r.getCellCount());
        List<String> values = new ArrayList<>(width);
        List<String> problems = new ArrayList<>();
        boolean any = false;
        boolean allWideMerges = true;
        for (int k = 0; k < width; k++) {
            String key = k < rows.columns().size() ? rows.columns().get(k) : "";
            String inFile = merges.cellProblem(rowNum, k);
            XlsxCell c = inFile != null ? XlsxCell.bad(inFile)
                    : XlsxCell.of(k < r.getCellCount() ? r.getCell(k) : null, LoopCsvReader.NUMERIC.contains(key));
            if (c.bad()) {
                problems.add(at(rowNum, k) + ": " + (key.isEmpty() ? "column " + letter(k) : key) + ": " + c.problem());
                values.add("");
                any = true;
                allWideMerges = false;
                continue;
            }
            values.add(c.text());
            if (!c.text().isBlank()) {
                any = true;
                allWideMerges &= merges.startsWideMerge(rowNum, k);
            }
        }
        if (!any || allWideMerges) {
            return null;
        }
        for (XlsxMerges.Range m : merges.covering(rowNum)) {
            // a merged cell shows its value over the range but stores it in the top-left cell alone:
            // the other rows (or cells) would read as empty, so as defaults; loopform does not spread it
            String key = m.firstColumn() < rows.columns().size() ? rows.columns().get(m.firstColumn()) : "";
            problems.add(at(rowNum, m.firstColumn()) + ": " + (key.isEmpty() ? "column " + letter(m.firstColumn())
                    : key) + ": " + m.ref() + " is merged (its value is stored in " + letter(m.firstColumn())
                    + m.firstRow() + " alone); unmerge it and fill each " + (m.spansRows() ? "row" : "cell"));
        }
        String where = at(rowNum, Math.max(0, tagColumn));
        return rows.row(index++, values, where, k -> at(rowNum, k), rowNum, first -> at(first, tagColumn), problems);
    }

    /** {@code loops.xlsx:Loops!C7}: the file, the sheet and the cell. */
    private String at(int row, int column) {
        return name + ":" + sheetRef + "!" + letter(column) + row;
    }

    /** Column letters: 0 is A, 25 is Z, 26 is AA. */
    static String letter(int column) {
        return CellAddress.convertNumToColString(column);
    }

    /** A sheet name as a formula writes it: quoted (with quotes doubled) unless it is a plain word. */
    static String ref(String sheetName) {
        return PLAIN_SHEET_NAME.matcher(sheetName).matches() ? sheetName : "'" + sheetName.replace("'", "''") + "'";
    }

    private static String names(List<Sheet> sheets) {
        return String.join(", ", sheets.stream().map(s -> "'" + s.getName() + "'").toList());
    }

    private static InputException notAWorkbook(String name, Exception e) {
        return new InputException(name + ": not a valid xlsx workbook (" + reason(e) + "); open it in a spreadsheet"
                + " program and save it again as an Excel workbook (.xlsx), or save the sheet as CSV");
    }

    private static InputException damaged(String name, String sheet, int afterRow, Exception e, XlsxMerges merges) {
        if (merges.firstDateCell() != null && reason(e).contains("cell type")) {
            return new InputException(name + ":" + ref(sheet) + "!" + merges.firstDateCell() + ": the cell holds a date"
                    + " written as text (cell type d, ISO 8601), which loopform does not read, and the rows after it"
                    + " cannot be read either; type the value as a number or text in its place (open the workbook in"
                    + " a spreadsheet program, change the cell and save it)");
        }
        return damaged(name, sheet, afterRow, e);
    }

    private static InputException damaged(String name, String sheet, int afterRow, Exception e) {
        return new InputException(name + ":" + ref(sheet) + ": the sheet cannot be read" + (afterRow > 0
                ? " after row " + afterRow : "") + " (" + reason(e) + "); the workbook may be damaged: open it in a"
                + " spreadsheet program and save it again, or save the sheet as CSV");
    }

    /** The first message along {@code e}'s causes (past wrappers), on one line, at most 160 characters. */
    static String reason(Throwable e) {
        Throwable t = e;
        while ((t instanceof UncheckedIOException || t.getMessage() == null) && t.getCause() != null) {
            t = t.getCause();
        }
        String m = t.getMessage() == null ? t.getClass().getSimpleName() : t.getMessage();
        m = m.replaceAll("\\s+", " ").trim();
        return m.length() > 160 ? m.substring(0, 160) + "..." : m;
    }

    private static void closeQuietly(ReadableWorkbook w) {
        try {
            w.close();
        } catch (IOException ignored) {
            // the file is given up on already
        }
    }

    @Override
    public void close() {
        try {
            stream.close();
        } finally {
            closeQuietly(workbook);
        }
    }
}

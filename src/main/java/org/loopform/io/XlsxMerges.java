package org.loopform.io;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.zip.ZipEntry;
import java.util.zip.ZipFile;
import javax.xml.stream.XMLInputFactory;
import javax.xml.stream.XMLStreamConstants;
import javax.xml.stream.XMLStreamException;
import javax.xml.stream.XMLStreamReader;
import org.dhatim.fastexcel.reader.CellAddress;

/**
 * The merged cells of one sheet: those that span two columns or more by their top-left cell, so that a
 * row of merged title cells can be told from a loop, and every merged range by the rows it covers, so
 * that a loop row with merged cells (a value shown in several rows but stored in the first) is refused.
 * A sheet lists its merged ranges after its rows
 * ({@code <mergeCells>} follows {@code <sheetData>}, ECMA-376 Part 1, {@code CT_Worksheet}; from
 * memory), so they are read first in a pass of their own that keeps nothing but the ranges. The
 * sheet's part is found as the Open Packaging Conventions say: the package relationship of type
 * {@code officeDocument} names the workbook, whose relationships name each sheet's part by id.
 *
 * <p>The same pass notes what the row reader does not see or gets wrong: a cell written twice in a
 * row (it keeps the last), a shared-string index past the workbook's strings (it reads an empty
 * cell), the number of a row written without one (it counts row elements instead), and the first
 * cell of type {@code d} (it stops the sheet there). It keeps only those exceptions, not the rows.
 *
 * <p>The same pass refuses a cell placed beyond the last column a sheet can have (XFD, column
 * 16,384; common practice for xlsx): the row reader would otherwise make room for every column up
 * to it, which a damaged or hostile file could use to exhaust memory.
 */
final class XlsxMerges {

    private static final String OFFICE_DOCUMENT = "/officeDocument";
    /** Columns a sheet can have: A to XFD. */
    static final int MAX_COLUMNS = 16_384;
    private static final java.util.regex.Pattern COLUMN_LETTERS = java.util.regex.Pattern.compile("\\$?([A-Za-z]+)");

    private final Map<Long, Integer> widthByTopLeft;
    /** Every merged range, by its first row. */
    private final List<Range> ranges;
    /** The ranges that may cover the row asked last, and the next range not yet among them. */
    private final List<Range> active = new ArrayList<>();
    private int next;
    private int lastAsked;

    /** Problems of single cells the row reader does not see (a cell given twice, a shared string that is not there). */
    private final Map<Long, String> cellProblems;
    /** The row number of each row element written without one ({@code <row>} with no {@code r}), by its place. */
    private final Map<Integer, Integer> rowByPlace;
    /** The first cell of type {@code d} (a date as ISO 8601 text), which the row reader stops at; null if none. */
    private final String firstDateCell;

    private XlsxMerges(Map<Long, Integer> widthByTopLeft, List<Range> ranges, Map<Long, String> cellProblems,
                       Map<Integer, Integer> rowByPlace, String firstDateCell) {
        this.widthByTopLeft = widthByTopLeft;
        this.cellProblems = cellProblems;
        this.rowByPlace = rowByPlace;
        this.firstDateCell = firstDateCell;
        this.ranges = ranges.stream().sorted(Comparator.comparingInt(Range::firstRow)).toList();
    }

    static XlsxMerges none() {
        return new XlsxMerges(Map.of(), List.of(), Map.of(), Map.of(), null);
    }

    /** A merged range: rows from 1, columns from 0, both ends included; {@code ref} as the file writes it. */
    record Range(int firstRow, int lastRow, int firstColumn, int lastColumn, String ref) {
        boolean spansRows() {
            return lastRow > firstRow;
        }
    }

    /**
     * The merged ranges that cover {@code row} (from 1), left to right. Rows are asked for in the
     * order a sheet lists them (rising); a row asked out of order starts the search again.
     */
    List<Range> covering(int row) {
        if (row < lastAsked) {
            active.clear();
            next = 0;
        }
        lastAsked = row;
        while (next < ranges.size() && ranges.get(next).firstRow() <= row) {
            active.add(ranges.get(next++));
        }
        active.removeIf(r -> r.lastRow() < row);
        return active.stream().sorted(Comparator.comparingInt(Range::firstColumn)).toList();
    }

    /** Whether the cell at {@code row} (from 1) and {@code column} (from 0) starts a merge over two columns or more. */
    boolean startsWideMerge(int row, int column) {
        return widthByTopLeft.containsKey(key(row, column));
    }

    /** What is wrong with the cell at {@code row} (from 1) and {@code column} (from 0) in the file itself, or null. */
    String cellProblem(int row, int column) {
        return cellProblems.get(key(row, column));
    }

    /**
     * The number of the {@code place}-th row element (from 1) of the sheet: its {@code r}, or for a
     * row written without one the number after the row before it (ECMA-376 Part 1, 18.3.1.73
     * {@code row}; from memory), which the row reader does not follow (it counts row elements).
     */
    int rowNumber(int place, int readerNumber) {
        return rowByPlace.getOrDefault(place, readerNumber);
    }

    /** The first cell holding a date as ISO 8601 text ({@code t="d"}), such as {@code D2}, or null. */
    String firstDateCell() {
        return firstDateCell;
    }

    private static long key(int row, int column) {
        return ((long) row << 20) | column;
    }

    /**
     * The wide merges of the sheet whose relationship id is {@code sheetRelationId}, or none when the
     * package does not say (the rows are then read without this help: a title row becomes a bad row).
     */
    static XlsxMerges of(Path workbook, String sheetRelationId, String shownName, String sheetName) {
        try (ZipFile zip = new ZipFile(workbook.toFile())) {
            String book = target(zip, "_rels/.rels", "", null);
            if (book == null) {
                return none();
            }
            int slash = book.lastIndexOf('/');
            String folder = slash < 0 ? "" : book.substring(0, slash + 1);
            String rels = folder + "_rels/" + book.substring(slash + 1) + ".rels";
            String sheet = target(zip, rels, folder, sheetRelationId);
            ZipEntry entry = sheet == null ? null : zip.getEntry(sheet);
            String strings = targetOfType(zip, rels, folder, "/sharedStrings");
            // no shared-string part: the workbook has none, so a cell that names one names what is not there
            int stringCount = strings == null || zip.getEntry(strings) == null ? 0 : countStrings(zip,
                    zip.getEntry(strings));
            return entry == null ? none() : read(zip, entry, shownName, sheetName, stringCount);
        } catch (InputException e) {
            throw e;
        } catch (IOException | XMLStreamException | RuntimeException e) {
            return none(); // a damaged package: the row reader reports it, with its position
        }
    }

    /** The target of a relationship in {@code relsPart} (by id, or the officeDocument one when id is null). */
    private static String target(ZipFile zip, String relsPart, String folder, String id)
            throws IOException, XMLStreamException {
        ZipEntry e = zip.getEntry(relsPart);
        if (e == null) {
            return null;
        }
        try (InputStream in = zip.getInputStream(e)) {
            XMLStreamReader r = factory().createXMLStreamReader(in);
            while (r.hasNext()) {
                if (r.next() == XMLStreamConstants.START_ELEMENT && r.getLocalName().equals("Relationship")) {
                    String type = r.getAttributeValue(null, "Type");
                    boolean match = id == null ? type != null && type.endsWith(OFFICE_DOCUMENT)
                            : id.equals(r.getAttributeValue(null, "Id"));
                    if (match) {
                        String t = r.getAttributeValue(null, "Target");
                        return t == null ? null : t.startsWith("/") ? t.substring(1) : folder + t;
                    }
                }
            }
        }
        return null;
    }

    /** The number of strings ({@code <si>}) in the shared-string part. */
    private static int countStrings(ZipFile zip, ZipEntry part) throws IOException, XMLStreamException {
        int count = 0;
        try (InputStream in = zip.getInputStream(part)) {
            XMLStreamReader r = factory().createXMLStreamReader(in);
            while (r.hasNext()) {
                if (r.next() == XMLStreamConstants.START_ELEMENT && r.getLocalName().equals("si")) {
                    count++;
                }
            }
        }
        return count;
    }

    /** The target of the first relationship in {@code relsPart} whose type ends with {@code typeEnd}, or null. */
    private static String targetOfType(ZipFile zip, String relsPart, String folder, String typeEnd)
            throws IOException, XMLStreamException {
        ZipEntry e = zip.getEntry(relsPart);
        if (e == null) {
            return null;
        }
        try (InputStream in = zip.getInputStream(e)) {
            XMLStreamReader r = factory().createXMLStreamReader(in);
            while (r.hasNext()) {
                if (r.next() == XMLStreamConstants.START_ELEMENT && r.getLocalName().equals("Relationship")) {
                    String type = r.getAttributeValue(null, "Type");
                    String t = r.getAttributeValue(null, "Target");
                    if (type != null && type.endsWith(typeEnd) && t != null) {
                        return t.startsWith("/") ? t.substring(1) : folder + t;
                    }
                }
            }
        }
        return null;
    }

    private static XlsxMerges read(ZipFile zip, ZipEntry sheet, String shownName, String sheetName, int stringCount)
            throws IOException, XMLStreamException {
        Map<Long, Integer> merges = new HashMap<>();
        List<Range> all = new ArrayList<>();
        Map<Long, String> cellProblems = new HashMap<>();
        Map<Integer, Integer> rowByPlace = new HashMap<>();
        String firstDate = null;
        java.util.Set<Integer> columnsInRow = new java.util.HashSet<>();
        int place = 0;
        int row = 0;
        int column = -1;
        long sharedCell = -1;
        try (InputStream in = zip.getInputStream(sheet)) {
            XMLStreamReader r = factory().createXMLStreamReader(in);
            while (r.hasNext()) {
                if (r.next() != XMLStreamConstants.START_ELEMENT) {
                    continue;
                }
                if (r.getLocalName().equals("row")) {
                    place++;
                    String number = r.getAttributeValue(null, "r");
                    int given = number == null ? -1 : parseRow(number);
                    row = given > 0 ? given : row + 1;
                    if (given <= 0 && row != place) {
                        rowByPlace.put(place, row);
                    }
                    column = -1;
                    columnsInRow.clear();
                    sharedCell = -1;
                } else if (r.getLocalName().equals("c")) {
                    String ref = r.getAttributeValue(null, "r");
                    if (ref != null && beyondLastColumn(ref)) {
                        throw new InputException(shownName + ":" + LoopXlsxReader.ref(sheetName) + ": a cell is"
                                + " placed at " + (ref.length() > 20 ? ref.substring(0, 20) + "..." : ref) + ", beyond"
                                + " column XFD, the last a sheet can have; the workbook is damaged: open it in a"
                                + " spreadsheet program and save it again, or save the sheet as CSV");
                    }
                    column = ref == null ? column + 1 : columnOf(ref, column + 1);
                    String at = LoopXlsxReader.letter(column) + row;
                    if (!columnsInRow.add(column)) {
                        cellProblems.putIfAbsent(key(row, column), "the cell " + at + " is written twice in the"
                                + " sheet's file, with two values; the workbook is damaged: open it in a spreadsheet"
                                + " program and save it again, or type the row again");
                    }
                    String type = r.getAttributeValue(null, "t");
                    sharedCell = "s".equals(type) ? key(row, column) : -1;
                    if ("d".equals(type) && firstDate == null) {
                        firstDate = at;
                    }
                } else if (r.getLocalName().equals("v") && sharedCell >= 0 && stringCount >= 0) {
                    String index = r.getElementText().trim();
                    boolean there;
                    try {
                        there = Integer.parseInt(index) < stringCount && Integer.parseInt(index) >= 0;
                    } catch (NumberFormatException e) {
                        there = false;
                    }
                    if (!there) {
                        cellProblems.putIfAbsent(sharedCell, "the cell names shared string " + index + ", but the"
                                + " workbook has " + (stringCount == 0 ? "none" : stringCount + " (0 to "
                                + (stringCount - 1) + ")") + "; the workbook"
                                + " is damaged at this cell: open it in a spreadsheet program and save it again, or"
                                + " type the value again");
                    }
                    sharedCell = -1;
                } else if (r.getLocalName().equals("mergeCell")) {
                    String ref = r.getAttributeValue(null, "ref");
                    int colon = ref == null ? -1 : ref.indexOf(':');
                    if (colon > 0) {
                        CellAddress from = new CellAddress(ref.substring(0, colon));
                        CellAddress to = new CellAddress(ref.substring(colon + 1));
                        int width = to.getColumn() - from.getColumn() + 1;
                        if (width >= 2) {
                            merges.put(key(from.getRow() + 1, from.getColumn()), width);
                        }
                        if (width >= 2 || to.getRow() > from.getRow()) {
                            all.add(new Range(from.getRow() + 1, to.getRow() + 1, from.getColumn(), to.getColumn(),
                                    ref));
                        }
                    }
                }
            }
        }
        return new XlsxMerges(merges, all, cellProblems, rowByPlace, firstDate);
    }

    /** The row number of {@code 12}, or -1 when it is none. */
    private static int parseRow(String number) {
        try {
            return Integer.parseInt(number.trim());
        } catch (NumberFormatException e) {
            return -1;
        }
    }

    /** The column (from 0) of a cell reference such as {@code C7}, or {@code otherwise} when it names none. */
    private static int columnOf(String ref, int otherwise) {
        java.util.regex.Matcher m = COLUMN_LETTERS.matcher(ref);
        if (!m.lookingAt()) {
            return otherwise;
        }
        String letters = m.group(1).toUpperCase(java.util.Locale.ROOT);
        int column = 0;
        for (int k = 0; k < letters.length(); k++) {
            column = column * 26 + (letters.charAt(k) - 'A' + 1);
        }
        return column - 1;
    }

    /** Whether a cell reference such as {@code C7} names a column past XFD (letters compared by count, then value). */
    static boolean beyondLastColumn(String ref) {
        java.util.regex.Matcher m = COLUMN_LETTERS.matcher(ref);
        if (!m.lookingAt()) {
            return false; // not a reference: the row reader says what is wrong
        }
        String letters = m.group(1).toUpperCase(java.util.Locale.ROOT);
        if (letters.length() > 3) {
            return true;
        }
        int column = 0;
        for (int k = 0; k < letters.length(); k++) {
            column = column * 26 + (letters.charAt(k) - 'A' + 1);
        }
        return column > MAX_COLUMNS;
    }

    /** A StAX factory that reads no DTD and resolves no external entity (a workbook is untrusted input). */
    private static XMLInputFactory factory() {
        XMLInputFactory f = XMLInputFactory.newFactory();
        f.setProperty(XMLInputFactory.SUPPORT_DTD, false);
        f.setProperty(XMLInputFactory.IS_SUPPORTING_EXTERNAL_ENTITIES, false);
        return f;
    }
}

package org.loopform.io;

import java.io.IOException;
import java.io.OutputStream;
import java.util.List;
import java.util.regex.Pattern;
import org.dhatim.fastexcel.Position;
import org.dhatim.fastexcel.Workbook;
import org.dhatim.fastexcel.Worksheet;

/**
 * The entry sheet as an .xlsx workbook, written row by row as the audit streams (FastExcel): a bold
 * header row frozen and repeated on every printed page, landscape A4 fitted to the page width, page
 * numbers in the footer. A plain decimal is written as a number cell; everything else as a text
 * cell, which a spreadsheet never evaluates, so a tag such as {@code =1+1} stays text as it is. A row
 * flagged do-not-enter (its {@code do_not_enter} cell {@code yes}) is shaded {@link #DO_NOT_ENTER_FILL}
 * across the whole row, so it stands out on a printed sheet too.
 */
final class EntrySheetXlsx {

    private static final Pattern PLAIN_NUMBER = Pattern.compile("[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?");
    /** Column widths in characters, by header name; others get {@link #DEFAULT_WIDTH}. */
    private static final double DEFAULT_WIDTH = 12;

    private final Workbook workbook;
    private final Worksheet sheet;
    /** A light red fill (RGB hex) for the rows not to be entered; dark text stays readable on it, in print too. */
    static final String DO_NOT_ENTER_FILL = "FFC7CE";

    private final int columns;
    /** The index of the {@code do_not_enter} column; -1 when the header has none. */
    private final int doNotEnterColumn;
    private int row;

    EntrySheetXlsx(OutputStream out, List<String> header, String title) {
        this.workbook = new Workbook(out, "loopform", "1.0");
        this.sheet = workbook.newWorksheet("entry sheet");
        this.columns = header.size();
        this.doNotEnterColumn = header.indexOf("do_not_enter");
        for (int c = 0; c < header.size(); c++) {
            sheet.value(0, c, header.get(c));
            sheet.style(0, c).bold().borderStyle(org.dhatim.fastexcel.BorderSide.BOTTOM, "thin").set();
            sheet.width(c, width(header.get(c)));
        }
        sheet.freezePane(0, 1);
        sheet.repeatRows(0);
        sheet.pageOrientation("landscape");
        sheet.paperSize(org.dhatim.fastexcel.PaperSize.A4_PAPER);
        sheet.setFitToPage(true);
        sheet.fitToWidth((short) 1);
        sheet.fitToHeight((short) 0);
        sheet.header(title, Position.LEFT);
        sheet.footer("page &P of &N", Position.RIGHT);
        this.row = 1;
    }

    private static double width(String column) {
        return switch (column) {
            case "tag", "target_form", "note" -> 22;
            case "as_left", "entered_by", "entered_on" -> 16;
            default -> DEFAULT_WIDTH;
        };
    }

    void row(List<String> cells) throws IOException {
        for (int c = 0; c < Math.min(columns, cells.size()); c++) {
            String v = cells.get(c);
            if (v == null || v.isEmpty()) {
                continue;
            }
            if (PLAIN_NUMBER.matcher(v).matches()) {
                sheet.value(row, c, Double.parseDouble(v));
            } else {
                sheet.value(row, c, v);
            }
        }
        if (doNotEnterColumn >= 0 && doNotEnterColumn < cells.size() && "yes".equals(cells.get(doNotEnterColumn))) {
            for (int c = 0; c < columns; c++) {
                sheet.style(row, c).fillColor(DO_NOT_ENTER_FILL).set();
            }
        }
        row++;
        if (row % 1000 == 0) {
            sheet.flush();
        }
    }

    void finish() throws IOException {
        sheet.finish();
        workbook.finish();
    }
}

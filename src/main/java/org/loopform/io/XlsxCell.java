package org.loopform.io;

import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import java.util.Set;
import org.dhatim.fastexcel.reader.Cell;
import org.dhatim.fastexcel.reader.CellType;

/**
 * One cell of a sheet read as the text a CSV loop list would hold in its place, or the reason it
 * cannot be. A text cell is its text; a number cell is its stored value written with the fewest
 * digits that give back the same binary64 number (0.1 stays {@code 0.1}), whatever number format
 * the cell shows it with; a formula cell is its stored (cached) result. A date or time, TRUE or
 * FALSE, an error value, a formula without a stored result, a number formatted as a percentage
 * where a number is expected, and a number whose format shows text beside it (a unit: {@code 0" s"}),
 * which would be read in another unit than the one shown, are not read.
 */
record XlsxCell(String text, String problem) {

    /**
     * The error values a cell can hold: ECMA-376 Part 1's {@code ST_CellErrorValue} (the first seven) and
     * those later spreadsheet programs add (from memory; an unknown one is read as text and then fails as a number).
     */
    private static final Set<String> ERRORS = Set.of("#NULL!", "#DIV/0!", "#VALUE!", "#REF!", "#NAME?", "#NUM!",
            "#N/A", "#GETTING_DATA", "#SPILL!", "#CALC!", "#FIELD!", "#BLOCKED!", "#CONNECT!", "#BUSY!", "#UNKNOWN!",
            "#EXTERNAL!", "#PYTHON!");
    /** Binary64 needs at most 17 significant decimal digits to be written back exactly (IEEE 754, 5.12.2; from memory). */
    private static final int MAX_DIGITS = 17;

    static final XlsxCell EMPTY = new XlsxCell("", null);

    static XlsxCell text(String text) {
        return new XlsxCell(text == null ? "" : text, null);
    }

    static XlsxCell bad(String problem) {
        return new XlsxCell("", problem);
    }

    boolean bad() {
        return problem != null;
    }

    /**
     * Reads {@code cell} (null for a cell that is not in the file) for a column that takes a number
     * when {@code numeric}. Problems are the end of a message ("the cell holds ...; fix").
     */
    static XlsxCell of(Cell cell, boolean numeric) {
        if (cell == null) {
            return EMPTY;
        }
        CellType type = cell.getType();
        Object value = cell.getValue();
        switch (type) {
            case EMPTY:
                return EMPTY;
            case STRING:
                return text(value == null ? "" : value.toString());
            case BOOLEAN:
                return bad("the cell holds " + booleanText(value) + ", not " + (numeric ? "a number" : "text")
                        + "; type the value, or clear the cell");
            case ERROR:
                String raw = cell.getRawValue();
                if (raw != null && !ERRORS.contains(raw.trim())) {
                    // the reader marks a cell whose stored text does not parse as its type as an error too
                    return bad("the cell stores '" + shorten(raw) + "', which is not what its type says it holds (a"
                            + " number cell with no number in it); the workbook is damaged at this cell: type the"
                            + " value again in a spreadsheet program and save the workbook");
                }
                return bad("the cell holds the error " + (raw == null ? "value" : raw.trim())
                        + "; correct it in the workbook, or type the value");
            case NUMBER:
                return number(cell, (BigDecimal) value, numeric, "");
            case FORMULA:
                return formula(cell, value, numeric);
            default:
                return bad("the cell's type (" + type + ") is not read; type the value as a number or text");
        }
    }

    private static XlsxCell formula(Cell cell, Object value, boolean numeric) {
        String formula = "=" + cell.getFormula();
        if (value == null) {
            return bad("the formula " + formula + " has no stored result (the workbook was saved by a program that"
                    + " does not calculate); open it in a spreadsheet program, recalculate and save it, or type the"
                    + " value");
        }
        if (value instanceof BigDecimal number) {
            return number(cell, number, numeric, " (the result of " + formula + ")");
        }
        if (value instanceof Boolean b) {
            return bad("the formula " + formula + " gives " + booleanText(b) + ", not " + (numeric ? "a number"
                    : "text") + "; type the value");
        }
        String text = value.toString();
        if (ERRORS.contains(text.trim())) {
            return bad("the formula " + formula + " gives the error " + text.trim() + "; correct it in the workbook,"
                    + " or type the value");
        }
        return text(text);
    }

    private static XlsxCell number(Cell cell, BigDecimal value, boolean numeric, String from) {
        if (value == null) {
            return EMPTY;
        }
        String shown = plain(value);
        String format;
        Integer formatId;
        try {
            format = cell.getDataFormatString();
            formatId = cell.getDataFormatId();
        } catch (RuntimeException e) {
            // a style whose number format id is not a number: whether it shows a date cannot be told
            return bad("the cell's number format cannot be read (the workbook may be damaged), so loopform cannot"
                    + " tell a number from a date; format the cell as a number (General) and save the workbook again");
        }
        if (isDateFormat(formatId, format)) {
            return bad("the cell holds a date or time" + from + " (stored as " + shown + "), not " + (numeric
                    ? "a number" : "text") + "; format the cell as a number (General) or as text and type the value");
        }
        if (numeric && isPercentFormat(formatId, format)) {
            return bad("the cell is formatted as a percentage" + from + ": it shows " + plain(value.movePointRight(2))
                    + "% but holds " + shown + "; loopform does not guess which was meant: format the cell as a"
                    + " number (General) and type the value the column takes (a band of 150 % is 150), or type it as"
                    + " text with its unit ('150 %')");
        }
        String literal = format == null ? "" : literalText(format);
        if (!literal.isEmpty()) {
            return bad("the cell shows '" + shownWith(format, value) + "' through its number format (" + format + ")"
                    + from + " but stores " + shown + "; loopform reads only what is stored: type the value with its"
                    + " unit as text ('" + shownWith(format, value).trim() + "') or clear the format");
        }
        return text(shown);
    }

    /**
     * The text a number format shows beside the number, in its first section: quoted strings, escaped
     * characters ({@code \s}), currency sections ({@code [$EUR-407]}) and bare letters, other than the
     * format codes {@code General} and the exponent {@code E+}/{@code E-}; spaces alone are no text.
     * Empty when the format shows the number alone. (Number format codes: ECMA-376 Part 1, 18.8.31
     * {@code numFmts}; from memory.)
     */
    static String literalText(String format) {
        StringBuilder out = new StringBuilder();
        String f = firstSection(format).replaceAll("(?i)general", "").replaceAll("(?i)e[-+]", "");
        for (int k = 0; k < f.length(); k++) {
            char c = f.charAt(k);
            if (c == '"') {
                int end = f.indexOf('"', k + 1);
                out.append(f, k + 1, end < 0 ? f.length() : end);
                k = end < 0 ? f.length() : end;
            } else if (c == '\\') {
                if (k + 1 < f.length()) {
                    out.append(f.charAt(k + 1));
                }
                k++;
            } else if (c == '_' || c == '*') {
                k++; // spacing: the width of a character, or a fill; no text
            } else if (c == '[') {
                int end = f.indexOf(']', k + 1);
                String inside = end < 0 ? "" : f.substring(k + 1, end);
                if (inside.startsWith("$")) {
                    int dash = inside.indexOf('-');
                    out.append(inside, 1, dash < 0 ? inside.length() : dash); // a currency symbol
                }
                k = end < 0 ? f.length() : end;
            } else if (Character.isLetter(c)) {
                out.append(c);
            }
        }
        return out.toString().isBlank() ? "" : out.toString();
    }

    /** The first section of a number format (the one for positive numbers): up to the first ';' outside quotes. */
    private static String firstSection(String format) {
        boolean quoted = false;
        for (int k = 0; k < format.length(); k++) {
            char c = format.charAt(k);
            if (c == '"') {
                quoted = !quoted;
            } else if (c == '\\' && !quoted) {
                k++;
            } else if (c == ';' && !quoted) {
                return format.substring(0, k);
            }
        }
        return format;
    }

    /**
     * About what a cell shows: {@code value} with as many decimals as the format's first section has
     * digit places after its point, in place of the format's digit codes, and its text around it.
     */
    static String shownWith(String format, BigDecimal value) {
        String f = firstSection(format);
        StringBuilder out = new StringBuilder();
        boolean numberDone = false;
        for (int k = 0; k < f.length(); k++) {
            char c = f.charAt(k);
            if (c == '"') {
                int end = f.indexOf('"', k + 1);
                out.append(f, k + 1, end < 0 ? f.length() : end);
                k = end < 0 ? f.length() : end;
            } else if (c == '\\') {
                if (k + 1 < f.length()) {
                    out.append(f.charAt(k + 1));
                }
                k++;
            } else if (c == '_') {
                k++;
                out.append(' ');
            } else if (c == '*') {
                k++;
            } else if (c == '[') {
                int end = f.indexOf(']', k + 1);
                String inside = end < 0 ? "" : f.substring(k + 1, end);
                if (inside.startsWith("$")) {
                    int dash = inside.indexOf('-');
                    out.append(inside, 1, dash < 0 ? inside.length() : dash);
                }
                k = end < 0 ? f.length() : end;
            } else if ("0#?.,".indexOf(c) >= 0) {
                int end = k;
                while (end < f.length() && "0#?.,".indexOf(f.charAt(end)) >= 0) {
                    end++;
                }
                if (!numberDone) {
                    String digits = f.substring(k, end);
                    int point = digits.indexOf('.');
                    int decimals = point < 0 ? 0 : digits.length() - point - 1 - (int) digits.substring(point + 1)
                            .chars().filter(ch -> ch == ',').count();
                    out.append(value.setScale(Math.max(0, decimals), RoundingMode.HALF_UP).toPlainString());
                    numberDone = true;
                }
                k = end - 1;
            } else if (Character.toLowerCase(c) == 'g' && f.regionMatches(true, k, "general", 0, 7)) {
                out.append(plain(value));
                numberDone = true;
                k += 6;
            } else {
                out.append(c);
            }
        }
        return out.toString();
    }

    private static String shorten(String text) {
        return text.length() > 40 ? text.substring(0, 40) + "..." : text;
    }

    private static String booleanText(Object value) {
        return Boolean.TRUE.equals(value) ? "TRUE" : "FALSE";
    }

    /**
     * {@code value} with the fewest significant digits that round (to nearest) to the same binary64
     * number, without an exponent: the stored {@code 0.10000000000000001} and {@code 0.1} are both
     * {@code 0.1}, {@code 1.0E-5} is {@code 0.00001}, {@code 2} stays {@code 2}.
     */
    static String plain(BigDecimal value) {
        double d = value.doubleValue();
        if (Double.isFinite(d) && d != 0) {
            for (int digits = 1; digits <= MAX_DIGITS; digits++) {
                BigDecimal r = value.round(new MathContext(digits, RoundingMode.HALF_EVEN));
                if (r.doubleValue() == d) {
                    return r.stripTrailingZeros().toPlainString();
                }
            }
        }
        return value.signum() == 0 ? "0" : value.stripTrailingZeros().toPlainString();
    }

    /**
     * Whether a number format shows dates or times: the built-in formats 14 to 22 and 45 to 47
     * (ECMA-376 Part 1, {@code numFmt}; from memory), the East Asian built-in date formats 27 to 36
     * and 50 to 58, or a format whose codes outside quoted text, escaped characters and
     * {@code [...]} sections hold a date or time letter (d, m, y, h, s; {@code [h]} elapsed hours too).
     */
    static boolean isDateFormat(Integer id, String format) {
        if (id != null && (id >= 14 && id <= 22 || id >= 27 && id <= 36 || id >= 45 && id <= 47
                || id >= 50 && id <= 58)) {
            return true;
        }
        if (format == null) {
            return false;
        }
        String codes = codes(format, true);
        for (int k = 0; k < codes.length(); k++) {
            char c = Character.toLowerCase(codes.charAt(k));
            if (c == 'd' || c == 'm' || c == 'y' || c == 'h' || c == 's') {
                return true;
            }
        }
        return false;
    }

    /** Whether a number format shows the value times 100 with a percent sign (built-in 9 and 10, or a '%' code). */
    static boolean isPercentFormat(Integer id, String format) {
        return id != null && (id == 9 || id == 10) || format != null && codes(format, false).indexOf('%') >= 0;
    }

    /**
     * The codes of a number format without its quoted text, escaped characters ({@code \x}, and the
     * {@code _x} and {@code *x} spacing codes) and bracketed sections (colours, conditions, locales),
     * except elapsed-time brackets such as {@code [h]} when {@code keepElapsed}.
     */
    private static String codes(String format, boolean keepElapsed) {
        StringBuilder out = new StringBuilder();
        for (int k = 0; k < format.length(); k++) {
            char c = format.charAt(k);
            if (c == '"') {
                int end = format.indexOf('"', k + 1);
                k = end < 0 ? format.length() : end;
            } else if (c == '\\' || c == '_' || c == '*') {
                k++;
            } else if (c == '[') {
                int end = format.indexOf(']', k + 1);
                String inside = end < 0 ? "" : format.substring(k + 1, end).toLowerCase(java.util.Locale.ROOT);
                if (keepElapsed && inside.matches("h+|m+|s+")) {
                    out.append(inside);
                }
                k = end < 0 ? format.length() : end;
            } else {
                out.append(c);
            }
        }
        String s = out.toString();
        // "General" is the default format, not codes: its letters are no date
        return s.replaceAll("(?i)general", "");
    }
}

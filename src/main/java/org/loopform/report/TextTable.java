package org.loopform.report;

import java.util.ArrayList;
import java.util.List;

/** A plain-text table with left-aligned columns separated by two spaces, for terminals and logs. */
public final class TextTable {
    private final List<String[]> rows = new ArrayList<>();
    private final int columns;

    public TextTable(String... header) {
        this.columns = header.length;
        rows.add(header);
    }

    public TextTable row(String... cells) {
        if (cells.length != columns) {
            throw new IllegalArgumentException("row has " + cells.length + " cells, table has " + columns);
        }
        rows.add(cells);
        return this;
    }

    /** The table, indented by {@code indent} spaces, with a rule under the header. */
    public String render(int indent) {
        int[] width = new int[columns];
        for (String[] r : rows) {
            for (int c = 0; c < columns; c++) {
                width[c] = Math.max(width[c], r[c].length());
            }
        }
        StringBuilder sb = new StringBuilder();
        String pad = " ".repeat(indent);
        for (int k = 0; k < rows.size(); k++) {
            String[] r = rows.get(k);
            StringBuilder line = new StringBuilder(pad);
            for (int c = 0; c < columns; c++) {
                line.append(r[c]);
                if (c < columns - 1) {
                    line.append(" ".repeat(width[c] - r[c].length() + 2));
                }
            }
            sb.append(line.toString().stripTrailing()).append(System.lineSeparator());
            if (k == 0) {
                int total = 0;
                for (int c = 0; c < columns; c++) {
                    total += width[c] + (c < columns - 1 ? 2 : 0);
                }
                sb.append(pad).append("-".repeat(total)).append(System.lineSeparator());
            }
        }
        return sb.toString();
    }
}

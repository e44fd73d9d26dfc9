package org.loopform.cli;

import java.util.Locale;
import picocli.CommandLine.Option;

/** The shared {@code --sheet NAME|INDEX} option of the commands that read an .xlsx loop list. */
final class SheetOption {

    @Option(names = "--sheet", paramLabel = "NAME|INDEX", description = "The sheet of an .xlsx list, by name or"
            + " number from 1 (default: the first visible sheet with a header row naming tag and form).")
    String sheet;

    /** Whether {@code name} is read as an xlsx workbook (by its extension). */
    static boolean isXlsx(String name) {
        return name.toLowerCase(Locale.ROOT).endsWith(".xlsx");
    }

    /** Refuses {@code --sheet} for a list that is not an .xlsx workbook. */
    void checkApplies(String name) {
        if (sheet != null && !isXlsx(name)) {
            throw new org.loopform.units.UnitException("--sheet: applies to an .xlsx loop list only (got " + name
                    + "); leave --sheet out, or give the .xlsx workbook");
        }
    }
}

package org.loopform.cli;

import java.util.List;
import org.loopform.io.TrendColumns;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParseResult;

/**
 * The columns of a logged record, shared by {@code replay} and {@code audit --records}: time,
 * setpoint, PV, controller output and the optional mode and tracking columns, each defaulting to
 * the column of that name.
 */
final class RecordColumnOptions {

    /** The options' names, for commands that refuse them when they read no record. */
    static final List<String> NAMES = List.of("--time", "--setpoint", "--pv", "--output", "--mode", "--tracking");

    @Option(names = "--time", paramLabel = "COLUMN", defaultValue = "time",
            description = "Records: the time column (default: ${DEFAULT-VALUE}).")
    String time;

    @Option(names = "--setpoint", paramLabel = "COLUMN", defaultValue = "setpoint",
            description = "Records: the setpoint column (default: ${DEFAULT-VALUE}).")
    String setpoint;

    @Option(names = "--pv", paramLabel = "COLUMN", defaultValue = "pv",
            description = "Records: the PV column (default: ${DEFAULT-VALUE}).")
    String pv;

    @Option(names = "--output", paramLabel = "COLUMN", defaultValue = "output",
            description = "Records: the controller output column (default: ${DEFAULT-VALUE}).")
    String output;

    @Option(names = "--mode", paramLabel = "COLUMN", defaultValue = "mode",
            description = "Records: the mode column (auto/manual/cascade), used when present (default: ${DEFAULT-VALUE}).")
    String mode;

    @Option(names = "--tracking", paramLabel = "COLUMN", defaultValue = "tracking",
            description = "Records: the output-tracking column (on/off), used when present (default: ${DEFAULT-VALUE}).")
    String tracking;

    /** The columns as given. */
    TrendColumns columns() {
        List<String> given = java.util.Arrays.asList(time, setpoint, pv, output, mode, tracking);
        for (int k = 0; k < NAMES.size(); k++) {
            String c = given.get(k);
            if (c == null || c.isBlank()) {
                throw new org.loopform.io.InputException(NAMES.get(k) + ": needs a column name (got an empty one);"
                        + " give the header of the record's column, or leave the option out for '"
                        + NAMES.get(k).substring(2) + "'");
            }
        }
        return new TrendColumns(time.strip(), setpoint.strip(), pv.strip(), output.strip(), mode.strip(),
                tracking.strip());
    }

    /** The first of these options given on the command line, or null. */
    static String firstGiven(ParseResult parsed) {
        return NAMES.stream().filter(parsed::hasMatchedOption).findFirst().orElse(null);
    }
}

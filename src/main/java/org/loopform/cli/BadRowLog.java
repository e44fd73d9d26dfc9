package org.loopform.cli;

import java.io.PrintWriter;
import org.loopform.audit.LoopOutcome;

/**
 * Writes an audit's bad rows to stderr as they stream past, the first {@link #SHOWN} problems in
 * full and the rest counted, so that a list of a million bad rows neither floods the terminal nor
 * fills memory. Every bad row is also in loops.csv and the report.
 */
final class BadRowLog {

    /** Problems written out in full; later ones are counted. */
    static final int SHOWN = 100;

    private final PrintWriter err;
    private long problems;
    private long rows;

    BadRowLog(PrintWriter err) {
        this.err = err;
    }

    void accept(LoopOutcome o) {
        if (o.ok()) {
            return;
        }
        rows++;
        for (String p : o.problems()) {
            if (problems++ < SHOWN) {
                err.println("loopform: " + p);
            }
        }
    }

    void finish() {
        if (problems > SHOWN) {
            err.println("loopform: ... and " + (problems - SHOWN) + " more problems; " + rows + " bad rows in all"
                    + " (with --out DIR, loops.csv lists each once at least one loop is checked)");
        } else if (rows > 0) {
            err.println("loopform: " + rows + (rows == 1 ? " bad row" : " bad rows") + " not checked");
        }
        err.flush();
    }
}

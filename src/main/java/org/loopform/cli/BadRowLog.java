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

    /** A record that could not be read or replayed: its problems, counted with the bad rows' (the loop was checked). */
    void acceptRecord(LoopOutcome o) {
        if (o.replay() == null || o.replay().status() != org.loopform.audit.ReplayEvidence.Status.UNREADABLE) {
            return;
        }
        for (String p : o.replay().problems()) {
            if (problems++ < SHOWN) {
                err.println("loopform: " + p + " (the loop was checked without replay evidence)");
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

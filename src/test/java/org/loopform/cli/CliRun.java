// plumbing: no published source needed
package org.loopform.cli;

import java.io.PrintWriter;
import java.io.StringWriter;

/** One run of loopform through {@link Main#run}, with what it printed on each stream. */
record CliRun(int exitCode, String out, String err) {

    static CliRun of(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(args, new PrintWriter(out), new PrintWriter(err));
        return new CliRun(code, out.toString(), err.toString());
    }
}

package org.loopform.cli;

import java.nio.file.Path;
import org.loopform.audit.SignOff;
import org.loopform.io.SignOffFileReader;
import picocli.CommandLine.Option;

/**
 * The shared sign-off options of {@code audit} and {@code demo}: names, change and revision for the
 * report's sign-off block, from options or a small YAML file (options win); blank lines otherwise.
 */
final class SignOffOptions {
    @Option(names = "--prepared-by", paramLabel = "NAME", description = "Who prepared the audit (sign-off block).")
    String preparedBy;

    @Option(names = "--checked-by", paramLabel = "NAME", description = "Who checked it (sign-off block).")
    String checkedBy;

    @Option(names = "--approved-by", paramLabel = "NAME", description = "Who approved it (sign-off block).")
    String approvedBy;

    @Option(names = "--change", paramLabel = "ID", description = "The change (management-of-change) number.")
    String change;

    @Option(names = "--revision", paramLabel = "REV", description = "The report's revision (A, B, 1, 2...).")
    String revision;

    @Option(names = "--signoff", paramLabel = "FILE", description = "A YAML file with any of prepared_by, checked_by,"
            + " approved_by, change, revision; the options above override it. Unnamed lines stay blank to sign.")
    Path file;

    /** The sign-off these options give (a file read first, then the options over it). */
    SignOff signOff() {
        SignOff fromFile = file == null ? SignOff.BLANK : SignOffFileReader.read(file, file.toString());
        return fromFile.overriddenBy(new SignOff(preparedBy, checkedBy, approvedBy, change, revision));
    }
}

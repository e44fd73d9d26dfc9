package org.loopform.report;

import java.util.List;
import java.util.Map;
import org.loopform.audit.AuditSummary;
import org.loopform.check.CheckResult;
import org.loopform.check.ScanSweep;
import org.loopform.findings.Finding;
import org.loopform.form.Conversion;
import org.loopform.form.FormDefinition;

/**
 * One output format for everything a command prints: a command picks a renderer (from its
 * {@code --format}) and hands it the result, never branching on the format itself. A new printed
 * format is one class implementing this interface ({@link TextRenderer}, {@link JsonRenderer}).
 */
public interface Renderer {

    /** The catalog of forms, one line or element per form. */
    String formList(List<FormDefinition> forms);

    /** One form in full. */
    String form(FormDefinition form);

    /** A form file that {@code forms check} found valid. */
    String formValid(String file, FormDefinition form);

    /** The problems {@code forms check} found in {@code file}. */
    String formProblems(String file, List<String> problems);

    /** Whether {@link #formProblems} belongs on standard output (a tool reads it) rather than standard error. */
    boolean problemsOnStandardOutput();

    /** A conversion with its findings, the source values as the user gave them. */
    String conversion(Conversion c, List<Finding> findings, Map<String, String> sourceValues);

    /** One loop's check. */
    String check(CheckResult r);

    /** A scan sweep of one loop. */
    String sweep(ScanSweep.Result sweep);

    /** An audit's summary; {@code folder} is where the output went, or null when none was written. */
    String auditSummary(AuditSummary summary, String folder);
}

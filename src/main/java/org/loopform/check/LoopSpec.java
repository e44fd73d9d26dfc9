package org.loopform.check;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormException;
import org.loopform.process.ProcessModel;
import org.loopform.units.Span;

/**
 * One loop to carry across: its tag (ISA-5.1 style, e.g. TIC-104), its process model if known,
 * its tuning as written in the source form (and the source's own scan time if the source is a
 * sampled controller whose algorithm should be simulated), the target form and scan time, and
 * the PV and output ranges. {@code where} names the file and line it came from, for messages;
 * {@code whereByParameter} names, for a tuning parameter read from a cell of its own (a sheet's
 * {@code Loops!D6}), that cell, so a message about the parameter points at it (empty otherwise).
 */
public record LoopSpec(String tag, ProcessModel process, FormDefinition sourceForm, Map<String, String> tuning,
                       Double sourceScanSeconds, FormDefinition targetForm, Double targetScanSeconds,
                       Span pvRange, Span outputRange, String where, Map<String, String> whereByParameter) {

    /** A loop whose parameters are all placed at {@code where}. */
    public LoopSpec(String tag, ProcessModel process, FormDefinition sourceForm, Map<String, String> tuning,
                    Double sourceScanSeconds, FormDefinition targetForm, Double targetScanSeconds,
                    Span pvRange, Span outputRange, String where) {
        this(tag, process, sourceForm, tuning, sourceScanSeconds, targetForm, targetScanSeconds, pvRange, outputRange,
                where, Map.of());
    }

    public LoopSpec {
        if (tag == null || tag.isBlank()) {
            throw new FormException("tag: every loop needs a tag, e.g. TIC-104");
        }
        if (sourceForm == null || targetForm == null) {
            throw new FormException("loop " + tag + " needs a source form (tuning.form) and a target form (target.form)");
        }
        tuning = Collections.unmodifiableMap(new LinkedHashMap<>(tuning));
        where = where == null ? "" : where;
        whereByParameter = whereByParameter == null ? Map.of() : Map.copyOf(whereByParameter);
    }

    /**
     * Where a problem of the tuning is: the cell of the parameter {@code problem} starts with
     * ({@code "kc: must be > 0"}) when the loop knows it, else {@link #where()}.
     */
    public String whereOf(String problem) {
        int colon = problem.indexOf(':');
        String cell = colon > 0 ? whereByParameter.get(problem.substring(0, colon).trim()) : null;
        return cell != null ? cell : where;
    }

    /** Whether {@code message} starts with this loop's position or the cell of one of its parameters. */
    public boolean placed(String message) {
        return message.startsWith(where) || whereByParameter.values().stream().anyMatch(message::startsWith);
    }

    public boolean hasProcess() {
        return process != null;
    }

    /** The loop with another target scan time (for --scan and --sweep-scan). */
    public LoopSpec withTargetScan(double scanSeconds) {
        return new LoopSpec(tag, process, sourceForm, tuning, sourceScanSeconds, targetForm, scanSeconds, pvRange,
                outputRange, where, whereByParameter);
    }
}

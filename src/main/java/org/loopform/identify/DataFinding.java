package org.loopform.identify;

import org.loopform.findings.Severity;

/**
 * Something about a record that limits what can be fitted to it: {@code fail} when no model can be
 * trusted, {@code warn} when the fit stands but with a caveat.
 *
 * @param code a stable id: no-step, unsteady-baseline, too-short, noise, saturation, outside-span, small-step,
 *             no-oscillation, time-unit
 * @param severity warn or fail
 * @param message what was found, with its figures and units, and what to do
 */
public record DataFinding(String code, Severity severity, String message) {

    public DataFinding {
        if (code == null || code.isBlank() || message == null || message.isBlank()) {
            throw new IllegalArgumentException("a finding needs a code and a message");
        }
    }
}

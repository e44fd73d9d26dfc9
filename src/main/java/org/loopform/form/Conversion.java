package org.loopform.form;

import java.util.List;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.law.ControlLaw;
import org.loopform.lti.FrequencyBand;
import org.loopform.law.LawDeviation;

/**
 * The result of carrying one tuning from a source form to a target form: whether the target
 * writes the source law exactly, the target values (as computed, and as entered at the target's
 * resolution), how far the target law strays from the source law over the band, and the findings.
 */
public record Conversion(FormDefinition from, FormDefinition to, PidSetting sourceSetting, ControlLaw sourceLaw,
                         PidSetting targetSetting, ControlLaw targetLaw, ControlLaw enteredLaw, boolean exact,
                         WrittenTuning parameters, WrittenTuning entered, LawDeviation deviation,
                         FrequencyBand band, List<Finding> findings) {

    public Conversion {
        findings = List.copyOf(findings);
    }

    /** This conversion with {@code more} findings after its own. */
    public Conversion withFindings(List<Finding> more) {
        List<Finding> all = new java.util.ArrayList<>(findings);
        all.addAll(more);
        return new Conversion(from, to, sourceSetting, sourceLaw, targetSetting, targetLaw, enteredLaw, exact, parameters,
                entered, deviation, band, all);
    }

    /** The worst finding's severity (INFO when there are none). */
    public Severity worst() {
        return Finding.worst(findings);
    }
}

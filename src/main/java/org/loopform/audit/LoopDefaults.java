package org.loopform.audit;

import org.loopform.check.LoopSpec;
import org.loopform.form.FormDefinition;

/**
 * What the command line sets for every loop of an audit: a target form and a target scan time
 * (either may be null). Given, they replace what the loop list says.
 */
public record LoopDefaults(FormDefinition targetForm, Double targetScanSeconds) {

    public static final LoopDefaults NONE = new LoopDefaults(null, null);

    public LoopSpec apply(LoopSpec l) {
        return new LoopSpec(l.tag(), l.process(), l.sourceForm(), l.tuning(), l.sourceScanSeconds(),
                targetForm != null ? targetForm : l.targetForm(),
                targetScanSeconds != null ? targetScanSeconds : l.targetScanSeconds(), l.pvRange(), l.outputRange(),
                l.where(), l.whereByParameter());
    }
}

package org.loopform.form;

import org.loopform.units.TimeUnit;

/** How a form writes derivative action: as time, gain or per-scan gain, in which time unit. 0 means off. */
public record DerivativeSpec(DerivativeWriting writing, TimeUnit unit) {
    public DerivativeSpec {
        if (writing == null || unit == null) {
            throw new FormException("derivative needs 'as' and 'unit'");
        }
    }
}

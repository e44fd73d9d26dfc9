package org.loopform.form;

import org.loopform.units.Span;

/**
 * What a form's values need beyond themselves: the PV and output ranges (for engineering-unit
 * gains) and the scan time (for per-scan gains). Any may be null when not known.
 */
public record WritingContext(Span pvRange, Span outputRange, Double scanSeconds) {

    static final WritingContext NONE = new WritingContext(null, null, null);

    public WritingContext {
        if (scanSeconds != null && !(scanSeconds > 0 && Double.isFinite(scanSeconds))) {
            throw new FormException("scan time must be > 0 s (got " + scanSeconds + " s)");
        }
    }

    /** Factor from engineering-unit gain to %/% gain: PV span / output span. */
    double engineeringToPercent(FormDefinition form, String side) {
        if (pvRange == null || outputRange == null) {
            String missing = pvRange == null && outputRange == null ? "--pv-range and --out-range"
                    : pvRange == null ? "--pv-range" : "--out-range";
            throw new FormException("form " + form.id() + " (" + side + ") writes gains in engineering units; give "
                    + missing + " (LOW..HIGH) so they can be put on a percent-of-span basis");
        }
        return pvRange.width() / outputRange.width();
    }

    double scan(FormDefinition form, String side) {
        if (scanSeconds == null) {
            throw new FormException("form " + form.id() + " (" + side + ") writes gains per scan; give --scan DURATION "
                    + "(for example --scan 0.5s)");
        }
        return scanSeconds;
    }
}

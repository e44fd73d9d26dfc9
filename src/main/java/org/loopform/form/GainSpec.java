package org.loopform.form;

/** How a form writes its proportional action: as gain or band, on which basis, with which sign convention. */
public record GainSpec(GainWriting writing, GainBasis basis, SignConvention sign) {
    public GainSpec {
        if (writing == null || basis == null || sign == null) {
            throw new FormException("gain needs 'as', 'basis' and 'sign'");
        }
        if (writing == GainWriting.BAND && basis == GainBasis.ENGINEERING) {
            throw new FormException("gain: a proportional band is a percentage of span, so it cannot have basis "
                    + "'engineering'; use basis 'percent', or write the gain as 'gain'");
        }
    }
}

package org.loopform.form;

import java.util.Optional;
import java.util.OptionalDouble;
import org.loopform.law.LawDeviation;

/**
 * One plain fact a conversion established, in figures: what was computed, never how bad it is.
 * {@code findings.ConversionRules} holds these against the policy's thresholds and words them as
 * findings; the conversion itself judges nothing. The notes come in the order their findings are
 * reported.
 */
public sealed interface ConversionNote {

    /**
     * The target wrote the source law only approximately (the nearest fit). The deviations over
     * the band and where the loop lives are the conversion's own ({@link Conversion#deviation()},
     * {@link Conversion#loopDeviation()}).
     *
     * @param complexZerosRatio p^2/(d i) (the ideal form's Ti/Td) when the target is a series
     *                          controller and the source law's zeros are complex (ratio below 4)
     * @param derivative        whether the source law has derivative action
     * @param filterBound       whether the target cannot follow the source's derivative filter
     *                          (fixed ratio, no filter, or an unfiltered source)
     * @param sourceHighFrequencyGain the source law's high-frequency derivative gain, %/% (infinite unfiltered)
     * @param targetHighFrequencyGain the target law's, %/% (infinite unfiltered)
     * @param feedbackExact     whether the feedback paths are the same rational function
     * @param setpoint          the setpoint path's deviation where the loop lives
     */
    record Inexact(OptionalDouble complexZerosRatio, boolean derivative, boolean filterBound,
                   double sourceHighFrequencyGain, double targetHighFrequencyGain, boolean feedbackExact,
                   LawDeviation setpoint) implements ConversionNote {
    }

    /**
     * The conversion is exact only with a derivative filter setting other than the target's default.
     *
     * @param parameter          {@code n} (a filter ratio) or {@code tf} (a filter time constant)
     * @param neededValue        the setting the exact conversion needs (n: a ratio, infinite for no
     *                           filter; tf: in {@code unitSymbol})
     * @param defaultValue       the target's default setting, in the same unit
     * @param unitSymbol         the unit of a time constant, empty for a ratio
     * @param seriesInvolved     whether source or target is a series controller of another structure
     * @param sourceFilterSeconds the source's filter time constant, s (0: the source has no filter)
     * @param sourceFilterKept   whether the setting needed is the source's own (the same ratio, or
     *                           the same filter time), so only the target's default differs
     * @param defaultCost        the feedback deviation, where the loop lives, of entering the
     *                           exact values with the default filter
     * @param textbookCost       the same for the textbook values entered with the default filter,
     *                           when they differ from the exact ones
     */
    record FilterSettingNeeded(String parameter, double neededValue, double defaultValue, String unitSymbol,
                               boolean seriesInvolved, double sourceFilterSeconds, boolean sourceFilterKept,
                               LawDeviation defaultCost,
                               Optional<LawDeviation> textbookCost) implements ConversionNote {
    }

    /** A written integral value is what the target reads as integral action off. */
    record ReadAsIntegralOff(String parameter, double value, String unit, double offValue) implements ConversionNote {
    }

    /** A written value lies outside the range the target accepts ({@code high}: above its maximum). */
    record OutOfRange(String parameter, double value, double bound, boolean high, String unit)
            implements ConversionNote {
    }

    /** Rounded to the target's resolution, the tuning is no longer valid; {@code reason} says why. */
    record RoundingInvalid(String reason) implements ConversionNote {
    }

    /** Rounded to the target's resolution, the integral value becomes the one that turns integral action off. */
    record RoundingLosesIntegral() implements ConversionNote {
    }

    /**
     * Rounding to the target's resolution moved the law by {@code moved} over the tuning's band;
     * {@code movedValues} lists the values that changed ("kc 1.23456 -> 1.23").
     */
    record Rounded(LawDeviation moved, String movedValues) implements ConversionNote {
    }
}

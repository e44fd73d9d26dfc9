package org.loopform.analysis;

import org.loopform.lti.FrequencyBand;

import java.util.Objects;

/**
 * The ultimate gain and frequency of a process: the proportional gain {@code Ku} that puts the
 * loop with a P controller at the stability limit, and the frequency {@code wu} at which it
 * then oscillates. {@code Ku = 1 / |P(i wu)|} where the phase of {@code P} is -180 degrees;
 * with several such frequencies, the one giving the smallest {@code Ku} (the lowest of those that
 * tie within 1e-9 relative). The ultimate period
 * is {@code Tu = 2 pi / wu}. Definition from Ziegler and Nichols, "Optimum settings for
 * automatic controllers", Trans. ASME 64, 1942.
 */
public record UltimateCycle(double ultimateGain, double ultimateRadPerSecond) {

    /** Ultimate gains this close, relative, are one gain: the lower frequency is the ultimate one. */
    private static final double TIE_RELATIVE = 1e-9;

    public UltimateCycle {
        if (!(ultimateGain > 0) || Double.isInfinite(ultimateGain)) {
            throw new IllegalArgumentException("ultimate gain must be finite and > 0 (got " + ultimateGain + ")");
        }
        if (!(ultimateRadPerSecond > 0) || Double.isInfinite(ultimateRadPerSecond)) {
            throw new IllegalArgumentException(
                    "ultimate frequency must be finite and > 0 rad/s (got " + ultimateRadPerSecond + " rad/s)");
        }
    }

    /**
     * The ultimate cycle of {@code process}, searched over {@code band}.
     *
     * @throws IllegalArgumentException when the phase of the process never reaches -180 degrees
     *     in the band (a first-order process, say), so no proportional gain reaches the limit
     */
    public static UltimateCycle of(LoopResponse process, FrequencyBand band) {
        Objects.requireNonNull(process, "process");
        LoopMargins margins = MarginAnalysis.over(band).analyze(process);
        PhaseCrossover lowest = null;
        for (PhaseCrossover c : margins.phaseCrossovers()) {
            // the crossovers come in rising frequency; a tie (a pure dead time reaches -180 deg at every odd
            // multiple of pi / L with one gain) goes to the lowest, the oscillation's fundamental
            if (lowest == null || c.gainFactor() < lowest.gainFactor() * (1 - TIE_RELATIVE)) {
                lowest = c;
            }
        }
        if (lowest == null) {
            throw new IllegalArgumentException("process phase never reaches -180 degrees between "
                    + band.lowRadPerSecond() + " and " + band.highRadPerSecond()
                    + " rad/s, so it has no ultimate gain there; widen the band or check the model");
        }
        return new UltimateCycle(lowest.gainFactor(), lowest.radPerSecond());
    }

    /** {@code Tu = 2 pi / wu}. */
    public double ultimatePeriodSeconds() {
        return 2 * Math.PI / ultimateRadPerSecond;
    }
}

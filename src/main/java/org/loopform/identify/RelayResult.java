package org.loopform.identify;

import java.util.List;

/**
 * The ultimate cycle read from a relay-feedback record (Astrom &amp; Hagglund, "Automatic tuning of
 * simple regulators with specifications on phase and amplitude margins", Automatica 20 (1984)
 * 645-651): {@code Ku = 4 d / (pi a)}, d the relay's amplitude (half its output swing), a the PV
 * oscillation's amplitude (half its swing), {@code Tu} the oscillation's period. The describing
 * function takes the PV as a sine: with a square-ish PV (a process with a long dead time against
 * its lag) Ku can be off by tens of percent.
 *
 * @param ultimateGain Ku, %/% (non-negative: its sign is the process's direction, unknown to a relay record)
 * @param ultimatePeriodSeconds Tu, s
 * @param relayAmplitudePercent d, % of output span
 * @param pvAmplitudePercent a, % of PV span
 * @param cycles whole cycles measured
 * @param findings what limits the reading
 */
public record RelayResult(double ultimateGain, double ultimatePeriodSeconds, double relayAmplitudePercent,
                          double pvAmplitudePercent, int cycles, List<DataFinding> findings) {

    public static final String CAVEAT = "The describing function treats the PV as a sine at the relay's frequency;"
            + " Ku is approximate (Astrom & Hagglund 1984), more so the squarer the PV oscillation.";

    public RelayResult {
        findings = List.copyOf(findings);
    }
}

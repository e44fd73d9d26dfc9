package org.loopform.identify;

import java.util.ArrayList;
import java.util.List;
import org.loopform.findings.Severity;
import org.loopform.units.Numbers;

/** Reads the ultimate gain and period from a relay-feedback record ({@link RelayResult}). */
public final class RelayAnalysis {

    /** Fewest whole PV cycles to read a period from. */
    static final int MIN_CYCLES = 2;

    /** Share of the PV's half swing it must fall below the mean before the next upward crossing counts. */
    static final double HYSTERESIS = 0.3;

    private RelayAnalysis() {
    }

    /**
     * The relay's amplitude is half the output's swing; the PV's amplitude half its mean peak-to-peak over the
     * whole cycles after the first (the first is a transient); Tu the mean time between upward crossings of
     * the PV's mean over the same cycles. Samples outside their spans are a finding of severity fail
     * (the spans, and so Ku in %/%, are wrong).
     */
    public static RelayResult analyze(PlantRecord r) {
        List<DataFinding> findings = new ArrayList<>();
        StepIdentification.outsideSpan(r, findings);
        int n = r.size();
        double uMin = Double.POSITIVE_INFINITY;
        double uMax = Double.NEGATIVE_INFINITY;
        double mean = 0;
        for (int k = 0; k < n; k++) {
            uMin = Math.min(uMin, r.output(k));
            uMax = Math.max(uMax, r.output(k));
            mean += r.pv(k) / n;
        }
        double d = (uMax - uMin) / 2;
        double pvMin = Double.POSITIVE_INFINITY;
        double pvMax = Double.NEGATIVE_INFINITY;
        for (int k = 0; k < n; k++) {
            pvMin = Math.min(pvMin, r.pv(k));
            pvMax = Math.max(pvMax, r.pv(k));
        }
        // hysteresis against noise: a crossing counts only after the PV was well below the mean
        double h = HYSTERESIS * (pvMax - pvMin) / 2;
        List<Double> ups = new ArrayList<>();
        boolean armed = false;
        for (int k = 1; k < n; k++) {
            if (r.pv(k) < mean - h) {
                armed = true;
            }
            if (armed && r.pv(k - 1) < mean && r.pv(k) >= mean) {
                armed = false;
                double f = (mean - r.pv(k - 1)) / (r.pv(k) - r.pv(k - 1));
                ups.add(r.time(k - 1) + f * (r.time(k) - r.time(k - 1)));
            }
        }
        if (d <= 0 || ups.size() < MIN_CYCLES + 2) {
            findings.add(new DataFinding("no-oscillation", Severity.FAIL, "The record holds " + Math.max(0,
                    ups.size() - 1) + " whole PV cycle(s) about its mean" + (d <= 0 ? " and the output never switches"
                    : "") + "; a relay test needs " + (MIN_CYCLES + 1) + " or more steady cycles: record longer."));
            return new RelayResult(0, 0, d, 0, 0, findings);
        }
        // skip the first cycle (transient)
        int first = 1;
        int last = ups.size() - 1;
        int cycles = last - first;
        double period = (ups.get(last) - ups.get(first)) / cycles;
        double ptp = 0;
        for (int c = first; c < last; c++) {
            double lo = Double.POSITIVE_INFINITY;
            double hi = Double.NEGATIVE_INFINITY;
            for (int k = 0; k < n; k++) {
                if (r.time(k) >= ups.get(c) && r.time(k) < ups.get(c + 1)) {
                    lo = Math.min(lo, r.pv(k));
                    hi = Math.max(hi, r.pv(k));
                }
            }
            ptp += (hi - lo) / cycles;
        }
        double a = ptp / 2;
        double spread = 0;
        for (int c = first; c < last; c++) {
            spread = Math.max(spread, Math.abs(ups.get(c + 1) - ups.get(c) - period));
        }
        if (spread > 0.1 * period) {
            findings.add(new DataFinding("unsteady-baseline", Severity.WARN, "Cycle lengths differ by up to "
                    + Numbers.significant(spread, 3) + " s from their mean " + Numbers.significant(period, 3) + " s:"
                    + " the oscillation is not steady (load changes or noise); Tu is uncertain."));
        }
        double ku = 4 * d / (Math.PI * a);
        return new RelayResult(ku, period, d, a, cycles, findings);
    }
}

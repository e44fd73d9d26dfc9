package org.loopform.replay;

import org.loopform.scan.ScanController;

/**
 * A controller run open loop on a record at its scan: each scan it reads the logged setpoint and
 * PV; in automatic its output is the replay's, otherwise (manual, tracking) it tracks the logged
 * output so that it takes over without a bump when the record returns to automatic (Astrom and
 * Hagglund, Advanced PID Control, ISA 2006, ch. 3, bumpless transfer - section from memory).
 * The first {@code warmupScans} scans track too: the derivative and filter states then start
 * from the logged signals, and the integral from the logged output at the first compared scan.
 *
 * @param output      the replayed output, % of span (the logged one where tracking)
 * @param compared    true where the scan is automatic and past the warm-up
 * @param runawayScan the scan at which the controller's own arithmetic overflowed (its output not a number:
 *                    a forward-difference derivative filter with h > 2 Tf grows each scan), or -1; from it on
 *                    the output holds its last value and no scan is compared
 */
record ReplayRun(double[] output, boolean[] compared, int runawayScan) {

    /** True when the controller ran away on the record ({@link #runawayScan}). */
    boolean ranAway() {
        return runawayScan >= 0;
    }

    static ReplayRun of(ScanController controller, ScanSeries s, int warmupScans, double lowPercent,
                        double highPercent) {
        int n = s.size();
        double[] y = new double[n];
        boolean[] compared = new boolean[n];
        controller.reset(clamp(s.output[0], lowPercent, highPercent), s.setpoint[0], s.pv[0]);
        for (int k = 0; k < n; k++) {
            double u = controller.update(s.setpoint[k], s.pv[k]);
            if (!Double.isFinite(u)) {
                double last = k > 0 ? y[k - 1] : clamp(s.output[0], lowPercent, highPercent);
                java.util.Arrays.fill(y, k, n, last);
                return new ReplayRun(y, compared, k);
            }
            if (k < warmupScans || !s.automatic[k]) {
                controller.track(s.output[k]);
                u = controller.outputPercent();
            } else {
                compared[k] = true;
            }
            y[k] = u;
        }
        return new ReplayRun(y, compared, -1);
    }

    private static double clamp(double v, double low, double high) {
        return Math.max(low, Math.min(high, v));
    }

    /**
     * Scans of warm-up: two (the last error and the last derivative input), and enough for the
     * derivative filter to forget its start, five filter time constants, but never more than a
     * fifth of the record.
     */
    static int warmupScans(double filterSeconds, double scanSeconds, int scans) {
        int forFilter = (int) Math.ceil(5 * filterSeconds / scanSeconds);
        return Math.min(Math.max(2, forFilter), Math.max(2, scans / 5));
    }
}

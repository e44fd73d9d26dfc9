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
 * @param output   the replayed output, % of span (the logged one where tracking)
 * @param compared true where the scan is automatic and past the warm-up
 */
record ReplayRun(double[] output, boolean[] compared) {

    static ReplayRun of(ScanController controller, ScanSeries s, int warmupScans, double lowPercent,
                        double highPercent) {
        int n = s.size();
        double[] y = new double[n];
        boolean[] compared = new boolean[n];
        controller.reset(clamp(s.output[0], lowPercent, highPercent), s.setpoint[0], s.pv[0]);
        for (int k = 0; k < n; k++) {
            double u = controller.update(s.setpoint[k], s.pv[k]);
            if (k < warmupScans || !s.automatic[k]) {
                controller.track(s.output[k]);
                u = controller.outputPercent();
            } else {
                compared[k] = true;
            }
            y[k] = u;
        }
        return new ReplayRun(y, compared);
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

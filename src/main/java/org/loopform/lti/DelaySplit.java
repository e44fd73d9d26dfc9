package org.loopform.lti;

/**
 * A dead time split into whole scans and a remainder: {@code L = d h + fraction}, with
 * {@code 0 <= fraction < h}. A remainder within {@link #WHOLE_SCAN_RELATIVE_TOLERANCE} of a
 * whole scan counts as a whole scan, so that {@code L = 0.3 s} at {@code h = 0.1 s} is three
 * scans and not two scans and a sliver.
 *
 * @param delayScans d, whole scans
 * @param fractionSeconds the remainder, seconds, in [0, h)
 */
record DelaySplit(int delayScans, double fractionSeconds) {

    /**
     * Relative distance of L / h from a whole number below which the split snaps to it: a few
     * thousand ulps, rounding noise from unit conversions, never a real fraction of a scan.
     */
    static final double WHOLE_SCAN_RELATIVE_TOLERANCE = 1e-12;
    /** Longest delay line a sampled process keeps; beyond it the scan is far too short for the dead time. */
    static final int MAX_DELAY_SCANS = 10_000_000;

    DelaySplit {
        if (delayScans < 0 || !(fractionSeconds >= 0.0) || !Double.isFinite(fractionSeconds)) {
            throw new IllegalArgumentException("delay split must have delayScans >= 0 and fraction >= 0 (got "
                    + delayScans + " scans + " + fractionSeconds + " s)");
        }
    }

    static DelaySplit of(double deadTimeSeconds, double scanSeconds) {
        requireScan(scanSeconds);
        if (!Double.isFinite(deadTimeSeconds) || deadTimeSeconds < 0.0) {
            throw new IllegalArgumentException("deadTimeSeconds must be finite and >= 0 s (got " + deadTimeSeconds + ")");
        }
        double scans = deadTimeSeconds / scanSeconds;
        if (scans > MAX_DELAY_SCANS) {
            throw new IllegalArgumentException("dead time is " + scans + " scans (dead time " + deadTimeSeconds
                    + " s, scan " + scanSeconds + " s); at most " + MAX_DELAY_SCANS + " are supported");
        }
        double whole = Math.rint(scans);
        if (Math.abs(scans - whole) <= WHOLE_SCAN_RELATIVE_TOLERANCE * Math.max(1.0, scans)) {
            return new DelaySplit((int) whole, 0.0);
        }
        int d = (int) Math.floor(scans);
        double fraction = Math.max(0.0, deadTimeSeconds - d * scanSeconds);
        return new DelaySplit(d, Math.min(fraction, scanSeconds));
    }

    static void requireScan(double scanSeconds) {
        if (!Double.isFinite(scanSeconds) || scanSeconds <= 0.0) {
            throw new IllegalArgumentException("scanSeconds must be finite and > 0 s (got " + scanSeconds + ")");
        }
    }
}

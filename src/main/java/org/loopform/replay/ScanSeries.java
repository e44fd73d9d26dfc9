package org.loopform.replay;

import org.loopform.units.BadInput;
import org.loopform.units.Span;

/**
 * A record read at one controller's scan instants {@code t(k) = start + k h}, in percent of span:
 * setpoint and PV of the PV range, output of the output range, each by linear interpolation
 * between its logged points ({@link Signal#at}), and the mode by sample and hold
 * ({@link ModeTrack#at}). The grid starts where all three signals have been logged.
 */
final class ScanSeries {

    /** More scans than this are refused: the replay keeps every scan in memory (8 bytes a value). */
    static final int MAX_SCANS = 20_000_000;

    final double startSeconds;
    final double scanSeconds;
    final double[] setpoint;
    final double[] pv;
    final double[] output;
    final boolean[] automatic;

    private ScanSeries(double startSeconds, double scanSeconds, int n) {
        this.startSeconds = startSeconds;
        this.scanSeconds = scanSeconds;
        this.setpoint = new double[n];
        this.pv = new double[n];
        this.output = new double[n];
        this.automatic = new boolean[n];
    }

    /** How many scans of {@code scanSeconds} the record holds (0 when shorter than two scans). */
    static long scansIn(Trend trend, double scanSeconds) {
        double length = trend.endSeconds() - trend.startSeconds();
        return length <= 0 ? 0 : (long) Math.floor(length / scanSeconds + 1e-9) + 1;
    }

    static ScanSeries of(Trend trend, double scanSeconds, Span pvRange, Span outputRange) {
        long n = scansIn(trend, scanSeconds);
        if (n < 2) {
            throw new BadInput("the record spans " + (trend.endSeconds() - trend.startSeconds()) + " s where setpoint,"
                    + " PV and output are all logged, less than two scans of " + scanSeconds + " s; give a longer"
                    + " record");
        }
        if (n > MAX_SCANS) {
            throw new BadInput("the record holds " + n + " scans of " + scanSeconds + " s, more than " + MAX_SCANS
                    + " the replay keeps in memory; cut the record into shorter pieces");
        }
        ScanSeries s = new ScanSeries(trend.startSeconds(), scanSeconds, (int) n);
        for (int k = 0; k < n; k++) {
            double t = s.timeSeconds(k);
            s.setpoint[k] = percent(trend.setpoint().at(t), pvRange);
            s.pv[k] = percent(trend.pv().at(t), pvRange);
            s.output[k] = percent(trend.output().at(t), outputRange);
            s.automatic[k] = trend.mode().at(t).isAutomatic();
        }
        return s;
    }

    static double percent(double value, Span range) {
        return 100.0 * (value - range.low()) / range.width();
    }

    int size() {
        return output.length;
    }

    double timeSeconds(int k) {
        return startSeconds + k * scanSeconds;
    }
}

package org.loopform.replay;

/**
 * The outputs of a replay over time, for plots, % of the output span: the logged output and the
 * source's replay at the source scan, the target's replay at the target scan; times in seconds
 * from the record's start. Immutable (accessors copy).
 */
public final class ReplayTrace {
    private final double[] sourceTimes;
    private final double[] logged;
    private final double[] source;
    private final double[] targetTimes;
    private final double[] target;

    ReplayTrace(ScanSeries atSource, ReplayRun sourceRun, ScanSeries atTarget, ReplayRun targetRun) {
        this.sourceTimes = times(atSource);
        this.logged = atSource.output.clone();
        this.source = sourceRun.output().clone();
        this.targetTimes = times(atTarget);
        this.target = targetRun.output().clone();
    }

    private static double[] times(ScanSeries s) {
        double[] t = new double[s.size()];
        for (int k = 0; k < t.length; k++) {
            t[k] = s.timeSeconds(k);
        }
        return t;
    }

    public double[] sourceTimesSeconds() {
        return sourceTimes.clone();
    }

    public double[] loggedPercent() {
        return logged.clone();
    }

    public double[] sourcePercent() {
        return source.clone();
    }

    public double[] targetTimesSeconds() {
        return targetTimes.clone();
    }

    public double[] targetPercent() {
        return target.clone();
    }
}

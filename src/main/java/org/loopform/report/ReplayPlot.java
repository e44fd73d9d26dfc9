package org.loopform.report;

import java.util.List;
import org.loopform.replay.ReplayResult;
import org.loopform.replay.ReplayTrace;

/** The replay's plot: the logged output, the old controller's replay and the target's, % of span over time. */
public final class ReplayPlot {

    private ReplayPlot() {
    }

    public static String svg(ReplayResult r) {
        return svg(r, SvgPlot.Size.STANDARD);
    }

    /** The plot at {@code size} ({@link SvgPlot.Size#COMPACT} in the audit report). */
    public static String svg(ReplayResult r, SvgPlot.Size size) {
        ReplayTrace t = r.trace();
        List<SvgPlot.Series> series = List.of(
                new SvgPlot.Series("logged output", t.sourceTimesSeconds(), t.loggedPercent(), "#555555", false),
                new SvgPlot.Series("old controller (replay)", t.sourceTimesSeconds(), t.sourcePercent(),
                        LoopPlots.DESIGN, true),
                new SvgPlot.Series("target (replay)", t.targetTimesSeconds(), t.targetPercent(), LoopPlots.TARGET,
                        false));
        return SvgPlot.panel(r.tag() + ": controller output, open-loop replay on the logged SP and PV",
                "time from record start (s)", "output (% of span)", series, false, size);
    }
}

package org.loopform.report;

import java.util.ArrayList;
import java.util.List;
import org.loopform.analysis.ControllerMismatch;
import org.loopform.simulate.SampledResponse;
import org.loopform.check.CheckResult;
import org.loopform.form.DiscreteAlgorithm;
import org.loopform.units.Numbers;

/**
 * The pictures of a checked loop: setpoint and load responses, as-found against as-left, PV and
 * controller output for each step, and the controller mismatch over frequency. The PV is drawn as
 * the process gives it, between the scans as well as at them (the check's runs record it so:
 * {@code simulate.LoopSimulator#runBetweenScans}); a sampled controller's output is drawn as the
 * steps it holds from scan to scan. Each step's panels end once both loops have settled
 * ({@link #plotHorizonSeconds}), so a fast loop is not squashed against the left axis; the output
 * panels draw the output limits and mark where an output sits at one.
 */
public final class LoopPlots {
    static final String DESIGN = "#1f5fa8";
    static final String TARGET = "#c0392b";
    private static final String DESIGN_LIMIT = "#6b8fc0";
    private static final String TARGET_LIMIT = "#d98a7f";
    private static final String LIMIT = "#555555";

    /**
     * A signal has settled once it stays within this share of its largest deviation from its final
     * value (2 %, the settling band of common practice: Ogata, Modern Control Engineering, 4th ed.,
     * 2002, section 5-3, from memory for the section number).
     */
    static final double SETTLED_SHARE = 0.02;
    /** The plots run this many times the later settling time: the settled tail stays in view (loopform's choice). */
    static final double SETTLED_MARGIN = 1.5;
    /** An output this close to a limit (% of span) sits at it: rounding only, the limited output equals the limit. */
    static final double AT_LIMIT_PERCENT = 1e-6;

    private LoopPlots() {
    }

    /** The panels for {@code r}: responses (with a process model) and the mismatch over frequency. */
    public static List<String> panels(CheckResult r) {
        return panels(r, SvgPlot.Size.STANDARD);
    }

    /** The panels for {@code r} drawn at {@code size}. */
    public static List<String> panels(CheckResult r, SvgPlot.Size size) {
        List<String> panels = new ArrayList<>();
        if (r.hasProcess()) {
            boolean designSampled = r.loop().sourceScanSeconds() != null;
            DiscreteAlgorithm found = r.loop().sourceForm().algorithm();
            DiscreteAlgorithm left = r.loop().targetForm().algorithm();
            Limits limits = new Limits(found.outputLowPercent(), found.outputHighPercent(), left.outputLowPercent(),
                    left.outputHighPercent());
            SampledResponse ds = r.designRun().setpoint();
            SampledResponse ts = r.targetRun().setpoint();
            double setpointEnd = plotHorizonSeconds(ds, ts);
            panels.add(pv("Setpoint step: PV", ds, ts, setpointEnd, size));
            panels.add(output("Setpoint step: controller output", ds, ts, designSampled, limits, setpointEnd, size));
            SampledResponse dl = r.designRun().load();
            SampledResponse tl = r.targetRun().load();
            double loadEnd = plotHorizonSeconds(dl, tl);
            panels.add(pv("Load step at the process input: PV", dl, tl, loadEnd, size));
            panels.add(output("Load step: controller output", dl, tl, designSampled, limits, loadEnd, size));
        }
        ControllerMismatch.Curve c = r.mismatchCurve();
        panels.add(SvgPlot.panel("New controller as run vs old law: gain ratio", "frequency, rad/s", "gain ratio, dB",
                List.of(new SvgPlot.Series("feedback path", c.omegas(), c.feedbackGainDb(), TARGET, false),
                        new SvgPlot.Series("setpoint path", c.omegas(), c.setpointGainDb(), DESIGN, true)), true, size));
        panels.add(SvgPlot.panel("New controller as run vs old law: phase difference", "frequency, rad/s",
                "phase difference, deg",
                List.of(new SvgPlot.Series("feedback path", c.omegas(), c.feedbackPhaseDeg(), TARGET, false),
                        new SvgPlot.Series("setpoint path", c.omegas(), c.setpointPhaseDeg(), DESIGN, true)), true, size));
        return panels;
    }

    /** The output limits of the old and the new controller, % of span. */
    record Limits(double foundLowPercent, double foundHighPercent, double leftLowPercent, double leftHighPercent) {
        boolean same() {
            return foundLowPercent == leftLowPercent && foundHighPercent == leftHighPercent;
        }
    }

    private static String pv(String title, SampledResponse design, SampledResponse target, double endSeconds,
                             SvgPlot.Size size) {
        SvgPlot.Series d = new SvgPlot.Series("as-found", design.timesSeconds(), design.processValuesPercent(), DESIGN,
                true);
        SvgPlot.Series t = new SvgPlot.Series("as-left", target.timesSeconds(), target.processValuesPercent(), TARGET,
                false);
        return SvgPlot.panel(title, "time, s", "PV, % of span", List.of(cut(d, endSeconds), cut(t, endSeconds)), false,
                size);
    }

    private static String output(String title, SampledResponse design, SampledResponse target, boolean designSampled,
                                 Limits limits, double endSeconds, SvgPlot.Size size) {
        SvgPlot.Series d = designSampled ? held("as-found", design, DESIGN, true)
                : new SvgPlot.Series("as-found", design.timesSeconds(), design.controllerOutputsPercent(), DESIGN, true);
        SvgPlot.Series t = held("as-left", target, TARGET, false);
        List<SvgPlot.Level> levels = new ArrayList<>();
        if (limits.same()) {
            levels.add(new SvgPlot.Level("limit " + Numbers.plain(limits.leftLowPercent()) + " %",
                    limits.leftLowPercent(), LIMIT));
            levels.add(new SvgPlot.Level("limit " + Numbers.plain(limits.leftHighPercent()) + " %",
                    limits.leftHighPercent(), LIMIT));
        } else {
            levels.add(new SvgPlot.Level("as-found limit " + Numbers.plain(limits.foundLowPercent()) + " %",
                    limits.foundLowPercent(), DESIGN_LIMIT));
            levels.add(new SvgPlot.Level("as-found limit " + Numbers.plain(limits.foundHighPercent()) + " %",
                    limits.foundHighPercent(), DESIGN_LIMIT));
            levels.add(new SvgPlot.Level("as-left limit " + Numbers.plain(limits.leftLowPercent()) + " %",
                    limits.leftLowPercent(), TARGET_LIMIT));
            levels.add(new SvgPlot.Level("as-left limit " + Numbers.plain(limits.leftHighPercent()) + " %",
                    limits.leftHighPercent(), TARGET_LIMIT));
        }
        List<SvgPlot.Stretch> stretches = new ArrayList<>();
        for (double[] s : atLimit(design, limits.foundLowPercent(), limits.foundHighPercent(), endSeconds)) {
            stretches.add(new SvgPlot.Stretch(s[0], s[1], DESIGN, 0));
        }
        for (double[] s : atLimit(target, limits.leftLowPercent(), limits.leftHighPercent(), endSeconds)) {
            stretches.add(new SvgPlot.Stretch(s[0], s[1], TARGET, 1));
        }
        return SvgPlot.panel(title, "time, s", "output, % of span", List.of(cut(d, endSeconds), cut(t, endSeconds)),
                levels, stretches, "at a limit (bars: as-found, as-left)", false, size);
    }

    /**
     * Where the plots of one step end, s: {@value #SETTLED_MARGIN} times the time by which the PV
     * and the controller output of every run given have settled ({@link #settledSeconds}), at most
     * the shortest run. A run that has not settled before the end is drawn whole; so are runs that
     * never move.
     */
    static double plotHorizonSeconds(SampledResponse... runs) {
        double end = Double.POSITIVE_INFINITY;
        double settled = 0;
        for (SampledResponse run : runs) {
            double[] t = run.timesSeconds();
            end = Math.min(end, t[t.length - 1]);
            settled = Math.max(settled, settledSeconds(t, run.processValuesPercent()));
            settled = Math.max(settled, settledSeconds(t, run.controllerOutputsPercent()));
        }
        double horizon = SETTLED_MARGIN * settled;
        return horizon > 0 && horizon < end ? horizon : end;
    }

    /**
     * The time after which {@code x} stays within {@value #SETTLED_SHARE} of its largest deviation
     * from its final (last) value, the crossing of the band's edge interpolated linearly between
     * samples; 0 for a signal that does not move.
     */
    static double settledSeconds(double[] t, double[] x) {
        int n = x.length;
        double last = x[n - 1];
        double largest = 0;
        for (double v : x) {
            largest = Math.max(largest, Math.abs(v - last));
        }
        if (largest == 0) {
            return 0;
        }
        double band = SETTLED_SHARE * largest;
        int k = n - 1;
        while (k >= 0 && Math.abs(x[k] - last) <= band) {
            k--;
        }
        if (k < 0) {
            return t[0];
        }
        // sample k is outside the band, k + 1 inside: where the line between them meets the band's edge
        double e0 = Math.abs(x[k] - last);
        double e1 = Math.abs(x[k + 1] - last);
        double share = e0 == e1 ? 1 : (e0 - band) / (e0 - e1);
        return t[k] + Math.max(0, Math.min(1, share)) * (t[k + 1] - t[k]);
    }

    /**
     * The stretches, up to {@code endSeconds}, where the run's controller output sits at the low or
     * the high limit, as {from, to} in s: an output at sample k is held until sample k + 1, so a
     * stretch runs from its first sample at the limit to the first sample off it.
     */
    static List<double[]> atLimit(SampledResponse run, double lowPercent, double highPercent, double endSeconds) {
        List<double[]> out = new ArrayList<>();
        double from = Double.NaN;
        int n = run.size();
        for (int k = 0; k < n; k++) {
            double t = run.timeSeconds(k);
            if (t > endSeconds) {
                break;
            }
            double u = run.controllerOutputPercent(k);
            boolean at = u >= highPercent - AT_LIMIT_PERCENT || u <= lowPercent + AT_LIMIT_PERCENT;
            if (at && Double.isNaN(from)) {
                from = t;
            } else if (!at && !Double.isNaN(from)) {
                out.add(new double[] {from, t});
                from = Double.NaN;
            }
        }
        if (!Double.isNaN(from)) {
            out.add(new double[] {from, Math.min(endSeconds, run.timeSeconds(n - 1))});
        }
        return out;
    }

    /** {@code s} up to {@code endSeconds}, its last point on that instant (interpolated linearly). */
    static SvgPlot.Series cut(SvgPlot.Series s, double endSeconds) {
        double[] x = s.x();
        double[] y = s.y();
        int m = 0;
        while (m < x.length && x[m] <= endSeconds) {
            m++;
        }
        if (m == x.length || m == 0) {
            return s;
        }
        double[] cx = java.util.Arrays.copyOf(x, m + 1);
        double[] cy = java.util.Arrays.copyOf(y, m + 1);
        double share = (endSeconds - x[m - 1]) / (x[m] - x[m - 1]);
        cx[m] = endSeconds;
        cy[m] = y[m - 1] + share * (y[m] - y[m - 1]);
        if (x[m - 1] == endSeconds) {
            return new SvgPlot.Series(s.label(), java.util.Arrays.copyOf(x, m), java.util.Arrays.copyOf(y, m),
                    s.colour(), s.dashed());
        }
        return new SvgPlot.Series(s.label(), cx, cy, s.colour(), s.dashed());
    }

    /**
     * A held controller output as a staircase: each value runs flat until the next change, which
     * is drawn as a vertical step at its instant; samples that repeat the held value are dropped.
     */
    static SvgPlot.Series held(String label, SampledResponse r, String colour, boolean dashed) {
        int n = r.size();
        double[] x = new double[2 * n];
        double[] y = new double[2 * n];
        int m = 0;
        for (int k = 0; k < n; k++) {
            double u = r.controllerOutputPercent(k);
            boolean last = k == n - 1;
            if (k > 0 && u == r.controllerOutputPercent(k - 1) && !last) {
                continue;
            }
            if (k > 0) {
                // the previous value held up to this instant
                x[m] = r.timeSeconds(k);
                y[m++] = r.controllerOutputPercent(k - 1);
            }
            if (k == 0 || u != r.controllerOutputPercent(k - 1)) {
                x[m] = r.timeSeconds(k);
                y[m++] = u;
            }
        }
        return new SvgPlot.Series(label, java.util.Arrays.copyOf(x, m), java.util.Arrays.copyOf(y, m), colour, dashed);
    }

    public static String svg(CheckResult r) {
        return SvgPlot.stack(panels(r));
    }
}

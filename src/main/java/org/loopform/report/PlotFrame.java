package org.loopform.report;

import java.util.Arrays;
import java.util.List;

/** The value ranges of one plot panel and the mapping from values to pixels, with thinning of long lines. */
final class PlotFrame {
    final double x0;
    final double x1;
    final double y0;
    final double y1;
    final boolean logX;
    final SvgPlot.Size size;

    private PlotFrame(double x0, double x1, double y0, double y1, boolean logX, SvgPlot.Size size) {
        this.x0 = x0;
        this.x1 = x1;
        this.y0 = y0;
        this.y1 = y1;
        this.logX = logX;
        this.size = size;
    }

    static PlotFrame of(List<SvgPlot.Series> series, boolean logX, SvgPlot.Size size) {
        return of(series, List.of(), logX, size);
    }

    /**
     * How far outside the lines' range a level may lie and still be drawn, in multiples of that
     * range: the frame then grows to include it, to at most three times the lines' range, so the
     * lines keep most of the height. A level farther off is named in the legend only.
     */
    static final double LEVEL_REACH = 1.0;

    /** The frame of {@code series}, grown to include the {@code levels} within {@link #LEVEL_REACH} of them. */
    static PlotFrame of(List<SvgPlot.Series> series, List<SvgPlot.Level> levels, boolean logX, SvgPlot.Size size) {
        double x0 = Double.POSITIVE_INFINITY;
        double x1 = Double.NEGATIVE_INFINITY;
        double y0 = Double.POSITIVE_INFINITY;
        double y1 = Double.NEGATIVE_INFINITY;
        for (SvgPlot.Series s : series) {
            for (int k = 0; k < s.x().length; k++) {
                double x = logX ? Math.log10(s.x()[k]) : s.x()[k];
                if (!Double.isFinite(x) || !Double.isFinite(s.y()[k])) {
                    continue;
                }
                x0 = Math.min(x0, x);
                x1 = Math.max(x1, x);
                y0 = Math.min(y0, s.y()[k]);
                y1 = Math.max(y1, s.y()[k]);
            }
        }
        if (!Double.isFinite(x0)) {
            // nothing finite to draw: an empty frame from 0 to 1
            x0 = 0;
            y0 = 0;
            y1 = 0;
        }
        if (!(x1 > x0)) {
            x1 = x0 + 1;
        }
        if (!(y1 > y0)) {
            y0 -= 1;
            y1 += 1;
        }
        double reach = LEVEL_REACH * (y1 - y0);
        double low = y0;
        double high = y1;
        for (SvgPlot.Level l : levels) {
            if (l.y() >= low - reach && l.y() <= high + reach) {
                y0 = Math.min(y0, l.y());
                y1 = Math.max(y1, l.y());
            }
        }
        double pad = 0.05 * (y1 - y0);
        return new PlotFrame(x0, x1, y0 - pad, y1 + pad, logX, size);
    }

    double px(double x) {
        return SvgPlot.LEFT + (x - x0) / (x1 - x0) * (size.width() - SvgPlot.LEFT - SvgPlot.RIGHT);
    }

    double py(double y) {
        return size.height() - SvgPlot.BOTTOM - (y - y0) / (y1 - y0) * (size.height() - SvgPlot.TOP - SvgPlot.BOTTOM);
    }

    /**
     * The series' finite points in pixels as {x, y, x, y, ...}, at most about {@code maxPoints}:
     * a long series is cut into buckets and each bucket keeps its lowest and highest point in
     * their order, so peaks and steps survive the thinning.
     */
    double[] pixels(SvgPlot.Series s, int maxPoints) {
        int n = s.x().length;
        int buckets = Math.max(1, maxPoints / 2);
        double[] out = new double[2 * Math.min(n, 2 * buckets + 2)];
        int m = 0;
        if (n <= maxPoints) {
            for (int k = 0; k < n; k++) {
                m = put(out, m, s, k);
            }
            return Arrays.copyOf(out, m);
        }
        double per = (double) n / buckets;
        for (int b = 0; b < buckets; b++) {
            int from = (int) Math.floor(b * per);
            int to = Math.min(n, (int) Math.floor((b + 1) * per));
            int lo = -1;
            int hi = -1;
            for (int k = from; k < to; k++) {
                if (!finite(s, k)) {
                    continue;
                }
                if (lo < 0 || s.y()[k] < s.y()[lo]) {
                    lo = k;
                }
                if (hi < 0 || s.y()[k] > s.y()[hi]) {
                    hi = k;
                }
            }
            if (lo < 0) {
                continue;
            }
            m = put(out, m, s, Math.min(lo, hi));
            if (lo != hi) {
                m = put(out, m, s, Math.max(lo, hi));
            }
        }
        // the last point ends the line where the data ends
        m = put(out, m, s, n - 1);
        return Arrays.copyOf(out, m);
    }

    private boolean finite(SvgPlot.Series s, int k) {
        double x = logX ? Math.log10(s.x()[k]) : s.x()[k];
        return Double.isFinite(x) && Double.isFinite(s.y()[k]);
    }

    private int put(double[] out, int m, SvgPlot.Series s, int k) {
        if (!finite(s, k)) {
            return m;
        }
        out[m] = px(logX ? Math.log10(s.x()[k]) : s.x()[k]);
        out[m + 1] = py(s.y()[k]);
        return m + 2;
    }
}

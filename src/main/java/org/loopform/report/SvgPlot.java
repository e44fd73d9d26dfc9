package org.loopform.report;

import java.util.List;
import java.util.Locale;

/**
 * Small, dependency-free SVG line charts: one panel per call, several series, axes with ticks,
 * labels with units. Self-contained (no scripts, no external fonts), so it prints and embeds.
 */
public final class SvgPlot {

    /** One line on a chart. {@code dashed} draws the reference (as-found) line. */
    public record Series(String label, double[] x, double[] y, String colour, boolean dashed) {
    }

    /**
     * A horizontal line at {@code y} (an output limit), drawn dotted across the plot and named in
     * the legend; those far outside the lines' range are named on one legend row, as off the
     * scale, so that they do not squash the lines (see {@link PlotFrame#of}).
     */
    public record Level(String label, double y, String colour) {
        public Level {
            if (!Double.isFinite(y)) {
                throw new IllegalArgumentException("a level must be finite (got " + y + ")");
            }
        }
    }

    /**
     * A stretch of the x axis to mark, from {@code fromX} to {@code toX} (an output sitting at a
     * limit): shaded lightly over the plot's height and drawn as a solid bar in row {@code row}
     * (0, 1, ...) along the top edge, so that it shows on a grey-scale print too.
     */
    public record Stretch(double fromX, double toX, String colour, int row) {
        public Stretch {
            if (!Double.isFinite(fromX) || !(toX >= fromX) || !Double.isFinite(toX) || row < 0) {
                throw new IllegalArgumentException("a stretch needs finite from <= to and a row >= 0 (got " + fromX
                        + " to " + toX + ", row " + row + ")");
            }
        }
    }

    private SvgPlot() {
    }

    /**
     * A panel's drawing size in pixels and the most points drawn per line: {@link #STANDARD} for a
     * single loop's plot file, {@link #COMPACT} for the audit report, where many loops share a page.
     */
    public record Size(int width, int height, int maxPoints) {
        public static final Size STANDARD = new Size(640, 260, 1500);
        public static final Size COMPACT = new Size(400, 200, 300);

        public Size {
            if (width <= LEFT + RIGHT || height <= TOP + BOTTOM || maxPoints < 4) {
                throw new IllegalArgumentException("plot size must leave room for the axes and draw at least 4 points"
                        + " (got " + width + " x " + height + " px, " + maxPoints + " points)");
            }
        }
    }

    static final int WIDTH = Size.STANDARD.width();
    static final int HEIGHT = Size.STANDARD.height();
    static final int LEFT = 64;
    static final int RIGHT = 16;
    static final int TOP = 28;
    static final int BOTTOM = 40;
    private static final int LEGEND_WIDTH = 120;
    private static final int LEGEND_ROW = 14;

    /** A panel as an {@code <svg>} element, {@code logX} for frequency axes, at the standard size. */
    public static String panel(String title, String xLabel, String yLabel, List<Series> series, boolean logX) {
        return panel(title, xLabel, yLabel, series, logX, Size.STANDARD);
    }

    /** A panel as an {@code <svg>} element of the given size. */
    public static String panel(String title, String xLabel, String yLabel, List<Series> series, boolean logX,
                               Size size) {
        return panel(title, xLabel, yLabel, series, List.of(), List.of(), null, logX, size);
    }

    /** Height of a stretch's bar along the top edge of the plot, px. */
    static final int STRETCH_BAR = 4;

    /**
     * A panel with horizontal {@code levels} and marked {@code stretches} as well as lines; the
     * stretches are named {@code stretchLabel} in the legend.
     */
    public static String panel(String title, String xLabel, String yLabel, List<Series> series, List<Level> levels,
                               List<Stretch> stretches, String stretchLabel, boolean logX, Size size) {
        PlotFrame f = PlotFrame.of(series, levels, logX, size);
        int width = size.width();
        int height = size.height();
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 %d %d\" "
                + "width=\"%d\" height=\"%d\" font-family=\"sans-serif\" font-size=\"11\" role=\"img\">%n",
                width, height, width, height));
        sb.append("<title>").append(esc(title)).append("</title>\n");
        sb.append(String.format(Locale.ROOT, "<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"%d\" fill=\"#fcfcfa\" "
                + "stroke=\"#888\"/>%n", LEFT, TOP, width - LEFT - RIGHT, height - TOP - BOTTOM));
        sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"16\" font-size=\"12\" font-weight=\"bold\">%s</text>%n",
                LEFT, esc(title)));
        double[] yTicks = ticks(f.y0, f.y1);
        for (double t : yTicks) {
            double py = f.py(t);
            sb.append(String.format(Locale.ROOT, "<line x1=\"%d\" x2=\"%d\" y1=\"%.1f\" y2=\"%.1f\" stroke=\"#ddd\"/>"
                    + "<text x=\"%d\" y=\"%.1f\" text-anchor=\"end\">%s</text>%n", LEFT, width - RIGHT, py, py,
                    LEFT - 4, py + 4, label(t, yTicks)));
        }
        double[] xTicks = logX ? logTicks(f.x0, f.x1) : ticks(f.x0, f.x1);
        for (double t : xTicks) {
            double px = f.px(t);
            sb.append(String.format(Locale.ROOT, "<line x1=\"%.1f\" x2=\"%.1f\" y1=\"%d\" y2=\"%d\" stroke=\"#ddd\"/>"
                    + "<text x=\"%.1f\" y=\"%d\" text-anchor=\"middle\">%s</text>%n", px, px, TOP, height - BOTTOM,
                    px, height - BOTTOM + 14, logX ? label(Math.pow(10, t)) : label(t, xTicks)));
        }
        sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" text-anchor=\"middle\">%s</text>%n",
                (LEFT + width - RIGHT) / 2, height - 8, esc(xLabel)));
        sb.append(String.format(Locale.ROOT, "<text transform=\"translate(14,%d) rotate(-90)\" text-anchor=\"middle\">"
                + "%s</text>%n", (TOP + height - BOTTOM) / 2, esc(yLabel)));
        for (Stretch st : stretches) {
            double a = Math.max(f.px(st.fromX()), LEFT);
            double b = Math.min(f.px(st.toX()), width - RIGHT);
            if (!(b > a)) {
                b = Math.min(a + 1, width - RIGHT);
            }
            sb.append(String.format(Locale.ROOT, "<rect class=\"at-limit\" x=\"%.1f\" y=\"%d\" width=\"%.1f\" "
                    + "height=\"%d\" fill=\"%s\" fill-opacity=\"0.12\"/><rect x=\"%.1f\" y=\"%d\" width=\"%.1f\" "
                    + "height=\"%d\" fill=\"%s\"/>%n", a, TOP, b - a, height - TOP - BOTTOM, st.colour(), a,
                    TOP + 1 + st.row() * (STRETCH_BAR + 1), b - a, STRETCH_BAR, st.colour()));
        }
        List<Level> off = new java.util.ArrayList<>();
        for (Level l : levels) {
            if (l.y() < f.y0 || l.y() > f.y1) {
                off.add(l);
                continue;
            }
            double py = f.py(l.y());
            sb.append(String.format(Locale.ROOT, "<line class=\"level\" x1=\"%d\" x2=\"%d\" y1=\"%.1f\" y2=\"%.1f\" "
                    + "stroke=\"%s\" stroke-width=\"1.2\" stroke-dasharray=\"2 2\"/>%n", LEFT, width - RIGHT, py, py,
                    l.colour()));
        }
        List<double[]> lines = new java.util.ArrayList<>();
        for (Series s : series) {
            double[] pts = f.pixels(s, size.maxPoints());
            lines.add(pts);
            StringBuilder text = new StringBuilder();
            for (int k = 0; k < pts.length; k += 2) {
                text.append(String.format(Locale.ROOT, "%.1f,%.1f ", pts[k], pts[k + 1]));
            }
            sb.append(String.format(Locale.ROOT, "<polyline fill=\"none\" stroke=\"%s\" stroke-width=\"1.6\"%s "
                    + "points=\"%s\"/>%n", s.colour(), s.dashed() ? " stroke-dasharray=\"6 3\"" : "",
                    text.toString().trim()));
        }
        int drawnLevels = levels.size() - off.size();
        int rows = series.size() + drawnLevels + (off.isEmpty() ? 0 : 1) + (stretches.isEmpty() ? 0 : 1);
        int[] corner = legendCorner(lines, rows, size);
        int legendX = corner[0];
        int legendY = corner[1];
        for (Series s : series) {
            sb.append(String.format(Locale.ROOT, "<line x1=\"%d\" x2=\"%d\" y1=\"%d\" y2=\"%d\" stroke=\"%s\" "
                    + "stroke-width=\"2\"%s/><text x=\"%d\" y=\"%d\" text-anchor=\"end\">%s</text>%n", legendX - 22,
                    legendX, legendY, legendY, s.colour(), s.dashed() ? " stroke-dasharray=\"6 3\"" : "",
                    legendX - 26, legendY + 4, esc(s.label())));
            legendY += LEGEND_ROW;
        }
        for (Level l : levels) {
            if (off.contains(l)) {
                continue;
            }
            sb.append(String.format(Locale.ROOT, "<line x1=\"%d\" x2=\"%d\" y1=\"%d\" y2=\"%d\" stroke=\"%s\" "
                    + "stroke-width=\"1.2\" stroke-dasharray=\"2 2\"/><text x=\"%d\" y=\"%d\" text-anchor=\"end\">%s"
                    + "</text>%n", legendX - 22, legendX, legendY, legendY, l.colour(), legendX - 26, legendY + 4,
                    esc(l.label())));
            legendY += LEGEND_ROW;
        }
        if (!off.isEmpty()) {
            // levels far off the lines share one row, without a swatch: nothing of them is drawn
            sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" text-anchor=\"end\">%s</text>%n", legendX,
                    legendY + 4, esc("off the scale: " + String.join(", ", off.stream().map(Level::label).toList()))));
            legendY += LEGEND_ROW;
        }
        if (!stretches.isEmpty()) {
            sb.append(String.format(Locale.ROOT, "<rect x=\"%d\" y=\"%d\" width=\"22\" height=\"%d\" fill=\"#777\"/>"
                    + "<text x=\"%d\" y=\"%d\" text-anchor=\"end\">%s</text>%n", legendX - 22, legendY - 2, STRETCH_BAR,
                    legendX - 26, legendY + 4, esc(stretchLabel == null ? "marked" : stretchLabel)));
        }
        sb.append("</svg>\n");
        return sb.toString();
    }

    /**
     * Where the legend goes: the corner of the plot area that the lines cross least (top right
     * when tied), as {x of the legend's right end, y of its first row}.
     */
    static int[] legendCorner(List<double[]> lines, int rows, Size size) {
        int right = size.width() - RIGHT - 8;
        int left = LEFT + 8 + LEGEND_WIDTH;
        int top = TOP + 14;
        int bottom = size.height() - BOTTOM - 8 - LEGEND_ROW * (rows - 1);
        int[][] corners = {{right, top}, {right, bottom}, {left, top}, {left, bottom}};
        int[] best = corners[0];
        int bestCount = Integer.MAX_VALUE;
        for (int[] c : corners) {
            double x0 = c[0] - LEGEND_WIDTH;
            double y0 = c[1] - 10;
            double y1 = c[1] + LEGEND_ROW * (rows - 1) + 8;
            int count = 0;
            for (double[] pts : lines) {
                for (int k = 0; k < pts.length; k += 2) {
                    if (pts[k] >= x0 && pts[k] <= c[0] + 4 && pts[k + 1] >= y0 && pts[k + 1] <= y1) {
                        count++;
                    }
                }
            }
            if (count < bestCount) {
                best = c;
                bestCount = count;
            }
        }
        return best;
    }

    /** Most intervals between ticks on an axis, so small panels stay legible. */
    private static final int MAX_TICK_INTERVALS = 6;

    /** Ticks at the smallest step of 1, 2 or 5 times a power of ten that gives at most {@value #MAX_TICK_INTERVALS} intervals. */
    static double[] ticks(double a, double b) {
        double span = b - a;
        double mag = Math.pow(10, Math.floor(Math.log10(span / MAX_TICK_INTERVALS)));
        double step = 10 * mag;
        for (double m : new double[] {1, 2, 5}) {
            if (span / (m * mag) <= MAX_TICK_INTERVALS) {
                step = m * mag;
                break;
            }
        }
        double first = Math.ceil(a / step) * step;
        int n = (int) Math.floor((b - first) / step) + 1;
        double[] t = new double[Math.max(n, 0)];
        for (int k = 0; k < t.length; k++) {
            t[k] = first + k * step;
        }
        return t;
    }

    private static double[] logTicks(double a, double b) {
        int lo = (int) Math.ceil(a);
        int hi = (int) Math.floor(b);
        double[] t = new double[Math.max(hi - lo + 1, 0)];
        for (int k = 0; k < t.length; k++) {
            t[k] = lo + k;
        }
        return t;
    }

    /**
     * A tick's label with as many decimals as the step between {@code ticks} needs, so that
     * neighbouring ticks never read the same (50.05 and 50.1, not 50.1 twice).
     */
    static String label(double v, double[] ticks) {
        if (ticks.length < 2 || Math.abs(v) < 1e-12 * Math.abs(ticks[1] - ticks[0])) {
            return ticks.length < 2 ? label(v) : "0";
        }
        double step = Math.abs(ticks[1] - ticks[0]);
        int decimals = Math.max(0, (int) Math.ceil(-Math.log10(step) - 1e-9));
        return new java.math.BigDecimal(v).setScale(decimals, java.math.RoundingMode.HALF_EVEN).stripTrailingZeros()
                .toPlainString();
    }

    private static String label(double v) {
        if (Math.abs(v) < 1e-12) {
            return "0";
        }
        return org.loopform.units.Numbers.significant(v, 3);
    }

    static String esc(String s) {
        return s.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace("\"", "&quot;");
    }

    /** A whole SVG document stacking panels vertically. */
    public static String stack(List<String> panels) {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 %d %d\" width=\"%d\""
                + " height=\"%d\">%n", WIDTH, HEIGHT * panels.size(), WIDTH, HEIGHT * panels.size()));
        for (int k = 0; k < panels.size(); k++) {
            sb.append(String.format(Locale.ROOT, "<g transform=\"translate(0,%d)\">%n", k * HEIGHT));
            sb.append(panels.get(k).replaceFirst("^<svg [^>]*>", "<svg width=\"" + WIDTH + "\" height=\"" + HEIGHT
                    + "\" font-family=\"sans-serif\" font-size=\"11\">"));
            sb.append("</g>\n");
        }
        sb.append("</svg>\n");
        return sb.toString();
    }
}

package org.loopform.report;

import java.util.List;
import java.util.Locale;

/**
 * Small, dependency-free SVG line charts: one panel per call, several series, axes with ticks,
 * labels with units. Self-contained (no scripts, no external fonts), so it prints and embeds.
 */
public final class SvgPlot {

    /** One line on a chart. {@code dashed} draws the reference (design) line. */
    public record Series(String label, double[] x, double[] y, String colour, boolean dashed) {
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
        PlotFrame f = PlotFrame.of(series, logX, size);
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
        for (double t : ticks(f.y0, f.y1)) {
            double py = f.py(t);
            sb.append(String.format(Locale.ROOT, "<line x1=\"%d\" x2=\"%d\" y1=\"%.1f\" y2=\"%.1f\" stroke=\"#ddd\"/>"
                    + "<text x=\"%d\" y=\"%.1f\" text-anchor=\"end\">%s</text>%n", LEFT, width - RIGHT, py, py,
                    LEFT - 4, py + 4, label(t)));
        }
        for (double t : logX ? logTicks(f.x0, f.x1) : ticks(f.x0, f.x1)) {
            double px = f.px(t);
            sb.append(String.format(Locale.ROOT, "<line x1=\"%.1f\" x2=\"%.1f\" y1=\"%d\" y2=\"%d\" stroke=\"#ddd\"/>"
                    + "<text x=\"%.1f\" y=\"%d\" text-anchor=\"middle\">%s</text>%n", px, px, TOP, height - BOTTOM,
                    px, height - BOTTOM + 14, logX ? label(Math.pow(10, t)) : label(t)));
        }
        sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" text-anchor=\"middle\">%s</text>%n",
                (LEFT + width - RIGHT) / 2, height - 8, esc(xLabel)));
        sb.append(String.format(Locale.ROOT, "<text transform=\"translate(14,%d) rotate(-90)\" text-anchor=\"middle\">"
                + "%s</text>%n", (TOP + height - BOTTOM) / 2, esc(yLabel)));
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
        int[] corner = legendCorner(lines, series.size(), size);
        int legendX = corner[0];
        int legendY = corner[1];
        for (Series s : series) {
            sb.append(String.format(Locale.ROOT, "<line x1=\"%d\" x2=\"%d\" y1=\"%d\" y2=\"%d\" stroke=\"%s\" "
                    + "stroke-width=\"2\"%s/><text x=\"%d\" y=\"%d\" text-anchor=\"end\">%s</text>%n", legendX - 22,
                    legendX, legendY, legendY, s.colour(), s.dashed() ? " stroke-dasharray=\"6 3\"" : "",
                    legendX - 26, legendY + 4, esc(s.label())));
            legendY += LEGEND_ROW;
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

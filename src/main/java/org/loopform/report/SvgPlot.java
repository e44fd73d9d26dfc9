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

    static final int WIDTH = 640;
    static final int HEIGHT = 260;
    private static final int LEFT = 64;
    private static final int RIGHT = 16;
    private static final int TOP = 28;
    private static final int BOTTOM = 40;

    /** A panel as an {@code <svg>} element, {@code logX} for frequency axes. */
    public static String panel(String title, String xLabel, String yLabel, List<Series> series, boolean logX) {
        double x0 = Double.POSITIVE_INFINITY;
        double x1 = Double.NEGATIVE_INFINITY;
        double y0 = Double.POSITIVE_INFINITY;
        double y1 = Double.NEGATIVE_INFINITY;
        for (Series s : series) {
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
        if (!(x1 > x0)) {
            x1 = x0 + 1;
        }
        if (!(y1 > y0)) {
            y0 -= 1;
            y1 += 1;
        }
        double pad = 0.05 * (y1 - y0);
        y0 -= pad;
        y1 += pad;
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "<svg xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 %d %d\" "
                + "width=\"%d\" height=\"%d\" font-family=\"sans-serif\" font-size=\"11\" role=\"img\">%n",
                WIDTH, HEIGHT, WIDTH, HEIGHT));
        sb.append("<title>").append(esc(title)).append("</title>\n");
        sb.append(String.format(Locale.ROOT, "<rect x=\"%d\" y=\"%d\" width=\"%d\" height=\"%d\" fill=\"#fcfcfa\" "
                + "stroke=\"#888\"/>%n", LEFT, TOP, WIDTH - LEFT - RIGHT, HEIGHT - TOP - BOTTOM));
        sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"16\" font-size=\"12\" font-weight=\"bold\">%s</text>%n",
                LEFT, esc(title)));
        // ticks
        for (double t : ticks(y0, y1)) {
            double py = py(t, y0, y1);
            sb.append(String.format(Locale.ROOT, "<line x1=\"%d\" x2=\"%d\" y1=\"%.1f\" y2=\"%.1f\" stroke=\"#ddd\"/>"
                    + "<text x=\"%d\" y=\"%.1f\" text-anchor=\"end\">%s</text>%n", LEFT, WIDTH - RIGHT, py, py,
                    LEFT - 4, py + 4, label(t)));
        }
        for (double t : logX ? logTicks(x0, x1) : ticks(x0, x1)) {
            double px = px(t, x0, x1);
            sb.append(String.format(Locale.ROOT, "<line x1=\"%.1f\" x2=\"%.1f\" y1=\"%d\" y2=\"%d\" stroke=\"#ddd\"/>"
                    + "<text x=\"%.1f\" y=\"%d\" text-anchor=\"middle\">%s</text>%n", px, px, TOP, HEIGHT - BOTTOM,
                    px, HEIGHT - BOTTOM + 14, logX ? label(Math.pow(10, t)) : label(t)));
        }
        sb.append(String.format(Locale.ROOT, "<text x=\"%d\" y=\"%d\" text-anchor=\"middle\">%s</text>%n",
                (LEFT + WIDTH - RIGHT) / 2, HEIGHT - 8, esc(xLabel)));
        sb.append(String.format(Locale.ROOT, "<text transform=\"translate(14,%d) rotate(-90)\" text-anchor=\"middle\">"
                + "%s</text>%n", (TOP + HEIGHT - BOTTOM) / 2, esc(yLabel)));
        int legendX = WIDTH - RIGHT - 8;
        int legendY = TOP + 14;
        for (Series s : series) {
            StringBuilder pts = new StringBuilder();
            int step = Math.max(1, s.x().length / 1500);
            for (int k = 0; k < s.x().length; k += step) {
                double x = logX ? Math.log10(s.x()[k]) : s.x()[k];
                if (!Double.isFinite(x) || !Double.isFinite(s.y()[k])) {
                    continue;
                }
                pts.append(String.format(Locale.ROOT, "%.1f,%.1f ", px(x, x0, x1), py(s.y()[k], y0, y1)));
            }
            sb.append(String.format(Locale.ROOT, "<polyline fill=\"none\" stroke=\"%s\" stroke-width=\"1.6\"%s "
                    + "points=\"%s\"/>%n", s.colour(), s.dashed() ? " stroke-dasharray=\"6 3\"" : "", pts.toString().trim()));
            sb.append(String.format(Locale.ROOT, "<line x1=\"%d\" x2=\"%d\" y1=\"%d\" y2=\"%d\" stroke=\"%s\" "
                    + "stroke-width=\"2\"%s/><text x=\"%d\" y=\"%d\" text-anchor=\"end\">%s</text>%n", legendX - 22,
                    legendX, legendY, legendY, s.colour(), s.dashed() ? " stroke-dasharray=\"6 3\"" : "",
                    legendX - 26, legendY + 4, esc(s.label())));
            legendY += 14;
        }
        sb.append("</svg>\n");
        return sb.toString();
    }

    private static double px(double x, double x0, double x1) {
        return LEFT + (x - x0) / (x1 - x0) * (WIDTH - LEFT - RIGHT);
    }

    private static double py(double y, double y0, double y1) {
        return HEIGHT - BOTTOM - (y - y0) / (y1 - y0) * (HEIGHT - TOP - BOTTOM);
    }

    static double[] ticks(double a, double b) {
        double span = b - a;
        double raw = span / 5;
        double mag = Math.pow(10, Math.floor(Math.log10(raw)));
        double step = raw / mag >= 5 ? 5 * mag : raw / mag >= 2 ? 2 * mag : mag;
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

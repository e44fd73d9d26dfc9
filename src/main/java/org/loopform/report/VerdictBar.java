package org.loopform.report;

import java.util.Locale;
import org.loopform.audit.AuditSummary;
import org.loopform.check.Verdict;

/**
 * Loops by verdict as one stacked horizontal bar in inline SVG: fail, warn, pass, not checked,
 * each segment as wide as its share and labelled with its count where it fits. The fills differ
 * in lightness as well as hue, so the bar still reads in black and white; the table beside it
 * carries the same numbers.
 */
final class VerdictBar {
    private VerdictBar() {
    }

    private static final int WIDTH = 400;
    private static final int HEIGHT = 26;
    /** Narrowest segment, in pixels, that gets its count written inside. */
    private static final double LABEL_MIN_PX = 24;

    static String svg(AuditSummary s) {
        int[] counts = {s.count(Verdict.FAIL), s.count(Verdict.WARN), s.count(Verdict.PASS), s.badRowCount()};
        String[] fills = {"#8b1a1a", "#e3a21a", "#b9d8bd", "#6f6f6a"};
        String[] inks = {"#ffffff", "#1d1d1b", "#1d1d1b", "#ffffff"};
        String[] names = {"fail", "warn", "pass", "not checked"};
        int total = 0;
        for (int c : counts) {
            total += c;
        }
        StringBuilder sb = new StringBuilder(String.format(Locale.ROOT, "<svg class=\"verdict-bar\" "
                + "xmlns=\"http://www.w3.org/2000/svg\" viewBox=\"0 0 %d %d\" width=\"%d\" height=\"%d\" "
                + "font-family=\"sans-serif\" font-size=\"12\" role=\"img\"><title>Loops by verdict</title>",
                WIDTH, HEIGHT, WIDTH, HEIGHT));
        sb.append(String.format(Locale.ROOT, "<rect x=\"0.5\" y=\"0.5\" width=\"%d\" height=\"%d\" fill=\"#fff\" "
                + "stroke=\"#1d1d1b\"/>", WIDTH - 1, HEIGHT - 1));
        double x = 0.5;
        for (int k = 0; k < counts.length && total > 0; k++) {
            double w = (WIDTH - 1) * (double) counts[k] / total;
            if (w <= 0) {
                continue;
            }
            sb.append(String.format(Locale.ROOT, "<rect x=\"%.1f\" y=\"0.5\" width=\"%.1f\" height=\"%d\" fill=\"%s\" "
                    + "stroke=\"#1d1d1b\" stroke-width=\"0.5\"><title>%s: %d loops</title></rect>", x, w, HEIGHT - 1,
                    fills[k], names[k], counts[k]));
            if (w >= LABEL_MIN_PX) {
                sb.append(String.format(Locale.ROOT, "<text x=\"%.1f\" y=\"%d\" text-anchor=\"middle\" fill=\"%s\">"
                        + "%d</text>", x + w / 2, HEIGHT / 2 + 4, inks[k], counts[k]));
            }
            x += w;
        }
        return sb.append("</svg>\n").toString();
    }
}

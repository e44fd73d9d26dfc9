package org.loopform.report;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

// plumbing: no published source needed, source: none (drawing and thinning of loopform's own charts)
@DisplayName("SVG plot panels")
class SvgPlotTest {

    private static String[] points(String svg) {
        Matcher m = Pattern.compile("points=\"([^\"]*)\"").matcher(svg);
        assertThat(m.find()).isTrue();
        return m.group(1).split(" ");
    }

    @Test
    void thin_a_long_line_to_the_size_limit_and_keep_its_peak() {
        int n = 20_000;
        double[] x = new double[n];
        double[] y = new double[n];
        for (int k = 0; k < n; k++) {
            x[k] = k;
            y[k] = k == 12_345 ? 10 : 0;
        }
        String svg = SvgPlot.panel("t", "time, s", "PV, %", List.of(new SvgPlot.Series("s", x, y, "#000", false)),
                false, SvgPlot.Size.COMPACT);
        String[] pts = points(svg);
        assertThat(pts.length).isLessThanOrEqualTo(SvgPlot.Size.COMPACT.maxPoints() + 1);
        // the top of the frame (y = 10 plus 5 % padding) sits just below the frame's top edge
        double top = Double.MAX_VALUE;
        for (String p : pts) {
            top = Math.min(top, Double.parseDouble(p.split(",")[1]));
        }
        assertThat(top).isLessThan(SvgPlot.TOP + 10);
    }

    @Test
    void keep_a_short_line_whole() {
        double[] x = {0, 1, 2, 3};
        double[] y = {0, 1, 0, 1};
        String svg = SvgPlot.panel("t", "x, s", "y, %", List.of(new SvgPlot.Series("s", x, y, "#000", true)), false);
        assertThat(points(svg)).hasSize(4);
        assertThat(svg).contains("stroke-dasharray");
    }

    @Test
    void escape_titles_and_labels() {
        String svg = SvgPlot.panel("<a&b>", "x, s", "y, %", List.of(new SvgPlot.Series("<s>", new double[] {0, 1},
                new double[] {0, 1}, "#000", false)), false);
        assertThat(svg).contains("&lt;a&amp;b&gt;", "&lt;s&gt;").doesNotContain("<a&b>", "<s>");
    }

    @Test
    void put_the_legend_where_the_lines_are_not() {
        // a line along the top of the frame leaves the bottom corners free
        double[] x = new double[100];
        double[] y = new double[100];
        for (int k = 0; k < 100; k++) {
            x[k] = k;
            y[k] = k < 99 ? 1 : 0;
        }
        SvgPlot.Size size = SvgPlot.Size.STANDARD;
        PlotFrame f = PlotFrame.of(List.of(new SvgPlot.Series("s", x, y, "#000", false)), false, size);
        double[] px = f.pixels(new SvgPlot.Series("s", x, y, "#000", false), size.maxPoints());
        int[] corner = SvgPlot.legendCorner(List.of(px), 2, size);
        assertThat(corner[1]).isGreaterThan(size.height() / 2);
    }

    @Test
    void neighbouring_ticks_never_read_the_same() {
        double[] t = SvgPlot.ticks(49.99, 50.24);
        java.util.Set<String> labels = new java.util.HashSet<>();
        for (double v : t) {
            labels.add(SvgPlot.label(v, t));
        }
        assertThat(labels).hasSize(t.length).contains("50.05", "50.1", "50.2");
        double[] big = SvgPlot.ticks(0, 1000);
        assertThat(SvgPlot.label(big[1], big)).isEqualTo("200");
    }
}

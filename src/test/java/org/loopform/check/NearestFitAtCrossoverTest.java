package org.loopform.check;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.LoopFileReader;
import org.loopform.law.ControlLaw;

/**
 * Source: numpy, by {@code python3 src/test/python/write_nearest_fit_golden.py}
 * ({@code form/nearest-fit-crossover-golden.csv}): for loops with a process, the design loop's
 * crossover (|C P| = 1, bisection in numpy), the source law's response and the deviation of the
 * textbook values (Astrom & Hagglund 1995 sec. 3.4) as the target holds them, at a tenth to three
 * times the crossover. With the process known the check weights the nearest fit around the
 * crossover (by the design loop's |S T| from a decade below to three times it), so the fit must be no worse there than entering the textbook values (plus 0.01 dB /
 * 0.1 deg for the fit's own tolerance); for the invented demo loop TIC-301 also at the crossover
 * itself, where the textbook values are 0.0178 dB and 0.868 deg off.
 */
class NearestFitAtCrossoverTest {

    @TempDir
    Path dir;

    record Row(String id, double crossover, double omega, double re, double im, double keptDb, double keptDeg) {
    }

    private static List<Row> golden(String id) throws IOException {
        List<Row> rows = new ArrayList<>();
        try (var in = NearestFitAtCrossoverTest.class.getResourceAsStream("/org/loopform/form/nearest-fit-crossover-golden.csv");
             var r = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8))) {
            r.readLine();
            for (String line = r.readLine(); line != null; line = r.readLine()) {
                String[] f = line.split(",");
                if (f[0].equals(id)) {
                    rows.add(new Row(f[0], Double.parseDouble(f[1]), Double.parseDouble(f[2]), Double.parseDouble(f[3]),
                            Double.parseDouble(f[4]), Double.parseDouble(f[5]), Double.parseDouble(f[6])));
                }
            }
        }
        assertThat(rows).as(id).hasSize(7);
        return rows;
    }

    /** The fit's gain (dB) and phase (deg) deviation from the numpy source response at the row's frequency. */
    private static double[] fitDeviation(ControlLaw fit, Row r) {
        double[] out = new double[2];
        fit.feedbackAt(r.omega(), out);
        double den = r.re() * r.re() + r.im() * r.im();
        double ratioRe = (out[0] * r.re() + out[1] * r.im()) / den;
        double ratioIm = (out[1] * r.re() - out[0] * r.im()) / den;
        return new double[] {Math.abs(20 * Math.log10(Math.hypot(ratioRe, ratioIm))),
                Math.abs(Math.toDegrees(Math.atan2(ratioIm, ratioRe)))};
    }

    private static void noWorseThanTheTextbookValues(ControlLaw fit, List<Row> rows) {
        double fitDb = 0;
        double fitDeg = 0;
        double keptDb = 0;
        double keptDeg = 0;
        for (Row r : rows) {
            double[] d = fitDeviation(fit, r);
            fitDb = Math.max(fitDb, d[0]);
            fitDeg = Math.max(fitDeg, d[1]);
            keptDb = Math.max(keptDb, r.keptDb());
            keptDeg = Math.max(keptDeg, r.keptDeg());
        }
        assertThat(fitDb).as("gain deviation around crossover, dB").isLessThanOrEqualTo(keptDb + 0.01);
        assertThat(fitDeg).as("phase deviation around crossover, deg").isLessThanOrEqualTo(keptDeg + 0.1);
    }

    /**
     * The process's weight, |S T| = |L| / |1 + L|^2, derived by hand for a P controller (K = 1) on
     * 1/(1 + s): L = 1/(1 + i w), 1 + L = (2 + i w)/(1 + i w), so |S T| = sqrt(1 + w^2)/(4 + w^2):
     * 1/4 at w = 0.001 (to 1e-6), sqrt(2)/5 at 1 rad/s, sqrt(5)/8 at 2 rad/s.
     */
    @Test
    void the_process_weight_is_the_design_loops_s_times_t() {
        var weight = LoopCheck.loopEmphasis(new ControlLaw(new org.loopform.law.PidTerms(1, 0, 0, 0, 1, 0)),
                new org.loopform.process.FirstOrderPlusDeadTime(1, 1, 0));
        assertThat(weight.applyAsDouble(0.001)).isCloseTo(0.25, org.assertj.core.api.Assertions.within(1e-6));
        assertThat(weight.applyAsDouble(1)).isCloseTo(Math.sqrt(2) / 5, org.assertj.core.api.Assertions.within(1e-12));
        assertThat(weight.applyAsDouble(2)).isCloseTo(Math.sqrt(5) / 8, org.assertj.core.api.Assertions.within(1e-12));
    }

    @Test
    void the_demo_loop_tic_301_is_fitted_no_worse_than_the_textbook_values_at_its_crossover() throws IOException {
        Path file = Path.of("examples/loops/tic-301.yaml");
        CheckResult r = LoopCheck.run(LoopFileReader.readOne(file, file.toString()), CheckPolicy.DEFAULT);
        assertThat(r.conversion().exact()).isFalse();
        List<Row> rows = golden("tic-301");
        noWorseThanTheTextbookValues(r.conversion().targetLaw(), rows);
        Row atCrossover = rows.stream().filter(x -> x.omega() == x.crossover()).findFirst().orElseThrow();
        double[] d = fitDeviation(r.conversion().targetLaw(), atCrossover);
        assertThat(d[0]).as("gain deviation at crossover, dB").isLessThanOrEqualTo(atCrossover.keptDb());
        assertThat(d[1]).as("phase deviation at crossover, deg").isLessThanOrEqualTo(atCrossover.keptDeg());
    }

    @Test
    void an_unfiltered_law_into_a_fixed_filter_is_fitted_no_worse_than_the_textbook_values_around_crossover()
            throws IOException {
        Path file = Files.writeString(dir.resolve("loop.yaml"), "tag: TIC-904\n"
                + "process: {model: fopdt, gain: 1.5, time_constant: 300 s, dead_time: 30 s}\n"
                + "tuning: {form: series, kc: 2, ti: 100, td: 20, n: off}\n"
                + "target: {form: ideal-fixed-n8, scan: 0.1 s}\n"
                + "ranges: {pv: 0..100, output: 0..100}\n");
        CheckResult r = LoopCheck.run(LoopFileReader.readOne(file, file.toString()), CheckPolicy.DEFAULT);
        assertThat(r.conversion().exact()).isFalse();
        noWorseThanTheTextbookValues(r.conversion().targetLaw(), golden("series-off-into-n8"));
    }
}

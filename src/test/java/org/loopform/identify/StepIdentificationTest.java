package org.loopform.identify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.identify.Records.Move;

/**
 * Fits on invented records generated from known models ({@link Records}, analytic responses) with fixed seeds.
 * The true parameters are the models that generated the data; the two-point estimates follow Smith
 * (28.3 % and 63.2 % points) and Sundaresan and Krishnaswamy (35.3 % and 85.3 %), as in Seborg, Edgar and
 * Mellichamp, Process Dynamics and Control (from memory for the edition and section); intervals from the
 * Jacobian of least squares are common practice.
 * Coverage counts are what was measured when the test was written; the thresholds sit just below them.
 */
class StepIdentificationTest {

    private static boolean inside(double lo, double x, double hi) {
        return lo <= x && x <= hi;
    }

    private static boolean covers(ModelFit f, double k, double t, double l) {
        return inside(f.gainLow(), k, f.gainHigh()) && inside(f.lagLow(), t, f.lagHigh())
                && inside(f.deadTimeLow(), l, f.deadTimeHigh());
    }

    @Test
    @DisplayName("FOPDT K=2, T=20 s, L=5 s, one step, white noise 0.3 %: all three inside their intervals in 9 of 10 seeds")
    void fopdt_white_noise_one_step() {
        int covered = 0;
        for (int seed = 0; seed < 10; seed++) {
            PlantRecord r = Records.make(s -> Records.fopdtStep(2, 20, 5, s), new Move[] {new Move(20, 10)}, 1, 200, 0,
                    0.3, 0, seed);
            StepTestResult res = StepIdentification.identify(r, true);
            assertThat(res.recommended()).isEqualTo(ModelKind.FOPDT);
            ModelFit f = res.fit(ModelKind.FOPDT);
            assertThat(f.gain()).isCloseTo(2, within(0.05));
            assertThat(f.lagSeconds()).isCloseTo(20, within(1.5));
            assertThat(f.deadTimeSeconds()).isCloseTo(5, within(1.0));
            covered += covers(f, 2, 20, 5) ? 1 : 0;
        }
        assertThat(covered).isGreaterThanOrEqualTo(8);
    }

    @Test
    @DisplayName("FOPDT, a pulse then a step, irregular sampling, AR(1) noise phi = 0.8: estimates close, and the"
            + " intervals (widened by the residual correlation, allowing for the dead time) cover all three in 10 of 10"
            + " seeds")
    void fopdt_coloured_noise_pulse_and_step() {
        int covered = 0;
        for (int seed = 0; seed < 10; seed++) {
            PlantRecord r = Records.make(s -> Records.fopdtStep(-1.2, 15, 4, s),
                    new Move[] {new Move(20, 8), new Move(40, -8), new Move(100, -6)}, 1, 250, 0.6, 0.25, 0.8, seed);
            StepTestResult res = StepIdentification.identify(r, true);
            ModelFit f = res.fit(ModelKind.FOPDT);
            assertThat(f.gain()).isCloseTo(-1.2, within(0.15));
            assertThat(f.deadTimeSeconds()).isCloseTo(4, within(2.0));
            covered += covers(f, -1.2, 15, 4) ? 1 : 0;
        }
        assertThat(covered).isGreaterThanOrEqualTo(COLOURED_MIN);
    }

    /**
     * Measured: 10 of 10 (44 of 50 over seeds 0..49). Before the gain's and time constant's intervals allowed for
     * the dead time, and the dead time's for the logging interval before each output move, it was 4 of 10.
     */
    static final int COLOURED_MIN = 9;

    @Test
    @DisplayName("The same record with white noise: the gain's interval covers in 7 of 10 seeds (30 of 50 all three):"
            + " the output's moves are only known to a logging interval, which moves the gain more than the noise does")
    void fopdt_white_noise_pulse_and_step_irregular() {
        int covered = 0;
        for (int seed = 0; seed < 10; seed++) {
            PlantRecord r = Records.make(s -> Records.fopdtStep(-1.2, 15, 4, s),
                    new Move[] {new Move(20, 8), new Move(40, -8), new Move(100, -6)}, 1, 250, 0.6, 0.25, 0, seed);
            ModelFit f = StepIdentification.identify(r, true).fit(ModelKind.FOPDT);
            assertThat(inside(f.deadTimeLow(), 4, f.deadTimeHigh())).as("dead time, seed %d", seed).isTrue();
            assertThat(inside(f.lagLow(), 15, f.lagHigh())).as("time constant, seed %d", seed).isTrue();
            covered += covers(f, -1.2, 15, 4) ? 1 : 0;
        }
        assertThat(covered).isGreaterThanOrEqualTo(6);
    }

    @Test
    @DisplayName("Integrating Kv = 0.02 %/s per %, L = 8 s: recommended, slope recovered")
    void integrating() {
        PlantRecord r = Records.make(s -> Records.ipdtStep(0.02, 8, s), new Move[] {new Move(30, 5), new Move(150, -5)},
                1, 300, 0, 0.1, 0, 7);
        StepTestResult res = StepIdentification.identify(r, true);
        assertThat(res.recommended()).isEqualTo(ModelKind.IPDT);
        ModelFit f = res.fit(ModelKind.IPDT);
        assertThat(f.gain()).isCloseTo(0.02, within(0.001));
        assertThat(f.deadTimeSeconds()).isCloseTo(8, within(1.5));
    }

    @Test
    @DisplayName("SOPDT data T1 = 12 s, T2 = 6 s, L = 2 s: the FOPDT fit lies near Skogestad's half rule (15 s, 5 s)")
    void sopdt_data_fitted_by_fopdt_is_near_the_half_rule() {
        // Skogestad 2003, half rule: tau = T1 + T2/2 = 15 s, theta = L + T2/2 = 5 s; a least-squares fit and the
        // rule are different approximations, so only closeness (within 25 %) is checked
        PlantRecord r = Records.make(s -> Records.sopdtStep(1, 12, 6, 2, s), new Move[] {new Move(20, 10)}, 1, 250, 0,
                0.1, 0, 11);
        StepTestResult res = StepIdentification.identify(r, true);
        ModelFit f = res.fit(ModelKind.FOPDT);
        assertThat(f.lagSeconds()).isCloseTo(15, within(15 * 0.25));
        assertThat(f.deadTimeSeconds()).isCloseTo(5, within(5 * 0.25));
        ModelFit s = res.fit(ModelKind.SOPDT);
        assertThat(s.lagSeconds()).isCloseTo(12, within(2.0));
        assertThat(s.secondLagSeconds()).isCloseTo(6, within(2.0));
        assertThat(res.recommended()).isEqualTo(ModelKind.SOPDT);
    }

    @DisplayName("Records that cannot support a model say so")
    @Test
    void cannot_fit_findings() {
        // no step in the output
        PlantRecord flat = Records.make(s -> 0, new Move[] {}, 1, 100, 0, 0.2, 0, 1);
        assertThat(codes(StepIdentification.identify(flat, true))).contains("no-step");
        // the response (0.2 %) hidden in 0.5 % noise
        PlantRecord hidden = Records.make(s -> Records.fopdtStep(0.1, 10, 2, s), new Move[] {new Move(20, 2)}, 1, 150,
                0, 0.5, 0, 2);
        StepTestResult h = StepIdentification.identify(hidden, true);
        assertThat(codes(h)).contains("noise");
        assertThat(h.recommended()).isNull();
        // a response of about 6 noise deviations: small step
        PlantRecord small = Records.make(s -> Records.fopdtStep(1, 10, 2, s), new Move[] {new Move(20, 1.2)}, 1, 150,
                0, 0.2, 0, 3);
        assertThat(codes(StepIdentification.identify(small, true))).contains("small-step");
        // a baseline drifting 3 % before the step
        PlantRecord steady = Records.make(s -> Records.fopdtStep(1, 10, 2, s), new Move[] {new Move(30, 10)}, 1, 150, 0,
                0.1, 0, 4);
        double[] dy = steady.pvs();
        for (int k = 0; k < dy.length; k++) {
            dy[k] += 0.1 * steady.time(k);
        }
        PlantRecord drifting = new PlantRecord(steady.times(), steady.outputs(), dy);
        assertThat(codes(StepIdentification.identify(drifting, true))).contains("unsteady-baseline");
        // recorded for 40 s after the step of a process with L + 3 T = 95 s
        PlantRecord shortRecord = Records.make(s -> Records.fopdtStep(1, 30, 5, s), new Move[] {new Move(20, 10)}, 1,
                60, 0, 0.1, 0, 5);
        assertThat(codes(StepIdentification.identify(shortRecord, true))).contains("too-short");
        // the PV clipped at 100 % of span
        PlantRecord clipped = clip(Records.make(s -> Records.fopdtStep(8, 10, 2, s), new Move[] {new Move(20, 10)}, 1,
                150, 0, 0.1, 0, 6));
        assertThat(codes(StepIdentification.identify(clipped, true))).contains("saturation");
    }

    private static PlantRecord clip(PlantRecord r) {
        double[] y = r.pvs();
        for (int k = 0; k < y.length; k++) {
            y[k] = Math.min(100, y[k]);
        }
        return new PlantRecord(r.times(), r.outputs(), y);
    }

    private static java.util.List<String> codes(StepTestResult r) {
        return r.findings().stream().map(DataFinding::code).toList();
    }

    @Test
    @DisplayName("Relay: Ku = 4 d/(pi a) and Tu from a sine PV under a square output (Astrom & Hagglund 1984)")
    void relay_reads_the_describing_function_gain() {
        int n = 2001;
        double[] t = new double[n];
        double[] u = new double[n];
        double[] y = new double[n];
        for (int k = 0; k < n; k++) {
            t[k] = 0.05 * k;
            double phase = 2 * Math.PI * t[k] / 7.0;
            u[k] = 50 + 5 * Math.signum(Math.sin(phase + 2.0));
            y[k] = 40 + 2 * Math.sin(phase);
        }
        RelayResult r = RelayAnalysis.analyze(new PlantRecord(t, u, y));
        assertThat(r.ultimatePeriodSeconds()).isCloseTo(7.0, within(0.01));
        assertThat(r.ultimateGain()).isCloseTo(4 * 5 / (Math.PI * 2), within(0.01));
        assertThat(r.findings()).isEmpty();
    }
}

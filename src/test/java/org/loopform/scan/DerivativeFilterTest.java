package org.loopform.scan;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;

@DisplayName("The scan controller's derivative filter")
class DerivativeFilterTest {

    /** The published poles are printed to 4 significant figures, the derived ones here to 6. */
    private static final double PUBLISHED_TOL = 1e-6;
    private static final double TOL = 1e-12;
    /** A ratio of two small terms, each read as output plus K y with y = 1: the subtraction loses a few digits. */
    private static final double RATIO_TOL = 1e-9;

    /**
     * The derivative term of an ideal PD on the measurement (c = 0, no integral) after a unit PV
     * step at scan 0, read from the controller's output: D(k) = u(k) + K y(k).
     */
    private static double[] derivativeAfterPvStep(Discretization method, double k, double td, double tf, double h,
                                                  int scans) {
        PidSetting pd = Setups.ideal(k, Double.POSITIVE_INFINITY, td, tf, 1.0, 0.0);
        ScanController c = ScanController.unlimited(pd, FilterPlacement.DERIVATIVE,
                Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD, method), h);
        double[] d = new double[scans];
        for (int i = 0; i < scans; i++) {
            d[i] = c.update(0.0, 1.0) + k * 1.0;
        }
        return d;
    }

    @Nested
    @DisplayName("has the published pole for each discretization")
    class Poles {

        // Wittenmark, Astrom & Arzen, "Computer Control: An Overview", IFAC Professional Brief, 2002,
        // Table 3: forward 1 - h/Tf, backward Tf/(Tf + h), Tustin (2Tf - h)/(2Tf + h), step (ramp)
        // invariant exp(-h/Tf); values for Tf = 1 s, h = 0.5 s as derived in docs/references.md 4
        @ParameterizedTest(name = "{0}: {1}")
        @CsvSource({"FORWARD, 0.5", "BACKWARD, 0.666667", "TRAPEZOIDAL, 0.6", "RAMP_INVARIANT, 0.606531", "STEP_INVARIANT, 0.606531"})
        void scan_facts_give_the_published_pole(Discretization method, double pole) {
            ScanFacts facts = new ScanFacts(0.5, 1.0, 4.0, method);
            assertThat(facts.filterPole()).isCloseTo(pole, within(PUBLISHED_TOL));
        }

        // same table and values: after the kick, the derivative term decays by the pole each scan
        @ParameterizedTest(name = "{0}: {1}")
        @CsvSource({"FORWARD, 0.5", "BACKWARD, 0.666667", "TRAPEZOIDAL, 0.6", "RAMP_INVARIANT, 0.606531", "STEP_INVARIANT, 0.606531"})
        void the_running_controller_decays_its_derivative_by_the_published_pole(Discretization method, double pole) {
            double[] d = derivativeAfterPvStep(method, 2.0, 4.0, 1.0, 0.5, 8);
            for (int i = 1; i < d.length; i++) {
                assertThat(d[i] / d[i - 1]).as("scan %d", i).isCloseTo(pole, within(PUBLISHED_TOL));
            }
        }

        // Table 3 of the same brief, the derivative's input gain b_d (from memory): forward K N,
        // backward K Td N/(Td + N h), Tustin 2 K N Td/(2 Td + N h), ramp K Td (1 - exp(-N h/Td))/h;
        // with N = Td/Tf = 4, K = 2, Td = 4 s, h = 0.5 s: 8, 16/3, 6.4, 6.295509 (derived by hand); step
        // invariance keeps the continuous kick K Td / Tf = K N = 8 of a PV step (derived by hand)
        @ParameterizedTest(name = "{0}: kick {1}")
        @CsvSource({"FORWARD, 8", "BACKWARD, 5.333333", "TRAPEZOIDAL, 6.4", "RAMP_INVARIANT, 6.295509",
            "STEP_INVARIANT, 8"})
        void a_unit_pv_step_kicks_the_output_by_the_published_derivative_gain(Discretization method, double kick) {
            double[] d = derivativeAfterPvStep(method, 2.0, 4.0, 1.0, 0.5, 1);
            assertThat(-d[0]).isCloseTo(kick, within(PUBLISHED_TOL));
        }
    }

    @Nested
    @DisplayName("misbehaves when the scan is long against the filter")
    class LongScans {

        // forward difference pole 1 - h/Tf = -2 for h = 3 Tf: |pole| > 1, unstable (IFAC brief 2002, Table 3;
        // docs/references.md 4)
        @Test
        void forward_difference_grows_without_bound_when_h_exceeds_2_tf() {
            double[] d = derivativeAfterPvStep(Discretization.FORWARD, 1.0, 5.0, 1.0, 3.0, 12);
            for (int i = 1; i < d.length; i++) {
                assertThat(Math.abs(d[i])).isGreaterThan(Math.abs(d[i - 1]));
                assertThat(Math.signum(d[i])).isEqualTo(-Math.signum(d[i - 1]));
            }
            ScanFacts facts = new ScanFacts(3.0, 1.0, 5.0, Discretization.FORWARD);
            assertThat(facts.unstable()).isTrue();
            assertThat(facts.rings()).isFalse();
        }

        // Tustin pole (2Tf - h)/(2Tf + h) = -1/5 for h = 3 Tf: negative, so the derivative flips
        // sign each scan while it decays (same sources)
        @Test
        void tustin_rings_when_h_exceeds_2_tf() {
            double[] d = derivativeAfterPvStep(Discretization.TRAPEZOIDAL, 1.0, 5.0, 1.0, 3.0, 12);
            for (int i = 1; i < d.length; i++) {
                assertThat(Math.abs(d[i])).isLessThan(Math.abs(d[i - 1]));
                assertThat(Math.signum(d[i])).isEqualTo(-Math.signum(d[i - 1]));
                assertThat(d[i] / d[i - 1]).isCloseTo(-0.2, within(RATIO_TOL));
            }
            ScanFacts facts = new ScanFacts(3.0, 1.0, 5.0, Discretization.TRAPEZOIDAL);
            assertThat(facts.rings()).isTrue();
            assertThat(facts.unstable()).isFalse();
        }

        // below h = 2 Tf the Tustin pole is positive and the forward pole inside the unit circle (same sources)
        @Test
        void neither_rings_nor_grows_when_h_is_below_2_tf_except_forward_past_tf() {
            assertThat(new ScanFacts(1.5, 1.0, 5.0, Discretization.TRAPEZOIDAL).rings()).isFalse();
            assertThat(new ScanFacts(0.5, 1.0, 5.0, Discretization.FORWARD).rings()).isFalse();
            assertThat(new ScanFacts(1.9, 1.0, 5.0, Discretization.FORWARD).unstable()).isFalse();
            // forward pole 1 - 1.5 = -0.5 for Tf < h < 2 Tf: negative inside the unit circle, so it rings (derived)
            assertThat(new ScanFacts(1.5, 1.0, 5.0, Discretization.FORWARD).rings()).isTrue();
            // backward and step-invariant poles are positive for every h (same sources)
            assertThat(new ScanFacts(30, 1.0, 5.0, Discretization.BACKWARD).rings()).isFalse();
            assertThat(new ScanFacts(30, 1.0, 5.0, Discretization.STEP_INVARIANT).rings()).isFalse();
        }
    }

    @Nested
    @DisplayName("without a filter")
    class Unfiltered {

        // with Tf = 0 the derivative is the backward difference K Td (y(k) - y(k-1))/h (IFAC brief
        // 2002, Table 3, backward column with N -> infinity): a one-scan kick of K Td/h, then nothing
        @ParameterizedTest
        @CsvSource({"FORWARD", "BACKWARD", "TRAPEZOIDAL", "RAMP_INVARIANT", "STEP_INVARIANT"})
        void every_method_runs_the_backward_difference(Discretization method) {
            double[] d = derivativeAfterPvStep(method, 2.0, 3.0, 0.0, 0.5, 4);
            assertThat(d).containsExactly(new double[] {-12.0, 0.0, 0.0, 0.0}, within(TOL));
            assertThat(new ScanFacts(0.5, 0.0, 3.0, method).filterPole()).isZero();
        }
    }

    // A ramp y = t from t = 0 through Td s/(1 + Tf s) gives Td (1 - exp(-t/Tf)) (inverse Laplace
    // transform, common practice); the ramp-invariant discretization keeps it at every sample
    // (Astrom & Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 8 - from memory)
    @Test
    void ramp_invariant_derivative_follows_a_pv_ramp_exactly_at_the_samples() {
        double k = 1.5;
        double td = 2.0;
        double tf = 0.7;
        double h = 0.3;
        PidSetting pd = Setups.ideal(k, Double.POSITIVE_INFINITY, td, tf, 1.0, 0.0);
        ScanController c = ScanController.unlimited(pd, FilterPlacement.DERIVATIVE,
                Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD, Discretization.RAMP_INVARIANT), h);
        for (int i = 0; i <= 30; i++) {
            double y = i * h;
            double derivative = c.update(0.0, y) + k * y;
            assertThat(derivative).as("t = %s s", i * h).isCloseTo(-k * td * (1 - Math.exp(-i * h / tf)), within(TOL));
        }
    }

    // A unit step y = 1 from t = 0 through K Td s/(1 + Tf s) gives K (Td/Tf) exp(-t/Tf) (inverse Laplace
    // transform, common practice); the step-invariant (zero-order-hold equivalent) discretization keeps it
    // at every sample (Astrom & Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 8 - from memory)
    @Test
    void step_invariant_derivative_follows_a_pv_step_exactly_at_the_samples() {
        double k = 1.5;
        double td = 2.0;
        double tf = 0.7;
        double h = 0.3;
        PidSetting pd = Setups.ideal(k, Double.POSITIVE_INFINITY, td, tf, 1.0, 0.0);
        ScanController c = ScanController.unlimited(pd, FilterPlacement.DERIVATIVE,
                Setups.algorithm(AlgorithmKind.POSITIONAL, Discretization.BACKWARD, Discretization.STEP_INVARIANT), h);
        c.update(0.0, 0.0);
        for (int i = 0; i <= 30; i++) {
            double derivative = c.update(0.0, 1.0) + k;
            assertThat(derivative).as("t = %s s", i * h).isCloseTo(-k * td / tf * Math.exp(-i * h / tf), within(TOL));
        }
    }
}

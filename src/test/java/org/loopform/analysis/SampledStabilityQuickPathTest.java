// source: hand derivation (RootPlacedLoop: the closed-loop poles are the roots placed); the walk counts are the documented quick paths
package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;
import static org.loopform.analysis.RootPlacedLoop.at;
import static org.loopform.analysis.RootPlacedLoop.concat;
import static org.loopform.analysis.RootPlacedLoop.join;
import static org.loopform.analysis.RootPlacedLoop.pair;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The largest closed-loop pole is found by Newton's method from the unit circle and confirmed by two
 * counts, so a stable loop is decided in four walks (the counts at 1 + and 1 - the tolerance, and one
 * either side of the pole) and an unstable one whose largest pole lies within 1 % of the circle (Newton's
 * travel outward is bounded there) in three; a slower search (six to thirty walks) would
 * give the same figure, so only the count of walks tells a quick path that works from one that fails.
 * Each loop: 1 + L = prod (z - c) / (z^d prod (z - a)), closed-loop poles c by construction.
 */
class SampledStabilityQuickPathTest {

    /**
     * A real largest pole r (negative: an oscillation at the Nyquist frequency), a smaller pair and d more poles near 0; open-loop poles at 1 (integral
     * action), 0.5 and 0.4; d scans of delay.
     */
    @ParameterizedTest(name = "real pole {0}, {1} scans of delay")
    @CsvSource({"0.7, 0", "0.95, 1", "0.999, 2", "0.3, 3", "-1.005, 0", "-1.002, 2"})
    void a_real_largest_pole_takes_the_quick_path(double r, int delay) {
        double[][] near0 = new double[delay][];
        for (int k = 0; k < delay; k++) {
            near0[k] = at(0.05 * (k + 1), 0);
        }
        SampledLoop loop = RootPlacedLoop.of(concat(join(at(r, 0)), pair(0.2, 2.0), near0),
                join(at(1.0, 0), at(0.5, 0), at(0.4, 0)), delay);
        assertQuick(loop, Math.abs(r));
    }

    /** A complex largest pair r e^(+-i theta), a smaller real pole and one near 0; open-loop poles at 1 and a pair; one scan of delay. */
    @ParameterizedTest(name = "pair {0} at {1} rad")
    @CsvSource({"0.9, 0.3", "0.6, 2.5", "0.99, 0.05", "1.004, 0.5", "1.008, 3.0"})
    void a_complex_largest_pair_takes_the_quick_path(double r, double theta) {
        SampledLoop loop = RootPlacedLoop.of(concat(pair(r, theta), join(at(0.1, 0), at(0.02, 0))),
                concat(join(at(1.0, 0)), pair(0.8, 1.0)), 1);
        assertQuick(loop, r);
    }

    private static void assertQuick(SampledLoop loop, double r) {
        LoopStability s = SampledStability.of(loop);
        assertThat(Math.log(s.largestPoleMagnitude().getAsDouble())).isCloseTo(Math.log(r),
                within(Math.max(1e-12, 1e-6 * Math.abs(Math.log(r)))));
        assertThat(SampledStability.circlesWalked(loop)).as("circles walked").isEqualTo(r > 1 ? 3 : 4);
    }

    /**
     * A lag the controller's zero nearly cancels: the closed loop keeps a pole a hair from the open-loop
     * pole q (Newton's method on 1 + L from the circle falls into the pole's narrow basin); the start
     * beside q, on (z - q)(1 + L), finds it, and the loop is still decided in four walks.
     */
    @ParameterizedTest(name = "pole {0} beside open-loop {1}")
    @CsvSource({"0.95005, 0.95", "0.99, 0.9899", "0.5001, 0.5"})
    void a_pole_beside_a_nearly_cancelled_lag_takes_the_quick_path(double r, double q) {
        SampledLoop loop = RootPlacedLoop.of(concat(join(at(r, 0)), pair(0.3, 1.0)),
                join(at(1.0, 0), at(q, 0), at(0.2, 0)), 0);
        assertQuick(loop, r);
    }
}

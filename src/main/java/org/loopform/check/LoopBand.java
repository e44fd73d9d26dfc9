package org.loopform.check;

import org.loopform.analysis.LoopResponse;
import org.loopform.law.ControlLaw;
import org.loopform.law.TuningBand;
import org.loopform.lti.FrequencyBand;
import org.loopform.lti.SampledStateSpace;
import org.loopform.process.ProcessModel;
import org.loopform.scan.PulseLaw;

/**
 * Where a check looks for crossings, and the open loops it looks at: the bottom and top of the
 * frequency band, design and target alike, and the loop responses L = C G of the continuous and
 * the sampled loop.
 */
final class LoopBand {

    private LoopBand() {
    }

    /**
     * Bottom of the band, design and target alike: a decade below the band the tuning implies
     * (two below its lowest corner) and two decades below the process's lowest nonzero corner,
     * so an integrating or conditionally stable loop's phase has settled on its low-frequency
     * branch there and no crossing lies below.
     */
    static double bandBottom(FrequencyBand lawBand, ProcessModel p) {
        double low = lawBand.lowRadPerSecond() / 10;
        var rational = p.rationalPart();
        low = Math.min(low, lowestCorner(rational.numerator()) / 100);
        low = Math.min(low, lowestCorner(rational.denominator()) / 100);
        return low;
    }

    /**
     * A bottom low enough that no gain crossover lies below it: with q integrators in the loop |L| grows
     * as 1/omega^q below every corner, so where |L| is still below {@link #LOW_END_LOOP_GAIN} at the
     * bottom, the bottom is moved down until it would be (|L| omega^q is constant down there).
     */
    static double belowLowestCrossover(double low, LoopResponse loop, int integrators) {
        if (integrators <= 0) {
            return low;
        }
        double[] l = new double[2];
        loop.at(low, l);
        double magnitude = Math.hypot(l[0], l[1]);
        if (magnitude >= LOW_END_LOOP_GAIN || !(magnitude > 0)) {
            return low;
        }
        return low * Math.pow(magnitude / LOW_END_LOOP_GAIN, 1.0 / integrators);
    }

    /** |L| at the bottom of the band, well above 1 so that every gain crossover lies above it. */
    static final double LOW_END_LOOP_GAIN = 10;

    /**
     * Top of the continuous band before it is raised to where |L| is negligible: a decade above
     * the band the tuning implies (so past the derivative filter corner 1/Tf) and a decade above
     * the process's highest corner and 1/L with dead time L. The margin search's grid follows the
     * dead-time phase however fast it turns, so the top is not cut for it.
     */
    static double continuousTop(ControlLaw law, ProcessModel p) {
        double high = TuningBand.implied(law.terms(), 0).highRadPerSecond() * 10;
        var rational = p.rationalPart();
        high = Math.max(high, 10 * highestCorner(rational.numerator()));
        high = Math.max(high, 10 * highestCorner(rational.denominator()));
        if (p.deadTimeSeconds() > 0) {
            high = Math.max(high, 10 / p.deadTimeSeconds());
        }
        return high;
    }

    /**
     * An upper bound on the magnitudes of the roots of {@code a}, Fujiwara's bound
     * {@code 2 max_i |a_(n-i) / a_n|^(1/i)} (M. Fujiwara, Tohoku Math. J. 10, 1916 - from memory;
     * at most twice the largest root for a polynomial with real negative roots). 0 for a constant.
     */
    static double highestCorner(org.loopform.lti.Polynomial a) {
        int n = a.degree();
        double bound = 0;
        for (int i = 1; i <= n; i++) {
            bound = Math.max(bound, Math.pow(Math.abs(a.coefficient(n - i) / a.coefficient(n)), 1.0 / i));
        }
        return 2 * bound;
    }

    /**
     * A lower bound on the magnitudes of the nonzero roots of {@code a}: Fujiwara's bound applied
     * to the reversed polynomial, its roots' reciprocals. Infinity when {@code a} has no nonzero root.
     */
    static double lowestCorner(org.loopform.lti.Polynomial a) {
        int n = a.degree();
        int m = 0;
        while (m < n && a.coefficient(m) == 0) {
            m++; // roots at the origin (integrators) have no corner
        }
        double bound = 0;
        for (int i = 1; i <= n - m; i++) {
            bound = Math.max(bound, Math.pow(Math.abs(a.coefficient(m + i) / a.coefficient(m)), 1.0 / i));
        }
        return bound > 0 ? 1 / (2 * bound) : Double.POSITIVE_INFINITY;
    }

    static LoopResponse continuousLoop(ControlLaw law, ProcessModel p) {
        double[] c = new double[2];
        double[] g = new double[2];
        return (w, out) -> {
            law.feedbackAt(w, c);
            p.responseAt(w, g);
            out[0] = c[0] * g[0] - c[1] * g[1];
            out[1] = c[0] * g[1] + c[1] * g[0];
        };
    }

    static LoopResponse sampledLoop(PulseLaw controller, SampledStateSpace p) {
        double[] c = new double[2];
        double[] g = new double[2];
        SampledStateSpace.Workspace work = p.newWorkspace();
        return (w, out) -> {
            controller.feedbackAt(w, c);
            p.responseAt(w, work, g);
            out[0] = c[0] * g[0] - c[1] * g[1];
            out[1] = c[0] * g[1] + c[1] * g[0];
        };
    }
}

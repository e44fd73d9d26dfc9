package org.loopform.tuning;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.apache.commons.math3.analysis.solvers.LaguerreSolver;
import org.apache.commons.math3.complex.Complex;
import org.loopform.lti.Polynomial;
import org.loopform.process.FirstOrderPlusDeadTime;
import org.loopform.process.GeneralTransferFunction;
import org.loopform.process.IntegratingPlusDeadTime;
import org.loopform.process.ProcessModel;
import org.loopform.process.SecondOrderPlusDeadTime;
import org.loopform.units.BadInput;

/**
 * Skogestad's half rule: a model with real lags reduced to first or second order plus dead time
 * (Skogestad, "Simple analytic rules for model reduction and PID controller tuning", J. Process
 * Control 13 (2003) 291-309, sec. 3). With the lags sorted {@code tau1 >= tau2 >= tau3 ...}:
 * <pre>
 *   first order:  tau1' = tau1 + tau2/2,   theta' = theta + tau2/2 + sum(tau_i, i >= 3) + sum(T0 of RHP zeros)
 *   second order: tau2' = tau2 + tau3/2,   theta' = theta + tau3/2 + sum(tau_i, i >= 4) + sum(T0 of RHP zeros)
 * </pre>
 * An inverse-response zero {@code (-T0 s + 1)} adds T0 to the dead time. A left-half-plane zero
 * {@code (T0 s + 1)} is cancelled against the smallest lag {@code tau0 >= T0}, which becomes the lag
 * {@code tau0 - T0}: the treatment of the paper's worked example, where {@code (0.08 s + 1)/(0.2 s + 1)}
 * leaves 0.12 s (a zero larger than every lag is refused). For an integrating process the integrator
 * is the retained pole and half of the largest neglected lag goes to the dead time (derived: the
 * other half would be added to an infinite time constant).
 */
public final class HalfRule {

    /** Roots closer than this (relative) to the real axis are real; a repeated root splits by about eps^(1/m). */
    static final double REAL_ROOT_TOLERANCE = 1e-3;

    private HalfRule() {
    }

    /** The first-order-plus-dead-time model of {@code p} (integrating with its lag folded in when it integrates). */
    public static ReducedModel firstOrder(ProcessModel p) {
        return reduce(p, false);
    }

    /** The second-order-plus-dead-time model of {@code p} (its own order when lower). */
    public static ReducedModel secondOrder(ProcessModel p) {
        return reduce(p, true);
    }

    private static ReducedModel reduce(ProcessModel p, boolean keepSecond) {
        Parts parts = parts(p);
        List<Double> lags = new ArrayList<>(parts.lags);
        lags.sort(Comparator.reverseOrder());
        double theta = p.deadTimeSeconds() + parts.inverseResponseSeconds;
        boolean integrating = parts.integrators == 1;
        // retained lags: one (first order) or two (second order); an integrator counts as the first
        int keep = (keepSecond ? 2 : 1) - (integrating ? 1 : 0);
        if (!integrating && lags.isEmpty()) {
            throw new BadInput("--process: the model has no lag (a pure gain with dead time); the tuning rules need"
                    + " at least one time constant");
        }
        List<Double> retained = new ArrayList<>();
        for (int k = 0; k < Math.min(keep, lags.size()); k++) {
            retained.add(lags.get(k));
        }
        boolean reduced = lags.size() > retained.size() || parts.inverseResponseSeconds > 0 || parts.cancelled;
        if (lags.size() > keep) {
            double half = lags.get(keep) / 2;
            if (!retained.isEmpty()) {
                retained.set(retained.size() - 1, retained.get(retained.size() - 1) + half);
            }
            theta += half;
            for (int k = keep + 1; k < lags.size(); k++) {
                theta += lags.get(k);
            }
        }
        String how = !reduced ? "as given" : "reduced by Skogestad's half rule (Skogestad 2003, sec. 3)";
        double gain = p.lowFrequencyGain();
        if (integrating) {
            return new ReducedModel(gain, Double.POSITIVE_INFINITY, retained.isEmpty() ? 0 : retained.get(0), theta, how);
        }
        return new ReducedModel(gain, retained.get(0), retained.size() > 1 ? retained.get(1) : 0, theta, how);
    }

    /** Lags (s), the dead time added by inverse-response zeros (s), and the integrators of {@code p}. */
    private record Parts(List<Double> lags, double inverseResponseSeconds, int integrators, boolean cancelled) {
    }

    private static Parts parts(ProcessModel p) {
        if (p instanceof FirstOrderPlusDeadTime f) {
            return new Parts(List.of(f.timeConstantSeconds()), 0, 0, false);
        }
        if (p instanceof IntegratingPlusDeadTime i) {
            return new Parts(i.lagSeconds() > 0 ? List.of(i.lagSeconds()) : List.of(), 0, 1, false);
        }
        if (p instanceof SecondOrderPlusDeadTime s) {
            if (s.dampingRatio() < 1) {
                throw new BadInput("--process: damping: the half rule needs real time constants, and damping "
                        + s.dampingRatio() + " < 1 gives complex poles; give an overdamped model (damping >= 1) or a"
                        + " first-order one fitted to the response");
            }
            double t = s.timeConstantSeconds();
            double z = s.dampingRatio();
            double root = Math.sqrt(z * z - 1);
            return new Parts(List.of(t * (z + root), t * (z - root)), 0, 0, false);
        }
        GeneralTransferFunction g = (GeneralTransferFunction) p;
        int integrators = p.integrators();
        if (integrators > 1) {
            throw new BadInput("--process: den: the model has " + integrators + " integrators; the rules here take at"
                    + " most one");
        }
        if (integrators < 0) {
            throw new BadInput("--process: num: the model has a zero at s = 0 (no steady-state gain); the rules here"
                    + " need a self-regulating or integrating process");
        }
        List<Double> lags = new ArrayList<>();
        for (double pole : realRoots(g.rationalPart().denominator(), "den")) {
            if (pole == 0) {
                continue;
            }
            if (pole > 0) {
                throw new BadInput("--process: den: the model has an unstable pole at s = " + pole + "; the rules here"
                        + " are for open-loop stable or integrating processes");
            }
            lags.add(-1 / pole);
        }
        double inverse = 0;
        boolean cancelled = false;
        for (double zero : realRoots(g.rationalPart().numerator(), "num")) {
            if (zero > 0) {
                inverse += 1 / zero;
                continue;
            }
            double t0 = -1 / zero;
            int at = -1;
            for (int k = 0; k < lags.size(); k++) {
                if (lags.get(k) >= t0 && (at < 0 || lags.get(k) < lags.get(at))) {
                    at = k;
                }
            }
            if (at < 0) {
                throw new BadInput("--process: num: a lead (T0 s + 1) with T0 = " + t0 + " s larger than every lag is"
                        + " outside the half rule as applied here; reduce the model by hand");
            }
            double left = lags.get(at) - t0;
            if (left > 0) {
                lags.set(at, left);
            } else {
                lags.remove(at);
            }
            cancelled = true;
        }
        return new Parts(lags, inverse, integrators, cancelled);
    }

    /** The real roots of {@code poly} (zeros at s = 0 included); complex ones are refused. */
    private static List<Double> realRoots(Polynomial poly, String key) {
        double[] asc = poly.ascending();
        int degree = poly.degree();
        List<Double> roots = new ArrayList<>();
        if (degree < 1) {
            return roots;
        }
        int zeros = 0;
        while (zeros < degree && asc[zeros] == 0) {
            roots.add(0.0);
            zeros++;
        }
        if (degree - zeros == 0) {
            return roots;
        }
        double[] rest = java.util.Arrays.copyOfRange(asc, zeros, degree + 1);
        if (rest.length == 2) {
            roots.add(-rest[0] / rest[1]);
            return roots;
        }
        Complex[] all = new LaguerreSolver(1e-14, 1e-14).solveAllComplex(rest, 0.0);
        for (Complex c : all) {
            if (Math.abs(c.getImaginary()) > REAL_ROOT_TOLERANCE * Math.max(1e-300, Math.abs(c.getReal()))) {
                throw new BadInput("--process: " + key + ": the model has complex roots (" + c.getReal() + " +/- "
                        + Math.abs(c.getImaginary()) + "i); the half rule needs real time constants: give a"
                        + " first- or second-order model fitted to the response instead");
            }
            roots.add(c.getReal());
        }
        return roots;
    }
}

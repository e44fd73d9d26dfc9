package org.loopform.identify;

import org.apache.commons.math3.fitting.leastsquares.LeastSquaresBuilder;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresOptimizer;
import org.apache.commons.math3.fitting.leastsquares.LevenbergMarquardtOptimizer;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.LUDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;
import org.apache.commons.math3.linear.SingularMatrixException;
import org.apache.commons.math3.util.Pair;

/**
 * Least squares on the response simulated from the recorded output. The dead time is profiled: for
 * each dead time on a grid the other parameters are fitted by Levenberg-Marquardt (Commons Math),
 * warm-started from the neighbour, and the best grid point is refined by golden-section search,
 * because the cost is not smooth in the dead time (it moves the input across samples). Time
 * constants are fitted by their logarithm (so they stay positive); gain and baseline PV freely.
 */
final class StepFitter {

    /** Dead times profiled on the grid. */
    static final int PROFILE_POINTS = 30;
    /** Golden-section steps refining the best dead time. */
    static final int REFINE_STEPS = 12;
    /** Chi-square, one degree of freedom, 95 %: the likelihood-ratio bound of the dead-time profile. */
    static final double CHI2_1_95 = 3.841;
    /** Two-sided normal 95 % quantile. */
    static final double Z95 = 1.96;
    /** Relative step of the finite-difference Jacobian. */
    static final double FD_STEP = 1e-6;

    private final PlantRecord record;
    private final ResponseSimulator sim;
    private final double[] pv;
    private final ModelKind kind;

    StepFitter(PlantRecord record, ModelKind kind) {
        this.record = record;
        this.sim = new ResponseSimulator(record);
        this.pv = record.pvs();
        this.kind = kind;
    }

    /** Best parameters at one dead time, and their cost. */
    private record Inner(double[] params, double cost) {
    }

    private double[] predict(double[] p, double[] input) {
        return switch (kind) {
            case FOPDT -> sim.simulate(kind, p[0], Math.exp(p[1]), 0, input, p[2]);
            case SOPDT -> sim.simulate(kind, p[0], Math.exp(p[1]), Math.exp(p[2]), input, p[3]);
            case IPDT -> sim.simulate(kind, p[0], 0, 0, input, p[1]);
        };
    }

    private double[][] jacobian(double[] p, double[] input, double[] at) {
        double[][] j = new double[pv.length][p.length];
        for (int c = 0; c < p.length; c++) {
            double h = FD_STEP * Math.max(1, Math.abs(p[c]));
            double[] q = p.clone();
            q[c] += h;
            double[] y = predict(q, input);
            for (int r = 0; r < pv.length; r++) {
                j[r][c] = (y[r] - at[r]) / h;
            }
        }
        return j;
    }

    private Inner inner(double deadTimeSeconds, double[] start) {
        double[] input = sim.delayedInput(deadTimeSeconds);
        LeastSquaresOptimizer.Optimum o;
        try {
            o = new LevenbergMarquardtOptimizer().optimize(new LeastSquaresBuilder()
                    .start(start).target(pv).maxEvaluations(2000).maxIterations(200)
                    .model((RealVector point) -> {
                        double[] p = point.toArray();
                        double[] y = predict(p, input);
                        return new Pair<>(new ArrayRealVector(y, false),
                                new Array2DRowRealMatrix(jacobian(p, input, y), false));
                    }).build());
        } catch (org.apache.commons.math3.exception.TooManyEvaluationsException
                 | org.apache.commons.math3.exception.TooManyIterationsException e) {
            return new Inner(start, cost(predict(start, input)));
        }
        double[] p = o.getPoint().toArray();
        return new Inner(p, cost(predict(p, input)));
    }

    private double cost(double[] y) {
        double s = 0;
        for (int k = 0; k < pv.length; k++) {
            double r = pv[k] - y[k];
            s += r * r;
        }
        return Double.isFinite(s) ? s : Double.MAX_VALUE;
    }

    /** The fit with its intervals; {@code start} as {gain, T1, T2, baseline} (T's ignored as the kind says). */
    ModelFit fit(double gain, double t1, double t2, double baseline, double maxDeadTimeSeconds) {
        double[] start = switch (kind) {
            case FOPDT -> new double[] {gain, Math.log(t1), baseline};
            case SOPDT -> new double[] {gain, Math.log(t1), Math.log(t2), baseline};
            case IPDT -> new double[] {gain, baseline};
        };
        double[] grid = new double[PROFILE_POINTS + 1];
        double[] costs = new double[PROFILE_POINTS + 1];
        Inner[] inners = new Inner[PROFILE_POINTS + 1];
        int best = 0;
        double[] warm = start;
        for (int g = 0; g <= PROFILE_POINTS; g++) {
            grid[g] = maxDeadTimeSeconds * g / PROFILE_POINTS;
            Inner i = inner(grid[g], warm);
            // a fresh start too, where the warm one may sit in another valley
            Inner fresh = inner(grid[g], start);
            if (fresh.cost < i.cost) {
                i = fresh;
            }
            inners[g] = i;
            costs[g] = i.cost;
            warm = i.params;
            if (costs[g] < costs[best]) {
                best = g;
            }
        }
        // golden section between the best grid point's neighbours
        double a = grid[Math.max(0, best - 1)];
        double b = grid[Math.min(PROFILE_POINTS, best + 1)];
        double bestL = grid[best];
        Inner bestInner = inners[best];
        double phi = (Math.sqrt(5) - 1) / 2;
        double c = b - phi * (b - a);
        double d = a + phi * (b - a);
        Inner ic = inner(c, bestInner.params);
        Inner id = inner(d, bestInner.params);
        for (int k = 0; k < REFINE_STEPS; k++) {
            if (ic.cost < id.cost) {
                b = d;
                d = c;
                id = ic;
                c = b - phi * (b - a);
                ic = inner(c, id.params);
            } else {
                a = c;
                c = d;
                ic = id;
                d = a + phi * (b - a);
                id = inner(d, ic.params);
            }
        }
        if (ic.cost < bestInner.cost) {
            bestInner = ic;
            bestL = c;
        }
        if (id.cost < bestInner.cost) {
            bestInner = id;
            bestL = d;
        }
        return summarize(bestInner, bestL, grid, costs);
    }

    private ModelFit summarize(Inner in, double deadTime, double[] grid, double[] costs) {
        int n = pv.length;
        int p = in.params.length + 1;
        double[] input = sim.delayedInput(deadTime);
        double[] y = predict(in.params, input);
        double ssr = cost(y);
        double mean = 0;
        for (double v : pv) {
            mean += v / n;
        }
        double sst = 0;
        for (double v : pv) {
            sst += (v - mean) * (v - mean);
        }
        double r1 = lagOneCorrelation(y);
        double inflation = (1 + r1) / (1 - r1);
        double s2 = ssr / Math.max(1, n - p) * inflation;
        double[] se = new double[in.params.length];
        java.util.Arrays.fill(se, Double.NaN);
        try {
            // the dead time joins the Jacobian (central difference over one simulation grid step, the finest shift
            // the held input can make), so the other parameters' intervals allow for its trade-off with them
            // instead of holding it at its best value
            RealMatrix j = new Array2DRowRealMatrix(withDeadTimeColumn(jacobian(in.params, input, y), in.params,
                    deadTime), false);
            RealMatrix cov = new LUDecomposition(j.transpose().multiply(j)).getSolver().getInverse().scalarMultiply(s2);
            for (int k = 0; k < se.length; k++) {
                se[k] = Math.sqrt(Math.max(0, cov.getEntry(k, k)));
            }
        } catch (SingularMatrixException e) {
            // intervals stay NaN: the data do not determine the parameters apart
        }
        // the dead-time profile's own interval: n_eff ln(S(L)/Smin) <= chi2(1, 95 %)
        double nEff = n / inflation;
        double bound = ssr * Math.exp(CHI2_1_95 / nEff);
        double lo = edge(deadTime, 0, grid, costs, bound, in.params);
        // the record shows an output move only at the first sample after it: the move may have come up to one
        // logging interval earlier, and the dead time be longer by as much
        double hi = edge(deadTime, grid[grid.length - 1], grid, costs, bound, in.params) + moveTimingSeconds();
        double rms = Math.sqrt(ssr / n);
        double r2 = sst > 0 ? 1 - ssr / sst : 0;
        double aic = n * Math.log(Math.max(ssr, 1e-300) / n) + 2 * p;
        double[] q = in.params;
        return switch (kind) {
            case FOPDT -> new ModelFit(kind, q[0], q[0] - Z95 * se[0], q[0] + Z95 * se[0],
                    Math.exp(q[1]), Math.exp(q[1] - Z95 * se[1]), Math.exp(q[1] + Z95 * se[1]),
                    Double.NaN, Double.NaN, Double.NaN, deadTime, lo, hi, rms, r2, aic);
            case SOPDT -> {
                // order the lags T1 >= T2 (the model is symmetric in them)
                int big = q[1] >= q[2] ? 1 : 2;
                int small = 3 - big;
                yield new ModelFit(kind, q[0], q[0] - Z95 * se[0], q[0] + Z95 * se[0],
                        Math.exp(q[big]), Math.exp(q[big] - Z95 * se[big]), Math.exp(q[big] + Z95 * se[big]),
                        Math.exp(q[small]), Math.exp(q[small] - Z95 * se[small]), Math.exp(q[small] + Z95 * se[small]),
                        deadTime, lo, hi, rms, r2, aic);
            }
            case IPDT -> new ModelFit(kind, q[0], q[0] - Z95 * se[0], q[0] + Z95 * se[0], Double.NaN, Double.NaN,
                    Double.NaN, Double.NaN, Double.NaN, Double.NaN, deadTime, lo, hi, rms, r2, aic);
        };
    }

    /**
     * Where the profile crosses {@code bound} between the optimum and {@code end}: by bisection from the
     * optimum to the first grid point beyond the bound in that direction ({@code end} itself when none is).
     */
    private double edge(double optimum, double end, double[] grid, double[] costs, double bound, double[] start) {
        double outside = end;
        boolean found = false;
        if (end > optimum) {
            for (int g = 0; g < grid.length; g++) {
                if (grid[g] > optimum && costs[g] > bound) {
                    outside = grid[g];
                    found = true;
                    break;
                }
            }
        } else {
            for (int g = grid.length - 1; g >= 0; g--) {
                if (grid[g] < optimum && costs[g] > bound) {
                    outside = grid[g];
                    found = true;
                    break;
                }
            }
        }
        if (!found) {
            return end;
        }
        double inside = optimum;
        for (int k = 0; k < EDGE_STEPS; k++) {
            double mid = 0.5 * (inside + outside);
            if (inner(mid, start).cost <= bound) {
                inside = mid;
            } else {
                outside = mid;
            }
        }
        return outside;
    }

    /** {@code j} with a last column: the prediction's derivative in the dead time at {@code deadTime}. */
    private double[][] withDeadTimeColumn(double[][] j, double[] params, double deadTime) {
        double h = sim.gridStepSeconds();
        double[] up = predict(params, sim.delayedInput(deadTime + h));
        double[] down = predict(params, sim.delayedInput(Math.max(0, deadTime - h)));
        double span = deadTime + h - Math.max(0, deadTime - h);
        double[][] out = new double[j.length][];
        for (int r = 0; r < j.length; r++) {
            out[r] = java.util.Arrays.copyOf(j[r], j[r].length + 1);
            out[r][j[r].length] = (up[r] - down[r]) / span;
        }
        return out;
    }

    /** Output moves smaller than this share of the largest are not used to time the dead time. */
    static final double MOVE_SHARE = 0.1;

    /**
     * The longest logging interval that ends at a sample showing an output move of at least {@link #MOVE_SHARE}
     * of the largest: how much earlier than logged a move that the fit times may have happened, s.
     */
    double moveTimingSeconds() {
        double largest = 0;
        for (int k = 1; k < record.size(); k++) {
            largest = Math.max(largest, Math.abs(record.output(k) - record.output(k - 1)));
        }
        double longest = 0;
        for (int k = 1; k < record.size(); k++) {
            if (largest > 0 && Math.abs(record.output(k) - record.output(k - 1)) >= MOVE_SHARE * largest) {
                longest = Math.max(longest, record.time(k) - record.time(k - 1));
            }
        }
        return longest;
    }

    /** Bisection steps locating each end of the dead-time interval. */
    static final int EDGE_STEPS = 8;

    /** The residuals' lag-one autocorrelation, clamped to [0, 0.95] (negative correlation narrows nothing here). */
    private double lagOneCorrelation(double[] y) {
        int n = pv.length;
        double num = 0;
        double den = 0;
        for (int k = 0; k < n; k++) {
            double r = pv[k] - y[k];
            den += r * r;
            if (k > 0) {
                num += r * (pv[k - 1] - y[k - 1]);
            }
        }
        double r1 = den > 0 ? num / den : 0;
        return Math.min(0.95, Math.max(0, r1));
    }
}

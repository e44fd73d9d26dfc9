package org.loopform.replay;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
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
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.PidSetting;
import org.loopform.form.WritingContext;
import org.loopform.scan.ScanController;
import org.loopform.units.BadInput;
import org.loopform.units.Numbers;

/**
 * Least-squares fit of the old controller's gain, integral and derivative values, as written in its
 * form, to the logged output: the controller is replayed open loop on the logged setpoint and PV
 * ({@link ReplayRun}) and the values minimise the sum of squared differences from the logged output
 * over the scans in automatic, by Levenberg-Marquardt (Commons Math; Nocedal and Wright, Numerical
 * Optimization, 2nd ed., 2006, sec. 10.3 - from memory). Each value is fitted as the logarithm of
 * its magnitude, so it keeps its sign (the action) and stays away from zero; the action, filter,
 * weights, form and scan are held as given. One more parameter, a constant offset of the replayed
 * output, takes up the start's error: the replay starts its integral from the first logged output,
 * which the log holds only to its resolution, and a positional controller carries that error
 * through every later scan (an error shared by all residuals, which the values would otherwise bend
 * to absorb).
 *
 * <p>Uncertainty from the Jacobian J at the optimum: covariance {@code s^2 (J^T J)^-1} with
 * {@code s^2 = SSR/(n - p)} (the Gauss-Newton linearisation; Seber and Wild, Nonlinear Regression,
 * 1989, sec. 2.1 - from memory), widened by {@code (1 + rho)/(1 - rho)} when the residuals' lag-one
 * correlation rho is positive (fewer independent samples than scans; common practice), and 95 %
 * intervals {@code value * exp(+-1.96 sd)} of the log-magnitude. The intervals hold only as far as
 * the form, scan and filter are the ones the controller ran.
 */
public final class TuningFit {

    /** Relative step of the forward-difference Jacobian in the log-magnitude. */
    static final double FD_STEP = 1e-6;
    /** Two-sided 95 % point of the normal distribution. */
    static final double Z95 = 1.959964;

    private final FormDefinition form;
    private final Map<String, String> start;
    private final List<String> names;
    private final double[] signs;
    private final WritingContext ctx;
    private final ScanSeries s;
    private final boolean[] compared;
    private final int warmup;
    private final int n;

    private TuningFit(FormDefinition form, Map<String, String> start, List<String> names, double[] signs,
                      WritingContext ctx, ScanSeries s, boolean[] compared, int warmup) {
        this.form = form;
        this.start = start;
        this.names = names;
        this.signs = signs;
        this.ctx = ctx;
        this.s = s;
        this.compared = compared;
        this.warmup = warmup;
        int c = 0;
        for (boolean b : compared) {
            c += b ? 1 : 0;
        }
        this.n = c;
    }

    /**
     * The fit starting from {@code values} written in {@code form} on {@code s} (read at the
     * form's scan), or null when the values leave nothing to fit or the record too few scans to fit them.
     */
    static FittedTuning fit(FormDefinition form, Map<String, String> values, String startWords, WritingContext ctx,
                            ScanSeries s) {
        List<String> names = new ArrayList<>();
        List<Double> magnitudes = new ArrayList<>();
        List<Double> signs = new ArrayList<>();
        for (String name : new String[] {form.gainName(), form.integralName(), form.derivativeName()}) {
            Double v = number(values.get(name));
            boolean off = name.equals(form.integralName()) && v != null && form.integral().isOff(v);
            if (v != null && v != 0 && Double.isFinite(v) && !off) {
                names.add(name);
                magnitudes.add(Math.log(Math.abs(v)));
                signs.add(Math.signum(v));
            }
        }
        if (names.isEmpty()) {
            return null;
        }
        PidSetting first;
        try {
            first = FormCodec.decode(form, values, ctx, "source");
        } catch (BadInput | IllegalArgumentException e) {
            return null;
        }
        int warmup = ReplayRun.warmupScans(first.filterSeconds(), s.scanSeconds, s.size());
        ReplayRun run0 = LoopReplay.run(form, first, s);
        double[] sg = signs.stream().mapToDouble(Double::doubleValue).toArray();
        TuningFit f = new TuningFit(form, values, names, sg, ctx, s, run0.compared(), warmup);
        if (f.n < 4 * names.size() + 10) {
            return null;
        }
        double[] p0 = new double[names.size() + 1];
        for (int c = 0; c < names.size(); c++) {
            p0[c] = magnitudes.get(c);
        }
        return f.solve(p0, startWords); // the last parameter, the start's offset, starts at 0
    }

    /**
     * Levenberg-Marquardt from {@code p0} and from every combination of its values halved, kept and
     * doubled (the cost can hold a second valley, a derivative traded against the gain, say); the
     * lowest sum of squares wins.
     */
    private FittedTuning solve(double[] p0, String startWords) {
        double[] target = new double[n];
        int j = 0;
        for (int k = 0; k < compared.length; k++) {
            if (compared[k]) {
                target[j++] = s.output[k];
            }
        }
        // every combination of each value as started, halved and doubled: 3^p starts (27 for a PID)
        List<double[]> starts = new ArrayList<>();
        int combos = (int) Math.pow(3, names.size());
        for (int m = 0; m < combos; m++) {
            double[] q = p0.clone();
            int code = m;
            for (int c = 0; c < names.size(); c++) {
                q[c] += (code % 3 - 1) * Math.log(2);
                code /= 3;
            }
            starts.add(q);
        }
        LeastSquaresOptimizer.Optimum o = null;
        for (double[] start : starts) {
            LeastSquaresOptimizer.Optimum candidate = optimum(start, target);
            if (candidate != null && (o == null || candidate.getCost() < o.getCost())) {
                o = candidate;
            }
        }
        if (o == null) {
            return null;
        }
        double[] p = o.getPoint().toArray();
        double[] y = predict(p);
        double[] r = new double[n];
        double ssr = 0;
        for (int k = 0; k < n; k++) {
            r[k] = y[k] - target[k];
            ssr += r[k] * r[k];
        }
        if (!Double.isFinite(ssr)) {
            return null;
        }
        double rho = lagOneCorrelation(r);
        double widen = rho > 0 ? (1 + rho) / (1 - rho) : 1.0;
        double s2 = ssr / Math.max(1, n - p.length) * widen;
        RealMatrix jac = new Array2DRowRealMatrix(jacobian(p, y), false);
        double[] sd = new double[p.length];
        try {
            RealMatrix cov = new LUDecomposition(jac.transpose().multiply(jac)).getSolver().getInverse()
                    .scalarMultiply(s2);
            for (int c = 0; c < p.length; c++) {
                sd[c] = Math.sqrt(Math.max(0, cov.getEntry(c, c)));
            }
        } catch (SingularMatrixException e) {
            java.util.Arrays.fill(sd, Double.POSITIVE_INFINITY); // the record cannot tell the values apart
        }
        Map<String, String> fitted = written(p);
        List<FittedTuning.Value> values = new ArrayList<>();
        for (int c = 0; c < names.size(); c++) {
            double v = signs[c] * Math.exp(p[c]);
            double a = signs[c] * Math.exp(p[c] - Z95 * sd[c]);
            double b = signs[c] * Math.exp(p[c] + Z95 * sd[c]);
            values.add(new FittedTuning.Value(names.get(c), v, Math.min(a, b), Math.max(a, b),
                    org.loopform.form.FormUnits.of(form, names.get(c))));
        }
        double[] shifted = run(p).output();
        for (int k = 0; k < shifted.length; k++) {
            shifted[k] += p[names.size()];
        }
        Agreement agreement = Agreement.of(shifted, s.output, compared, s::timeSeconds);
        return new FittedTuning(form.id(), s.scanSeconds, startWords, fitted, values, agreement, o.getIterations(), rho);
    }

    private LeastSquaresOptimizer.Optimum optimum(double[] start, double[] target) {
        try {
            return new LevenbergMarquardtOptimizer().optimize(new LeastSquaresBuilder()
                    .start(start).target(target).maxEvaluations(500).maxIterations(200)
                    .model((RealVector point) -> {
                        double[] p = point.toArray();
                        double[] y = predict(p);
                        return new Pair<>(new ArrayRealVector(y, false), new Array2DRowRealMatrix(jacobian(p, y), false));
                    }).build());
        } catch (org.apache.commons.math3.exception.TooManyEvaluationsException
                 | org.apache.commons.math3.exception.TooManyIterationsException e) {
            return null;
        }
    }

    private Map<String, String> written(double[] p) {
        Map<String, String> m = new LinkedHashMap<>(start);
        for (int c = 0; c < names.size(); c++) {
            m.put(names.get(c), plain(signs[c] * Math.exp(p[c])));
        }
        return m;
    }

    private ReplayRun run(double[] p) {
        PidSetting setting = FormCodec.decode(form, written(p), ctx, "source");
        ScanController c = ScanController.of(form, setting, s.scanSeconds);
        return ReplayRun.of(c, s, warmup, form.algorithm().outputLowPercent(), form.algorithm().outputHighPercent());
    }

    /** The replayed output over the compared scans; a reading that cannot be run gives a large constant. */
    private double[] predict(double[] p) {
        double[] y = new double[n];
        ReplayRun r;
        try {
            r = run(p);
        } catch (BadInput | IllegalArgumentException e) {
            java.util.Arrays.fill(y, 1e6); // values the form refuses: far from any log, so the step is rejected
            return y;
        }
        int j = 0;
        double offset = p[names.size()];
        for (int k = 0; k < compared.length; k++) {
            if (compared[k]) {
                y[j++] = r.output()[k] + offset;
            }
        }
        return y;
    }

    private double[][] jacobian(double[] p, double[] at) {
        double[][] jm = new double[n][p.length];
        for (int c = 0; c < p.length; c++) {
            double h = c == names.size() ? 1e-6 : FD_STEP * Math.max(1, Math.abs(p[c]));
            double[] q = p.clone();
            q[c] += h;
            double[] y = predict(q);
            for (int k = 0; k < n; k++) {
                jm[k][c] = (y[k] - at[k]) / h;
            }
        }
        return jm;
    }

    static double lagOneCorrelation(double[] r) {
        double mean = 0;
        for (double x : r) {
            mean += x;
        }
        mean /= r.length;
        double num = 0;
        double den = 0;
        for (int k = 0; k < r.length; k++) {
            double a = r[k] - mean;
            den += a * a;
            if (k > 0) {
                num += a * (r[k - 1] - mean);
            }
        }
        return den > 0 ? Math.max(-0.99, Math.min(0.99, num / den)) : 0;
    }

    private static Double number(String text) {
        if (text == null) {
            return null;
        }
        try {
            return Double.parseDouble(text.trim());
        } catch (NumberFormatException e) {
            return null;
        }
    }

    private static String plain(double v) {
        return Numbers.plain(Double.parseDouble(String.format(java.util.Locale.ROOT, "%.12g", v)));
    }
}

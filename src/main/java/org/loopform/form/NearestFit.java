package org.loopform.form;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.optim.InitialGuess;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.PointValuePair;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.nonlinear.scalar.ObjectiveFunction;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.NelderMeadSimplex;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.SimplexOptimizer;
import org.loopform.law.ControlLaw;
import org.loopform.lti.FrequencyBand;
import org.loopform.law.PidTerms;

/**
 * The member of a target form's family nearest to a law it cannot write exactly: minimizes the
 * weighted squared complex log-ratio |ln(C_target(i w) / C_source(i w))|^2 (gain in nepers and
 * phase in radians alike) over log-spaced frequencies of the band, weighted 1 where the loop lives
 * and less a decade away ({@link #weight}). The setpoint weights b and c
 * do not enter the feedback path, so the fit runs in two stages: first gain, integral, derivative
 * and filter against the feedback path (which sets stability and disturbance response), then
 * the adjustable weights against the setpoint path with the rest held. Positive coordinates are
 * searched as logarithms so that no step can change their sign; weights stay within their range
 * through a smooth map.
 */
final class NearestFit {

    private static final int FIT_POINTS = 80;
    private static final int MAX_EVALUATIONS = 40_000;
    /**
     * The search stays where every coordinate (the log of a gain, a time or a ratio) lies within
     * 1e-50..1e50: products of three such values stay finite, so every point searched is a valid
     * setting and law, and no exception has to be caught (a caught exception could hide a bug).
     */
    private static final double MAX_ABS_LOG = Math.log(1e50);
    /**
     * The simplex stops when the cost changes by less than this between iterations; the reported
     * deviations (three significant figures) are settled long before.
     */
    private static final double CONVERGED_RELATIVE = 1e-10;
    private static final double CONVERGED_ABSOLUTE = 1e-14;

    private final FormDefinition target;
    private final ControlLaw source;
    private final double[] omegas;
    /** The weight of each frequency of {@link #omegas}: 1 where the loop lives, falling off outside. */
    private final double[] weights;
    private final double sign;
    private final boolean useIntegral;
    private final boolean useDerivative;
    private final boolean freeFilter;

    NearestFit(FormDefinition target, ControlLaw source, FrequencyBand band, FrequencyBand lives) {
        this(target, source, band, lives, null);
    }

    /**
     * As {@link #NearestFit(FormDefinition, ControlLaw, FrequencyBand, FrequencyBand)}, each frequency's
     * weight multiplied by {@code loopWeight} (the loop's own emphasis, for example |S T| of the design
     * loop when the process is known; null: none).
     */
    NearestFit(FormDefinition target, ControlLaw source, FrequencyBand band, FrequencyBand lives,
               java.util.function.DoubleUnaryOperator loopWeight) {
        this.target = target;
        this.source = source;
        this.omegas = band.grid(FIT_POINTS);
        this.weights = new double[omegas.length];
        for (int k = 0; k < omegas.length; k++) {
            double extra = loopWeight == null ? 1.0 : loopWeight.applyAsDouble(omegas[k]);
            weights[k] = weight(omegas[k], lives) * (Double.isFinite(extra) && extra >= 0 ? extra : 1.0);
        }
        PidTerms t = source.terms();
        this.sign = Math.signum(t.p() != 0 ? t.p() : t.d() != 0 ? t.d() : t.i());
        this.useIntegral = t.i() != 0;
        this.useDerivative = t.d() != 0 && !(t.tf() > 0 && Math.abs(t.d()) / t.tf() <= Math.abs(t.p()) * 1e-12);
        this.freeFilter = useDerivative && (target.filter().kind() == FilterKind.RATIO
                || target.filter().kind() == FilterKind.TIME_CONSTANT);
    }

    /** The nearest setting, searched from {@code start}. */
    PidSetting fit(PidSetting start) {
        double[] x = minimize(encode(start), v -> cost(decode(v, start.b(), start.c()), true));
        PidSetting feedbackFitted = decode(x, start.b(), start.c());
        double[] w = encodeWeights(feedbackFitted);
        if (w.length == 0) {
            return feedbackFitted;
        }
        double[] wBest = minimize(w, v -> cost(withWeights(feedbackFitted, v), false));
        return withWeights(feedbackFitted, wBest);
    }

    private static double[] minimize(double[] x0, java.util.function.ToDoubleFunction<double[]> f) {
        if (x0.length == 0) {
            return x0;
        }
        org.apache.commons.math3.analysis.MultivariateFunction safe = v -> {
            for (double x : v) {
                if (!(Math.abs(x) <= MAX_ABS_LOG)) {
                    return Double.MAX_VALUE;
                }
            }
            double c = f.applyAsDouble(v);
            return Double.isFinite(c) ? c : Double.MAX_VALUE;
        };
        double[] best = x0;
        double bestValue = safe.value(x0);
        // Three rounds: each restarts the simplex at the last result, so a collapsed simplex does
        // not stop the search short of the minimum.
        for (int round = 0; round < 3; round++) {
            double[] steps = new double[best.length];
            java.util.Arrays.fill(steps, round == 0 ? 0.5 : 0.05);
            SimplexOptimizer optimizer = new SimplexOptimizer(CONVERGED_RELATIVE, CONVERGED_ABSOLUTE);
            PointValuePair r = optimizer.optimize(new MaxEval(MAX_EVALUATIONS), new ObjectiveFunction(safe),
                    GoalType.MINIMIZE, new InitialGuess(best), new NelderMeadSimplex(steps));
            if (r.getValue() < bestValue) {
                best = r.getPoint();
                bestValue = r.getValue();
            }
        }
        return best;
    }

    /** The fit's objective over the band, for the feedback path or the setpoint path. */
    private double cost(PidSetting s, boolean feedback) {
        ControlLaw law = StructureLaw.toLaw(s, target.filter().placement());
        double[] a = new double[2];
        double[] b = new double[2];
        double sum = 0;
        for (int k = 0; k < omegas.length; k++) {
            double w = omegas[k];
            if (feedback) {
                source.feedbackAt(w, a);
                law.feedbackAt(w, b);
            } else {
                source.setpointAt(w, a);
                law.setpointAt(w, b);
            }
            sum += weights[k] * logRatioSquared(a, b);
        }
        return sum;
    }

    /**
     * 1 inside the band where the loop lives, and (edge / omega)^2 or (omega / edge)^2 outside: a
     * decade away counts a hundredth, so the filter corner and the high-frequency derivative gain,
     * reported apart, no longer pull the fit away from the crossover.
     */
    static double weight(double omega, FrequencyBand lives) {
        if (omega < lives.lowRadPerSecond()) {
            double r = omega / lives.lowRadPerSecond();
            return r * r;
        }
        if (omega > lives.highRadPerSecond()) {
            double r = lives.highRadPerSecond() / omega;
            return r * r;
        }
        return 1.0;
    }

    private double[] encodeWeights(PidSetting s) {
        List<Double> x = new ArrayList<>();
        if (target.b().adjustable()) {
            x.add(toUnbounded(s.b(), target.b()));
        }
        if (target.c().adjustable() && useDerivative) {
            x.add(toUnbounded(s.c(), target.c()));
        }
        return x.stream().mapToDouble(Double::doubleValue).toArray();
    }

    private PidSetting withWeights(PidSetting s, double[] w) {
        int k = 0;
        double b = target.b().adjustable() ? fromUnbounded(w[k++], target.b()) : s.b();
        double c = target.c().adjustable() && useDerivative ? fromUnbounded(w[k++], target.c()) : s.c();
        return s.withWeights(b, c);
    }

    private static double logRatioSquared(double[] a, double[] b) {
        double ma = a[0] * a[0] + a[1] * a[1];
        double mb = b[0] * b[0] + b[1] * b[1];
        if (ma == 0 && mb == 0) {
            return 0;
        }
        if (ma == 0 || mb == 0) {
            return 1e6;
        }
        double re = b[0] * a[0] + b[1] * a[1];
        double im = b[1] * a[0] - b[0] * a[1];
        double gain = 0.5 * Math.log(mb / ma);
        double phase = Math.atan2(im, re);
        return gain * gain + phase * phase;
    }

    private double[] encode(PidSetting s) {
        List<Double> x = new ArrayList<>();
        x.add(Math.log(Math.abs(s.gain())));
        if (useIntegral) {
            x.add(Math.log(Math.abs(s.integral())));
        }
        if (useDerivative) {
            x.add(Math.log(Math.max(Math.abs(s.derivative()), 1e-300)));
        }
        if (freeFilter) {
            double td = s.derivativeTimeSeconds();
            x.add(Math.log(target.filter().kind() == FilterKind.RATIO
                    ? (s.filterSeconds() > 0 ? td / s.filterSeconds() : target.filter().ratio())
                    : Math.max(s.filterSeconds(), td / target.filter().ratio())));
        }
        return x.stream().mapToDouble(Double::doubleValue).toArray();
    }

    private PidSetting decode(double[] x, double b, double c) {
        int k = 0;
        double gain = sign * Math.exp(x[k++]);
        boolean parallel = target.structure() == Structure.PARALLEL;
        double integral;
        if (useIntegral) {
            double v = Math.exp(x[k++]);
            integral = parallel ? sign * v : v;
        } else {
            integral = parallel ? 0.0 : Double.POSITIVE_INFINITY;
        }
        double derivative = 0.0;
        if (useDerivative) {
            double v = Math.exp(x[k++]);
            derivative = parallel ? sign * v : v;
        }
        double td = parallel ? derivative / gain : derivative;
        double tf;
        if (freeFilter) {
            double v = Math.exp(x[k++]);
            tf = target.filter().kind() == FilterKind.RATIO ? td / v : v;
        } else {
            tf = switch (target.filter().kind()) {
                case NONE -> 0.0;
                case FIXED_RATIO, RATIO -> td / target.filter().ratio();
                case TIME_CONSTANT -> target.filter().unit().toSeconds(target.filter().defaultTime());
            };
        }
        return new PidSetting(target.structure(), gain, integral, derivative, tf, b, c);
    }

    private static double toUnbounded(double v, Weight w) {
        double width = w.max() - w.min();
        if (width == 0) {
            return 0;
        }
        double u = Math.min(Math.max((v - w.min()) / width, 1e-6), 1 - 1e-6);
        return Math.log(u / (1 - u));
    }

    private static double fromUnbounded(double z, Weight w) {
        return w.min() + (w.max() - w.min()) / (1 + Math.exp(-z));
    }
}

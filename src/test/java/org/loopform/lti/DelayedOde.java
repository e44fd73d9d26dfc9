package org.loopform.lti;

import java.util.Arrays;
import java.util.function.ToDoubleFunction;
import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;
import org.apache.commons.math3.ode.FirstOrderIntegrator;
import org.apache.commons.math3.ode.nonstiff.DormandPrince853Integrator;

/**
 * Reference simulation of {@code dx/dt = f(x, v(t))}, {@code y = g(x)}, driven by
 * {@code v(t) = u(t - L)} with u held constant over each scan. Integrated with Commons Math's
 * adaptive Dormand-Prince 8(5,3) one smooth piece at a time: every sample instant and every
 * instant where the delayed input switches is a segment end, so the integrator never steps
 * across a discontinuity.
 */
final class DelayedOde {

    /** Right-hand side: writes dx/dt for state x and delayed input v into dx. */
    interface Dynamics {
        void derivative(double[] x, double v, double[] dx);
    }

    /** Local error tolerances, absolute and relative: far below the test's 1e-9. */
    private static final double INTEGRATOR_TOLERANCE = 1e-13;

    private DelayedOde() {
    }

    /** Output at t = k h for k = 0..inputs.length, the process starting at rest. */
    static double[] samples(int dimension, Dynamics f, ToDoubleFunction<double[]> g,
            double deadTimeSeconds, double scanSeconds, double[] inputs) {
        int n = inputs.length;
        double[] breaks = new double[2 * n + 1];
        for (int k = 0; k <= n; k++) {
            breaks[k] = k * scanSeconds;
        }
        for (int k = 0; k < n; k++) {
            breaks[n + 1 + k] = Math.min(k * scanSeconds + deadTimeSeconds, n * scanSeconds);
        }
        Arrays.sort(breaks);
        FirstOrderIntegrator integrator = new DormandPrince853Integrator(
                1e-14, scanSeconds, INTEGRATOR_TOLERANCE, INTEGRATOR_TOLERANCE);
        double[] x = new double[dimension];
        double[] y = new double[n + 1];
        y[0] = g.applyAsDouble(x);
        int nextSample = 1;
        for (int i = 0; i + 1 < breaks.length; i++) {
            double t0 = breaks[i];
            double t1 = breaks[i + 1];
            if (t1 - t0 > 1e-12) {
                double v = delayedInput(0.5 * (t0 + t1), deadTimeSeconds, scanSeconds, inputs);
                integrator.integrate(equations(dimension, f, v), t0, x, t1, x);
            }
            while (nextSample <= n && Math.abs(nextSample * scanSeconds - t1) <= 1e-12) {
                y[nextSample++] = g.applyAsDouble(x);
            }
        }
        return y;
    }

    private static double delayedInput(double t, double deadTimeSeconds, double scanSeconds, double[] inputs) {
        double source = t - deadTimeSeconds;
        if (source < 0) {
            return 0.0;
        }
        return inputs[Math.min(inputs.length - 1, (int) Math.floor(source / scanSeconds))];
    }

    private static FirstOrderDifferentialEquations equations(int dimension, Dynamics f, double v) {
        return new FirstOrderDifferentialEquations() {
            @Override
            public int getDimension() {
                return dimension;
            }

            @Override
            public void computeDerivatives(double t, double[] x, double[] dx) {
                f.derivative(x, v, dx);
            }
        };
    }
}

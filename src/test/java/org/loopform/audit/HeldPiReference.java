package org.loopform.audit;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;
import org.apache.commons.math3.ode.events.EventHandler;
import org.apache.commons.math3.ode.nonstiff.DormandPrince853Integrator;

/**
 * An independent reference for a sampled PI loop, written out here and not taken from loopform:
 * a process given by its own differential equations, integrated with Commons Math's adaptive
 * Dormand-Prince 8(5,3), behind a zero-order hold and a dead time, under a discrete ideal PI in
 * positional form with a backward-difference integral (the {@code ideal} catalog form's default
 * algorithm), written by hand:
 *
 * <pre>
 *   e(k) = r - y(k h),  I(k) = I(k-1) + (kc h / ti) e(k),  u(k) = kc e(k) + I(k)   (deviation variables)
 *   process input v(t) = u(floor((t - L) / h)) + load, for t >= L (0 before)
 * </pre>
 *
 * (Astrom &amp; Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 2, a computer-controlled
 * system: sample, compute, hold - from memory for the section; the PI recursion is common
 * practice.) The load is a step at the process input; by default it is added to the controller
 * output, so it passes the dead time with it, or it reaches the process at a given instant. The input is constant between the scan instants and the switch instants {@code k h + L},
 * so the integration runs piece by piece between them and never steps across a discontinuity.
 * Events locate every extremum of y (dy/dt = 0), every zero of the error (where |e| has a corner:
 * the IAE integrand restarts there) and every crossing of the settling band.
 */
final class HeldPiReference {

    /** A linear process {@code dx/dt = f(x, v)}, {@code y = g(x)}, in deviation variables. */
    interface Process {
        int dimension();

        void derivative(double[] x, double v, double[] dx);

        double output(double[] x);

        /** dy/dt at state x and input v. */
        double outputRate(double[] x, double v);
    }

    /** What the reference measured over the run, in percent of span and seconds. */
    record Figures(double largestPv, double smallestPv, double largestPvAtScans, double iae,
                   double settlingSeconds) {
    }

    /** Integrator tolerances, absolute and relative: far below the percent-level figures compared. */
    private static final double TOLERANCE = 1e-11;

    private HeldPiReference() {
    }

    /**
     * Runs {@code scans} scans of {@code h} from rest, setpoint step {@code setpointStep} and
     * load {@code load} applied at t = 0, and measures the continuous PV; the settling band is
     * {@code band} either side of the setpoint.
     */
    static Figures run(Process p, double kc, double tiSeconds, double h, double deadTimeSeconds, double setpointStep,
                       double load, int scans, double band) {
        return run(p, kc, tiSeconds, h, deadTimeSeconds, setpointStep, load, deadTimeSeconds, scans, band);
    }

    /**
     * As above, with the load reaching the process input at {@code loadOnsetSeconds} instead of at
     * the dead time: {@code v(t) = u(floor((t - L) / h)) [t >= L] + load [t >= onset]}.
     */
    static Figures run(Process p, double kc, double tiSeconds, double h, double deadTimeSeconds, double setpointStep,
                       double load, double loadOnsetSeconds, int scans, double band) {
        int n = p.dimension();
        double[] state = new double[n + 1]; // process states, then the integral of |e|
        double[] inputs = new double[scans];
        double integral = 0;
        List<Double> breaks = new ArrayList<>();
        if (loadOnsetSeconds < scans * h && Math.abs(loadOnsetSeconds - Math.rint(loadOnsetSeconds / h) * h) > 1e-9) {
            breaks.add(loadOnsetSeconds);
        }
        for (int k = 0; k <= scans; k++) {
            breaks.add(k * h);
            double sw = k * h + deadTimeSeconds;
            if (sw < scans * h && Math.abs(sw - Math.rint(sw / h) * h) > 1e-9) {
                breaks.add(sw);
            }
        }
        breaks.sort(Double::compare);
        // the load onset may coincide with a switch instant: one break each
        for (int i = breaks.size() - 1; i > 0; i--) {
            if (breaks.get(i) - breaks.get(i - 1) <= 1e-9) {
                breaks.remove(i);
            }
        }
        double[] largest = {Double.NEGATIVE_INFINITY};
        double[] smallest = {Double.POSITIVE_INFINITY};
        double largestAtScans = Double.NEGATIVE_INFINITY;
        double[] lastEntry = {0.0};
        boolean[] insideBand = {false};
        DormandPrince853Integrator integrator = new DormandPrince853Integrator(1e-12, h, TOLERANCE, TOLERANCE);
        double[] v = new double[1];
        FirstOrderDifferentialEquations equations = new FirstOrderDifferentialEquations() {
            @Override
            public int getDimension() {
                return n + 1;
            }

            @Override
            public void computeDerivatives(double t, double[] x, double[] dx) {
                p.derivative(x, v[0], dx);
                dx[n] = Math.abs(setpointStep - p.output(x));
            }
        };
        double check = Math.min(h, deadTimeSeconds > 0 ? deadTimeSeconds : h) / 50;
        integrator.addEventHandler(new Recorder(s -> p.outputRate(s, v[0])) {
            @Override
            void at(double t, double[] x, boolean increasing) {
                largest[0] = Math.max(largest[0], p.output(x));
                smallest[0] = Math.min(smallest[0], p.output(x));
            }
        }, check, 1e-12, 1000);
        // a zero of the error is a corner of |e|: restart the integrator there
        integrator.addEventHandler(new Recorder(s -> setpointStep - p.output(s)) {
            @Override
            void at(double t, double[] x, boolean increasing) {
            }
        }, check, 1e-12, 1000);
        integrator.addEventHandler(new Recorder(s -> Math.abs(setpointStep - p.output(s)) - band) {
            @Override
            void at(double t, double[] x, boolean increasing) {
                insideBand[0] = !increasing;
                if (!increasing) {
                    lastEntry[0] = t;
                }
            }
        }, check, 1e-12, 1000);
        insideBand[0] = Math.abs(setpointStep) <= band;
        int scan = 0;
        for (int i = 0; i + 1 < breaks.size(); i++) {
            double t0 = breaks.get(i);
            double t1 = breaks.get(i + 1);
            if (Math.abs(t0 - scan * h) <= 1e-9 && scan < scans) {
                // the controller reads the PV at the scan instant and writes its output
                double y = p.output(state);
                largestAtScans = Math.max(largestAtScans, y);
                double e = setpointStep - y;
                integral += kc * h / tiSeconds * e;
                inputs[scan] = kc * e + integral;
                scan++;
            }
            double source = 0.5 * (t0 + t1) - deadTimeSeconds;
            v[0] = (source < 0 ? 0.0 : inputs[(int) Math.floor(source / h)])
                    + (0.5 * (t0 + t1) >= loadOnsetSeconds ? load : 0.0);
            largest[0] = Math.max(largest[0], p.output(state));
            smallest[0] = Math.min(smallest[0], p.output(state));
            integrator.integrate(equations, t0, state, t1, state);
        }
        double yEnd = p.output(state);
        largest[0] = Math.max(largest[0], yEnd);
        smallest[0] = Math.min(smallest[0], yEnd);
        largestAtScans = Math.max(largestAtScans, yEnd);
        double settling = insideBand[0] ? lastEntry[0] : Double.NaN;
        return new Figures(largest[0], smallest[0], largestAtScans, state[n], settling);
    }

    /** An event at the zeros of one function of the state; the integrator restarts there. */
    private abstract static class Recorder implements EventHandler {
        private final java.util.function.ToDoubleFunction<double[]> g;

        Recorder(java.util.function.ToDoubleFunction<double[]> g) {
            this.g = g;
        }

        abstract void at(double t, double[] x, boolean increasing);

        @Override
        public void init(double t0, double[] y0, double t) {
        }

        @Override
        public double g(double t, double[] y) {
            return g.applyAsDouble(y);
        }

        @Override
        public Action eventOccurred(double t, double[] y, boolean increasing) {
            at(t, y, increasing);
            return Action.RESET_DERIVATIVES;
        }

        @Override
        public void resetState(double t, double[] y) {
        }
    }

    /** First order {@code K/(1 + T s)}: {@code dx/dt = (K v - x)/T}, y = x. */
    static Process firstOrder(double gain, double timeConstantSeconds) {
        return new Process() {
            @Override
            public int dimension() {
                return 1;
            }

            @Override
            public void derivative(double[] x, double v, double[] dx) {
                dx[0] = (gain * v - x[0]) / timeConstantSeconds;
            }

            @Override
            public double output(double[] x) {
                return x[0];
            }

            @Override
            public double outputRate(double[] x, double v) {
                return (gain * v - x[0]) / timeConstantSeconds;
            }
        };
    }

    /** Two lags in series, {@code K/((1 + T1 s)(1 + T2 s))}: x1 after the first lag, y = x2 after the second. */
    static Process twoLags(double gain, double t1Seconds, double t2Seconds) {
        return new Process() {
            @Override
            public int dimension() {
                return 2;
            }

            @Override
            public void derivative(double[] x, double v, double[] dx) {
                dx[0] = (gain * v - x[0]) / t1Seconds;
                dx[1] = (x[0] - x[1]) / t2Seconds;
            }

            @Override
            public double output(double[] x) {
                return x[1];
            }

            @Override
            public double outputRate(double[] x, double v) {
                return (x[0] - x[1]) / t2Seconds;
            }
        };
    }
}

package org.loopform.identify;

import java.util.Random;

/**
 * Invented test records generated from known models by their analytic step responses (superposed
 * for several steps or a pulse), independent of the fitter's simulator:
 * FOPDT {@code K du (1 - e^(-(t - L)/T))}; SOPDT {@code K du (1 - (T1 e^(-t'/T1) - T2 e^(-t'/T2))/(T1 - T2))};
 * integrating {@code Kv du (t - L)} (Seborg, Edgar &amp; Mellichamp, 2nd ed., 2004, ch. 5 - textbook step responses).
 */
final class Records {

    private Records() {
    }

    /** A step (or several): times of each output change and its size. */
    record Move(double atSeconds, double sizePercent) {
    }

    static double fopdtStep(double k, double t, double l, double since) {
        return since <= l ? 0 : k * (1 - Math.exp(-(since - l) / t));
    }

    static double sopdtStep(double k, double t1, double t2, double l, double since) {
        if (since <= l) {
            return 0;
        }
        double s = since - l;
        return k * (1 - (t1 * Math.exp(-s / t1) - t2 * Math.exp(-s / t2)) / (t1 - t2));
    }

    static double ipdtStep(double kv, double l, double since) {
        return since <= l ? 0 : kv * (since - l);
    }

    interface StepResponse {
        double at(double secondsSinceStep);
    }

    /**
     * Samples every {@code dt} s over {@code duration} s (jittered by up to {@code jitter} s when non-zero), output
     * starting at 50 %, PV at 40 % plus the response plus noise: white with deviation {@code sigma}, or AR(1) with
     * coefficient {@code phi} and the same stationary deviation.
     */
    static PlantRecord make(StepResponse unit, Move[] moves, double dt, double duration, double jitter, double sigma,
                            double phi, long seed) {
        Random rnd = new Random(seed);
        int n = (int) Math.round(duration / dt) + 1;
        double[] t = new double[n];
        double[] u = new double[n];
        double[] y = new double[n];
        double e = 0;
        double innov = sigma * Math.sqrt(1 - phi * phi);
        for (int k = 0; k < n; k++) {
            t[k] = k * dt + (k > 0 && k < n - 1 && jitter > 0 ? (rnd.nextDouble() - 0.5) * jitter : 0);
            double out = 50;
            double pv = 40;
            for (Move m : moves) {
                if (t[k] >= m.atSeconds()) {
                    out += m.sizePercent();
                }
                double since = t[k] - m.atSeconds();
                if (since > 0) {
                    pv += m.sizePercent() * unit.at(since);
                }
            }
            e = k == 0 ? sigma * rnd.nextGaussian() : phi * e + innov * rnd.nextGaussian();
            u[k] = out;
            y[k] = pv + e;
        }
        return new PlantRecord(t, u, y);
    }
}

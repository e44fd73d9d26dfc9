package org.loopform.analysis;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.complex.Complex;

/**
 * A sampled loop built from the roots it should have, for tests whose answer is the roots
 * themselves: {@code 1 + L(z) = prod (z - c_k) / (z^d prod (z - a_j))} with d + (number of a_j)
 * closed-loop poles c_k, so that {@code 1 + L} tends to 1 as |z| grows. Then
 * {@code R(z) = prod (z - c_k) / prod (z - a_j) - z^d} and {@code L = R z^-d}, whose closed-loop
 * poles are the c_k and open-loop poles the a_j by construction (hand derivation: multiply out
 * {@code 1 + R z^-d}). Complex roots are given with their conjugates, so L has real coefficients.
 */
final class RootPlacedLoop implements SampledLoop {

    private final double[][] closedLoop;
    private final double[][] openLoop;
    private final int delayScans;

    private RootPlacedLoop(double[][] closedLoop, double[][] openLoop, int delayScans) {
        if (closedLoop.length != openLoop.length + delayScans) {
            throw new IllegalArgumentException("need d + " + openLoop.length + " closed-loop poles (got "
                    + closedLoop.length + ")");
        }
        this.closedLoop = closedLoop;
        this.openLoop = openLoop;
        this.delayScans = delayScans;
    }

    /** Closed-loop poles {@code closed}, open-loop poles {@code open} (each {re, im}), d scans of delay. */
    static RootPlacedLoop of(double[][] closed, double[][] open, int delayScans) {
        return new RootPlacedLoop(closed, open, delayScans);
    }

    /** The point {re, im}. */
    static double[] at(double re, double im) {
        return new double[] {re, im};
    }

    /** The point of magnitude r at angle theta (radians). */
    static double[] polar(double r, double theta) {
        return new double[] {r * Math.cos(theta), r * Math.sin(theta)};
    }

    /** The pair r e^(+- i theta). */
    static double[][] pair(double r, double theta) {
        return new double[][] {polar(r, theta), polar(r, -theta)};
    }

    static double[][] join(double[]... points) {
        return points;
    }

    static double[][] concat(double[][]... groups) {
        List<double[]> all = new ArrayList<>();
        for (double[][] g : groups) {
            all.addAll(List.of(g));
        }
        return all.toArray(new double[0][]);
    }

    @Override
    public void at(double radiusOffset, double theta, double[] out) {
        double r = 1 + radiusOffset;
        double zr = r * Math.cos(theta);
        double zi = r * Math.sin(theta);
        double[] c = product(closedLoop, zr, zi);
        double[] a = product(openLoop, zr, zi);
        double m = a[0] * a[0] + a[1] * a[1];
        // C / D
        double qr = (c[0] * a[0] + c[1] * a[1]) / m;
        double qi = (c[1] * a[0] - c[0] * a[1]) / m;
        // z^d and z^-d
        double zdMagnitude = Math.pow(r, delayScans);
        double zdr = zdMagnitude * Math.cos(delayScans * theta);
        double zdi = zdMagnitude * Math.sin(delayScans * theta);
        double rr = qr - zdr;
        double ri = qi - zdi;
        double inverse = 1 / zdMagnitude;
        double wr = inverse * Math.cos(-delayScans * theta);
        double wi = inverse * Math.sin(-delayScans * theta);
        out[0] = rr * wr - ri * wi;
        out[1] = rr * wi + ri * wr;
        out[2] = rr;
        out[3] = ri;
    }

    private static double[] product(double[][] roots, double zr, double zi) {
        double pr = 1;
        double pi = 0;
        for (double[] root : roots) {
            double fr = zr - root[0];
            double fi = zi - root[1];
            double t = pr * fr - pi * fi;
            pi = pr * fi + pi * fr;
            pr = t;
        }
        return new double[] {pr, pi};
    }

    @Override
    public List<Complex> openLoopPoles() {
        List<Complex> poles = new ArrayList<>();
        for (double[] a : openLoop) {
            if (a[0] != 0 || a[1] != 0) {
                poles.add(new Complex(a[0], a[1]));
            }
        }
        return poles;
    }

    @Override
    public int delayScans() {
        return delayScans;
    }
}

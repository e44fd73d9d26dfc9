package org.loopform.scan;

import org.loopform.form.DiscreteAlgorithm;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;

/**
 * The pulse transfer functions of a scan controller without output limits,
 * {@code u = C_r(z) r - C_y(z) y}, evaluated on the unit circle {@code z = e^(i omega h)}. With
 * {@code D(z)} the discrete filtered derivative ({@link DerivativeFilter}) and {@code J(z)} the
 * discrete integrator ({@link IntegralRule}):
 *
 * <pre>
 *   C_y(z) = (kp + ki J) (1 + measurementLead D) + kd D
 *   C_r(z) = (kp b + ki J) (1 + setpointLead D) + kd cd D
 * </pre>
 *
 * (terms as in {@link ScanWiring}). Replacing D by s/(1 + Tf s) and J by 1/s gives back the
 * continuous law of {@code form.StructureLaw}.
 */
public final class PulseLaw {

    private final ScanWiring wiring;
    private final DerivativeFilter filter;
    private final IntegralRule integralRule;
    private final double scanSeconds;

    PulseLaw(ScanWiring wiring, DerivativeFilter filter, IntegralRule integralRule, double scanSeconds) {
        this.wiring = wiring;
        this.filter = filter;
        this.integralRule = integralRule;
        this.scanSeconds = scanSeconds;
    }

    /** The pulse law of {@code setting} run with {@code algorithm}'s discretizations at scan time h. */
    public static PulseLaw of(PidSetting setting, FilterPlacement placement, DiscreteAlgorithm algorithm,
                              double scanSeconds) {
        return of(setting, placement, algorithm.integral(), algorithm.derivative(), scanSeconds);
    }

    /** The pulse law of {@code setting} with the given integral and derivative discretizations at scan time h. */
    public static PulseLaw of(PidSetting setting, FilterPlacement placement, Discretization integral,
                              Discretization derivative, double scanSeconds) {
        ScanController.checkScan(scanSeconds);
        if (setting == null || placement == null || integral == null || derivative == null) {
            throw new IllegalArgumentException("a pulse law needs a setting, a filter placement and two discretizations");
        }
        return new PulseLaw(ScanWiring.of(setting, placement),
                DerivativeFilter.of(derivative, setting.filterSeconds(), scanSeconds),
                IntegralRule.of(integral), scanSeconds);
    }

    public double scanSeconds() {
        return scanSeconds;
    }

    /** C_y(e^(i omega h)) into {@code out} as {re, im}, without allocating; omega > 0 rad/s. */
    public void feedbackAt(double omegaRadPerSecond, double[] out) {
        evaluate(omegaRadPerSecond, wiring.kp(), wiring.measurementLeadSeconds(), wiring.kd(), out);
    }

    /**
     * True when the setpoint path is the feedback path to the bit (same proportional weight, lead and
     * derivative), so that {@link #setpointAt} gives exactly what {@link #feedbackAt} gives.
     */
    public boolean setpointPathIsFeedbackPath() {
        return same(wiring.kp() * wiring.b(), wiring.kp())
                && same(wiring.setpointLeadSeconds(), wiring.measurementLeadSeconds())
                && same(wiring.kd() * wiring.cd(), wiring.kd());
    }

    private static boolean same(double a, double b) {
        return Double.doubleToLongBits(a) == Double.doubleToLongBits(b);
    }

    /** C_r(e^(i omega h)) into {@code out} as {re, im}, without allocating; omega > 0 rad/s. */
    public void setpointAt(double omegaRadPerSecond, double[] out) {
        evaluate(omegaRadPerSecond, wiring.kp() * wiring.b(), wiring.setpointLeadSeconds(),
                wiring.kd() * wiring.cd(), out);
    }

    /**
     * C_y anywhere in the plane, for the argument principle: at {@code z = (1 + radiusOffset) e^(i theta)}
     * into {@code out} as {re, im}, with {@code J(z) = h (current z + previous) / (z - 1)} and
     * {@code D(z) = gain (z - 1) / (z - pole)}; z - 1 and z - pole are formed without cancellation
     * near z = 1. Allocates nothing.
     */
    public void feedbackAtRadius(double radiusOffset, double theta, double[] out) {
        double cos = Math.cos(theta);
        double sin = Math.sin(theta);
        feedbackAtPoint(radiusOffset, cos, sin, oneMinusCos(cos, sin), out);
    }

    /** 1 - cos theta without cancellation near theta = 0: sin^2 / (1 + cos) there. */
    public static double oneMinusCos(double cos, double sin) {
        return cos > 0 ? sin * sin / (1 + cos) : 1 - cos;
    }

    /**
     * As {@link #feedbackAtRadius}, with the angle given by its cosine, sine and {@code 1 - cos}
     * ({@link #oneMinusCos}), so that a caller evaluating several factors at one point computes them once.
     */
    public void feedbackAtPoint(double radiusOffset, double cos, double sin, double oneMinusCos, double[] out) {
        double radius = 1 + radiusOffset;
        double zMinusOneRe = radiusOffset * cos - oneMinusCos;
        double zIm = radius * sin;
        double zRe = radius * cos;
        // J = h (current z + previous) / (z - 1)
        double jnRe = scanSeconds * (integralRule.current() * zRe + integralRule.previous());
        double jnIm = scanSeconds * integralRule.current() * zIm;
        double jd2 = zMinusOneRe * zMinusOneRe + zIm * zIm;
        double jRe = (jnRe * zMinusOneRe + jnIm * zIm) / jd2;
        double jIm = (jnIm * zMinusOneRe - jnRe * zIm) / jd2;
        double ar = wiring.kp() + (wiring.ki() != 0 ? wiring.ki() * jRe : 0.0);
        double ai = wiring.ki() != 0 ? wiring.ki() * jIm : 0.0;
        // D = gain (z - 1) / (z - pole), z - pole = (1 - pole) + (z - 1)
        double pdRe = (1 - filter.pole()) + zMinusOneRe;
        double pd2 = pdRe * pdRe + zIm * zIm;
        double dr = filter.gain() * (zMinusOneRe * pdRe + zIm * zIm) / pd2;
        double di = filter.gain() * (zIm * pdRe - zMinusOneRe * zIm) / pd2;
        double leadSeconds = wiring.measurementLeadSeconds();
        double lr = 1 + leadSeconds * dr;
        double li = leadSeconds * di;
        out[0] = ar * lr - ai * li + wiring.kd() * dr;
        out[1] = ar * li + ai * lr + wiring.kd() * di;
    }

    /**
     * The poles of C_y other than z = 0, as {re, im} pairs: the integrator's at z = 1 when there is
     * integral action, the derivative filter's when a derivative or a lead acts on the measurement.
     */
    public double[][] feedbackPoles() {
        java.util.List<double[]> poles = new java.util.ArrayList<>();
        if (wiring.ki() != 0) {
            poles.add(new double[] {1.0, 0.0});
        }
        if ((wiring.kd() != 0 || wiring.measurementLeadSeconds() != 0) && filter.pole() != 0) {
            poles.add(new double[] {filter.pole(), 0.0});
        }
        return poles.toArray(new double[0][]);
    }

    /** (proportional + ki J)(1 + lead D) + derivative D at theta = omega h. */
    private void evaluate(double omega, double proportional, double leadSeconds, double derivative, double[] out) {
        if (!(omega > 0) || !Double.isFinite(omega)) {
            throw new IllegalArgumentException("frequency must be > 0 rad/s and finite (got " + omega + " rad/s)");
        }
        double theta = omega * scanSeconds;
        integralRule.responseAt(theta, scanSeconds, out);
        double ar = proportional + wiring.ki() * out[0];
        double ai = wiring.ki() * out[1];
        filter.responseAt(theta, out);
        double dr = out[0];
        double di = out[1];
        double lr = 1 + leadSeconds * dr;
        double li = leadSeconds * di;
        out[0] = ar * lr - ai * li + derivative * dr;
        out[1] = ar * li + ai * lr + derivative * di;
    }
}

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

    /** C_r(e^(i omega h)) into {@code out} as {re, im}, without allocating; omega > 0 rad/s. */
    public void setpointAt(double omegaRadPerSecond, double[] out) {
        evaluate(omegaRadPerSecond, wiring.kp() * wiring.b(), wiring.setpointLeadSeconds(),
                wiring.kd() * wiring.cd(), out);
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

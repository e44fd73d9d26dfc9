package org.loopform.scan;

import org.loopform.form.Discretization;
import org.loopform.form.PidSetting;

/**
 * What a scan time does to a setting's integral (h / Ti) and derivative: N h / Td (which equals h / Tf when
 * Tf = Td / N), the discrete filter pole, whether the derivative rings or does not decay, and the
 * phase lead it keeps. Filter poles per discretization as in Wittenmark, Astrom and Arzen,
 * "Computer Control: An Overview", IFAC Professional Brief, 2002, Table 3: forward 1 - h/Tf
 * (unstable when h > 2 Tf), backward Tf/(Tf + h), trapezoidal (2 Tf - h)/(2 Tf + h) (negative,
 * so ringing, when h > 2 Tf), step (ramp) invariant exp(-h/Tf).
 *
 * @param scanSeconds           scan time h, s
 * @param filterSeconds         derivative filter time constant Tf, s (0: none)
 * @param derivativeTimeSeconds derivative time Td, s (0: no derivative action)
 * @param method                the derivative discretization
 * @param integralTimeSeconds   the integral time Ti of the law in the ideal form's terms (kp / ki of its parallel
 *                              writing; for the series form Ti + Td), s; infinite without integral action
 */
public record ScanFacts(double scanSeconds, double filterSeconds, double derivativeTimeSeconds,
                        Discretization method, double integralTimeSeconds) {

    public ScanFacts {
        ScanController.checkScan(scanSeconds);
        if (!(filterSeconds >= 0) || !Double.isFinite(filterSeconds)) {
            throw new IllegalArgumentException("filter time constant must be >= 0 s (got " + filterSeconds + " s)");
        }
        if (!(derivativeTimeSeconds >= 0) || !Double.isFinite(derivativeTimeSeconds)) {
            throw new IllegalArgumentException("derivative time must be >= 0 s (got " + derivativeTimeSeconds + " s)");
        }
        if (method == null) {
            throw new IllegalArgumentException("scan facts need the derivative discretization");
        }
        if (!(integralTimeSeconds > 0)) {
            throw new IllegalArgumentException("integral time must be > 0 s, or infinite without integral action (got "
                    + integralTimeSeconds + " s)");
        }
    }

    /** The facts of a setting without integral action (or whose integral is not looked at). */
    public ScanFacts(double scanSeconds, double filterSeconds, double derivativeTimeSeconds, Discretization method) {
        this(scanSeconds, filterSeconds, derivativeTimeSeconds, method, Double.POSITIVE_INFINITY);
    }

    /** The facts for {@code setting} run with derivative discretization {@code method} at scan time h. */
    public static ScanFacts of(PidSetting setting, Discretization method, double scanSeconds) {
        return new ScanFacts(scanSeconds, setting.filterSeconds(), Math.abs(setting.derivativeTimeSeconds()), method,
                idealIntegralSeconds(setting));
    }

    /**
     * The law's integral time in the ideal form's terms: Ti itself; kp / ki for the parallel
     * structure; Ti + Td for the series one, whose ideal equivalent has Ti' = Ti + Td (Astrom and
     * Hagglund, PID Controllers, 1995, sec. 3.4). Infinite without integral action.
     */
    static double idealIntegralSeconds(PidSetting setting) {
        if (!setting.hasIntegral()) {
            return Double.POSITIVE_INFINITY;
        }
        double ti = switch (setting.structure()) {
            case PARALLEL -> Math.abs(setting.gain() / setting.integral());
            case IDEAL -> setting.integral();
            case SERIES -> setting.integral() + setting.derivative();
        };
        return ti > 0 ? ti : Double.POSITIVE_INFINITY;
    }

    /** h / Ti: how many times the proportional action the integral adds each scan; 0 without integral action. */
    public double integralStepRatio() {
        return scanSeconds / integralTimeSeconds;
    }

    public boolean hasDerivative() {
        return derivativeTimeSeconds > 0;
    }

    /** N h / Td with N = Td / Tf, that is h / Tf; infinite without a filter. */
    public double nhOverTd() {
        return filterSeconds == 0 ? Double.POSITIVE_INFINITY : scanSeconds / filterSeconds;
    }

    /** The discrete derivative filter's pole in z (0 without a filter: a plain backward difference). */
    public double filterPole() {
        return filter().pole();
    }

    /** True when the filter pole lies in (-1, 0): each scan the derivative flips sign while it decays. */
    public boolean rings() {
        double pole = filterPole();
        return pole < 0 && pole > -1;
    }

    /** True when the filter pole has magnitude 1 or more: the derivative term does not decay (forward, h >= 2 Tf). */
    public boolean unstable() {
        return Math.abs(filterPole()) >= 1;
    }

    /**
     * The phase of the discrete filtered derivative {@code D(e^(i omega h))}, degrees; the
     * continuous one, {@code Td s/(1 + Tf s)}, leads by 90 - atan(omega Tf). The hold's h/2 delay
     * is the process side's and is not included.
     */
    public double phaseLeadDegrees(double omegaRadPerSecond) {
        checkFrequency(omegaRadPerSecond);
        double[] d = new double[2];
        filter().responseAt(omegaRadPerSecond * scanSeconds, d);
        return Math.toDegrees(Math.atan2(d[1], d[0]));
    }

    /** The continuous filtered derivative's phase lead, 90 - atan(omega Tf), degrees (common practice). */
    public double continuousPhaseLeadDegrees(double omegaRadPerSecond) {
        checkFrequency(omegaRadPerSecond);
        return 90.0 - Math.toDegrees(Math.atan(omegaRadPerSecond * filterSeconds));
    }

    /** How much phase lead the discrete derivative loses against the continuous one at omega, degrees. */
    public double phaseLeadLostDegrees(double omegaRadPerSecond) {
        return continuousPhaseLeadDegrees(omegaRadPerSecond) - phaseLeadDegrees(omegaRadPerSecond);
    }

    private DerivativeFilter filter() {
        return DerivativeFilter.of(method, filterSeconds, scanSeconds);
    }

    private static void checkFrequency(double omega) {
        if (!(omega > 0) || !Double.isFinite(omega)) {
            throw new IllegalArgumentException("frequency must be > 0 rad/s and finite (got " + omega + " rad/s)");
        }
    }
}

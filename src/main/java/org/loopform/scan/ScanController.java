package org.loopform.scan;

import org.loopform.form.AlgorithmKind;
import org.loopform.form.AntiWindup;
import org.loopform.form.DiscreteAlgorithm;
import org.loopform.form.FilterPlacement;
import org.loopform.form.FormDefinition;
import org.loopform.form.PidSetting;
import org.loopform.form.Structure;

/**
 * A PID controller exactly as a target runs it each scan: the discrete counterpart of the law a
 * {@link PidSetting} writes ({@code form.StructureLaw}), with the algorithm's integral and
 * derivative discretizations, positional or velocity form, output limits and anti-windup.
 * Stateful and not thread-safe; {@link #update} does not allocate.
 *
 * <p>Each scan, with the terms of {@link ScanWiring} and {@code D[x](k) = pole D[x](k-1) +
 * gain (x(k) - x(k-1))} ({@link DerivativeFilter}):
 * <pre>
 *   P(k) = kp (b r'(k) - y'(k)),  e(k) = r'(k) - y'(k),  D(k) = kd (cd D[r](k) - D[y](k))
 *   dI(k) = ki h (current e(k) + previous e(k-1))                       ({@link IntegralRule})
 *   positional: I(k) = I(k-1) + dI(k),  v(k) = P(k) + I(k) + D(k)
 *   velocity:   v(k) = u(k-1) + P(k) - P(k-1) + dI(k) + D(k) - D(k-1)
 *   u(k) = v(k) limited to the algorithm's output range (when limits are on)
 * </pre>
 * For an unfiltered ideal PID with backward differences the velocity increments are those of
 * Wittenmark, Astrom and Arzen, "Computer Control: An Overview", IFAC Professional Brief, 2002
 * (the incremental algorithm); its limits clamp the accumulated output, so windup does not arise
 * and the anti-windup setting is not used.
 * Positional anti-windup: clamping skips this scan's increment when the output is beyond a limit
 * and the increment drives it further (conditional integration); back-calculation adds
 * {@code (h/Tt)(u(k) - v(k))} to the integral after the output is written (Astrom and
 * Hagglund, PID Controllers: Theory, Design and Tuning, 2nd ed., ISA 1995, section 3.5 - from
 * memory), with Tt the algorithm's tracking time or, when that is 0, sqrt(Ti Td) (Ti when Td = 0).
 */
public final class ScanController {

    private final PulseLaw pulseLaw;
    private final double scanSeconds;
    private final boolean limited;
    private final boolean velocity;
    private final AntiWindup antiWindup;
    private final double lowPercent;
    private final double highPercent;
    private final double trackingTimeSeconds;

    private final double kp;
    private final double ki;
    private final double kd;
    private final double b;
    private final double cd;
    private final double setpointLead;
    private final double measurementLead;
    private final double pole;
    private final double differenceGain;
    private final double currentWeight;
    private final double previousWeight;
    private final double trackingGain;

    private double previousSetpoint;
    private double previousPv;
    private double setpointDerivative;
    private double pvDerivative;
    private double previousError;
    private double integral;
    private double previousProportional;
    private double previousDerivativeTerm;
    private double outputPercent;
    private double unlimitedPercent;
    /** Whether the last scan's output was clipped or its integral held by clamping: the loop was not linear. */
    private boolean limitsActed;

    private ScanController(PidSetting setting, FilterPlacement placement, DiscreteAlgorithm algorithm,
                           double scanSeconds, boolean limited) {
        checkScan(scanSeconds);
        if (setting == null || placement == null || algorithm == null) {
            throw new IllegalArgumentException("a scan controller needs a setting, a filter placement and an algorithm");
        }
        ScanWiring wiring = ScanWiring.of(setting, placement);
        DerivativeFilter filter = DerivativeFilter.of(algorithm.derivative(), setting.filterSeconds(), scanSeconds);
        IntegralRule rule = IntegralRule.of(algorithm.integral());
        this.pulseLaw = new PulseLaw(wiring, filter, rule, scanSeconds);
        this.scanSeconds = scanSeconds;
        this.limited = limited;
        this.velocity = algorithm.kind() == AlgorithmKind.VELOCITY;
        this.antiWindup = algorithm.antiWindup();
        this.lowPercent = algorithm.outputLowPercent();
        this.highPercent = algorithm.outputHighPercent();
        this.kp = wiring.kp();
        this.ki = wiring.ki();
        this.kd = wiring.kd();
        this.b = wiring.b();
        this.cd = wiring.cd();
        this.setpointLead = wiring.setpointLeadSeconds();
        this.measurementLead = wiring.measurementLeadSeconds();
        this.pole = filter.pole();
        this.differenceGain = filter.gain();
        this.currentWeight = rule.current();
        this.previousWeight = rule.previous();
        this.trackingTimeSeconds = trackingTime(setting, algorithm.trackingTimeSeconds());
        this.trackingGain = ki == 0 ? 0.0 : scanSeconds / trackingTimeSeconds;
        // at rest at 0 %, or at the nearer limit when the output range leaves 0 % out (say 48..52 %)
        reset(limited ? limit(0.0) : 0.0, 0.0, 0.0);
    }

    /** The controller with the algorithm's output limits (and its anti-windup) in force. */
    public static ScanController limited(PidSetting setting, FilterPlacement placement, DiscreteAlgorithm algorithm,
                                         double scanSeconds) {
        return new ScanController(setting, placement, algorithm, scanSeconds, true);
    }

    /** The linear controller: no output limits, so no anti-windup; its transfer functions are {@link #pulseLaw()}. */
    public static ScanController unlimited(PidSetting setting, FilterPlacement placement,
                                           DiscreteAlgorithm algorithm, double scanSeconds) {
        return new ScanController(setting, placement, algorithm, scanSeconds, false);
    }

    /** The controller {@code form} runs for {@code setting}, limits on. */
    public static ScanController of(FormDefinition form, PidSetting setting, double scanSeconds) {
        return limited(setting, form.filter().placement(), form.algorithm(), scanSeconds);
    }

    static void checkScan(double scanSeconds) {
        if (!(scanSeconds > 0) || !Double.isFinite(scanSeconds)) {
            throw new IllegalArgumentException("scan time must be > 0 s and finite (got " + scanSeconds + " s)");
        }
    }

    /** Tt: the given one, else sqrt(Ti Td), else Ti (Astrom and Hagglund 1995, section 3.5 - from memory). */
    private static double trackingTime(PidSetting s, double givenSeconds) {
        if (givenSeconds > 0) {
            return givenSeconds;
        }
        if (!s.hasIntegral()) {
            return Double.POSITIVE_INFINITY;
        }
        double ti = s.structure() == Structure.PARALLEL ? Math.abs(s.gain() / s.integral()) : s.integral();
        double td = Math.abs(s.derivativeTimeSeconds());
        return td > 0 ? Math.sqrt(ti * td) : ti;
    }

    /**
     * Puts the controller at rest as if it had held {@code outputPercent} for a long time with
     * setpoint and PV steady: derivative and filter states at rest, integral (or, in velocity
     * form, the accumulated output) chosen so that the last output was {@code outputPercent}.
     * With zero error the next scans then continue from it without a bump.
     */
    public void reset(double outputPercent, double setpointPercent, double pvPercent) {
        if (!Double.isFinite(outputPercent) || !Double.isFinite(setpointPercent) || !Double.isFinite(pvPercent)) {
            throw new IllegalArgumentException("reset needs finite values (got output " + outputPercent
                    + " %, setpoint " + setpointPercent + " %, pv " + pvPercent + " %)");
        }
        if (limited && (outputPercent < lowPercent || outputPercent > highPercent)) {
            throw new IllegalArgumentException("reset output must lie within the output limits " + lowPercent + ".."
                    + highPercent + " % (got " + outputPercent + " %)");
        }
        previousSetpoint = setpointPercent;
        previousPv = pvPercent;
        setpointDerivative = 0.0;
        pvDerivative = 0.0;
        previousError = setpointPercent - pvPercent;
        previousProportional = kp * (b * setpointPercent - pvPercent);
        previousDerivativeTerm = 0.0;
        integral = outputPercent - previousProportional;
        this.outputPercent = outputPercent;
        this.unlimitedPercent = outputPercent;
        this.limitsActed = false;
    }

    /** One scan: reads setpoint and PV (%), returns the output (%) written this scan. */
    public double update(double setpointPercent, double pvPercent) {
        setpointDerivative = flushSubnormal(pole * setpointDerivative
                + differenceGain * (setpointPercent - previousSetpoint));
        pvDerivative = flushSubnormal(pole * pvDerivative + differenceGain * (pvPercent - previousPv));
        double setpointPath = setpointPercent + setpointLead * setpointDerivative;
        double pvPath = pvPercent + measurementLead * pvDerivative;
        double proportional = kp * (b * setpointPath - pvPath);
        double error = setpointPath - pvPath;
        double derivativeTerm = kd * (cd * setpointDerivative - pvDerivative);
        double integralIncrement = ki * scanSeconds * (currentWeight * error + previousWeight * previousError);

        double output = velocity ? velocityScan(proportional, integralIncrement, derivativeTerm)
                : positionalScan(proportional, integralIncrement, derivativeTerm);

        previousSetpoint = setpointPercent;
        previousPv = pvPercent;
        previousError = error;
        previousProportional = proportional;
        previousDerivativeTerm = derivativeTerm;
        outputPercent = output;
        return output;
    }

    /**
     * Tracking, for bumpless transfer: after {@link #update} has run this scan on the real setpoint
     * and PV, the output written is forced to {@code outputPercent} (within the limits when they are
     * on) and the state follows it: in positional form the integral becomes {@code u - P - D}, in
     * velocity form the accumulated output becomes {@code u}. Proportional and derivative states keep
     * running on the real signals, so when the controller is released the next scan continues from
     * the tracked output without a bump (Astrom and Hagglund, Advanced PID Control, ISA 2006, ch. 3,
     * bumpless transfer and tracking - section from memory).
     */
    public void track(double outputPercent) {
        if (!Double.isFinite(outputPercent)) {
            throw new IllegalArgumentException("track needs a finite output (got " + outputPercent + " %)");
        }
        double u = limited ? limit(outputPercent) : outputPercent;
        if (!velocity) {
            integral = u - previousProportional - previousDerivativeTerm;
        }
        this.outputPercent = u;
        this.unlimitedPercent = u;
        this.limitsActed = false;
    }

    // The two forms' output steps live in their own methods to keep update() small enough for
    // the JIT to inline it into a simulation loop.

    /** The velocity form's output this scan; sets {@link #unlimitedPercent}. */
    private double velocityScan(double proportional, double integralIncrement, double derivativeTerm) {
        double unlimited = outputPercent + (proportional - previousProportional) + integralIncrement
                + (derivativeTerm - previousDerivativeTerm);
        unlimitedPercent = unlimited;
        double output = limited ? limit(unlimited) : unlimited;
        limitsActed = output != unlimited;
        return output;
    }

    /** The positional form's output this scan, with anti-windup; sets the integral and {@link #unlimitedPercent}. */
    private double positionalScan(double proportional, double integralIncrement, double derivativeTerm) {
        double nextIntegral = integral + integralIncrement;
        double unlimited = proportional + nextIntegral + derivativeTerm;
        boolean held = false;
        if (limited && antiWindup == AntiWindup.CLAMPING
                && ((unlimited > highPercent && integralIncrement > 0)
                || (unlimited < lowPercent && integralIncrement < 0))) {
            // conditional integration: keep the integral where it was while it would push further into the limit
            nextIntegral = integral;
            unlimited = proportional + nextIntegral + derivativeTerm;
            held = true;
        }
        double output = limited ? limit(unlimited) : unlimited;
        limitsActed = held || output != unlimited;
        if (limited && antiWindup == AntiWindup.BACK_CALCULATION) {
            nextIntegral += trackingGain * (output - unlimited);
        }
        integral = nextIntegral;
        unlimitedPercent = unlimited;
        return output;
    }

    /**
     * A filter state that has decayed below the smallest normal double becomes 0. It moves no
     * output any more (it is some 300 decades below a percent), but with a pole above 1/2 it would
     * otherwise stay on the smallest subnormal for good, and subnormal arithmetic costs the
     * processor tens of times more than normal arithmetic in every later scan.
     */
    private static double flushSubnormal(double state) {
        return Math.abs(state) < Double.MIN_NORMAL ? 0.0 : state;
    }

    private double limit(double v) {
        // Math.max(low, Math.min(high, v)) by comparisons (Math.min and max are calls, not single
        // instructions, under the client compiler the launcher runs); NaN passes through as before
        double below = highPercent <= v ? highPercent : v;
        return lowPercent >= below ? lowPercent : below;
    }

    /** The output written by the last scan (or set by {@link #reset}), %. */
    public double outputPercent() {
        return outputPercent;
    }

    /**
     * Whether the output limits acted in the last scan: the output was clipped, or clamping held the
     * integral (the output can then stay just inside a limit while the loop is no longer linear).
     */
    public boolean limitsActedLastScan() {
        return limitsActed;
    }

    /** The last scan's output before limiting (v), %. */
    public double unlimitedOutputPercent() {
        return unlimitedPercent;
    }

    /**
     * The integral state of the positional form after the last scan, % (it carries the output
     * bias, so a controller without integral action holds its reset output here); NaN in velocity form.
     */
    public double integralPercent() {
        return velocity ? Double.NaN : integral;
    }

    public double scanSeconds() {
        return scanSeconds;
    }

    public boolean isLimited() {
        return limited;
    }

    /** The back-calculation tracking time Tt in use, s (infinite without integral action). */
    public double trackingTimeSeconds() {
        return trackingTimeSeconds;
    }

    /** The controller's pulse transfer functions, valid without limits. */
    public PulseLaw pulseLaw() {
        return pulseLaw;
    }

    /** C_y(e^(i omega h)) into {@code out} as {re, im}, without allocating; see {@link PulseLaw}. */
    public void feedbackAt(double omegaRadPerSecond, double[] out) {
        pulseLaw.feedbackAt(omegaRadPerSecond, out);
    }

    /** C_r(e^(i omega h)) into {@code out} as {re, im}, without allocating; see {@link PulseLaw}. */
    public void setpointAt(double omegaRadPerSecond, double[] out) {
        pulseLaw.setpointAt(omegaRadPerSecond, out);
    }
}

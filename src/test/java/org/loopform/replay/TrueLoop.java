package org.loopform.replay;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;

/**
 * Writes a record the way a plant's historian would, by simulating a known controller on a known
 * process, independently of loopform's own controller code: a first-order-plus-dead-time process
 * sampled exactly at the logging interval, {@code y(k+1) = a y(k) + (1 - a) Kp u(k - d) + load},
 * {@code a = exp(-hl/T)} (zero-order hold, Astrom and Wittenmark, Computer-Controlled Systems, 1997,
 * ch. 2 - from memory), with measurement noise on the PV the controller reads; a positional PID
 * with backward differences, run at its own scan (Wittenmark, Astrom and Arzen, Computer Control:
 * An Overview, IFAC 2002, Table 3: {@code I(k) = I(k-1) + K h/Ti e(k)},
 * {@code D(k) = Tf/(Tf+h) D(k-1) + K Td/(Tf+h) (e(k) - e(k-1))}); in manual the operator sets the
 * output and the integral tracks it, {@code I = u - P - D} (Astrom and Hagglund, Advanced PID
 * Control, 2006, ch. 3, bumpless transfer - from memory). The series form runs the PI part on the
 * error through the lead-lag {@code (1 + Td s)/(1 + Tf s)}, discretized the same way.
 * Values are logged rounded to 4 decimals, PV in 0..150 units, output in % (0..100).
 */
final class TrueLoop {

    enum Structure { IDEAL, SERIES }

    static final double PV_SPAN = 150.0;

    Structure structure = Structure.IDEAL;
    double gain = 2.0;
    double tiSeconds = 60.0;
    double tdSeconds = 6.0;
    /** Derivative filter N; 0 for none. */
    double n = 10.0;
    double scanSeconds = 1.0;
    double logSeconds = 1.0;
    double lengthSeconds = 1500.0;
    double processGain = 1.5;
    double timeConstantSeconds = 40.0;
    double deadTimeSeconds = 5.0;
    double noisePercent = 0.15;
    /** Manual from .. to, seconds (none when from >= to). */
    double manualFrom = 0;
    double manualTo = 0;
    long seed = 7;
    /** The resolution the output is logged at, % (a historian's or an analog input's quantisation). */
    double outputResolutionPercent = 1e-4;

    double[] times;
    double[] setpoint;
    double[] pv;
    double[] output;
    List<Mode> modes;

    TrueLoop run() {
        int steps = (int) Math.round(lengthSeconds / logSeconds) + 1;
        int perScan = (int) Math.round(scanSeconds / logSeconds);
        int delay = (int) Math.round(deadTimeSeconds / logSeconds);
        double a = Math.exp(-logSeconds / timeConstantSeconds);
        Random random = new Random(seed);
        times = new double[steps];
        setpoint = new double[steps];
        pv = new double[steps];
        output = new double[steps];
        modes = new ArrayList<>();
        double[] uHistory = new double[steps + delay + 1];
        double y = 40.0;
        double u = 40.0 / processGain;
        java.util.Arrays.fill(uHistory, u);
        double h = scanSeconds;
        double tf = n > 0 ? tdSeconds / n : 0.0;
        double integral = u - gain * (40.0 - 40.0);
        double derivative = 0;
        double previousError = 0;
        double leadDerivative = 0;
        for (int k = 0; k < steps; k++) {
            double t = k * logSeconds;
            double r = t < 100 ? 40 : t < 700 ? 44 : 46;
            double load = t < 350 ? 0 : t < 1000 ? -4 : 3;
            double measured = y + noisePercent * random.nextGaussian();
            boolean manual = t >= manualFrom && t < manualTo;
            if (k % perScan == 0) {
                double e = r - measured;
                double ePrime = e;
                if (structure == Structure.SERIES) {
                    // lead-lag (1 + Td s)/(1 + Tf s) on e: e' = e + (Td - Tf) D[e], D[e] = s/(1 + Tf s) e backward
                    leadDerivative = k == 0 ? 0 : tf / (tf + h) * leadDerivative + (e - previousError) / (tf + h);
                    ePrime = e + (tdSeconds - tf) * leadDerivative;
                    if (k == 0) {
                        integral = u - gain * ePrime;
                    }
                    double proportional = gain * ePrime;
                    integral += gain * h / tiSeconds * ePrime;
                    u = manual ? operatorOutput(t) : proportional + integral;
                    if (manual) {
                        integral = u - proportional;
                    }
                } else {
                    double proportional = gain * e;
                    derivative = k == 0 ? 0 : tf / (tf + h) * derivative + gain * tdSeconds / (tf + h)
                            * (e - previousError);
                    if (k == 0) {
                        integral = u - proportional;
                    }
                    integral += gain * h / tiSeconds * e;
                    u = manual ? operatorOutput(t) : proportional + integral + derivative;
                    if (manual) {
                        integral = u - proportional - derivative;
                    }
                }
                previousError = e;
            }
            times[k] = t;
            setpoint[k] = round(r * PV_SPAN / 100);
            pv[k] = round(measured * PV_SPAN / 100);
            output[k] = outputResolutionPercent == 1e-4 ? round(u)
                    : Math.round(u / outputResolutionPercent) * outputResolutionPercent;
            modes.add(manual ? Mode.MANUAL : Mode.AUTOMATIC);
            uHistory[k + delay] = u;
            y = a * y + (1 - a) * (processGain * uHistory[k] + load);
        }
        return this;
    }

    /** The operator's output in manual: 10 % above the level before, held. */
    private double operatorOutput(double t) {
        return 45.0;
    }

    private static double round(double v) {
        return Math.round(v * 1e4) / 1e4;
    }

    Trend trend() {
        return new Trend(new Signal("setpoint", times, setpoint), new Signal("pv", times, pv),
                new Signal("output", times, output), new ModeTrack(times, modes), null);
    }

    /** The record with every signal compressed: a point is kept when it moves more than {@code band} from the last kept. */
    Trend compressed(double bandPvUnits, double bandOutputPercent) {
        return new Trend(compress("setpoint", setpoint, 1e-9), compress("pv", pv, bandPvUnits),
                compress("output", output, bandOutputPercent), new ModeTrack(times, modes), null);
    }

    private Signal compress(String name, double[] v, double band) {
        List<Integer> kept = new ArrayList<>();
        kept.add(0);
        for (int k = 1; k < v.length - 1; k++) {
            if (Math.abs(v[k] - v[kept.get(kept.size() - 1)]) > band) {
                if (kept.get(kept.size() - 1) != k - 1) {
                    kept.add(k - 1); // the last point before the move, so a step stays a step
                }
                kept.add(k);
            }
        }
        kept.add(v.length - 1);
        double[] t = new double[kept.size()];
        double[] x = new double[kept.size()];
        for (int j = 0; j < t.length; j++) {
            t[j] = times[kept.get(j)];
            x[j] = v[kept.get(j)];
        }
        return new Signal(name, t, x);
    }
}

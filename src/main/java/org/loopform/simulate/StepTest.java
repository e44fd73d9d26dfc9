package org.loopform.simulate;

/**
 * The two closed-loop tests a check runs, in percent of span around an operating point: a
 * setpoint step, and a load step added at the process input (an output-side disturbance the
 * controller must reject). The loop starts at rest at the operating point.
 */
public record StepTest(double operatingPvPercent, double operatingOutputPercent, double setpointStepPercent,
                       double loadStepPercent, double horizonSeconds) {

    public StepTest {
        if (!(horizonSeconds > 0) || !Double.isFinite(horizonSeconds)) {
            throw new IllegalArgumentException("simulation horizon must be > 0 s (got " + horizonSeconds + " s)");
        }
        if (setpointStepPercent == 0 || loadStepPercent == 0) {
            throw new IllegalArgumentException("step sizes must not be 0 %");
        }
    }

    /** 10 % steps about 50 % PV and 50 % output (common practice for a small-signal bump test). */
    public static StepTest standard(double horizonSeconds) {
        return new StepTest(50.0, 50.0, 10.0, 10.0, horizonSeconds);
    }
}

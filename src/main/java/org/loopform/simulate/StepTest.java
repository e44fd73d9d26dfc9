package org.loopform.simulate;


/**
 * The two closed-loop tests a check runs, in percent of span around an operating point: a
 * setpoint step, and a load step added at the process input (an output-side disturbance the
 * controller must reject). The loop starts at rest at the operating point.
 *
 * <p>The standard steps are {@value #STANDARD_STEP_PERCENT} %. Where they would drive the
 * controller output to a limit, {@link #scaledToStayWithin} makes them smaller so that the
 * linear loop's output uses at most {@value #LIMIT_ROOM_SHARE} of the room between the operating
 * output and each limit, never below {@value #SMALLEST_STEP_PERCENT} %: the loop is linear only
 * while its output is off the limits, and the design and target loops are compared as linear
 * loops (loopform policy, common practice for a small-signal bump test).
 */
public record StepTest(double operatingPvPercent, double operatingOutputPercent, double setpointStepPercent,
                       double loadStepPercent, double horizonSeconds) {

    /** The standard setpoint and load steps, % of span (common practice for a small-signal bump test). */
    public static final double STANDARD_STEP_PERCENT = 10.0;
    /** Steps are never made smaller than this, % of span: smaller ones drown in a real plant's noise (common practice). */
    public static final double SMALLEST_STEP_PERCENT = 1.0;
    /** The share of the room between operating output and limit a scaled step may use (a margin, loopform policy). */
    public static final double LIMIT_ROOM_SHARE = 0.8;
    /** Scaled steps are rounded down to 1/this % of span (0.1 %), so that the text shows round figures. */
    static final double STEPS_PER_PERCENT = 10;

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
        return new StepTest(50.0, 50.0, STANDARD_STEP_PERCENT, STANDARD_STEP_PERCENT, horizonSeconds);
    }

    /**
     * The standard steps for a controller whose output is limited to {@code lowPercent..highPercent}:
     * about 50 % output when that lies inside the limits with room for a step either way, otherwise
     * about the middle of the limits (a loop cannot rest at an output it cannot reach).
     */
    public static StepTest standard(double horizonSeconds, double lowPercent, double highPercent) {
        if (!(highPercent > lowPercent)) {
            throw new IllegalArgumentException("output limits need low < high (got " + lowPercent + " %, "
                    + highPercent + " %)");
        }
        double room = STANDARD_STEP_PERCENT;
        double u0 = lowPercent + room <= 50.0 && 50.0 <= highPercent - room ? 50.0 : (lowPercent + highPercent) / 2;
        return new StepTest(50.0, u0, STANDARD_STEP_PERCENT, STANDARD_STEP_PERCENT, horizonSeconds);
    }

    /** The lowest and highest controller output of one run, %. */
    public record OutputExtremes(double lowestPercent, double highestPercent) {

        public OutputExtremes {
            if (!(highestPercent >= lowestPercent)) {
                throw new IllegalArgumentException("output extremes need lowest <= highest (got " + lowestPercent
                        + " %, " + highestPercent + " %)");
            }
        }

        public static OutputExtremes of(SampledResponse run) {
            double low = Double.POSITIVE_INFINITY;
            double high = Double.NEGATIVE_INFINITY;
            // a held tail repeats the last stored sample
            for (int k = 0; k < run.heldFrom(); k++) {
                double u = run.controllerOutputPercent(k);
                // comparisons, not Math.min/max calls: a response's samples are finite
                low = u < low ? u : low;
                high = u > high ? u : high;
            }
            return new OutputExtremes(low, high);
        }

        /** True when the output got to (or past) either limit. */
        public boolean reaches(double lowLimitPercent, double highLimitPercent) {
            return lowestPercent <= lowLimitPercent || highestPercent >= highLimitPercent;
        }
    }

    /**
     * This test with each step scaled down so that the output of the linear loop, which reached
     * {@code setpointRun} and {@code loadRun} under this test's steps, stays within
     * {@link #LIMIT_ROOM_SHARE} of the room to the limits {@code lowPercent..highPercent}; a
     * step whose run stays within that already is kept. The loop is linear about the operating
     * point, so its output's excursions scale with the step. Scaled steps are rounded down to
     * 0.1 % and are at least {@link #SMALLEST_STEP_PERCENT}.
     */
    public StepTest scaledToStayWithin(OutputExtremes setpointRun, OutputExtremes loadRun, double lowPercent,
                                       double highPercent) {
        return new StepTest(operatingPvPercent, operatingOutputPercent,
                scaled(setpointStepPercent, setpointRun, lowPercent, highPercent),
                scaled(loadStepPercent, loadRun, lowPercent, highPercent), horizonSeconds);
    }

    private double scaled(double step, OutputExtremes run, double lowPercent, double highPercent) {
        double rise = run.highestPercent() - operatingOutputPercent;
        double fall = operatingOutputPercent - run.lowestPercent();
        double factor = 1;
        if (rise > 0) {
            factor = Math.min(factor, LIMIT_ROOM_SHARE * (highPercent - operatingOutputPercent) / rise);
        }
        if (fall > 0) {
            factor = Math.min(factor, LIMIT_ROOM_SHARE * (operatingOutputPercent - lowPercent) / fall);
        }
        if (factor >= 1) {
            return step;
        }
        double size = Math.floor(Math.abs(step) * factor * STEPS_PER_PERCENT) / STEPS_PER_PERCENT;
        // the floor keeps the test meaningful; a loop that saturates even then is reported so
        return Math.copySign(Math.max(SMALLEST_STEP_PERCENT, Math.min(Math.abs(step), size)), step);
    }
}

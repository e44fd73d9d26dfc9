package org.loopform.findings;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Optional;
import org.loopform.simulate.SampledResponse;
import org.loopform.analysis.StepMetrics;
import org.loopform.simulate.StepTest;
import org.loopform.simulate.StepTest.OutputExtremes;
import org.loopform.units.Numbers;

/**
 * What the output limits do to the test steps, topic {@link Topic#LIMITS}: a warning when a step
 * the target loop was tested with drives its controller output to a limit (the loop is then not
 * the linear loop its margins describe; the text says what the PV reached), and a note when a
 * standard step was made smaller so that the output stays off the limits (see {@link StepTest}).
 */
public final class SaturationRules {

    private SaturationRules() {
    }

    /**
     * {@code standard}: the steps a check starts from; {@code used}: the steps the target loop ran
     * ({@code targetRun}); {@code linear}: the unlimited loop's output under the standard steps,
     * absent when it was not needed (the standard steps stayed off the limits);
     * {@code lowPercent..highPercent}: the target's output limits.
     */
    public record Inputs(StepTest standard, StepTest used, SampledResponse targetSetpoint, SampledResponse targetLoad,
                         Optional<LinearOutput> linear, double lowPercent, double highPercent) {

        public Inputs {
            Objects.requireNonNull(linear, "linear (Optional.empty() when the standard steps stayed off the limits)");
        }

        /**
         * Inputs from plain figures: {@code linearSetpoint} and {@code linearLoad} both given, or
         * both null when the unlimited loop was not run.
         */
        public Inputs(StepTest standard, StepTest used, SampledResponse targetSetpoint, SampledResponse targetLoad,
                      OutputExtremes linearSetpoint, OutputExtremes linearLoad, double lowPercent,
                      double highPercent) {
            this(standard, used, targetSetpoint, targetLoad, LinearOutput.ofNullable(linearSetpoint, linearLoad),
                    lowPercent, highPercent);
        }
    }

    /** The unlimited loop's output extremes under the standard setpoint and load steps. */
    public record LinearOutput(OutputExtremes setpoint, OutputExtremes load) {

        public LinearOutput {
            Objects.requireNonNull(setpoint, "setpoint");
            Objects.requireNonNull(load, "load");
        }

        /** Both runs' extremes, or empty when neither was run; one without the other is a bug of the caller. */
        static Optional<LinearOutput> ofNullable(OutputExtremes setpoint, OutputExtremes load) {
            if ((setpoint == null) != (load == null)) {
                throw new IllegalArgumentException("the unlimited loop's setpoint and load extremes come together"
                        + " (got " + setpoint + " and " + load + ")");
            }
            return setpoint == null ? Optional.empty() : Optional.of(new LinearOutput(setpoint, load));
        }
    }

    public static List<Finding> evaluate(Inputs in) {
        List<Finding> out = new ArrayList<>();
        step(in, true, out);
        step(in, false, out);
        return out;
    }

    private static void step(Inputs in, boolean setpoint, List<Finding> out) {
        SampledResponse run = setpoint ? in.targetSetpoint() : in.targetLoad();
        double used = setpoint ? in.used().setpointStepPercent() : in.used().loadStepPercent();
        double standard = setpoint ? in.standard().setpointStepPercent() : in.standard().loadStepPercent();
        String name = setpoint ? "setpoint" : "load";
        OutputExtremes reached = OutputExtremes.of(run);
        String range = Numbers.plain(in.lowPercent()) + ".." + Numbers.plain(in.highPercent()) + " %";
        if (reached.reaches(in.lowPercent(), in.highPercent())) {
            double limit = reached.highestPercent() >= in.highPercent() ? in.highPercent() : in.lowPercent();
            boolean smallest = Math.abs(used) < Math.abs(standard)
                    && Math.abs(used) <= StepTest.SMALLEST_STEP_PERCENT;
            out.add(new Finding(Topic.LIMITS, Severity.WARN, limit, null, "%", CheckRules.COMMON, "The "
                    + Numbers.significant(Math.abs(used), 3) + " % " + name + " step saturates the controller output"
                    + " at " + Numbers.plain(limit) + " % (the new controller's output range is " + range + "): "
                    + (setpoint ? setpointOutcome(in, run) : loadOutcome(in, run))
                    + (smallest ? " The step is already the smallest loopform tries ("
                    + Numbers.plain(StepTest.SMALLEST_STEP_PERCENT) + " %)." : "")
                    + " The loop's figures describe it off the limits only; check the output range and the"
                    + " operating point before trusting its response to larger upsets."));
        } else if (Math.abs(used) < Math.abs(standard)) {
            Optional<OutputExtremes> unlimited = in.linear().map(x -> setpoint ? x.setpoint() : x.load());
            String needed = "";
            if (unlimited.isPresent()) {
                OutputExtremes linear = unlimited.get();
                double u0 = in.standard().operatingOutputPercent();
                boolean up = linear.highestPercent() - u0 >= u0 - linear.lowestPercent();
                needed = " (without limits the output would reach " + Numbers.significant(up
                        ? linear.highestPercent() : linear.lowestPercent(), 3) + " %)";
            }
            out.add(new Finding(Topic.LIMITS, Severity.INFO, Math.abs(used), Math.abs(standard), "%",
                    "loopform policy: steps keep the output within " + Numbers.plain(100 * StepTest.LIMIT_ROOM_SHARE)
                            + " % of its room to each limit", "A " + Numbers.plain(Math.abs(standard)) + " % " + name
                    + " step would drive the controller output beyond its range of " + range + needed
                    + ", so the check uses a " + Numbers.plain(Math.abs(used)) + " % " + name + " step, which keeps"
                    + " the loop off its limits and linear."));
        }
    }

    /** "the PV reached 52.5 %, 25 % of the way to its 60 % setpoint, by the end of the 900 s run." */
    private static String setpointOutcome(Inputs in, SampledResponse run) {
        double pv0 = in.used().operatingPvPercent();
        double sp = pv0 + in.used().setpointStepPercent();
        double last = run.processValuePercent(run.size() - 1);
        double share = 100 * (last - pv0) / (sp - pv0);
        double end = run.timeSeconds(run.size() - 1);
        if (Math.abs(100 - share) <= StepMetrics.SETTLING_BAND_PERCENT_OF_STEP) {
            return "the PV still reached its " + Numbers.significant(sp, 4) + " % setpoint within the "
                    + Numbers.significant(end, 4) + " s run, more slowly than a linear loop would.";
        }
        return "the PV reached " + Numbers.significant(last, 4) + " %, " + Numbers.significant(share, 3)
                + " % of the way to its " + Numbers.significant(sp, 4) + " % setpoint, by the end of the "
                + Numbers.significant(end, 4) + " s run.";
    }

    /** "the PV ended 4.7 % of span from its setpoint ..." */
    private static String loadOutcome(Inputs in, SampledResponse run) {
        double pv0 = in.used().operatingPvPercent();
        double offset = Math.abs(run.processValuePercent(run.size() - 1) - pv0);
        double end = run.timeSeconds(run.size() - 1);
        double band = StepMetrics.SETTLING_BAND_PERCENT_OF_STEP / 100 * Math.abs(in.used().loadStepPercent());
        if (offset <= band) {
            return "the PV still returned to its setpoint within the " + Numbers.significant(end, 4) + " s run.";
        }
        return "the controller cannot take up the whole load, and the PV ended " + Numbers.significant(offset, 3)
                + " % of span off its setpoint after the " + Numbers.significant(end, 4) + " s run.";
    }
}

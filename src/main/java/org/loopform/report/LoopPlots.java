package org.loopform.report;

import java.util.ArrayList;
import java.util.List;
import org.loopform.analysis.ControllerMismatch;
import org.loopform.analysis.SampledResponse;
import org.loopform.audit.CheckResult;

/** The pictures of a checked loop: setpoint and load responses, design against target, and the controller mismatch. */
public final class LoopPlots {
    static final String DESIGN = "#1f5fa8";
    static final String TARGET = "#c0392b";

    private LoopPlots() {
    }

    /** The panels for {@code r}: responses (with a process model) and the mismatch over frequency. */
    public static List<String> panels(CheckResult r) {
        return panels(r, SvgPlot.Size.STANDARD);
    }

    /** The panels for {@code r} drawn at {@code size}. */
    public static List<String> panels(CheckResult r, SvgPlot.Size size) {
        List<String> panels = new ArrayList<>();
        if (r.hasProcess()) {
            panels.add(response("Setpoint step: PV", r.designRun().setpoint(), r.targetRun().setpoint(), false, size));
            panels.add(response("Load step at the process input: PV", r.designRun().load(), r.targetRun().load(),
                    false, size));
            panels.add(response("Load step: controller output", r.designRun().load(), r.targetRun().load(), true, size));
        }
        ControllerMismatch.Curve c = r.mismatchCurve();
        panels.add(SvgPlot.panel("Controller as run vs design law: gain ratio", "frequency, rad/s", "gain ratio, dB",
                List.of(new SvgPlot.Series("feedback path", c.omegas(), c.feedbackGainDb(), TARGET, false),
                        new SvgPlot.Series("setpoint path", c.omegas(), c.setpointGainDb(), DESIGN, true)), true, size));
        panels.add(SvgPlot.panel("Controller as run vs design law: phase difference", "frequency, rad/s",
                "phase difference, deg",
                List.of(new SvgPlot.Series("feedback path", c.omegas(), c.feedbackPhaseDeg(), TARGET, false),
                        new SvgPlot.Series("setpoint path", c.omegas(), c.setpointPhaseDeg(), DESIGN, true)), true, size));
        return panels;
    }

    private static String response(String title, SampledResponse design, SampledResponse target, boolean output,
                                   SvgPlot.Size size) {
        return SvgPlot.panel(title, "time, s", output ? "output, %" : "PV, %", List.of(
                new SvgPlot.Series("design", design.timesSeconds(),
                        output ? design.controllerOutputsPercent() : design.processValuesPercent(), DESIGN, true),
                new SvgPlot.Series("target", target.timesSeconds(),
                        output ? target.controllerOutputsPercent() : target.processValuesPercent(), TARGET, false)),
                false, size);
    }

    public static String svg(CheckResult r) {
        return SvgPlot.stack(panels(r));
    }
}

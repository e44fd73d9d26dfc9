package org.loopform.report;

import java.util.ArrayList;
import java.util.List;
import org.loopform.analysis.ControllerMismatch;
import org.loopform.simulate.SampledResponse;
import org.loopform.check.CheckResult;

/**
 * The pictures of a checked loop: setpoint and load responses, design against target, and the
 * controller mismatch. The PV is drawn as the process gives it, between the scans as well as at
 * them; a sampled controller's output is drawn as the steps it holds from scan to scan.
 */
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
            boolean designSampled = r.loop().sourceScanSeconds() != null;
            panels.add(response("Setpoint step: PV", r.designRun().setpoint(), r.targetRun().setpoint(), false,
                    designSampled, size));
            panels.add(response("Load step at the process input: PV", r.designRun().load(), r.targetRun().load(),
                    false, designSampled, size));
            panels.add(response("Load step: controller output", r.designRun().load(), r.targetRun().load(), true,
                    designSampled, size));
        }
        ControllerMismatch.Curve c = r.mismatchCurve();
        panels.add(SvgPlot.panel("New controller as run vs old law: gain ratio", "frequency, rad/s", "gain ratio, dB",
                List.of(new SvgPlot.Series("feedback path", c.omegas(), c.feedbackGainDb(), TARGET, false),
                        new SvgPlot.Series("setpoint path", c.omegas(), c.setpointGainDb(), DESIGN, true)), true, size));
        panels.add(SvgPlot.panel("New controller as run vs old law: phase difference", "frequency, rad/s",
                "phase difference, deg",
                List.of(new SvgPlot.Series("feedback path", c.omegas(), c.feedbackPhaseDeg(), TARGET, false),
                        new SvgPlot.Series("setpoint path", c.omegas(), c.setpointPhaseDeg(), DESIGN, true)), true, size));
        return panels;
    }

    private static String response(String title, SampledResponse design, SampledResponse target, boolean output,
                                   boolean designSampled, SvgPlot.Size size) {
        SvgPlot.Series d = output
                ? (designSampled ? held("as-found", design, DESIGN, true)
                        : new SvgPlot.Series("as-found", design.timesSeconds(), design.controllerOutputsPercent(), DESIGN,
                                true))
                : new SvgPlot.Series("as-found", design.timesSeconds(), design.processValuesPercent(), DESIGN, true);
        SvgPlot.Series t = output ? held("as-left", target, TARGET, false)
                : new SvgPlot.Series("as-left", target.timesSeconds(), target.processValuesPercent(), TARGET, false);
        return SvgPlot.panel(title, "time, s", output ? "output, %" : "PV, %", List.of(d, t), false, size);
    }

    /**
     * A held controller output as a staircase: each value runs flat until the next change, which
     * is drawn as a vertical step at its instant; samples that repeat the held value are dropped.
     */
    static SvgPlot.Series held(String label, SampledResponse r, String colour, boolean dashed) {
        int n = r.size();
        double[] x = new double[2 * n];
        double[] y = new double[2 * n];
        int m = 0;
        for (int k = 0; k < n; k++) {
            double u = r.controllerOutputPercent(k);
            boolean last = k == n - 1;
            if (k > 0 && u == r.controllerOutputPercent(k - 1) && !last) {
                continue;
            }
            if (k > 0) {
                // the previous value held up to this instant
                x[m] = r.timeSeconds(k);
                y[m++] = r.controllerOutputPercent(k - 1);
            }
            if (k == 0 || u != r.controllerOutputPercent(k - 1)) {
                x[m] = r.timeSeconds(k);
                y[m++] = u;
            }
        }
        return new SvgPlot.Series(label, java.util.Arrays.copyOf(x, m), java.util.Arrays.copyOf(y, m), colour, dashed);
    }

    public static String svg(CheckResult r) {
        return SvgPlot.stack(panels(r));
    }
}

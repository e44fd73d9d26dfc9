package org.loopform.report;

import java.util.ArrayList;
import java.util.List;
import org.loopform.identify.FittedResponse;
import org.loopform.identify.ModelFit;
import org.loopform.identify.PlantRecord;
import org.loopform.identify.StepTestResult;

/**
 * {@code fit --plot}: the recorded PV with each fitted model's response to the recorded output, the
 * output itself, and the recommended model's residuals (PV minus its response), all in % of span over time.
 */
public final class FitPlot {

    private static final String[] MODEL_COLOURS = {"#1f5fa8", "#c0392b", "#2e8b57"};

    private FitPlot() {
    }

    public static String svg(PlantRecord record, StepTestResult result) {
        int n = record.size();
        double[] t = new double[n];
        double[] pv = new double[n];
        double[] out = new double[n];
        for (int k = 0; k < n; k++) {
            t[k] = record.time(k);
            pv[k] = record.pv(k);
            out[k] = record.output(k);
        }
        List<SvgPlot.Series> fits = new ArrayList<>();
        fits.add(new SvgPlot.Series("recorded PV", t, pv, "#888888", false));
        double[] residual = null;
        String recommended = "no model recommended";
        for (int i = 0; i < result.fits().size(); i++) {
            ModelFit f = result.fits().get(i);
            double[] y = FittedResponse.of(record, f);
            boolean best = f.kind() == result.recommended();
            fits.add(new SvgPlot.Series(f.kind().id() + (best ? " (recommended)" : ""), t, y,
                    MODEL_COLOURS[i % MODEL_COLOURS.length], !best));
            if (best) {
                residual = new double[n];
                for (int k = 0; k < n; k++) {
                    residual[k] = pv[k] - y[k];
                }
                recommended = f.kind().id();
            }
        }
        List<String> panels = new ArrayList<>();
        panels.add(SvgPlot.panel("Recorded PV and the fitted models' responses to the recorded output",
                "time from record start (s)", "PV (% of span)", fits, false));
        panels.add(SvgPlot.panel("Recorded controller output", "time from record start (s)", "output (% of span)",
                List.of(new SvgPlot.Series("output", t, out, "#555555", false)), false));
        if (residual != null) {
            panels.add(SvgPlot.panel("Residuals of the " + recommended + " fit (recorded PV minus model)",
                    "time from record start (s)", "residual (% of span)",
                    List.of(new SvgPlot.Series("residual", t, residual, MODEL_COLOURS[0], false)), false));
        }
        return SvgPlot.stack(panels);
    }
}

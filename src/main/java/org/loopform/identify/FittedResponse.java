package org.loopform.identify;

/**
 * The PV a fitted model predicts at each sample of the record it was fitted to, for plots and residuals:
 * the model's response to the recorded output (as fitted, {@link ResponseSimulator}) plus the baseline.
 * The baseline enters the model linearly, so its least-squares value for the fitted gain, lags and dead
 * time is the mean of the record's PV minus the response; the fit's own optimum satisfies the same
 * normal equation.
 */
public final class FittedResponse {

    private FittedResponse() {
    }

    /** The predicted PV, % of span, at each of {@code record}'s samples. */
    public static double[] of(PlantRecord record, ModelFit fit) {
        ResponseSimulator sim = new ResponseSimulator(record);
        double[] y = sim.simulate(fit.kind(), fit.gain(), fit.lagSeconds(), fit.secondLagSeconds(),
                fit.deadTimeSeconds(), 0);
        double baseline = 0;
        for (int k = 0; k < y.length; k++) {
            baseline += (record.pv(k) - y[k]) / y.length;
        }
        for (int k = 0; k < y.length; k++) {
            y[k] += baseline;
        }
        return y;
    }
}

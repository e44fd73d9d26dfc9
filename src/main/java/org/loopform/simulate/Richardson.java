package org.loopform.simulate;


/**
 * Richardson extrapolation of two closed-loop runs of the same continuous loop, one on step h and
 * one on step 2h: the hold between controller and process makes the sampled run's error grow in
 * proportion to h (it acts as a delay of h/2: Wittenmark, Astrom and Arzen, "Computer Control:
 * An Overview", IFAC Professional Brief, 2002), so {@code 2 y_h - y_2h} cancels that leading term
 * and leaves an error of order h^2 (Richardson's deferred approach to the limit; any numerical
 * analysis text, e.g. Dahlquist and Bjorck, Numerical Methods, 1974, sec. 7.2 - from memory).
 * The result is sampled on the coarse step.
 */
public final class Richardson {

    private Richardson() {
    }

    /** The extrapolated runs, and an estimate of the fine run's own error (largest PV change, % of span). */
    public record Result(ClosedLoopRun run, double fineErrorPercent) {
    }

    public static Result extrapolate(ClosedLoopRun fine, ClosedLoopRun coarse) {
        double[] error = new double[1];
        SampledResponse sp = extrapolate(fine.setpoint(), coarse.setpoint(), error);
        SampledResponse load = extrapolate(fine.load(), coarse.load(), error);
        return new Result(new ClosedLoopRun(sp, load, coarse.stepSeconds()), error[0]);
    }

    private static SampledResponse extrapolate(SampledResponse fine, SampledResponse coarse, double[] error) {
        int n = Math.min(coarse.size(), (fine.size() + 1) / 2);
        double step = coarse.size() > 1 ? coarse.timeSeconds(1) - coarse.timeSeconds(0) : 1.0;
        SampledResponse.Recorder r = SampledResponse.recorder(n, step);
        for (int k = 0; k < n; k++) {
            double yf = fine.processValuePercent(2 * k);
            double y = 2 * yf - coarse.processValuePercent(k);
            double u = 2 * fine.controllerOutputPercent(2 * k) - coarse.controllerOutputPercent(k);
            error[0] = Math.max(error[0], Math.abs(y - yf));
            r.add(y, u);
        }
        return r.toResponse();
    }
}

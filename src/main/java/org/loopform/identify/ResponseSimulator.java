package org.loopform.identify;

/**
 * The model's response to the recorded output, simulated on a uniform grid fine against the record
 * and read at the sample times. The output is held between samples and delayed by L; each lag
 * {@code T} is stepped exactly for an input held over a grid step ({@code x += (1 - e^(-dt/T))(u - x)});
 * the second lag of a chain takes its input as the mean of the first's at both ends of the step; an
 * integrator adds {@code Kv u dt}. Deviations are from the output's first value and the baseline PV.
 */
final class ResponseSimulator {

    /** Grid steps over the record: fine enough that the grid's error is far below any noise worth fitting. */
    static final int GRID_STEPS = 2000;

    private final PlantRecord record;
    private final double dt;
    private final double[] gridTime;
    private final double u0;

    ResponseSimulator(PlantRecord record) {
        this.record = record;
        this.dt = record.durationSeconds() / GRID_STEPS;
        this.gridTime = new double[GRID_STEPS + 1];
        for (int k = 0; k <= GRID_STEPS; k++) {
            gridTime[k] = record.time(0) + k * dt;
        }
        this.u0 = record.output(0);
    }

    double gridStepSeconds() {
        return dt;
    }

    /**
     * The PV the model predicts at each sample: {@code baseline + G(s) (u - u0)} with
     * {@code p = {gain, T1, T2}} (T1, T2 unused as the kind says).
     */
    double[] simulate(ModelKind kind, double gain, double t1, double t2, double deadTimeSeconds, double baseline) {
        return simulate(kind, gain, t1, t2, delayedInput(deadTimeSeconds), baseline);
    }

    /** The output's deviation from its first value over each grid step, delayed by {@code deadTimeSeconds}. */
    double[] delayedInput(double deadTimeSeconds) {
        double[] u = new double[GRID_STEPS + 1];
        for (int k = 0; k <= GRID_STEPS; k++) {
            u[k] = record.outputAt(gridTime[k] + dt / 2 - deadTimeSeconds) - u0;
        }
        return u;
    }

    /** As {@link #simulate(ModelKind, double, double, double, double, double)} on an input made by {@link #delayedInput}. */
    double[] simulate(ModelKind kind, double gain, double t1, double t2, double[] input, double baseline) {
        int n = record.size();
        double[] out = new double[n];
        double a1 = kind.lags() >= 1 ? Math.exp(-dt / t1) : 0;
        double a2 = kind.lags() >= 2 ? Math.exp(-dt / t2) : 0;
        double x1 = 0;
        double x2 = 0;
        int sample = 0;
        double prevY = 0;
        for (int k = 0; k <= GRID_STEPS && sample < n; k++) {
            double y = switch (kind) {
                case FOPDT, IPDT -> x1;
                case SOPDT -> x2;
            };
            // read the samples that fall between the previous grid point and this one, linearly
            while (sample < n && record.time(sample) <= gridTime[k] + 1e-12 * Math.abs(gridTime[k])) {
                double frac = k == 0 ? 1 : (record.time(sample) - gridTime[k - 1]) / dt;
                out[sample] = baseline + prevY + frac * (y - prevY);
                sample++;
            }
            prevY = y;
            // the input during (t, t + dt): held output at t + dt/2 - L
            double u = input[k];
            switch (kind) {
                case FOPDT -> x1 += (1 - a1) * (gain * u - x1);
                case SOPDT -> {
                    double x1Start = x1;
                    x1 += (1 - a1) * (gain * u - x1);
                    x2 += (1 - a2) * (0.5 * (x1Start + x1) - x2);
                }
                case IPDT -> x1 += gain * u * dt;
            }
        }
        while (sample < n) {
            out[sample++] = baseline + prevY;
        }
        return out;
    }
}

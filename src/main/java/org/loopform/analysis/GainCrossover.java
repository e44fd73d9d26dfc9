package org.loopform.analysis;

/**
 * One gain crossover: a frequency where {@code |L(i omega)| = 1}, its phase margin
 * {@code 180 + arg L} wrapped into (-180, 180] degrees, and its delay margin
 * {@code ((PM mod 360) in rad) / omega}, the extra dead time that turns this crossover onto -1.
 * After Astrom and Murray, Feedback Systems, 2008, sections 9.3 and 10.x (from memory for the
 * section numbers).
 */
public record GainCrossover(double radPerSecond, double phaseMarginDegrees, double delayMarginSeconds) {

    public GainCrossover {
        if (!(radPerSecond > 0) || Double.isInfinite(radPerSecond)) {
            throw new IllegalArgumentException(
                    "gain crossover must be finite and > 0 rad/s (got " + radPerSecond + " rad/s)");
        }
        if (!(phaseMarginDegrees > -180 && phaseMarginDegrees <= 180)) {
            throw new IllegalArgumentException(
                    "phase margin must lie in (-180, 180] deg (got " + phaseMarginDegrees + " deg)");
        }
        if (!(delayMarginSeconds >= 0) || Double.isInfinite(delayMarginSeconds)) {
            throw new IllegalArgumentException(
                    "delay margin must be finite and >= 0 s (got " + delayMarginSeconds + " s)");
        }
    }
}

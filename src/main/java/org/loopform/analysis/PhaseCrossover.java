package org.loopform.analysis;

/**
 * One phase crossover: a frequency where the phase of {@code L(i omega)} is -180 degrees
 * (modulo 360), and the factor {@code 1 / |L|} by which the loop gain must be multiplied to
 * put the plot on -1 there (above 1: the gain may grow by that factor; below 1: it may shrink).
 * After Astrom and Murray, Feedback Systems, 2008, section 9.3 (from memory for the section).
 */
public record PhaseCrossover(double radPerSecond, double gainFactor) {

    public PhaseCrossover {
        if (!(radPerSecond > 0) || Double.isInfinite(radPerSecond)) {
            throw new IllegalArgumentException(
                    "phase crossover must be finite and > 0 rad/s (got " + radPerSecond + " rad/s)");
        }
        if (!(gainFactor > 0) || Double.isInfinite(gainFactor)) {
            throw new IllegalArgumentException(
                    "gain factor at a phase crossover must be finite and > 0 (got " + gainFactor + ")");
        }
    }
}

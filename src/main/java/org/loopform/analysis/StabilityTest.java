package org.loopform.analysis;

/** How a loop's stability was decided; {@link #describe} is the sentence the reports print. */
public enum StabilityTest {
    /**
     * The sampled loop: its closed-loop poles counted outside circles {@code |z| = r} by the argument
     * principle, with the dead time's whole scans as poles at z = 0 and the open-loop poles outside
     * counted exactly.
     */
    SAMPLED_POLES("closed-loop poles of the sampled loop, counted outside |z| = r by the argument principle"),
    /** A continuous loop with dead time: the Nyquist criterion by the argument principle. */
    NYQUIST("Nyquist criterion (argument principle along the imaginary axis, open-loop right-half-plane"
            + " poles counted)"),
    /** A continuous loop without dead time: the roots of its characteristic polynomial. */
    POLYNOMIAL_ROOTS("roots of the closed-loop characteristic polynomial"),
    /**
     * A continuous loop with dead time whose loop gain does not fall off at high frequency: the
     * chain of roots of a neutral (or advanced) delay equation.
     */
    HIGH_FREQUENCY_GAIN("high-frequency loop gain behind a dead time (neutral delay equation)");

    private final String description;

    StabilityTest(String description) {
        this.description = description;
    }

    public String describe() {
        return description;
    }
}

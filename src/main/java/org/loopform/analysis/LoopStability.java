package org.loopform.analysis;

import java.util.Objects;
import java.util.OptionalDouble;

/**
 * The closed-loop stability of one loop and how it was decided.
 *
 * @param verdict stable, marginal or unstable
 * @param test how it was decided
 * @param unstablePoles closed-loop poles outside the stability region (right half plane, or outside the
 *     unit circle for a sampled loop); {@link Integer#MAX_VALUE} for the infinite chain of a neutral
 *     delay equation
 * @param largestPoleMagnitude for a sampled loop, the largest closed-loop pole magnitude |z| (below 1:
 *     stable); empty for a continuous loop
 * @param explanation one plain sentence on what was found
 */
public record LoopStability(Stability verdict, StabilityTest test, int unstablePoles,
                            OptionalDouble largestPoleMagnitude, String explanation) {

    public LoopStability {
        Objects.requireNonNull(verdict, "verdict");
        Objects.requireNonNull(test, "test");
        Objects.requireNonNull(largestPoleMagnitude, "largestPoleMagnitude");
        Objects.requireNonNull(explanation, "explanation");
        if (unstablePoles < 0) {
            throw new IllegalArgumentException("unstable pole count must be >= 0 (got " + unstablePoles + ")");
        }
        if (verdict == Stability.STABLE && unstablePoles != 0) {
            throw new IllegalArgumentException("a stable loop has no unstable poles (got " + unstablePoles + ")");
        }
        if (largestPoleMagnitude.isPresent() && !(largestPoleMagnitude.getAsDouble() >= 0)) {
            throw new IllegalArgumentException("largest pole magnitude must be >= 0 (got "
                    + largestPoleMagnitude.getAsDouble() + ")");
        }
    }

    public boolean isStable() {
        return verdict == Stability.STABLE;
    }
}

package org.loopform.tuning;

/**
 * A rule's own choices: SIMC's closed-loop time constant {@code tau_c}, the lambda (closed-loop
 * time constant) of the lambda and IMC rules, and a published variant where sources disagree
 * ({@code zn-step}: {@code paper} or {@code textbook}; {@code amigo}: {@code paper} or {@code limit}).
 * Null fields take the rule's default.
 *
 * @param tauCSeconds SIMC tau_c, seconds, >= 0, or null
 * @param lambdaSeconds lambda, seconds, > 0, or null
 * @param variant the variant's id, or null for the default
 */
public record RuleOptions(Double tauCSeconds, Double lambdaSeconds, String variant) {

    public static final RuleOptions DEFAULTS = new RuleOptions(null, null, null);

    public RuleOptions {
        if (tauCSeconds != null && !(tauCSeconds >= 0 && Double.isFinite(tauCSeconds))) {
            throw new org.loopform.units.BadInput("--tau-c: must be >= 0 s (got " + tauCSeconds + " s)");
        }
        if (lambdaSeconds != null && !(lambdaSeconds > 0 && Double.isFinite(lambdaSeconds))) {
            throw new org.loopform.units.BadInput("--lambda: must be > 0 s (got " + lambdaSeconds + " s)");
        }
    }
}

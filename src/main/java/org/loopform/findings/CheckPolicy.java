package org.loopform.findings;

import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.units.BadInput;

/**
 * The thresholds the deployment checker holds figures against, one value for each
 * {@link PolicyKey}; the keys, defaults, units and sources are listed there.
 *
 * <p>Defaults and their sources, in short: the scan rules {@code sampling_warn} 0.5 rad and
 * {@code sampling_fail} 1 rad of h wc and {@code derivative_nh_td_warn} 0.6 (common practice,
 * rules of thumb for sampled PID; Wittenmark, Astrom &amp; Arzen 2002, verified, for the hold's
 * h/2 delay); robustness: {@code ms_warn} 2 (Ms 1.3 to 2
 * is reasonable: Astrom &amp; Hagglund 1995 as cited by Octave's control package and Wikipedia's
 * "Sensitivity (control systems)" - verified), {@code ms_fail} 3, {@code phase_margin_fail_deg}
 * 20 and {@code gain_margin_fail} 1.5 (loopform policy: the margins Ms 3 guarantees,
 * GM &gt;= Ms/(Ms-1) = 1.5 and PM &gt;= 2 arcsin(1/(2 Ms)) = 19.2 deg, derived from
 * |1 + L| &gt;= 1/Ms at the crossovers; "we usually aim for a gain margin of
 * &gt; 1.5 and a phase margin above 30-45 deg", ControlSystems.jl documentation, analysis example -
 * verified), {@code phase_margin_warn_deg} 30 and {@code gain_margin_warn} 2 (common practice:
 * PM 30 to 60 deg, GM 2 to 5); the delay margin in target scans, fail below 1 and warn below 2
 * (loopform policy: one or two scans of added latency must not destabilize the loop); the
 * response rules (common practice) hold the target's responses to the design's.
 *
 * <p>Invariants: every value finite and &gt;= 0, and each fail threshold on the bad side of its
 * warning (or equal), so that a loop fails only where it would also warn. No policy may switch off
 * the edge of instability: {@code ms_fail} is at most 10, {@code gain_margin_fail} at least 1.1 and
 * {@code phase_margin_fail_deg} at least 5 (loopform policy, common practice: a Nyquist curve within
 * 1/10 of -1, a 10 % gain error or 5 deg of phase from instability is not a loop to deploy; Ms 10
 * alone guarantees only GM &gt;= 10/9 and PM &gt;= 2 arcsin(1/20) = 5.7 deg).
 */
public record CheckPolicy(Map<PolicyKey, Double> values) {

    /** A fail key, the warn key it must not be laxer than, and whether higher figures are worse. */
    private record Pair(PolicyKey fail, PolicyKey warn, boolean higherIsWorse) {
    }

    private static final List<Pair> PAIRS = List.of(
            new Pair(PolicyKey.SAMPLING_FAIL, PolicyKey.SAMPLING_WARN, true),
            new Pair(PolicyKey.MS_FAIL, PolicyKey.MS_WARN, true),
            new Pair(PolicyKey.PHASE_MARGIN_FAIL_DEG, PolicyKey.PHASE_MARGIN_WARN_DEG, false),
            new Pair(PolicyKey.GAIN_MARGIN_FAIL, PolicyKey.GAIN_MARGIN_WARN, false),
            new Pair(PolicyKey.DELAY_MARGIN_FAIL_SCANS, PolicyKey.DELAY_MARGIN_WARN_SCANS, false),
            new Pair(PolicyKey.REPLAY_RMS_FAIL_PCT, PolicyKey.REPLAY_RMS_WARN_PCT, true),
            new Pair(PolicyKey.REPLAY_CORRELATION_FAIL, PolicyKey.REPLAY_CORRELATION_WARN, false),
            new Pair(PolicyKey.REPLAY_AS_LEFT_RMS_FAIL_PCT, PolicyKey.REPLAY_AS_LEFT_RMS_WARN_PCT, true),
            new Pair(PolicyKey.FIT_FAIL_DB, PolicyKey.FIT_WARN_DB, true),
            new Pair(PolicyKey.FIT_FAIL_DEG, PolicyKey.FIT_WARN_DEG, true),
            new Pair(PolicyKey.ROUNDING_WARN_DB, PolicyKey.ROUNDING_INFO_DB, true),
            new Pair(PolicyKey.ROUNDING_WARN_DEG, PolicyKey.ROUNDING_INFO_DEG, true));

    /** A fail key, the laxest value any policy may give it, and whether higher figures are worse. */
    private record Floor(PolicyKey key, double laxest, boolean higherIsWorse) {
    }

    private static final List<Floor> EDGE_OF_INSTABILITY = List.of(
            new Floor(PolicyKey.MS_FAIL, 10, true),
            new Floor(PolicyKey.GAIN_MARGIN_FAIL, 1.1, false),
            new Floor(PolicyKey.PHASE_MARGIN_FAIL_DEG, 5, false));

    public CheckPolicy {
        EnumMap<PolicyKey, Double> copy = new EnumMap<>(PolicyKey.class);
        for (PolicyKey k : PolicyKey.values()) {
            Double v = values.get(k);
            if (v == null) {
                throw new PolicyException(k.id() + ": missing from the policy", k);
            }
            if (!(v >= 0) || !Double.isFinite(v)) {
                throw new PolicyException(k.id() + ": must be a finite number >= 0 (got " + v + ")", k);
            }
            copy.put(k, v);
        }
        for (Pair p : PAIRS) {
            double fail = copy.get(p.fail());
            double warn = copy.get(p.warn());
            if (p.higherIsWorse() ? fail < warn : fail > warn) {
                throw new PolicyException(p.fail().id() + ": must not be " + (p.higherIsWorse() ? "below "
                        : "above ") + p.warn().id() + " (got " + plain(fail) + " against " + plain(warn) + " "
                        + p.warn().unit() + "): a loop must fail only where it would also warn; "
                        + (p.higherIsWorse() ? "raise " : "lower ") + p.fail().id() + " or "
                        + (p.higherIsWorse() ? "lower " : "raise ") + p.warn().id() + ".", p.fail(), p.warn());
            }
        }
        for (Floor f : EDGE_OF_INSTABILITY) {
            double v = copy.get(f.key());
            if (f.higherIsWorse() ? v > f.laxest() : v < f.laxest()) {
                throw new PolicyException(f.key().id() + ": must not be " + (f.higherIsWorse() ? "above " : "below ")
                        + plain(f.laxest()) + " " + f.key().unit() + " (got " + plain(v) + "): a loop that close to"
                        + " instability fails whatever the policy (an Ms of 10, a gain margin of 1.1 or a phase margin"
                        + " of 5 deg is the edge of instability); give a value from " + plain(f.laxest())
                        + (f.higherIsWorse() ? " down." : " up."), f.key());
            }
        }
        values = java.util.Collections.unmodifiableMap(copy);
    }

    /** The defaults of {@link PolicyKey}. */
    public static final CheckPolicy DEFAULT = defaults();

    private static CheckPolicy defaults() {
        Map<PolicyKey, Double> m = new EnumMap<>(PolicyKey.class);
        for (PolicyKey k : PolicyKey.values()) {
            m.put(k, k.defaultValue());
        }
        return new CheckPolicy(m);
    }

    public double get(PolicyKey key) {
        return values.get(key);
    }

    /** The policy keys as a policy file writes them, with this policy's values, in catalogue order. */
    public Map<String, Double> asMap() {
        Map<String, Double> m = new LinkedHashMap<>();
        values.forEach((k, v) -> m.put(k.id(), v));
        return m;
    }

    /**
     * This policy with the keys of {@code overrides} (as a policy file writes them) replaced; an
     * unknown key is an error naming the known ones.
     */
    public CheckPolicy with(Map<String, Double> overrides) {
        Map<PolicyKey, Double> m = new EnumMap<>(values);
        for (var e : overrides.entrySet()) {
            PolicyKey k = PolicyKey.byId(e.getKey());
            if (k == null) {
                throw new BadInput(e.getKey() + ": unknown policy key; known keys are "
                        + String.join(", ", asMap().keySet()));
            }
            m.put(k, e.getValue());
        }
        return new CheckPolicy(m);
    }

    private static String plain(double v) {
        return org.loopform.units.Numbers.plain(v);
    }

    public double samplingWarn() {
        return get(PolicyKey.SAMPLING_WARN);
    }

    public double samplingFail() {
        return get(PolicyKey.SAMPLING_FAIL);
    }

    public double derivativeNhTdWarn() {
        return get(PolicyKey.DERIVATIVE_NH_TD_WARN);
    }

    public double derivativeLeadKeptWarn() {
        return get(PolicyKey.DERIVATIVE_LEAD_KEPT_WARN);
    }

    public double msWarn() {
        return get(PolicyKey.MS_WARN);
    }

    public double msFail() {
        return get(PolicyKey.MS_FAIL);
    }

    public double msIncreaseWarn() {
        return get(PolicyKey.MS_INCREASE_WARN);
    }

    public double phaseMarginWarnDegrees() {
        return get(PolicyKey.PHASE_MARGIN_WARN_DEG);
    }

    public double phaseMarginFailDegrees() {
        return get(PolicyKey.PHASE_MARGIN_FAIL_DEG);
    }

    public double gainMarginWarn() {
        return get(PolicyKey.GAIN_MARGIN_WARN);
    }

    public double gainMarginFail() {
        return get(PolicyKey.GAIN_MARGIN_FAIL);
    }

    public double delayMarginWarnScans() {
        return get(PolicyKey.DELAY_MARGIN_WARN_SCANS);
    }

    public double delayMarginFailScans() {
        return get(PolicyKey.DELAY_MARGIN_FAIL_SCANS);
    }

    public double mismatchWarnDb() {
        return get(PolicyKey.MISMATCH_WARN_DB);
    }

    public double mismatchWarnDegrees() {
        return get(PolicyKey.MISMATCH_WARN_DEG);
    }
}

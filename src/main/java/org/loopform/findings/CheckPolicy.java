package org.loopform.findings;

import java.util.LinkedHashMap;
import java.util.Map;
import org.loopform.units.BadInput;

/**
 * The thresholds the deployment checker holds figures against. Defaults and their sources:
 * <ul>
 *   <li>{@code sampling_warn} 0.5 and {@code sampling_fail} 1.0, scan time times crossover
 *       (rad): h wc of about 0.15 to 0.5 is the usual choice (Astrom & Wittenmark,
 *       Computer-Controlled Systems, 3rd ed., 1997, ch. 8 - from memory); at h wc = 1 the hold
 *       alone costs about 29 deg of phase (its delay h/2, Wittenmark, Astrom & Arzen 2002, verified);</li>
 *   <li>{@code derivative_nh_td_warn} 0.6: N h / Td of about 0.2 to 0.6 (same book, from memory);</li>
 *   <li>{@code derivative_lead_kept_warn} 0.5: half the continuous derivative's phase lead at crossover
 *       kept (common practice);</li>
 *   <li>{@code ms_warn} 2.0: Ms of 1.3 to 2 is reasonable (Astrom & Hagglund 1995, as cited in Octave's
 *       control package documentation - verified);</li>
 *   <li>{@code ms_increase_warn} 0.1: the target's Ms more than 10 % above the design's (common practice);</li>
 *   <li>{@code phase_margin_warn_deg} 30 and {@code gain_margin_warn} 2 (common practice: PM 30 to 60 deg,
 *       GM 2 to 5);</li>
 *   <li>{@code mismatch_warn_db} 1 and {@code mismatch_warn_deg} 5: the sampled controller's response
 *       against the design law over the tuning's band (loopform policy, common practice).</li>
 * </ul>
 */
public record CheckPolicy(double samplingWarn, double samplingFail, double derivativeNhTdWarn,
                          double derivativeLeadKeptWarn, double msWarn, double msIncreaseWarn,
                          double phaseMarginWarnDegrees, double gainMarginWarn, double mismatchWarnDb,
                          double mismatchWarnDegrees) {

    public CheckPolicy {
        double[] all = {samplingWarn, samplingFail, derivativeNhTdWarn, derivativeLeadKeptWarn, msWarn, msIncreaseWarn,
                phaseMarginWarnDegrees, gainMarginWarn, mismatchWarnDb, mismatchWarnDegrees};
        for (double v : all) {
            if (!(v >= 0) || !Double.isFinite(v)) {
                throw new IllegalArgumentException("policy thresholds must be finite and >= 0 (got " + v + ")");
            }
        }
        if (samplingFail < samplingWarn) {
            throw new IllegalArgumentException("sampling_fail (" + samplingFail + ") must not be below sampling_warn ("
                    + samplingWarn + ")");
        }
    }

    public static final CheckPolicy DEFAULT = new CheckPolicy(0.5, 1.0, 0.6, 0.5, 2.0, 0.1, 30, 2, 1, 5);

    /** The policy keys as a policy file writes them, with this policy's values. */
    public Map<String, Double> asMap() {
        Map<String, Double> m = new LinkedHashMap<>();
        m.put("sampling_warn", samplingWarn);
        m.put("sampling_fail", samplingFail);
        m.put("derivative_nh_td_warn", derivativeNhTdWarn);
        m.put("derivative_lead_kept_warn", derivativeLeadKeptWarn);
        m.put("ms_warn", msWarn);
        m.put("ms_increase_warn", msIncreaseWarn);
        m.put("phase_margin_warn_deg", phaseMarginWarnDegrees);
        m.put("gain_margin_warn", gainMarginWarn);
        m.put("mismatch_warn_db", mismatchWarnDb);
        m.put("mismatch_warn_deg", mismatchWarnDegrees);
        return m;
    }

    /** This policy with the keys of {@code overrides} replaced; an unknown key is an error naming the known ones. */
    public CheckPolicy with(Map<String, Double> overrides) {
        Map<String, Double> m = asMap();
        for (var e : overrides.entrySet()) {
            if (!m.containsKey(e.getKey())) {
                throw new BadInput(e.getKey() + ": unknown policy key; known keys are "
                        + String.join(", ", m.keySet()));
            }
            m.put(e.getKey(), e.getValue());
        }
        return new CheckPolicy(m.get("sampling_warn"), m.get("sampling_fail"), m.get("derivative_nh_td_warn"),
                m.get("derivative_lead_kept_warn"), m.get("ms_warn"), m.get("ms_increase_warn"),
                m.get("phase_margin_warn_deg"), m.get("gain_margin_warn"), m.get("mismatch_warn_db"),
                m.get("mismatch_warn_deg"));
    }
}

package org.loopform.findings;

/**
 * One threshold of the check policy: the key a policy file writes, its default, the unit it is
 * in, what it means and where the default comes from. The catalogue is the one place a key is
 * declared; {@link CheckPolicy}, the policy file reader and {@code loopform check --help} read it.
 * A rule "fires" when a figure is worse than its threshold; for a {@code _fail} key that means
 * severity fail, for a {@code _warn} key severity warn.
 */
public enum PolicyKey {
    SAMPLING_WARN("sampling_warn", 0.5, "rad", "scan time x as-left crossover above which the scan is slow",
            CheckRules.SAMPLING_PRACTICE + ": h wc of about 0.15 to 0.5"),
    SAMPLING_FAIL("sampling_fail", 1.0, "rad", "scan time x as-left crossover above which the scan fails",
            "at h wc = 1 the hold alone costs about 29 deg at crossover (its h/2 delay, "
                    + CheckRules.WITTENMARK_2002 + ")"),
    DERIVATIVE_NH_TD_WARN("derivative_nh_td_warn", 0.6, "ratio", "N h / Td above which the scan is coarse for the"
            + " derivative filter", CheckRules.SAMPLING_PRACTICE + ": N h / Td of about 0.2 to 0.6"),
    DERIVATIVE_LEAD_KEPT_WARN("derivative_lead_kept_warn", 0.5, "fraction", "share of the continuous derivative's"
            + " phase lead at crossover the sampled derivative must keep", CheckRules.COMMON),
    MS_WARN("ms_warn", 2.0, "ratio", "as-left maximum sensitivity Ms above which the loop warns", CheckRules.MS_SOURCE),
    MS_FAIL("ms_fail", 3.0, "ratio", "as-left Ms above which the loop fails (the Nyquist curve within 1/3 of -1)",
            "loopform policy (common practice): Ms 3 still guarantees GM >= 1.5 and PM >= 19.2 deg, as "
                    + CheckRules.MS_BOUNDS),
    MS_INCREASE_WARN("ms_increase_warn", 0.1, "fraction", "rise of Ms from as-found to as-left above which robustness is"
            + " lost in the migration", CheckRules.COMMON),
    PHASE_MARGIN_WARN_DEG("phase_margin_warn_deg", 30, "deg", "as-left phase margin below which the loop warns",
            "common practice: PM 30 to 60 deg; ControlSystems.jl docs, analysis example: 'above 30-45 deg'"),
    PHASE_MARGIN_FAIL_DEG("phase_margin_fail_deg", 20, "deg", "as-left phase margin below which the loop fails",
            "loopform policy (common practice): the phase margin Ms 3 guarantees, 2 arcsin(1/6) = 19.2 deg, as "
                    + CheckRules.MS_BOUNDS),
    GAIN_MARGIN_WARN("gain_margin_warn", 2, "ratio", "as-left gain margin below which the loop warns",
            "common practice: GM 2 to 5"),
    GAIN_MARGIN_FAIL("gain_margin_fail", 1.5, "ratio", "as-left gain margin below which the loop fails",
            "ControlSystems.jl docs, analysis example: 'we usually aim for a gain margin of > 1.5'; also the GM"
                    + " Ms 3 guarantees, 3/(3-1), as " + CheckRules.MS_BOUNDS),
    DELAY_MARGIN_WARN_SCANS("delay_margin_warn_scans", 2, "scans", "as-left delay margin, in new scans, below which"
            + " the loop warns", "loopform policy (common practice): two scans of added latency must not make the"
            + " loop unstable"),
    DELAY_MARGIN_FAIL_SCANS("delay_margin_fail_scans", 1, "scans", "as-left delay margin, in new scans, below which"
            + " the loop fails", "loopform policy (common practice): one late I/O update (one scan of added"
            + " latency) must not make the loop unstable"),
    MISMATCH_WARN_DB("mismatch_warn_db", 1, "dB", "gain departure of the controller as run from its own law over"
            + " its band above which the discretization warns", "loopform policy (common practice)"),
    MISMATCH_WARN_DEG("mismatch_warn_deg", 5, "deg", "phase departure of the controller as run from its own law"
            + " above which the discretization warns", "loopform policy (common practice)"),
    OVERSHOOT_RISE_WARN("overshoot_rise_warn", 0.5, "fraction", "setpoint overshoot worse than the as-found's by more"
            + " than this share AND by more than overshoot_rise_warn_pct warns", CheckRules.COMMON),
    OVERSHOOT_RISE_WARN_PCT("overshoot_rise_warn_pct", 2, "% of step", "the absolute part of the overshoot rule,"
            + " in percentage points of the setpoint step", CheckRules.COMMON),
    SETTLING_RISE_WARN("settling_rise_warn", 0.5, "fraction", "setpoint settling time (2 % band) longer than the"
            + " as-found's by more than this share AND by more than settling_rise_warn_scans warns; an as-left loop that"
            + " does not settle where the as-found does warns too", CheckRules.COMMON),
    SETTLING_RISE_WARN_SCANS("settling_rise_warn_scans", 2, "scans", "the absolute part of the settling rule, in"
            + " new scans (the resolution of the as-left settling time)", CheckRules.COMMON),
    IAE_RISE_WARN("iae_rise_warn", 0.25, "fraction", "setpoint-step or load-step IAE above the as-found's by more than"
            + " this share warns", CheckRules.COMMON),
    LOAD_PEAK_RISE_WARN("load_peak_rise_warn", 0.25, "fraction", "load-step peak deviation above the as-found's by more"
            + " than this share AND by more than load_peak_rise_warn_pct warns", CheckRules.COMMON),
    LOAD_PEAK_RISE_WARN_PCT("load_peak_rise_warn_pct", 1, "% of step", "the absolute part of the load peak rule, in"
            + " percent of the load step", CheckRules.COMMON),
    REPLAY_RMS_WARN_PCT("replay_rms_warn_pct", 0.5, "% of span", "replay: RMS difference between a controller run on"
            + " the logged SP and PV and the logged output above which it does not reproduce the log", CheckRules.REPLAY_POLICY),
    REPLAY_RMS_FAIL_PCT("replay_rms_fail_pct", 2, "% of span", "replay: RMS difference above which the record"
            + " refutes the controller", CheckRules.REPLAY_POLICY),
    REPLAY_MAX_WARN_PCT("replay_max_warn_pct", 5, "% of span", "replay: largest single difference from the logged"
            + " output above which the replay warns", CheckRules.REPLAY_POLICY),
    REPLAY_CORRELATION_WARN("replay_correlation_warn", 0.98, "ratio", "replay: correlation of the replayed with the"
            + " logged output below which it does not reproduce the log", CheckRules.REPLAY_POLICY),
    REPLAY_CORRELATION_FAIL("replay_correlation_fail", 0.9, "ratio", "replay: correlation below which the record"
            + " refutes the controller", CheckRules.REPLAY_POLICY),
    REPLAY_MOVEMENT_WARN_PCT("replay_movement_warn_pct", 0.5, "% of span", "replay: standard deviation of the logged"
            + " output in automatic below which the record moves too little to confirm a controller", CheckRules.REPLAY_POLICY),
    REPLAY_LOG_INTERVAL_WARN_SCANS("replay_log_interval_warn_scans", 2, "scans", "replay: median interval between"
            + " logged points, in controller scans, above which the record is too coarse for the scan", CheckRules.REPLAY_POLICY),
    REPLAY_AS_LEFT_RMS_WARN_PCT("replay_as_left_rms_warn_pct", 1, "% of span", "replay: RMS difference of the new controller's"
            + " output from the old one's on the record above which the as-left preview warns", CheckRules.REPLAY_POLICY),
    REPLAY_AS_LEFT_RMS_FAIL_PCT("replay_as_left_rms_fail_pct", 5, "% of span", "replay: RMS difference of the"
            + " new controller's output from the old one's above which the as-left preview fails", CheckRules.REPLAY_POLICY),
    FIT_WARN_DB("fit_warn_db", 0.25, "dB", "feedback-path gain deviation of a nearest fit, where the loop lives, above"
            + " which the conversion warns (and by which the setpoint path must exceed it to be reported)",
            "loopform policy (common practice): 0.25 dB is 3 % of gain, within what a loop's model is known to"),
    FIT_WARN_DEG("fit_warn_deg", 3, "deg", "feedback-path phase deviation of a nearest fit, where the loop lives,"
            + " above which the conversion warns", "loopform policy (common practice): a few degrees of phase"
            + " margin, within what a loop's model is known to"),
    FIT_FAIL_DB("fit_fail_db", 3, "dB", "feedback-path gain deviation of a nearest fit, where the loop lives, above"
            + " which the conversion fails (anywhere in the band: warns)", "loopform policy (common practice)"),
    FIT_FAIL_DEG("fit_fail_deg", 20, "deg", "feedback-path phase deviation of a nearest fit, where the loop lives,"
            + " above which the conversion fails (anywhere in the band: warns)", "loopform policy (common practice)"),
    FILTER_CHANGE_DB("filter_change_db", 0.1, "dB", "change of the high-frequency derivative gain above which a"
            + " new form that cannot hold the old filter is reported", "loopform policy (common practice)"),
    ROUNDING_INFO_DB("rounding_info_db", 0.1, "dB", "gain move of the law by rounding to the new form's resolution"
            + " above which it is reported", "loopform policy (common practice)"),
    ROUNDING_INFO_DEG("rounding_info_deg", 1, "deg", "phase move of the law by rounding above which it is reported",
            "loopform policy (common practice)"),
    ROUNDING_WARN_DB("rounding_warn_db", 0.5, "dB", "gain move of the law by rounding above which it warns",
            "loopform policy (common practice): 0.5 dB is a gain change of 6 %, within what a loop's tuning is"
                    + " known to"),
    ROUNDING_WARN_DEG("rounding_warn_deg", 3, "deg", "phase move of the law by rounding above which it warns",
            "loopform policy (common practice)");

    private final String id;
    private final double defaultValue;
    private final String unit;
    private final String meaning;
    private final String source;

    PolicyKey(String id, double defaultValue, String unit, String meaning, String source) {
        this.id = id;
        this.defaultValue = defaultValue;
        this.unit = unit;
        this.meaning = meaning;
        this.source = source;
    }

    /** The key as a policy file writes it, e.g. {@code phase_margin_fail_deg}. */
    public String id() {
        return id;
    }

    public double defaultValue() {
        return defaultValue;
    }

    /** The unit the value is in ("ratio", "deg", "scans", "fraction"...). */
    public String unit() {
        return unit;
    }

    public String meaning() {
        return meaning;
    }

    /** Where the default comes from. */
    public String source() {
        return source;
    }

    /** The key whose {@link #id()} is {@code id}, or null. */
    public static PolicyKey byId(String id) {
        for (PolicyKey k : values()) {
            if (k.id.equals(id)) {
                return k;
            }
        }
        return null;
    }
}

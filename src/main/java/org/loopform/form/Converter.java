package org.loopform.form;

import org.loopform.law.TuningBand;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.law.ControlLaw;
import org.loopform.lti.FrequencyBand;
import org.loopform.law.LawDeviation;
import org.loopform.law.PidTerms;
import org.loopform.units.Numbers;

/**
 * Converts a tuning between forms along one path: source values -> source setting -> the law ->
 * the target's setting -> target values. The target is exact when its law is the source law as
 * rational functions; otherwise it is the nearest member of the target's family
 * ({@link NearestFit}), and findings say why and by how much.
 */
public final class Converter {

    /** Rounding that moves the law by more than this is reported (the tool's policy). */
    public static final double ROUNDING_GAIN_DB = 0.1;
    public static final double ROUNDING_PHASE_DEG = 1.0;
    /** A nearest fit worse than this is a failure rather than a warning (the tool's policy, common practice). */
    public static final double FIT_FAIL_GAIN_DB = 3.0;
    public static final double FIT_FAIL_PHASE_DEG = 20.0;
    /** A change in high-frequency derivative gain below this is not worth a finding. */
    static final double FILTER_CHANGE_DB = 0.1;

    private static final String ASTROM_1995 =
            "Astrom & Hagglund, PID Controllers: Theory, Design and Tuning, 2nd ed., ISA 1995, sec. 3.4";
    private static final String POLICY = "loopform policy (common practice)";

    private Converter() {
    }

    /** Converts {@code values} written in {@code from} into {@code to}. */
    public static Conversion convert(FormDefinition from, Map<String, String> values, FormDefinition to,
                                     WritingContext ctx) {
        return convertBetween(from, values, ctx, to, ctx);
    }

    /**
     * As {@link #convert}, with the source's values read in {@code fromCtx} and the target's written
     * in {@code ctx} (they differ when source and target controllers scan at different rates).
     */
    public static Conversion convertBetween(FormDefinition from, Map<String, String> values, WritingContext fromCtx,
                                            FormDefinition to, WritingContext ctx) {
        List<Finding> findings = new ArrayList<>();
        PidSetting src = FormCodec.decode(from, values, fromCtx, "source");
        if (from.gain().sign() == SignConvention.ACTION && values.keySet().stream()
                .noneMatch(k -> k.trim().equalsIgnoreCase("action"))) {
            findings.add(new Finding(Topic.UNITS, Severity.INFO, null, null, "", POLICY,
                    "No action was given for " + from.id() + "; reverse action (output falls as the PV rises) was "
                            + "assumed. Write action=direct if the controller is direct acting."));
        }
        ControlLaw law = StructureLaw.toLaw(src, from.filter().placement());
        FrequencyBand band = TuningBand.implied(law.terms(), ctx.scanSeconds() == null ? 0 : ctx.scanSeconds());

        PidSetting candidate = StructureLaw.fromTerms(law.terms(), to.structure(), to.filter().placement(),
                to.c().defaultValue());
        PidSetting start = project(candidate != null ? candidate : startingPoint(law.terms(), to), to, law.terms());
        ControlLaw startLaw = StructureLaw.toLaw(start, to.filter().placement());
        boolean exact = startLaw.sameAs(law, ControlLaw.SAME_LAW_TOLERANCE);
        PidSetting result = start;
        ControlLaw targetLaw = startLaw;
        if (!exact) {
            PidSetting fitted = new NearestFit(to, law, band).fit(start);
            ControlLaw fittedLaw = StructureLaw.toLaw(fitted, to.filter().placement());
            if (score(LawDeviation.ofFeedback(law, fittedLaw, band), LawDeviation.ofSetpoint(law, fittedLaw, band))
                    <= score(LawDeviation.ofFeedback(law, startLaw, band), LawDeviation.ofSetpoint(law, startLaw, band))) {
                result = fitted;
                targetLaw = fittedLaw;
            }
            exact = targetLaw.sameAs(law, ControlLaw.SAME_LAW_TOLERANCE);
        }
        LawDeviation deviation = LawDeviation.NONE;
        if (!exact) {
            deviation = LawDeviation.ofFeedback(law, targetLaw, band);
            explainInexact(law, targetLaw, to, band, deviation, findings);
        }

        WrittenTuning written = FormCodec.encode(to, result, ctx, "target");
        checkLimits(to, written, result, findings);
        WrittenTuning entered = enter(to, written);
        ControlLaw enteredLaw = targetLaw;
        if (!sameToDigits(entered, written)) {
            enteredLaw = checkRounding(to, written, entered, targetLaw, band, ctx, findings);
        }
        return new Conversion(from, to, src, law, result, targetLaw, enteredLaw, exact, written, entered, deviation,
                band, findings);
    }

    /** Feedback path first: a setpoint-path gain never buys a feedback-path loss. */
    private static double score(LawDeviation feedback, LawDeviation setpoint) {
        return 1e3 * (feedback.gainDb() / FIT_FAIL_GAIN_DB + feedback.phaseDegrees() / FIT_FAIL_PHASE_DEG)
                + setpoint.gainDb() / FIT_FAIL_GAIN_DB + setpoint.phaseDegrees() / FIT_FAIL_PHASE_DEG;
    }

    /** Puts a candidate onto what the target can hold: its filter rule and its fixed weights. */
    private static PidSetting project(PidSetting s, FormDefinition to, PidTerms law) {
        double td = s.derivativeTimeSeconds();
        double tf = switch (to.filter().kind()) {
            case NONE -> 0.0;
            case FIXED_RATIO -> td / to.filter().ratio();
            case RATIO -> s.filterSeconds() > 0 && td > 0 ? s.filterSeconds() : td / to.filter().ratio();
            case TIME_CONSTANT -> s.filterSeconds();
        };
        double b = to.b().adjustable() ? clamp(s.b(), to.b()) : to.b().defaultValue();
        double c = to.c().adjustable() && td > 0 ? clamp(s.c(), to.c()) : to.c().defaultValue();
        return new PidSetting(s.structure(), s.gain(), s.integral(), s.derivative(), tf, b, c);
    }

    private static double clamp(double v, Weight w) {
        return Math.min(Math.max(v, w.min()), w.max());
    }

    /** A start for the nearest fit when no setting writes the law: the law without filter, or a double series zero. */
    private static PidSetting startingPoint(PidTerms t, FormDefinition to) {
        PidTerms unfiltered = new PidTerms(t.p(), t.i(), t.d(), 0.0, t.pr(), t.dr());
        PidSetting s = StructureLaw.fromTerms(unfiltered, to.structure(), to.filter().placement(),
                to.c().defaultValue());
        if (s != null) {
            return s.withFilterSeconds(t.tf());
        }
        if (to.structure() == Structure.SERIES && t.p() != 0) {
            // complex zeros: start from the double real zero with the same gain and integral coefficient
            double k = t.p() / 2;
            double ti = t.i() == 0 ? Double.POSITIVE_INFINITY : k / t.i();
            double td = Math.abs(t.d() / k);
            return new PidSetting(Structure.SERIES, k, ti, td, t.tf(), 1.0, to.c().defaultValue());
        }
        double k = t.p() != 0 ? t.p() : 1.0;
        return new PidSetting(to.structure(), k, to.structure() == Structure.PARALLEL ? t.i()
                : (t.i() == 0 ? Double.POSITIVE_INFINITY : Math.abs(k / t.i())), Math.abs(t.d()), t.tf(), 1.0,
                to.c().defaultValue());
    }

    private static void explainInexact(ControlLaw law, ControlLaw target, FormDefinition to, FrequencyBand band,
                                       LawDeviation deviation, List<Finding> findings) {
        PidTerms s = law.terms();
        Severity fitSeverity = deviation.gainDb() > FIT_FAIL_GAIN_DB || deviation.phaseDegrees() > FIT_FAIL_PHASE_DEG
                ? Severity.FAIL : Severity.WARN;
        String bandText = "over " + Numbers.significant(band.lowRadPerSecond(), 3) + " to "
                + Numbers.significant(band.highRadPerSecond(), 3) + " rad/s";
        String devText = "deviates in its feedback path by up to " + Numbers.significant(deviation.gainDb(), 3) + " dB and "
                + Numbers.significant(deviation.phaseDegrees(), 3) + " deg " + bandText;
        boolean explained = false;
        if (to.structure() == Structure.SERIES && StructureLaw.seriesDiscriminant(s) < 0) {
            double ratio = s.p() * s.p() / (s.d() * s.i());
            findings.add(new Finding(Topic.REALIZABILITY, fitSeverity, ratio, 4.0, "ratio", ASTROM_1995,
                    "The source law has complex zeros (p^2/(d i), the ideal form's Ti/Td, is "
                            + Numbers.significant(ratio, 4) + ", below 4), so a series controller cannot write it."
                            + " The nearest series setting " + devText + "."));
            explained = true;
        }
        double hfSource = s.highFrequencyGain();
        double hfTarget = target.terms().highFrequencyGain();
        boolean sourceFiltered = Double.isFinite(hfSource);
        boolean targetFiltered = Double.isFinite(hfTarget);
        boolean filterBound = to.filter().kind() == FilterKind.FIXED_RATIO || to.filter().kind() == FilterKind.NONE
                || !sourceFiltered;
        if (s.d() != 0 && filterBound && (sourceFiltered != targetFiltered || sourceFiltered
                && Math.abs(20 * Math.log10(hfTarget / hfSource)) > FILTER_CHANGE_DB)) {
            String what = switch (to.filter().kind()) {
                case FIXED_RATIO -> "fixes its filter ratio at N = " + Numbers.plain(to.filter().ratio());
                case NONE -> "has no derivative filter";
                default -> "cannot hold the source's derivative filter";
            };
            if (sourceFiltered && targetFiltered) {
                double changeDb = 20 * Math.log10(hfTarget / hfSource);
                findings.add(new Finding(Topic.FILTER, fitSeverity, changeDb, 0.0, "dB", POLICY,
                        "Target " + to.id() + " " + what + ": the high-frequency derivative gain changes from "
                                + Numbers.significant(hfSource, 4) + " to " + Numbers.significant(hfTarget, 4)
                                + " %/% (" + Numbers.significant(changeDb, 3) + " dB); the nearest setting "
                                + devText + "."));
            } else if (targetFiltered) {
                findings.add(new Finding(Topic.FILTER, fitSeverity, hfTarget, null, "%/%", POLICY,
                        "The source law has no derivative filter (derivative gain unlimited at high frequency); target "
                                + to.id() + " " + what + " and caps it at " + Numbers.significant(hfTarget, 4)
                                + " %/%. The target law " + devText + "."));
            } else {
                findings.add(new Finding(Topic.FILTER, fitSeverity, hfSource, null, "%/%", POLICY,
                        "Target " + to.id() + " has no derivative filter: its derivative gain grows without bound "
                                + "where the source law capped it at " + Numbers.significant(hfSource, 4)
                                + " %/%. The target law " + devText + "."));
            }
            explained = true;
        }
        boolean feedbackExact = target.sameFeedbackAs(law, ControlLaw.SAME_LAW_TOLERANCE);
        if (!explained && !feedbackExact) {
            findings.add(new Finding(Topic.REALIZABILITY, fitSeverity, deviation.gainDb(), FIT_FAIL_GAIN_DB, "dB",
                    POLICY, "Target " + to.id() + " cannot write the source law exactly; the nearest setting "
                    + devText + "."));
        }
        LawDeviation sp = LawDeviation.ofSetpoint(law, target, band);
        // only what the feedback path's deviation does not already explain is the weights' doing
        if (sp.gainDb() > deviation.gainDb() + ROUNDING_GAIN_DB
                || sp.phaseDegrees() > deviation.phaseDegrees() + ROUNDING_PHASE_DEG) {
            findings.add(new Finding(Topic.REALIZABILITY, Severity.WARN, sp.gainDb(), ROUNDING_GAIN_DB, "dB", POLICY,
                    (feedbackExact ? "The feedback path is exact, but t" : "T") + "arget " + to.id()
                            + " cannot weight the setpoint as the source does (setpoint weights b, c"
                            + (to.c().adjustable() ? "" : "; its c is fixed at " + Numbers.plain(to.c().defaultValue()))
                            + "): the setpoint path deviates by up to " + Numbers.significant(sp.gainDb(), 3) + " dB and "
                            + Numbers.significant(sp.phaseDegrees(), 3) + " deg " + bandText
                            + ". Setpoint responses will differ; disturbance responses follow the feedback path."));
        }
    }

    private static void checkLimits(FormDefinition to, WrittenTuning written, PidSetting s, List<Finding> findings) {
        written.values().forEach((name, value) -> {
            if (name.equals(to.integralName()) && !s.hasIntegral()) {
                return; // the off value is written as the form says, whatever the range
            }
            if (name.equals(to.integralName()) && to.integral().isOff(value)) {
                String unit = FormUnits.of(to, name);
                findings.add(new Finding(Topic.LIMITS, Severity.FAIL, value, to.integral().offValue(), unit,
                        "target form " + to.id(), name + " = " + Numbers.significant(value, 6) + " " + unit
                        + " is what " + to.id() + " reads as integral action off ("
                        + Numbers.plain(to.integral().offValue()) + " " + unit + (to.integral().offValue() > 0
                        ? " or more" : "") + "): entered, the loop would lose its integral action and hold an"
                        + " offset. Retune, or pick a form that can hold this integral time."));
                return;
            }
            ParameterLimit limit = to.limit(name);
            if (!limit.accepts(value)) {
                boolean high = limit.max() != null && value > limit.max();
                double bound = high ? limit.max() : limit.min();
                String unit = FormUnits.of(to, name);
                findings.add(new Finding(Topic.LIMITS, Severity.FAIL, value, bound, unit, "target form " + to.id(),
                        name + " = " + Numbers.significant(value, 6) + " " + unit + " is " + (high ? "above" : "below")
                                + " what " + to.id() + " accepts (" + (high ? "max " : "min ")
                                + Numbers.plain(bound) + " " + unit + "); the target cannot hold this tuning."
                                + " Nothing was clipped: retune or pick another form."));
            }
        });
    }

    /** True when rounding moved no value beyond its twelfth significant digit (nothing to check then). */
    private static boolean sameToDigits(WrittenTuning a, WrittenTuning b) {
        for (var e : a.values().entrySet()) {
            double x = e.getValue();
            double y = b.values().get(e.getKey());
            if (Math.abs(x - y) > 1e-11 * Math.max(Math.abs(x), Math.abs(y))) {
                return false;
            }
        }
        return true;
    }

    private static WrittenTuning enter(FormDefinition to, WrittenTuning written) {
        Map<String, Double> v = new LinkedHashMap<>();
        written.values().forEach((name, value) -> v.put(name, to.limit(name).round(value)));
        return new WrittenTuning(v, written.action());
    }

    private static ControlLaw checkRounding(FormDefinition to, WrittenTuning written, WrittenTuning entered,
                                            ControlLaw targetLaw, FrequencyBand band, WritingContext ctx,
                                            List<Finding> findings) {
        ControlLaw enteredLaw;
        try {
            PidSetting e = FormCodec.decode(to, FormCodec.asText(entered), ctx, "target");
            enteredLaw = StructureLaw.toLaw(e, to.filter().placement());
        } catch (FormException ex) {
            findings.add(new Finding(Topic.ROUNDING, Severity.FAIL, null, null, "", "target form " + to.id(),
                    "Rounded to " + to.id() + "'s resolution the tuning is no longer valid (" + ex.getMessage()
                            + "); enter it by hand or use a finer resolution."));
            return targetLaw;
        }
        if (targetLaw.terms().i() != 0 && enteredLaw.terms().i() == 0) {
            findings.add(new Finding(Topic.ROUNDING, Severity.FAIL, null, null, "", "target form " + to.id(),
                    "Rounded to " + to.id() + "'s resolution, " + to.integralName() + " becomes the value that turns"
                            + " integral action off; enter it by hand at a finer resolution, or retune."));
        }
        LawDeviation d = LawDeviation.between(targetLaw, enteredLaw, band);
        if (d.gainDb() > ROUNDING_GAIN_DB || d.phaseDegrees() > ROUNDING_PHASE_DEG) {
            StringBuilder moved = new StringBuilder();
            written.values().forEach((name, value) -> {
                double r = entered.values().get(name);
                if (r != value) {
                    moved.append(moved.length() == 0 ? "" : ", ").append(name).append(' ')
                            .append(Numbers.significant(value, 6)).append(" -> ").append(Numbers.plain(r));
                }
            });
            findings.add(new Finding(Topic.ROUNDING, Severity.WARN, d.gainDb(), ROUNDING_GAIN_DB, "dB", POLICY,
                    "Rounding to " + to.id() + "'s resolution (" + moved + ") moves the law by up to "
                            + Numbers.significant(d.gainDb(), 3) + " dB and " + Numbers.significant(d.phaseDegrees(), 3)
                            + " deg (limits " + Numbers.plain(ROUNDING_GAIN_DB) + " dB, "
                            + Numbers.plain(ROUNDING_PHASE_DEG) + " deg)."));
        }
        return enteredLaw;
    }
}

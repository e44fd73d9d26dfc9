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
    /**
     * Rounding to the target's resolution is the best it can store; a move beyond these is worth
     * acting on (a finer form or a retune), one within them is reported as info (the tool's policy:
     * 0.5 dB is a gain change of 6 %, within what a loop's tuning is known to).
     */
    public static final double ROUNDING_WARN_GAIN_DB = 0.5;
    public static final double ROUNDING_WARN_PHASE_DEG = 3.0;
    /** A nearest fit worse than this is a failure rather than a warning (the tool's policy, common practice). */
    public static final double FIT_FAIL_GAIN_DB = 3.0;
    public static final double FIT_FAIL_PHASE_DEG = 20.0;
    /**
     * A feedback-path deviation below this where the loop lives changes nothing an engineer could
     * see in the loop's response: 0.25 dB is 3 % of gain, 3 deg a few degrees of phase margin,
     * both within what a loop's model is known to (the tool's policy, common practice). With a
     * process the check compares the loops themselves.
     */
    static final double NEGLIGIBLE_GAIN_DB = 0.25;
    static final double NEGLIGIBLE_PHASE_DEG = 3.0;
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
        return convertBetween(from, values, fromCtx, to, ctx, null);
    }

    /**
     * As {@link #convertBetween(FormDefinition, Map, WritingContext, FormDefinition, WritingContext)},
     * with the band where the loop lives given ({@code loopBand}, for example around the crossover of
     * the design loop when the process is known); null takes it from the law's own corners
     * ({@link TuningBand#whereLoopLives}). The nearest fit weights that band, and the reported loop deviation is
     * taken over it.
     */
    public static Conversion convertBetween(FormDefinition from, Map<String, String> values, WritingContext fromCtx,
                                            FormDefinition to, WritingContext ctx, FrequencyBand loopBand) {
        List<Finding> findings = new ArrayList<>();
        List<String> assumptions = new ArrayList<>();
        PidSetting src = FormCodec.decode(from, values, fromCtx, "source");
        java.util.Set<String> given = new java.util.HashSet<>();
        values.keySet().forEach(k -> given.add(k.trim().toLowerCase(java.util.Locale.ROOT)));
        if (from.gain().sign() == SignConvention.ACTION && !given.contains("action")) {
            assumptions.add("No action was given for " + from.id() + "; reverse action (output falls as the PV rises)"
                    + " was assumed. Write action=direct if the controller is direct acting.");
        }
        if (src.derivative() != 0) {
            if (from.filter().kind() == FilterKind.RATIO && !given.contains("n")) {
                assumptions.add("No n was given for " + from.id() + "; its default derivative filter ratio N = "
                        + Numbers.plain(from.filter().ratio()) + " (Tf = Td/" + Numbers.plain(from.filter().ratio())
                        + ") was assumed. Write n=off for a source without a derivative filter.");
            } else if (from.filter().kind() == FilterKind.TIME_CONSTANT && !given.contains("tf")) {
                assumptions.add("No tf was given for " + from.id() + "; its default derivative filter time constant "
                        + Numbers.plain(from.filter().defaultTime()) + " " + from.filter().unit().symbol()
                        + " was assumed.");
            }
        }
        ControlLaw law = StructureLaw.toLaw(src, from.filter().placement());
        double scan = ctx.scanSeconds() == null ? 0 : ctx.scanSeconds();
        FrequencyBand band = TuningBand.implied(law.terms(), scan);
        FrequencyBand lives = loopBand != null ? loopBand : TuningBand.whereLoopLives(law.terms(), scan);

        PidSetting candidate = StructureLaw.fromTerms(law.terms(), to.structure(), to.filter().placement(),
                to.c().defaultValue());
        PidSetting start = project(candidate != null ? candidate : startingPoint(law.terms(), to), to, law.terms());
        ControlLaw startLaw = StructureLaw.toLaw(start, to.filter().placement());
        boolean exact = startLaw.sameAs(law, ControlLaw.SAME_LAW_TOLERANCE);
        PidSetting result = start;
        ControlLaw targetLaw = startLaw;
        PidSetting textbookSetting = textbook(src, from, to);
        if (!exact) {
            // candidates: the fit, the exact coordinates put onto the target's filter rule, and the
            // textbook values with the target's filter; the best where the loop lives wins, so the fit
            // is never worse there than keeping the values
            List<PidSetting> candidates = new ArrayList<>();
            candidates.add(new NearestFit(to, law, band, lives).fit(start));
            candidates.add(start);
            if (textbookSetting != null) {
                candidates.add(project(textbookSetting, to, law.terms()));
            }
            double best = Double.POSITIVE_INFINITY;
            for (PidSetting c : candidates) {
                ControlLaw cl;
                try {
                    cl = StructureLaw.toLaw(c, to.filter().placement());
                } catch (IllegalArgumentException e) {
                    continue;
                }
                double sc = score(LawDeviation.ofFeedback(law, cl, lives), LawDeviation.ofSetpoint(law, cl, lives));
                if (sc < best) {
                    best = sc;
                    result = c;
                    targetLaw = cl;
                }
            }
            exact = targetLaw.sameAs(law, ControlLaw.SAME_LAW_TOLERANCE);
        }
        LawDeviation deviation = LawDeviation.NONE;
        LawDeviation loopDeviation = LawDeviation.NONE;
        if (!exact) {
            deviation = LawDeviation.ofFeedback(law, targetLaw, band);
            loopDeviation = LawDeviation.ofFeedback(law, targetLaw, lives);
            explainInexact(law, targetLaw, to, band, lives, deviation, loopDeviation, findings);
        }

        WrittenTuning written = FormCodec.encode(to, result, ctx, "target");
        WrittenTuning textbookValues = null;
        if (textbookSetting != null) {
            WrittenTuning t = FormCodec.encode(to, textbookSetting, ctx, "target");
            if (differs(t, written, to)) {
                textbookValues = t;
            }
        }
        if (exact) {
            explainExactFilter(from, src, to, result, law, textbookSetting, textbookValues != null, lives, findings);
        }
        Map<String, String> refused = new LinkedHashMap<>();
        checkLimits(to, written, result, findings, refused);
        WrittenTuning entered = enter(to, written);
        ControlLaw enteredLaw = targetLaw;
        if (!sameToDigits(entered, written)) {
            enteredLaw = checkRounding(to, written, entered, targetLaw, band, ctx, findings);
        }
        return new Conversion(from, to, src, law, result, targetLaw, enteredLaw, exact, written, entered, deviation,
                band, findings, textbookValues, assumptions, lives, loopDeviation, refused);
    }

    /**
     * The target setting by the textbook relations, which ignore the derivative filter: the source
     * setting without its filter, multiplied out and solved in the target's structure (Astrom and
     * Hagglund 1995, sec. 3.4: series Kc', Ti', Td' to ideal Kc = Kc'(1 + Td'/Ti'), Ti = Ti' + Td',
     * Td = Ti'Td'/(Ti' + Td')). Null when there is no derivative (the filter then changes nothing),
     * or when the target's structure cannot write the unfiltered law.
     */
    private static PidSetting textbook(PidSetting src, FormDefinition from, FormDefinition to) {
        if (src.derivative() == 0) {
            return null;
        }
        try {
            PidTerms unfiltered = StructureLaw.toTerms(src.withFilterSeconds(0.0), from.filter().placement());
            PidSetting t = StructureLaw.fromTerms(unfiltered, to.structure(), to.filter().placement(),
                    to.c().defaultValue());
            return t == null ? null : t.withFilterSeconds(src.filterSeconds());
        } catch (IllegalArgumentException e) {
            return null;
        }
    }

    /** True when gain, integral or derivative of {@code a} and {@code b} differ beyond rounding noise. */
    private static boolean differs(WrittenTuning a, WrittenTuning b, FormDefinition to) {
        for (String name : List.of(to.gainName(), to.integralName(), to.derivativeName())) {
            double x = a.values().get(name);
            double y = b.values().get(name);
            if (Math.abs(x - y) > TEXTBOOK_DIFFERS * Math.max(Math.abs(x), Math.abs(y))) {
                return true;
            }
        }
        return false;
    }

    /** Textbook and exact values closer than this (relative) are the same values as printed. */
    static final double TEXTBOOK_DIFFERS = 1e-6;

    /**
     * An exact conversion that needs a filter setting other than the target's default (or the
     * source's) says so, and what entering the other values with the default filter would cost.
     */
    private static void explainExactFilter(FormDefinition from, PidSetting src, FormDefinition to, PidSetting result,
                                           ControlLaw law, PidSetting textbookSetting, boolean textbookDiffers,
                                           FrequencyBand lives, List<Finding> findings) {
        double td = result.derivativeTimeSeconds();
        if (td == 0) {
            return;
        }
        PidSetting withDefault;
        String needed;
        String defaultText;
        if (to.filter().kind() == FilterKind.RATIO) {
            double n = result.filterSeconds() > 0 ? td / result.filterSeconds() : Double.POSITIVE_INFINITY;
            double nDefault = to.filter().ratio();
            if (Double.isFinite(n) && Math.abs(n - nDefault) <= TEXTBOOK_DIFFERS * nDefault) {
                return;
            }
            withDefault = result.withFilterSeconds(td / nDefault);
            needed = "n = " + (Double.isFinite(n) ? Numbers.significant(n, 4) : "off");
            defaultText = "n = " + Numbers.plain(nDefault);
        } else if (to.filter().kind() == FilterKind.TIME_CONSTANT) {
            double tfDefault = to.filter().unit().toSeconds(to.filter().defaultTime());
            if (Math.abs(result.filterSeconds() - tfDefault) <= TEXTBOOK_DIFFERS * Math.max(tfDefault, td)) {
                return;
            }
            withDefault = result.withFilterSeconds(tfDefault);
            needed = "tf = " + Numbers.significant(to.filter().unit().fromSeconds(result.filterSeconds()), 4) + " "
                    + to.filter().unit().symbol();
            defaultText = "tf = " + Numbers.plain(to.filter().defaultTime()) + " " + to.filter().unit().symbol();
        } else {
            return;
        }
        LawDeviation cost = LawDeviation.ofFeedback(law, StructureLaw.toLaw(withDefault, to.filter().placement()), lives);
        StringBuilder m = new StringBuilder("Exact with " + needed + " instead of " + to.id() + "'s default "
                + defaultText + ": ");
        if (from.structure() != to.structure() && (from.structure() == Structure.SERIES
                || to.structure() == Structure.SERIES)) {
            m.append("a series controller filters its derivative lead-lag K(1 + 1/(Ti s))(1 + Td s)/(1 + Tf s), and"
                    + " written in the other structure that same filter time is a different share of the derivative"
                    + " time. ");
        } else {
            m.append("the source's filter time Tf = ").append(Numbers.significant(src.filterSeconds(), 4))
                    .append(" s is a different share of the target's derivative time. ");
        }
        m.append("Entering the other values with ").append(defaultText).append(" would move the law by up to ")
                .append(Numbers.deviation(cost.gainDb())).append(" dB and ").append(Numbers.deviation(cost.phaseDegrees()))
                .append(" deg over ").append(bandText(lives)).append(" (where the loop lives); enter ")
                .append(needed).append('.');
        if (textbookDiffers && textbookSetting != null) {
            LawDeviation tb = LawDeviation.ofFeedback(law, StructureLaw.toLaw(
                    project(textbookSetting, to, law.terms()), to.filter().placement()), lives);
            m.append(" The textbook values (the relations without a filter) with ").append(defaultText)
                    .append(" would move it by up to ").append(Numbers.deviation(tb.gainDb())).append(" dB and ")
                    .append(Numbers.deviation(tb.phaseDegrees())).append(" deg there.");
        }
        findings.add(new Finding(Topic.FILTER, Severity.INFO, cost.gainDb(), null, "dB", ASTROM_1995, m.toString()));
    }

    private static String bandText(FrequencyBand b) {
        return Numbers.significant(b.lowRadPerSecond(), 3) + " to " + Numbers.significant(b.highRadPerSecond(), 3)
                + " rad/s";
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
            // an adjustable ratio can be switched off (n=off): an unfiltered law stays unfiltered
            case RATIO -> td > 0 && s.filterSeconds() >= 0 ? s.filterSeconds() : td / to.filter().ratio();
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

    /**
     * The severity of a nearest fit, judged where the loop lives: fail beyond
     * {@link #FIT_FAIL_GAIN_DB} / {@link #FIT_FAIL_PHASE_DEG} there; warn beyond
     * {@link #NEGLIGIBLE_GAIN_DB} / {@link #NEGLIGIBLE_PHASE_DEG} there, or beyond the fail limits
     * anywhere in the band (the loop band is an estimate without a process); info otherwise.
     */
    static Severity fitSeverity(LawDeviation loop, LawDeviation whole) {
        if (loop.gainDb() > FIT_FAIL_GAIN_DB || loop.phaseDegrees() > FIT_FAIL_PHASE_DEG) {
            return Severity.FAIL;
        }
        if (loop.gainDb() > NEGLIGIBLE_GAIN_DB || loop.phaseDegrees() > NEGLIGIBLE_PHASE_DEG
                || whole.gainDb() > FIT_FAIL_GAIN_DB || whole.phaseDegrees() > FIT_FAIL_PHASE_DEG) {
            return Severity.WARN;
        }
        return Severity.INFO;
    }

    private static void explainInexact(ControlLaw law, ControlLaw target, FormDefinition to, FrequencyBand band,
                                       FrequencyBand lives, LawDeviation deviation, LawDeviation loopDeviation,
                                       List<Finding> findings) {
        PidTerms s = law.terms();
        Severity fitSeverity = fitSeverity(loopDeviation, deviation);
        String bandText = "over " + bandText(band);
        String devText = "deviates in its feedback path by up to " + Numbers.deviation(loopDeviation.gainDb())
                + " dB and " + Numbers.deviation(loopDeviation.phaseDegrees()) + " deg over " + bandText(lives)
                + " (where the loop lives), and by up to " + Numbers.deviation(deviation.gainDb()) + " dB and "
                + Numbers.deviation(deviation.phaseDegrees()) + " deg " + bandText;
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
            findings.add(new Finding(Topic.REALIZABILITY, fitSeverity, loopDeviation.gainDb(), FIT_FAIL_GAIN_DB, "dB",
                    POLICY, "Target " + to.id() + " cannot write the source law exactly; the nearest setting "
                    + devText + "."));
        }
        LawDeviation sp = LawDeviation.ofSetpoint(law, target, lives);
        // only what the feedback path's deviation does not already explain is the weights' doing; it
        // is info on the setpoint path (usually wanted: derivative on the measurement, a weighted
        // setpoint) unless the feedback path changes too where the loop lives
        if (sp.gainDb() > loopDeviation.gainDb() + NEGLIGIBLE_GAIN_DB
                || sp.phaseDegrees() > loopDeviation.phaseDegrees() + NEGLIGIBLE_PHASE_DEG) {
            boolean feedbackChanges = fitSeverity != Severity.INFO;
            findings.add(new Finding(Topic.REALIZABILITY, feedbackChanges ? Severity.WARN : Severity.INFO, sp.gainDb(),
                    NEGLIGIBLE_GAIN_DB, "dB", POLICY,
                    (feedbackExact ? "The feedback path is exact, but t" : "T") + "arget " + to.id()
                            + " cannot weight the setpoint as the source does (setpoint weights b, c"
                            + (to.c().adjustable() ? "" : "; its c is fixed at " + Numbers.plain(to.c().defaultValue()))
                            + "): the setpoint path deviates by up to " + Numbers.deviation(sp.gainDb()) + " dB and "
                            + Numbers.deviation(sp.phaseDegrees()) + " deg over " + bandText(lives)
                            + ". Setpoint responses will differ; disturbance responses follow the feedback path"
                            + (feedbackChanges ? ", which changes too." : ", which does not change there.")));
        }
    }

    private static void checkLimits(FormDefinition to, WrittenTuning written, PidSetting s, List<Finding> findings,
                                    Map<String, String> refused) {
        written.values().forEach((name, value) -> {
            if (name.equals(to.integralName()) && !s.hasIntegral()) {
                return; // the off value is written as the form says, whatever the range
            }
            if (name.equals(to.integralName()) && to.integral().isOff(value)) {
                String unit = FormUnits.of(to, name);
                refused.put(name, "read as integral action off by " + to.id());
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
                refused.put(name, (high ? "above the maximum " : "below the minimum ") + Numbers.plain(bound) + " " + unit
                        + " " + to.id() + " accepts");
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
            // rounding to the nearest step is the best the target can store: it is worth acting on
            // (a form with a finer resolution, or a retune to values it holds) only when it moves
            // the law by more than the resolution margin
            boolean matters = d.gainDb() > ROUNDING_WARN_GAIN_DB || d.phaseDegrees() > ROUNDING_WARN_PHASE_DEG;
            findings.add(new Finding(Topic.ROUNDING, matters ? Severity.WARN : Severity.INFO, d.gainDb(),
                    matters ? ROUNDING_WARN_GAIN_DB : ROUNDING_GAIN_DB, "dB", POLICY,
                    "Rounding to " + to.id() + "'s resolution (" + moved + ") moves the law by up to "
                            + Numbers.deviation(d.gainDb()) + " dB and " + Numbers.deviation(d.phaseDegrees())
                            + " deg" + (matters ? " (beyond " + Numbers.plain(ROUNDING_WARN_GAIN_DB) + " dB or "
                            + Numbers.plain(ROUNDING_WARN_PHASE_DEG) + " deg: use a form with a finer resolution,"
                            + " or retune to values the target can hold)."
                            : "; no value can be entered more precisely, and the move is within "
                            + Numbers.plain(ROUNDING_WARN_GAIN_DB) + " dB and " + Numbers.plain(ROUNDING_WARN_PHASE_DEG)
                            + " deg.")));
        }
        return enteredLaw;
    }
}

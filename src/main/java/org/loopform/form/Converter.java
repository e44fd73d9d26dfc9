package org.loopform.form;

import org.loopform.law.TuningBand;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
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

    /**
     * The scales of the nearest fit's score: a feedback-path deviation of this many dB or degrees
     * weighs one unit (the fail limits of the default policy, {@code fit_fail_db} and
     * {@code fit_fail_deg}; a weighting, not a threshold).
     */
    public static final double FIT_SCALE_GAIN_DB = 3.0;
    public static final double FIT_SCALE_PHASE_DEG = 20.0;

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
        return convertBetween(from, values, fromCtx, to, ctx, loopBand, null);
    }

    /**
     * As {@link #convertBetween(FormDefinition, Map, WritingContext, FormDefinition, WritingContext,
     * FrequencyBand)}, the nearest fit's frequencies also weighted by {@code loopWeight} (rad/s to a
     * weight >= 0; with a process, the design loop's |S T|, which peaks at the crossover); null: none.
     * The candidates are still judged unweighted over {@code loopBand}.
     */
    public static Conversion convertBetween(FormDefinition from, Map<String, String> values, WritingContext fromCtx,
                                            FormDefinition to, WritingContext ctx, FrequencyBand loopBand,
                                            java.util.function.DoubleUnaryOperator loopWeight) {
        List<ConversionNote> notes = new ArrayList<>();
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
            candidates.add(new NearestFit(to, law, band, lives, loopWeight).fit(start));
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
            notes.add(inexact(law, targetLaw, to, lives));
        }

        WrittenTuning written = FormCodec.encode(to, result, ctx, "target");
        WrittenTuning textbookValues = null;
        if (textbookSetting != null) {
            WrittenTuning t = FormCodec.encode(to, textbookSetting, ctx, "target");
            if (differs(t, written, to)) {
                textbookValues = t;
            }
        }
        Optional<LawDeviation> textbookLoopDeviation = Optional.empty();
        if (!exact && textbookValues != null) {
            try {
                textbookLoopDeviation = Optional.of(LawDeviation.ofFeedback(law, StructureLaw.toLaw(
                        project(textbookSetting, to, law.terms()), to.filter().placement()), lives));
            } catch (IllegalArgumentException e) {
                // the target cannot write the textbook values at all: nothing to set beside the fit
            }
        }
        if (exact) {
            explainExactFilter(from, src, to, result, law, textbookSetting, textbookValues != null, lives, notes);
        }
        Map<String, String> refused = new LinkedHashMap<>();
        checkLimits(to, written, result, notes, refused);
        WrittenTuning entered = enter(to, written);
        ControlLaw enteredLaw = targetLaw;
        if (!sameToDigits(entered, written)) {
            enteredLaw = checkRounding(to, written, entered, targetLaw, band, ctx, notes);
        }
        return new Conversion(from, to, src, law, result, targetLaw, enteredLaw, exact, written, entered, deviation,
                band, notes, textbookValues, assumptions, lives, loopDeviation, refused, textbookLoopDeviation);
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
     * source's) notes it, with what entering the other values with the default filter would cost.
     */
    private static void explainExactFilter(FormDefinition from, PidSetting src, FormDefinition to, PidSetting result,
                                           ControlLaw law, PidSetting textbookSetting, boolean textbookDiffers,
                                           FrequencyBand lives, List<ConversionNote> notes) {
        double td = result.derivativeTimeSeconds();
        if (td == 0) {
            return;
        }
        PidSetting withDefault;
        // the textbook values as a person would enter them: with the same default filter setting
        PidSetting textbookWithDefault = textbookDiffers && textbookSetting != null
                ? project(textbookSetting, to, law.terms()) : null;
        String parameter;
        double needed;
        double defaultValue;
        String unit;
        if (to.filter().kind() == FilterKind.RATIO) {
            double n = result.filterSeconds() > 0 ? td / result.filterSeconds() : Double.POSITIVE_INFINITY;
            double nDefault = to.filter().ratio();
            if (Double.isFinite(n) && Math.abs(n - nDefault) <= TEXTBOOK_DIFFERS * nDefault) {
                return;
            }
            withDefault = result.withFilterSeconds(td / nDefault);
            if (textbookWithDefault != null) {
                textbookWithDefault = textbookWithDefault.withFilterSeconds(
                        textbookWithDefault.derivativeTimeSeconds() / nDefault);
            }
            parameter = "n";
            needed = n;
            defaultValue = nDefault;
            unit = "";
        } else if (to.filter().kind() == FilterKind.TIME_CONSTANT) {
            double tfDefault = to.filter().unit().toSeconds(to.filter().defaultTime());
            if (Math.abs(result.filterSeconds() - tfDefault) <= TEXTBOOK_DIFFERS * Math.max(tfDefault, td)) {
                return;
            }
            withDefault = result.withFilterSeconds(tfDefault);
            if (textbookWithDefault != null) {
                textbookWithDefault = textbookWithDefault.withFilterSeconds(tfDefault);
            }
            parameter = "tf";
            needed = to.filter().unit().fromSeconds(result.filterSeconds());
            defaultValue = to.filter().defaultTime();
            unit = to.filter().unit().symbol();
        } else {
            return;
        }
        LawDeviation cost = LawDeviation.ofFeedback(law, StructureLaw.toLaw(withDefault, to.filter().placement()), lives);
        boolean seriesInvolved = from.structure() != to.structure() && (from.structure() == Structure.SERIES
                || to.structure() == Structure.SERIES);
        Optional<LawDeviation> textbookCost = Optional.empty();
        if (textbookWithDefault != null) {
            textbookCost = Optional.of(LawDeviation.ofFeedback(law, StructureLaw.toLaw(
                    textbookWithDefault, to.filter().placement()), lives));
        }
        double sourceTf = src.filterSeconds();
        boolean kept = sourceTf == 0 ? result.filterSeconds() == 0
                : Math.abs(sourceTf * td / src.derivativeTimeSeconds() - result.filterSeconds())
                        <= TEXTBOOK_DIFFERS * result.filterSeconds()
                  || to.filter().kind() == FilterKind.TIME_CONSTANT
                        && Math.abs(sourceTf - result.filterSeconds()) <= TEXTBOOK_DIFFERS * sourceTf;
        notes.add(new ConversionNote.FilterSettingNeeded(parameter, needed, defaultValue, unit, seriesInvolved,
                sourceTf, kept, cost, textbookCost));
    }

    /** Feedback path first: a setpoint-path gain never buys a feedback-path loss. */
    private static double score(LawDeviation feedback, LawDeviation setpoint) {
        return 1e3 * (feedback.gainDb() / FIT_SCALE_GAIN_DB + feedback.phaseDegrees() / FIT_SCALE_PHASE_DEG)
                + setpoint.gainDb() / FIT_SCALE_GAIN_DB + setpoint.phaseDegrees() / FIT_SCALE_PHASE_DEG;
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

    /** The figures of an inexact conversion that say why it is inexact ({@link ConversionNote.Inexact}). */
    private static ConversionNote inexact(ControlLaw law, ControlLaw target, FormDefinition to, FrequencyBand lives) {
        PidTerms s = law.terms();
        OptionalDouble complexZeros = to.structure() == Structure.SERIES && StructureLaw.seriesDiscriminant(s) < 0
                ? OptionalDouble.of(s.p() * s.p() / (s.d() * s.i())) : OptionalDouble.empty();
        double hfSource = s.highFrequencyGain();
        boolean filterBound = to.filter().kind() == FilterKind.FIXED_RATIO || to.filter().kind() == FilterKind.NONE
                || !Double.isFinite(hfSource);
        return new ConversionNote.Inexact(complexZeros, s.d() != 0, filterBound, hfSource,
                target.terms().highFrequencyGain(), target.sameFeedbackAs(law, ControlLaw.SAME_LAW_TOLERANCE),
                LawDeviation.ofSetpoint(law, target, lives));
    }

    private static void checkLimits(FormDefinition to, WrittenTuning written, PidSetting s,
                                    List<ConversionNote> notes, Map<String, String> refused) {
        written.values().forEach((name, value) -> {
            if (name.equals(to.integralName()) && !s.hasIntegral()) {
                return; // the off value is written as the form says, whatever the range
            }
            if (name.equals(to.integralName()) && to.integral().isOff(value)) {
                refused.put(name, "read as integral action off by " + to.id());
                notes.add(new ConversionNote.ReadAsIntegralOff(name, value, FormUnits.of(to, name),
                        to.integral().offValue()));
                return;
            }
            ParameterLimit limit = to.limit(name);
            if (!limit.accepts(value)) {
                boolean high = limit.max() != null && value > limit.max();
                double bound = high ? limit.max() : limit.min();
                String unit = FormUnits.of(to, name);
                refused.put(name, (high ? "above the maximum " : "below the minimum ") + Numbers.plain(bound) + " " + unit
                        + " " + to.id() + " accepts");
                notes.add(new ConversionNote.OutOfRange(name, value, bound, high, unit));
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
                                            List<ConversionNote> notes) {
        ControlLaw enteredLaw;
        try {
            PidSetting e = FormCodec.decode(to, FormCodec.asText(entered), ctx, "target");
            enteredLaw = StructureLaw.toLaw(e, to.filter().placement());
        } catch (FormException ex) {
            notes.add(new ConversionNote.RoundingInvalid(ex.getMessage()));
            return targetLaw;
        }
        if (targetLaw.terms().i() != 0 && enteredLaw.terms().i() == 0) {
            notes.add(new ConversionNote.RoundingLosesIntegral());
        }
        StringBuilder moved = new StringBuilder();
        written.values().forEach((name, value) -> {
            double r = entered.values().get(name);
            // a value that only lost the conversion's binary noise (20.000000000000004 -> 20) did not move
            if (Math.abs(r - value) > 1e-11 * Math.max(Math.abs(r), Math.abs(value))) {
                moved.append(moved.length() == 0 ? "" : ", ").append(name).append(' ')
                        .append(Numbers.significant(value, 6)).append(" -> ").append(Numbers.plain(r));
            }
        });
        notes.add(new ConversionNote.Rounded(LawDeviation.between(targetLaw, enteredLaw, band), moved.toString()));
        return enteredLaw;
    }
}

package org.loopform.findings;

import java.util.ArrayList;
import java.util.List;
import org.loopform.form.Conversion;
import org.loopform.form.ConversionNote;
import org.loopform.form.FormDefinition;
import org.loopform.law.LawDeviation;
import org.loopform.lti.FrequencyBand;
import org.loopform.units.Numbers;

/**
 * The rules that turn a conversion's plain facts ({@link ConversionNote}) into findings: how far a
 * nearest fit may stray where the loop lives, when a filter change or a rounding is worth saying,
 * and what a target refuses. The thresholds are the policy's ({@code fit_*}, {@code filter_change_db},
 * {@code rounding_*}); the conversion itself judges nothing. Findings come in the order of the notes.
 */
public final class ConversionRules {

    static final String ASTROM_1995 =
            "Astrom & Hagglund, PID Controllers: Theory, Design and Tuning, 2nd ed., ISA 1995, sec. 3.4";
    static final String POLICY = "loopform policy (common practice)";
    /** A series controller writes real zeros only: Ti/Td of the ideal form at least 4 (Astrom & Hagglund 1995, sec. 3.4). */
    static final double SERIES_RATIO_LIMIT = 4.0;

    private ConversionRules() {
    }

    /** The findings of {@code c} under {@code policy}. */
    public static List<Finding> findings(Conversion c, CheckPolicy policy) {
        List<Finding> out = new ArrayList<>();
        for (ConversionNote note : c.notes()) {
            // Java 17: no pattern switch; the notes are a sealed set, so every branch is listed
            if (note instanceof ConversionNote.Inexact n) {
                inexact(c, n, policy, out);
            } else if (note instanceof ConversionNote.FilterSettingNeeded n) {
                out.add(filterSetting(c, n));
            } else if (note instanceof ConversionNote.ReadAsIntegralOff n) {
                out.add(readAsOff(c.to(), n));
            } else if (note instanceof ConversionNote.OutOfRange n) {
                out.add(outOfRange(c.to(), n));
            } else if (note instanceof ConversionNote.RoundingInvalid n) {
                out.add(new Finding(Topic.ROUNDING, Severity.FAIL, null, null, "", "target form " + c.to().id(),
                        "Rounded to " + c.to().id() + "'s resolution the tuning is no longer valid (" + n.reason()
                                + "); enter it by hand or use a finer resolution."));
            } else if (note instanceof ConversionNote.RoundingLosesIntegral) {
                out.add(new Finding(Topic.ROUNDING, Severity.FAIL, null, null, "", "target form " + c.to().id(),
                        "Rounded to " + c.to().id() + "'s resolution, " + c.to().integralName() + " becomes the value"
                                + " that turns integral action off; enter it by hand at a finer resolution, or retune."));
            } else if (note instanceof ConversionNote.Rounded n) {
                rounded(c.to(), n, policy, out);
            } else {
                throw new IllegalStateException("no rule for conversion note " + note);
            }
        }
        return out;
    }

    /** The findings of {@code c} under the default policy. */
    public static List<Finding> findings(Conversion c) {
        return findings(c, CheckPolicy.DEFAULT);
    }

    /**
     * The severity of a nearest fit, judged where the loop lives: fail beyond {@code fit_fail_db} /
     * {@code fit_fail_deg} there; warn beyond {@code fit_warn_db} / {@code fit_warn_deg} there, or
     * beyond the fail limits anywhere in the band (the loop band is an estimate without a process);
     * info otherwise.
     */
    static Severity fitSeverity(LawDeviation loop, LawDeviation whole, CheckPolicy p) {
        double failDb = p.get(PolicyKey.FIT_FAIL_DB);
        double failDeg = p.get(PolicyKey.FIT_FAIL_DEG);
        if (loop.gainDb() > failDb || loop.phaseDegrees() > failDeg) {
            return Severity.FAIL;
        }
        if (loop.gainDb() > p.get(PolicyKey.FIT_WARN_DB) || loop.phaseDegrees() > p.get(PolicyKey.FIT_WARN_DEG)
                || whole.gainDb() > failDb || whole.phaseDegrees() > failDeg) {
            return Severity.WARN;
        }
        return Severity.INFO;
    }

    private static void inexact(Conversion c, ConversionNote.Inexact n, CheckPolicy p, List<Finding> out) {
        FormDefinition to = c.to();
        LawDeviation deviation = c.deviation();
        LawDeviation loopDeviation = c.loopDeviation();
        FrequencyBand lives = c.loopBand();
        Severity fitSeverity = fitSeverity(loopDeviation, deviation, p);
        String bandText = "over " + bandText(c.band());
        String devText = "deviates in its feedback path by up to " + Numbers.deviation(loopDeviation.gainDb())
                + " dB and " + Numbers.deviation(loopDeviation.phaseDegrees()) + " deg over " + bandText(lives)
                + " (where the loop lives), and by up to " + Numbers.deviation(deviation.gainDb()) + " dB and "
                + Numbers.deviation(deviation.phaseDegrees()) + " deg " + bandText;
        boolean explained = false;
        if (n.complexZerosRatio().isPresent()) {
            double ratio = n.complexZerosRatio().getAsDouble();
            out.add(new Finding(Topic.REALIZABILITY, fitSeverity, ratio, SERIES_RATIO_LIMIT, "ratio", ASTROM_1995,
                    "The old law has complex zeros (p^2/(d i), the ideal form's Ti/Td, is "
                            + Numbers.significant(ratio, 4) + ", below 4), so a series controller cannot write it."
                            + " The nearest series setting " + devText + "."));
            explained = true;
        }
        double hfSource = n.sourceHighFrequencyGain();
        double hfTarget = n.targetHighFrequencyGain();
        boolean sourceFiltered = Double.isFinite(hfSource);
        boolean targetFiltered = Double.isFinite(hfTarget);
        if (n.derivative() && n.filterBound() && (sourceFiltered != targetFiltered || sourceFiltered
                && Math.abs(20 * Math.log10(hfTarget / hfSource)) > p.get(PolicyKey.FILTER_CHANGE_DB))) {
            String what = switch (to.filter().kind()) {
                case FIXED_RATIO -> "fixes its filter ratio at N = " + Numbers.plain(to.filter().ratio());
                case NONE -> "has no derivative filter";
                default -> "cannot hold the old derivative filter";
            };
            if (sourceFiltered && targetFiltered) {
                double changeDb = 20 * Math.log10(hfTarget / hfSource);
                out.add(new Finding(Topic.FILTER, fitSeverity, changeDb, 0.0, "dB", POLICY,
                        "The new form " + to.id() + " " + what + ": the high-frequency derivative gain changes from "
                                + Numbers.significant(hfSource, 4) + " to " + Numbers.significant(hfTarget, 4)
                                + " %/% (" + Numbers.significant(changeDb, 3) + " dB); the nearest setting "
                                + devText + "."));
            } else if (targetFiltered) {
                out.add(new Finding(Topic.FILTER, fitSeverity, hfTarget, null, "%/%", POLICY,
                        "The old law has no derivative filter (derivative gain unlimited at high frequency); the new form "
                                + to.id() + " " + what + " and caps it at " + Numbers.significant(hfTarget, 4)
                                + " %/%. The new law " + devText + "."));
            } else {
                out.add(new Finding(Topic.FILTER, fitSeverity, hfSource, null, "%/%", POLICY,
                        "The new form " + to.id() + " has no derivative filter: its derivative gain grows without bound "
                                + "where the old law capped it at " + Numbers.significant(hfSource, 4)
                                + " %/%. The new law " + devText + "."));
            }
            explained = true;
        }
        if (!explained && !n.feedbackExact()) {
            out.add(new Finding(Topic.REALIZABILITY, fitSeverity, loopDeviation.gainDb(), p.get(PolicyKey.FIT_FAIL_DB),
                    "dB", POLICY, "The new form " + to.id() + " cannot write the old law exactly; the nearest setting "
                    + devText + "."));
        }
        LawDeviation sp = n.setpoint();
        double warnDb = p.get(PolicyKey.FIT_WARN_DB);
        // only what the feedback path's deviation does not already explain is the weights' doing; it
        // is info on the setpoint path (usually wanted: derivative on the measurement, a weighted
        // setpoint) unless the feedback path changes too where the loop lives
        if (sp.gainDb() > loopDeviation.gainDb() + warnDb
                || sp.phaseDegrees() > loopDeviation.phaseDegrees() + p.get(PolicyKey.FIT_WARN_DEG)) {
            boolean feedbackChanges = fitSeverity != Severity.INFO;
            out.add(new Finding(Topic.REALIZABILITY, feedbackChanges ? Severity.WARN : Severity.INFO, sp.gainDb(),
                    warnDb, "dB", POLICY,
                    (n.feedbackExact() ? "The feedback path is exact, but the" : "The") + " new form " + to.id()
                            + " cannot weight the setpoint as the old does (setpoint weights b, c"
                            + (to.c().adjustable() ? "" : "; its c is fixed at " + Numbers.plain(to.c().defaultValue()))
                            + "): the setpoint path deviates by up to " + Numbers.deviation(sp.gainDb()) + " dB and "
                            + Numbers.deviation(sp.phaseDegrees()) + " deg over " + bandText(lives)
                            + ". Setpoint responses will differ; disturbance responses follow the feedback path"
                            + (feedbackChanges ? ", which changes too." : ", which does not change there.")));
        }
    }

    private static Finding filterSetting(Conversion c, ConversionNote.FilterSettingNeeded n) {
        boolean ratio = n.parameter().equals("n");
        String needed = ratio ? "n = " + (Double.isFinite(n.neededValue()) ? Numbers.significant(n.neededValue(), 4)
                : "off") : "tf = " + Numbers.significant(n.neededValue(), 4) + " " + n.unitSymbol();
        String defaultText = ratio ? "n = " + Numbers.plain(n.defaultValue())
                : "tf = " + Numbers.plain(n.defaultValue()) + " " + n.unitSymbol();
        LawDeviation cost = n.defaultCost();
        StringBuilder m = new StringBuilder("Exact with " + needed + " instead of " + c.to().id() + "'s default "
                + defaultText + ": ");
        if (n.sourceFilterSeconds() == 0) {
            m.append("the old law has no derivative filter, and ").append(needed).append(" writes it so. ");
        } else if (n.sourceFilterKept() && !n.seriesInvolved()) {
            m.append("the old controller's own filter (Tf = ").append(Numbers.significant(n.sourceFilterSeconds(), 4))
                    .append(" s) is kept as it was. ");
        } else if (n.seriesInvolved()) {
            m.append("a series controller filters its derivative lead-lag K(1 + 1/(Ti s))(1 + Td s)/(1 + Tf s), and"
                    + " written in the other structure that same filter time is a different share of the derivative"
                    + " time. ");
        } else {
            m.append("the old filter time Tf = ").append(Numbers.significant(n.sourceFilterSeconds(), 4))
                    .append(" s is a different share of the new derivative time. ");
        }
        m.append("Entering the other values with ").append(defaultText).append(" would move the law by up to ")
                .append(Numbers.deviation(cost.gainDb())).append(" dB and ").append(Numbers.deviation(cost.phaseDegrees()))
                .append(" deg over ").append(bandText(c.loopBand())).append(" (where the loop lives); enter ")
                .append(needed).append('.');
        n.textbookCost().ifPresent(tb -> m.append(" The textbook values (the relations without a filter) with ")
                .append(defaultText).append(" would move it by up to ").append(Numbers.deviation(tb.gainDb()))
                .append(" dB and ").append(Numbers.deviation(tb.phaseDegrees())).append(" deg there."));
        return new Finding(Topic.FILTER, Severity.INFO, cost.gainDb(), null, "dB", ASTROM_1995, m.toString());
    }

    private static Finding readAsOff(FormDefinition to, ConversionNote.ReadAsIntegralOff n) {
        String unit = n.unit();
        return new Finding(Topic.LIMITS, Severity.FAIL, n.value(), n.offValue(), unit, "target form " + to.id(),
                n.parameter() + " = " + Numbers.significant(n.value(), 6) + " " + unit + " is what " + to.id()
                        + " reads as integral action off (" + Numbers.plain(n.offValue()) + " " + unit
                        + (n.offValue() > 0 ? " or more" : "") + "): entered, the loop would lose its integral action"
                        + " and hold an offset. Retune, or pick a form that can hold this integral time.");
    }

    private static Finding outOfRange(FormDefinition to, ConversionNote.OutOfRange n) {
        boolean high = n.high();
        String unit = n.unit();
        return new Finding(Topic.LIMITS, Severity.FAIL, n.value(), n.bound(), unit, "target form " + to.id(),
                n.parameter() + " = " + Numbers.significant(n.value(), 6) + " " + unit + " is "
                        + (high ? "above" : "below") + " what " + to.id() + " accepts (" + (high ? "max " : "min ")
                        + Numbers.plain(n.bound()) + " " + unit + "); the new form cannot hold this tuning."
                        + " Nothing was clipped: retune or pick another form.");
    }

    private static void rounded(FormDefinition to, ConversionNote.Rounded n, CheckPolicy p, List<Finding> out) {
        LawDeviation d = n.moved();
        double infoDb = p.get(PolicyKey.ROUNDING_INFO_DB);
        double warnDb = p.get(PolicyKey.ROUNDING_WARN_DB);
        double warnDeg = p.get(PolicyKey.ROUNDING_WARN_DEG);
        if (d.gainDb() > infoDb || d.phaseDegrees() > p.get(PolicyKey.ROUNDING_INFO_DEG)) {
            // rounding to the nearest step is the best the target can store: it is worth acting on
            // (a form with a finer resolution, or a retune to values it holds) only when it moves
            // the law by more than the resolution margin
            boolean matters = d.gainDb() > warnDb || d.phaseDegrees() > warnDeg;
            out.add(new Finding(Topic.ROUNDING, matters ? Severity.WARN : Severity.INFO, d.gainDb(),
                    matters ? warnDb : infoDb, "dB", POLICY,
                    "Rounding to " + to.id() + "'s resolution (" + n.movedValues() + ") moves the law by up to "
                            + Numbers.deviation(d.gainDb()) + " dB and " + Numbers.deviation(d.phaseDegrees())
                            + " deg" + (matters ? " (beyond " + Numbers.plain(warnDb) + " dB or "
                            + Numbers.plain(warnDeg) + " deg: use a form with a finer resolution,"
                            + " or retune to values the new form can hold)."
                            : "; no value can be entered more precisely, and the move is within "
                            + Numbers.plain(warnDb) + " dB and " + Numbers.plain(warnDeg) + " deg.")));
        }
    }

    private static String bandText(FrequencyBand b) {
        return Numbers.significant(b.lowRadPerSecond(), 3) + " to " + Numbers.significant(b.highRadPerSecond(), 3)
                + " rad/s";
    }
}

package org.loopform.report;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.Map;
import org.loopform.findings.Finding;
import org.loopform.form.Conversion;
import org.loopform.form.Converter;
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormUnits;
import org.loopform.form.WrittenTuning;
import org.loopform.law.ControlLaw;
import org.loopform.units.Numbers;

/** A conversion as text for people and as JSON for tools. */
public final class ConversionReport {

    /** Significant digits for printed values: more than any controller stores. */
    static final int DIGITS = 6;

    private ConversionReport() {
    }

    /** {@code c} and its {@code findings} as text, the source values as {@code sourceValues} gave them. */
    public static String text(Conversion c, java.util.List<Finding> findings, Map<String, String> sourceValues) {
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder();
        sb.append("From ").append(c.from().id()).append("  (").append(c.from().title()).append(')').append(nl);
        TextTable src = new TextTable("parameter", "given", "unit");
        // a value typed with its own unit (ti=120s) is read in that unit, not the form's
        sourceValues.forEach((k, v) -> src.row(k, v, k.equals("action") ? ""
                : isPlainNumber(v) ? FormUnits.of(c.from(), k) : "as typed"));
        sb.append(src.render(2));
        sb.append(nl).append("To   ").append(c.to().id()).append("  (").append(c.to().title()).append(')').append(nl);
        WrittenTuning w = c.parameters();
        WrittenTuning tb = c.textbook();
        TextTable out = tb == null ? new TextTable("parameter", "value", "unit", "enter")
                : new TextTable("parameter", "value", "unit", "enter", "textbook");
        w.values().forEach((k, v) -> {
            String value = FormCodec.show(c.to(), k, v, DIGITS);
            String enter = c.refusal(k) != null ? "do not enter"
                    : FormCodec.show(c.to(), k, c.entered().values().get(k), DIGITS);
            if (tb == null) {
                out.row(k, value, FormUnits.of(c.to(), k), enter);
            } else {
                boolean main = k.equals(c.to().gainName()) || k.equals(c.to().integralName())
                        || k.equals(c.to().derivativeName());
                out.row(k, value, FormUnits.of(c.to(), k), enter,
                        main ? Numbers.significant(tb.values().get(k), 4) : "-");
            }
        });
        if (w.action() != null) {
            if (tb == null) {
                out.row("action", w.action().id(), "", w.action().id());
            } else {
                out.row("action", w.action().id(), "", w.action().id(), w.action().id());
            }
        }
        sb.append(out.render(2));
        c.refused().forEach((k, why) -> sb.append("  ").append(k).append(": do not enter; ").append(why).append('.')
                .append(nl));
        if (tb != null) {
            sb.append("  textbook: the relations for laws without a derivative filter (").append(TEXTBOOK_SOURCE)
                    .append(")");
            if (c.exact()) {
                sb.append(". They differ from the exact values because the old derivative filter enters the"
                        + " conversion; see the filter finding.");
            } else {
                // the textbook values are the old ones only when the structure is the same
                sb.append(c.from().structure() == c.to().structure() ? ", that is the values kept" : "")
                        .append(". The new form cannot write the old law exactly");
                c.textbookLoopDeviation().ifPresent(d -> sb.append(": the textbook values as the new form holds them"
                        + " deviate by up to ").append(Numbers.deviation(d.gainDb())).append(" dB and ")
                        .append(Numbers.deviation(d.phaseDegrees())).append(" deg where the loop lives, the nearest"
                        + " setting by up to ").append(Numbers.deviation(c.loopDeviation().gainDb())).append(" dB and ")
                        .append(Numbers.deviation(c.loopDeviation().phaseDegrees()))
                        .append(" deg (the fit weighs ").append(Numbers.plain(Converter.FIT_SCALE_GAIN_DB))
                        .append(" dB as much as ").append(Numbers.plain(Converter.FIT_SCALE_PHASE_DEG)).append(" deg)"));
                sb.append('.');
            }
            sb.append(nl);
        }
        sb.append(nl);
        if (c.exact()) {
            sb.append("Exact: the new form writes the same control law (both paths compared as rational functions).")
                    .append(nl);
        } else {
            boolean feedbackExact = c.targetLaw().sameFeedbackAs(c.sourceLaw(), ControlLaw.SAME_LAW_TOLERANCE);
            if (feedbackExact) {
                sb.append("Not exact: the feedback path is exact; the setpoint path differs (see the findings).")
                        .append(nl);
            } else {
                sb.append("Not exact: nearest setting; its feedback path deviates by up to ")
                        .append(Numbers.deviation(c.loopDeviation().gainDb())).append(" dB and ")
                        .append(Numbers.deviation(c.loopDeviation().phaseDegrees())).append(" deg where the loop lives (")
                        .append(Numbers.significant(c.loopBand().lowRadPerSecond(), 3)).append(" to ")
                        .append(Numbers.significant(c.loopBand().highRadPerSecond(), 3)).append(" rad/s), and by up to ")
                        .append(Numbers.deviation(c.deviation().gainDb())).append(" dB and ")
                        .append(Numbers.deviation(c.deviation().phaseDegrees())).append(" deg over the whole band (")
                        .append(Numbers.significant(c.band().lowRadPerSecond(), 3)).append(" to ")
                        .append(Numbers.significant(c.band().highRadPerSecond(), 3)).append(" rad/s).").append(nl);
            }
        }
        sb.append(nl).append(assumptionsText(c.assumptions()));
        sb.append(FindingText.render(findings));
        sb.append(nl).append(Cautions.SHORT).append(nl);
        return sb.toString();
    }

    private static boolean isPlainNumber(String text) {
        return text.trim().matches("[-+]?(\\d+\\.?\\d*|\\.\\d+)([eE][-+]?\\d+)?");
    }

    /** "Assumed:" and one line per assumption, or nothing. */
    static String assumptionsText(java.util.List<String> assumptions) {
        if (assumptions.isEmpty()) {
            return "";
        }
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder("Assumed:").append(nl);
        assumptions.forEach(a -> sb.append("  ").append(a).append(nl));
        return sb.append(nl).toString();
    }

    /** Where the textbook relations come from. */
    static final String TEXTBOOK_SOURCE = "Astrom & Hagglund, PID Controllers, 2nd ed., ISA 1995, sec. 3.4";

    /** Puts a written tuning's values, "off" where a filter is switched off. */
    static void putValues(ObjectNode n, WrittenTuning t) {
        t.values().forEach((k, v) -> {
            if (FormCodec.isFilterOff(k, v)) {
                n.put(k, FormCodec.OFF);
            } else {
                n.put(k, v);
            }
        });
    }

    /**
     * Puts the values to enter as the text prints them: a form's resolution where it names one,
     * else {@link #DIGITS} significant digits (the conversion keeps more, so that the checked law is
     * the converted one; a person enters these, and JSON says the same as the text and loops.csv).
     */
    static void putEntered(ObjectNode n, Conversion c) {
        c.entered().values().forEach((k, v) -> {
            if (FormCodec.isFilterOff(k, v)) {
                n.put(k, FormCodec.OFF);
            } else if (c.to().limit(k).resolution() != null) {
                n.put(k, v);
            } else {
                n.put(k, Double.parseDouble(Numbers.significant(v, DIGITS)));
            }
        });
    }

    /** {@code c} and its {@code findings} as JSON. */
    public static String json(Conversion c, java.util.List<Finding> findings) {
        ObjectNode n = Json.object();
        n.put("from", c.from().id());
        n.put("to", c.to().id());
        n.put("exact", c.exact());
        putValues(n.putObject("parameters"), c.parameters());
        ObjectNode units = n.putObject("units");
        c.parameters().values().keySet().forEach(k -> units.put(k, FormUnits.of(c.to(), k)));
        putEntered(n.putObject("entered"), c);
        if (c.textbook() != null) {
            ObjectNode tb = n.putObject("textbook");
            for (String k : java.util.List.of(c.to().gainName(), c.to().integralName(), c.to().derivativeName())) {
                tb.put(k, c.textbook().values().get(k));
            }
        }
        if (!c.refused().isEmpty()) {
            ObjectNode r = n.putObject("do_not_enter");
            c.refused().forEach(r::put);
        }
        if (c.parameters().action() != null) {
            n.put("action", c.parameters().action().id());
        }
        ObjectNode dev = n.putObject("deviation");
        dev.put("gain_db", c.deviation().gainDb());
        dev.put("phase_deg", c.deviation().phaseDegrees());
        ObjectNode loop = n.putObject("loop_deviation");
        loop.put("gain_db", c.loopDeviation().gainDb());
        loop.put("phase_deg", c.loopDeviation().phaseDegrees());
        loop.put("low_rad_s", c.loopBand().lowRadPerSecond());
        loop.put("high_rad_s", c.loopBand().highRadPerSecond());
        com.fasterxml.jackson.databind.node.ArrayNode a = n.putArray("assumptions");
        c.assumptions().forEach(a::add);
        n.set("findings", Json.findings(findings));
        return Json.write(n);
    }

    /** One line per parameter: "kc (%/%): controller gain". */
    public static String describeParameters(FormDefinition f) {
        StringBuilder sb = new StringBuilder();
        f.parameters().forEach(p -> sb.append("  ").append(p.name()).append(" (").append(p.unit()).append("): ")
                .append(p.meaning()).append(p.required() ? "" : p.defaultValue() != null
                        ? ", default " + Numbers.plain(p.defaultValue()) : ", default reverse")
                .append(System.lineSeparator()));
        return sb.toString();
    }

}

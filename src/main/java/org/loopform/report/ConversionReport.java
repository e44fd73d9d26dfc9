package org.loopform.report;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.Map;
import org.loopform.form.Conversion;
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

    public static String text(Conversion c, Map<String, String> sourceValues) {
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder();
        sb.append("From ").append(c.from().id()).append("  (").append(c.from().title()).append(')').append(nl);
        TextTable src = new TextTable("parameter", "given", "unit");
        sourceValues.forEach((k, v) -> src.row(k, v, k.equals("action") ? "" : FormUnits.of(c.from(), k)));
        sb.append(src.render(2));
        sb.append(nl).append("To   ").append(c.to().id()).append("  (").append(c.to().title()).append(')').append(nl);
        TextTable out = new TextTable("parameter", "value", "unit", "enter");
        WrittenTuning w = c.parameters();
        w.values().forEach((k, v) -> out.row(k, Numbers.significant(v, DIGITS), FormUnits.of(c.to(), k),
                c.to().limit(k).resolution() == null ? Numbers.significant(c.entered().values().get(k), DIGITS)
                        : Numbers.plain(c.entered().values().get(k))));
        if (w.action() != null) {
            out.row("action", w.action().id(), "", w.action().id());
        }
        sb.append(out.render(2));
        sb.append(nl);
        if (c.exact()) {
            sb.append("Exact: the target writes the same control law (both paths compared as rational functions).")
                    .append(nl);
        } else {
            boolean feedbackExact = c.targetLaw().sameFeedbackAs(c.sourceLaw(), ControlLaw.SAME_LAW_TOLERANCE);
            if (feedbackExact) {
                sb.append("Not exact: the feedback path is exact; the setpoint path differs (see the findings).")
                        .append(nl);
            } else {
                sb.append("Not exact: nearest setting; its feedback path deviates by up to ")
                        .append(Numbers.deviation(c.deviation().gainDb())).append(" dB and ")
                        .append(Numbers.deviation(c.deviation().phaseDegrees())).append(" deg over ")
                        .append(Numbers.significant(c.band().lowRadPerSecond(), 3)).append(" to ")
                        .append(Numbers.significant(c.band().highRadPerSecond(), 3)).append(" rad/s.").append(nl);
            }
        }
        sb.append(nl).append(FindingText.render(c.findings()));
        sb.append(nl).append(Cautions.SHORT).append(nl);
        return sb.toString();
    }

    public static String json(Conversion c) {
        ObjectNode n = Json.object();
        n.put("from", c.from().id());
        n.put("to", c.to().id());
        n.put("exact", c.exact());
        ObjectNode params = n.putObject("parameters");
        c.parameters().values().forEach(params::put);
        ObjectNode units = n.putObject("units");
        c.parameters().values().keySet().forEach(k -> units.put(k, FormUnits.of(c.to(), k)));
        ObjectNode entered = n.putObject("entered");
        c.entered().values().forEach(entered::put);
        if (c.parameters().action() != null) {
            n.put("action", c.parameters().action().id());
        }
        ObjectNode dev = n.putObject("deviation");
        dev.put("gain_db", c.deviation().gainDb());
        dev.put("phase_deg", c.deviation().phaseDegrees());
        n.set("findings", Json.findings(c.findings()));
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

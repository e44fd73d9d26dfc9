package org.loopform.report;

import org.loopform.findings.Finding;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import java.util.Map;
import org.loopform.check.CheckResult;
import org.loopform.form.Conversion;
import org.loopform.form.Structure;
import org.loopform.tuning.PublishedTuning;
import org.loopform.tuning.ReducedModel;
import org.loopform.units.Numbers;

/**
 * A tuning by a published rule: the rule's own figures, the tuning as published, its conversion
 * into the target form and, when a model is known, the resulting loop (the design loop, or the
 * whole check at the target's scan).
 */
public final class TuneReport {

    private TuneReport() {
    }

    /** The published form's name in reports: "ideal, no derivative filter". */
    static String publishedForm(PublishedTuning t) {
        return t.structure().id() + ", no derivative filter";
    }

    /** "first order plus dead time: k = 1 %/%, tau1 = 2.5 s, theta = 1.47 s". */
    public static String modelText(ReducedModel m) {
        StringBuilder sb = new StringBuilder();
        if (m.integrating()) {
            sb.append("integrating plus dead time: k' = ").append(Numbers.significant(m.gain(), 4)).append(" %/s per %");
        } else {
            sb.append(m.secondOrder() ? "second" : "first").append(" order plus dead time: k = ")
                    .append(Numbers.significant(m.gain(), 4)).append(" %/%, tau1 = ")
                    .append(Numbers.significant(m.lagSeconds(), 4)).append(" s");
        }
        if (m.secondOrder()) {
            sb.append(", tau2 = ").append(Numbers.significant(m.secondLagSeconds(), 4)).append(" s");
        }
        sb.append(", theta = ").append(Numbers.significant(m.deadTimeSeconds(), 4)).append(" s (").append(m.how())
                .append(')');
        return sb.toString();
    }

    private static String figureUnit(String key) {
        return key.endsWith("_s") ? " s" : key.equals("ku") ? " %/%" : "";
    }

    public static String text(PublishedTuning t, Conversion c, java.util.List<Finding> convFindings,
                              Map<String, String> published, CheckResult design,
                              CheckResult check) {
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder();
        sb.append("Rule ").append(t.rule().id()).append(" (").append(t.controller().id().toUpperCase(java.util.Locale.ROOT))
                .append("): ").append(t.rule().source()).append(nl);
        if (t.model() != null) {
            sb.append("  model read: ").append(modelText(t.model())).append(nl);
        }
        t.figures().forEach((k, v) -> sb.append("  ").append(k.replaceAll("_s$", "")).append(" = ")
                .append(Numbers.significant(v, 5)).append(figureUnit(k)).append(nl));
        sb.append("  as published (").append(publishedForm(t)).append("): kc = ")
                .append(Numbers.significant(t.gain(), 5)).append(" %/%, ti = ")
                .append(Numbers.significant(t.integralTimeSeconds(), 5)).append(" s, td = ")
                .append(Numbers.significant(t.derivativeTimeSeconds(), 5)).append(" s").append(nl);
        t.notes().forEach(n -> sb.append("  note: ").append(n).append(nl));
        sb.append(nl);
        if (check != null) {
            // a new loop has no as-found controller: its reference is the rule's law as published, run continuously
            sb.append("The check compares the new controller (as-left) with the rule's law as published (the column"
                    + " 'as published').").append(nl);
            sb.append(CheckReport.text(check, CheckReport.Reference.PUBLISHED));
            return sb.toString();
        }
        if (design != null && design.hasProcess()) {
            sb.append(nl).append("Design loop (the published law on the model, continuous; give --scan for the target"
                    + " loop):").append(nl);
            TextTable tt = new TextTable("figure", "value", "unit");
            // read through the catalogue: "unstable" in place of the margins of a loop that is not stable
            LoopSide d = LoopSide.design(design);
            for (LoopFigure f : List.of(LoopFigure.PHASE_MARGIN, LoopFigure.GAIN_MARGIN, LoopFigure.CROSSOVER,
                    LoopFigure.MAX_SENSITIVITY, LoopFigure.DELAY_MARGIN)) {
                tt.row(f.label(), f.text(d), f.unit());
            }
            tt.row("stability", design.designStability().verdict().word(), "");
            if (design.designStability().isStable()) {
                var sp = design.designSetpoint();
                tt.row("setpoint overshoot", sp.overshootPercent().isPresent()
                        ? Numbers.significant(sp.overshootPercent().getAsDouble(), 3) : "none", "%");
                tt.row("setpoint settling", sp.settlingTimeSeconds().isPresent()
                        ? Numbers.significant(sp.settlingTimeSeconds().getAsDouble(), 3) : "not settled", "s");
                tt.row("load IAE", Numbers.significant(design.designLoad().integralAbsoluteErrorPercentSeconds(), 3),
                        "% s");
            }
            sb.append(tt.render(2));
        }
        sb.append(nl).append(ConversionReport.text(c, convFindings, published));
        return sb.toString();
    }

    public static String json(PublishedTuning t, Conversion c, java.util.List<Finding> convFindings, CheckResult design,
                              CheckResult check) {
        return json(t, c, convFindings, design, check, null);
    }

    /** As above, with {@code "robust"} ({@link RobustReport#json}) when {@code robust} is given. */
    public static String json(PublishedTuning t, Conversion c, java.util.List<Finding> convFindings, CheckResult design,
                              CheckResult check, org.loopform.tuning.RobustResult robust) {
        return Json.write(jsonNode(t, c, convFindings, design, check, robust));
    }

    /** {@code tune}'s JSON as a node, for documents that carry a tuning by rule (the demo's chain). */
    public static ObjectNode jsonNode(PublishedTuning t, Conversion c, java.util.List<Finding> convFindings,
                                      CheckResult design, CheckResult check, org.loopform.tuning.RobustResult robust) {
        ObjectNode n = Json.object();
        RuleTuningText.put(n, t);
        n.put("from", c.from().id());
        n.put("to", c.to().id());
        n.put("exact", c.exact());
        ConversionReport.putValues(n.putObject("parameters"), c.parameters());
        ObjectNode units = n.putObject("units");
        c.parameters().values().keySet().forEach(k -> units.put(k, org.loopform.form.FormUnits.of(c.to(), k)));
        ConversionReport.putEntered(n.putObject("entered"), c);
        if (c.parameters().action() != null) {
            n.put("action", c.parameters().action().id());
        }
        if (design != null && design.hasProcess()) {
            n.set("design", CheckReport.figures(design.designMargins(), design.designStability(),
                    design.designSetpoint(), design.designLoad(), Double.NaN));
        } else {
            n.putNull("design");
        }
        if (check != null) {
            n.set("check", CheckReport.node(check));
        } else {
            n.putNull("check");
        }
        n.set("findings", Json.findings(check != null ? check.findings() : convFindings));
        if (robust != null) {
            n.set("robust", RobustReport.json(robust));
        }
        return n;
    }

    /** True when the published structure is the series one (its catalog form then needs n=off). */
    public static boolean series(PublishedTuning t) {
        return t.structure() == Structure.SERIES;
    }
}

package org.loopform.report;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import java.util.Locale;
import org.loopform.form.DiscreteAlgorithm;
import org.loopform.form.FilterSpec;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormParameter;
import org.loopform.form.ParameterLimit;
import org.loopform.form.Weight;
import org.loopform.units.Numbers;

/** A form described for people (text) and tools (JSON). */
public final class FormReport {
    private FormReport() {
    }

    private static String lower(Enum<?> e) {
        return e.name().toLowerCase(Locale.ROOT);
    }

    public static String text(FormDefinition f) {
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder();
        sb.append(f.id()).append(": ").append(f.title()).append(nl);
        if (!f.description().isBlank()) {
            sb.append("  ").append(f.description().strip().replace("\n", nl + "  ")).append(nl);
        }
        sb.append(nl);
        sb.append("structure   ").append(f.structure().id()).append(nl);
        sb.append("gain        written as ").append(lower(f.gain().writing())).append(", basis ")
                .append(lower(f.gain().basis())).append(", action ")
                .append(f.gain().sign() == org.loopform.form.SignConvention.SIGNED ? "in the sign of the gain"
                        : "set apart (reverse|direct)").append(nl);
        sb.append("integral    written as ").append(lower(f.integral().writing())).append(" (")
                .append(f.integral().unit().symbol()).append("), off when ")
                .append(Numbers.plain(f.integral().offValue())).append(nl);
        sb.append("derivative  written as ").append(lower(f.derivative().writing())).append(" (")
                .append(f.derivative().unit().symbol()).append(")").append(nl);
        sb.append("filter      ").append(filterText(f.filter())).append(nl);
        sb.append("weights     b ").append(weightText(f.b())).append(", c ").append(weightText(f.c())).append(nl);
        DiscreteAlgorithm a = f.algorithm();
        sb.append("algorithm   ").append(lower(a.kind())).append(", integral ").append(lower(a.integral()))
                .append(", derivative ").append(lower(a.derivative())).append(", anti-windup ")
                .append(lower(a.antiWindup())).append(", output ").append(Numbers.plain(a.outputLowPercent()))
                .append("..").append(Numbers.plain(a.outputHighPercent())).append(" %").append(nl);
        sb.append("scan        ").append(scanText(a)).append(nl);
        sb.append(nl);
        TextTable t = new TextTable("parameter", "unit", "meaning", "min", "max", "resolution");
        for (FormParameter p : f.parameters()) {
            ParameterLimit l = f.limit(p.name());
            t.row(p.name(), p.unit(), p.meaning() + (p.required() ? "" : p.defaultValue() != null
                    ? " (default " + Numbers.plain(p.defaultValue()) + ")" : " (default reverse)"),
                    l.min() == null ? "-" : Numbers.plain(l.min()), l.max() == null ? "-" : Numbers.plain(l.max()),
                    l.resolution() == null ? "-" : Numbers.plain(l.resolution()));
        }
        sb.append(t.render(0));
        return sb.toString();
    }

    private static String filterText(FilterSpec s) {
        return switch (s.kind()) {
            case NONE -> "none";
            case FIXED_RATIO -> "fixed ratio N = " + Numbers.plain(s.ratio()) + " (Tf = Td/N), on the "
                    + lower(s.placement());
            case RATIO -> "adjustable ratio n, default " + Numbers.plain(s.ratio()) + " (Tf = Td/n; n=off: no filter),"
                    + " on the " + lower(s.placement());
            case TIME_CONSTANT -> "time constant tf in " + s.unit().symbol() + ", default "
                    + Numbers.plain(s.defaultTime()) + " (tf=off: no filter), on the " + lower(s.placement());
        };
    }

    private static String weightText(Weight w) {
        return w.adjustable() ? "adjustable " + Numbers.plain(w.min()) + ".." + Numbers.plain(w.max()) + " (default "
                + Numbers.plain(w.defaultValue()) + ")" : "fixed " + Numbers.plain(w.defaultValue());
    }

    private static String scanText(DiscreteAlgorithm a) {
        if (!a.allowedScansSeconds().isEmpty()) {
            return "one of " + String.join(", ", a.allowedScansSeconds().stream().map(h -> Numbers.plain(h) + " s")
                    .toList());
        }
        if (a.maxScanSeconds() == Double.MAX_VALUE) {
            return a.minScanSeconds() > 0 ? "at least " + Numbers.plain(a.minScanSeconds()) + " s" : "any";
        }
        return Numbers.plain(a.minScanSeconds()) + " s to " + Numbers.plain(a.maxScanSeconds()) + " s";
    }

    public static ObjectNode node(FormDefinition f) {
        ObjectNode n = Json.object();
        n.put("id", f.id());
        n.put("title", f.title());
        n.put("description", f.description().strip());
        n.put("structure", f.structure().id());
        ObjectNode g = n.putObject("gain");
        g.put("as", lower(f.gain().writing()));
        g.put("basis", lower(f.gain().basis()));
        g.put("sign", lower(f.gain().sign()));
        ObjectNode i = n.putObject("integral");
        i.put("as", lower(f.integral().writing()));
        i.put("unit", f.integral().unit().symbol());
        i.put("off", f.integral().offValue());
        ObjectNode d = n.putObject("derivative");
        d.put("as", lower(f.derivative().writing()));
        d.put("unit", f.derivative().unit().symbol());
        ObjectNode fl = n.putObject("filter");
        fl.put("kind", lower(f.filter().kind()));
        fl.put("placement", lower(f.filter().placement()));
        fl.put("ratio", f.filter().ratio());
        ArrayNode params = n.putArray("parameters");
        for (FormParameter p : f.parameters()) {
            ObjectNode pn = params.addObject();
            pn.put("name", p.name());
            pn.put("unit", p.unit());
            pn.put("meaning", p.meaning());
            pn.put("required", p.required());
            ParameterLimit l = f.limit(p.name());
            Json.putNumber(pn, "min", l.min());
            Json.putNumber(pn, "max", l.max());
            Json.putNumber(pn, "resolution", l.resolution());
        }
        DiscreteAlgorithm a = f.algorithm();
        ObjectNode an = n.putObject("algorithm");
        an.put("kind", lower(a.kind()));
        an.put("integral", lower(a.integral()));
        an.put("derivative", lower(a.derivative()));
        an.put("anti_windup", lower(a.antiWindup()));
        an.put("output_low_pct", a.outputLowPercent());
        an.put("output_high_pct", a.outputHighPercent());
        return n;
    }

    public static String json(FormDefinition f) {
        return Json.write(node(f));
    }

    public static String listJson(List<FormDefinition> forms) {
        ObjectNode root = Json.object();
        ArrayNode a = root.putArray("forms");
        for (FormDefinition f : forms) {
            ObjectNode n = a.addObject();
            n.put("id", f.id());
            n.put("structure", f.structure().id());
            n.put("title", f.title());
            ArrayNode p = n.putArray("parameters");
            f.parameterNames().forEach(p::add);
        }
        return Json.write(root);
    }

    /**
     * The result of checking a form file: {@code {"file", "valid", "id" (when valid), "problems"}}.
     * {@code id} is null when the file has problems.
     */
    public static String checkJson(String file, String id, List<String> problems) {
        ObjectNode n = Json.object();
        n.put("file", file);
        n.put("valid", id != null);
        if (id != null) {
            n.put("id", id);
        }
        ArrayNode p = n.putArray("problems");
        problems.forEach(p::add);
        return Json.write(n);
    }
}

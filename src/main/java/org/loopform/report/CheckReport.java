package org.loopform.report;

import com.fasterxml.jackson.databind.node.ObjectNode;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.StepMetrics;
import org.loopform.check.CheckResult;
import org.loopform.form.Conversion;
import org.loopform.form.FormCodec;
import org.loopform.form.FormUnits;
import org.loopform.units.Numbers;

/** A loop check as a side-by-side table for people and as JSON for tools. */
public final class CheckReport {

    private CheckReport() {
    }

    private static String fmt(double v, int digits) {
        return Numbers.significant(v, digits);
    }

    /**
     * How the text names the loop the new controller is compared with: the old controller as found,
     * or, for a new loop tuned by a rule, the rule's law as published.
     */
    public record Reference(String column, String loop, String law, String noScan) {
        public static final Reference AS_FOUND = new Reference("as-found", "the as-found loop", "old law",
                "no scan was given for the old controller, so the as-found loop runs its law continuously");
        public static final Reference PUBLISHED = new Reference("as published", "the published law's loop",
                "the published law", "the published law has no scan, so it runs continuously");
    }

    public static String text(CheckResult r) {
        return text(r, Reference.AS_FOUND);
    }

    /** As {@link #text(CheckResult)}, the reference loop named as {@code ref} says. */
    public static String text(CheckResult r, Reference ref) {
        String nl = System.lineSeparator();
        Conversion c = r.conversion();
        StringBuilder sb = new StringBuilder();
        sb.append(r.loop().tag()).append(": ").append(c.from().id()).append(" -> ").append(c.to().id()).append(" at a ")
                .append(Numbers.plain(r.scanSeconds())).append(" s scan").append("    verdict: ")
                .append(r.verdict().id().toUpperCase(java.util.Locale.ROOT))
                .append(r.hasProcess() ? "" : " (no process model: stability not checked)").append(nl).append(nl);
        TextTable values = new TextTable("enter", "value", "unit", "converted");
        c.entered().values().forEach((k, v) -> values.row(k, c.refusal(k) != null ? "do not enter"
                : FormCodec.show(c.to(), k, v, 6), FormUnits.of(c.to(), k),
                FormCodec.show(c.to(), k, c.parameters().values().get(k), 6)));
        if (c.entered().action() != null) {
            values.row("action", c.entered().action().id(), "", c.entered().action().id());
        }
        sb.append(values.render(2));
        c.refused().forEach((k, why) -> sb.append("  ").append(k).append(": do not enter; ").append(why).append('.')
                .append(nl));
        sb.append("  conversion: ").append(c.exact() ? "exact" : "nearest setting, feedback path within "
                + Numbers.deviation(c.loopDeviation().gainDb()) + " dB and "
                + Numbers.deviation(c.loopDeviation().phaseDegrees()) + " deg where the loop lives ("
                + Numbers.significant(c.loopBand().lowRadPerSecond(), 3) + " to "
                + Numbers.significant(c.loopBand().highRadPerSecond(), 3) + " rad/s), "
                + Numbers.deviation(c.deviation().gainDb()) + " dB and " + Numbers.deviation(c.deviation().phaseDegrees())
                + " deg over the whole band").append(nl);
        sb.append("  new controller as run vs ").append(ref.law()).append(": up to ").append(Numbers.deviation(r.mismatch().gainDb())).append(" dB, ")
                .append(Numbers.deviation(r.mismatch().phaseDegrees())).append(" deg").append(nl).append(nl);
        if (r.hasProcess()) {
            TextTable t = new TextTable("figure", ref.column(), "as-left", "unit");
            LoopSide d = LoopSide.design(r);
            LoopSide g = LoopSide.target(r);
            for (LoopFigure f : LoopFigure.tableOrder()) {
                if (f.shown(d, g)) {
                    t.row(f.label(), f.text(d), f.text(g), f.unit());
                }
            }
            sb.append(t.render(2));
            var sp = r.targetRun().setpoint();
            sb.append("  Steps of ").append(fmt(r.steps().setpointStepPercent(), 3)).append(" % (setpoint) and ")
                    .append(fmt(r.steps().loadStepPercent(), 3)).append(" % at the process input (load) ").append(aboutOperatingPoint(r.steps())).append(", over ")
                    .append(fmt(sp.timeSeconds(sp.size() - 1), 4)).append(" s; ");
            if (r.referenceStepSeconds() > 0 && r.loop().sourceScanSeconds() == null) {
                sb.append(ref.noScan()).append(": simulated on ").append(fmt(r.referenceStepSeconds(), 3))
                        .append(" s and ").append(fmt(2 * r.referenceStepSeconds(), 3))
                        .append(" s steps and extrapolated; estimated PV error under ")
                        .append(fmt(r.referenceErrorPercent(), 2)).append(" %.");
            } else {
                sb.append("the as-found loop runs the old controller's own algorithm at its scan.");
            }
            sb.append(nl);
            sb.append("  Stability: ").append(ref.column()).append(" ").append(r.designStability().verdict().word()).append(" (")
                    .append(r.designStability().test().describe()).append("); as-left ")
                    .append(r.targetStability().verdict().word()).append(" (")
                    .append(r.targetStability().test().describe()).append(")").append(nl)
                    .append("    as-left: ").append(r.targetStability().explanation()).append(nl);
            notStable(r, ref).ifPresent(note -> sb.append("  ").append(notStableLabel(r)).append(": ").append(note)
                    .append(nl));
        } else {
            sb.append("  No process model: only the controller and the sampling rules were checked.").append(nl);
        }
        sb.append(nl).append(ConversionReport.assumptionsText(c.assumptions()));
        sb.append(FindingText.render(r.findings()));
        sb.append(nl).append(Cautions.SHORT).append(nl);
        return sb.toString();
    }

    /**
     * Which loops of {@code r} are not stable and what that leaves out, e.g. "the as-left loop is
     * unstable; its margins, Ms and responses are left out: margins are figures of safety only for a
     * stable loop, and the responses are held only by the output limits."; empty when both are stable
     * (or without a process model).
     */
    static java.util.Optional<String> notStable(CheckResult r) {
        return notStable(r, Reference.AS_FOUND);
    }

    static java.util.Optional<String> notStable(CheckResult r, Reference ref) {
        if (!r.hasProcess()) {
            return java.util.Optional.empty();
        }
        java.util.List<String> loops = new java.util.ArrayList<>();
        if (!r.designStability().isStable()) {
            loops.add(ref.loop() + " is " + r.designStability().verdict().word());
        }
        if (!r.targetStability().isStable()) {
            loops.add("the as-left loop is " + r.targetStability().verdict().word());
        }
        if (loops.isEmpty()) {
            return java.util.Optional.empty();
        }
        return java.util.Optional.of(String.join(" and ", loops) + "; " + (loops.size() == 1 ? "its" : "their")
                + " margins, Ms and responses are left out: margins are figures of safety only for a stable loop,"
                + " and the responses are held only by the output limits.");
    }

    /** "UNSTABLE" when a loop of {@code r} is unstable, otherwise "MARGINAL". */
    static String notStableLabel(CheckResult r) {
        boolean unstable = r.designStability().verdict() == org.loopform.analysis.Stability.UNSTABLE
                || r.targetStability().verdict() == org.loopform.analysis.Stability.UNSTABLE;
        return unstable ? "UNSTABLE" : "MARGINAL";
    }

    /** The scan of the design loop when it runs the source's own algorithm; NaN for the continuous design. */
    static double designScanSeconds(CheckResult r) {
        return LoopSide.designScanSeconds(r);
    }

    /** One loop's figures as JSON (continuous: {@code scanSeconds} NaN); see {@link #figures(LoopSide)}. */
    static ObjectNode figures(LoopMargins m, org.loopform.analysis.LoopStability st, StepMetrics sp,
                              StepMetrics load, double scanSeconds) {
        return figures(new LoopSide(m, st, sp, load, scanSeconds));
    }

    /**
     * One loop's figures as JSON: the catalogue's margins ({@link LoopFigure}), the margins' notes,
     * the stability, and the step figures in their objects; every figure is null for a loop that is
     * not stable, and the margin notes say why.
     */
    static ObjectNode figures(LoopSide side) {
        ObjectNode n = Json.object();
        LoopFigure.inGroup(LoopFigure.Group.MARGINS).forEach(f -> f.putJson(n, side));
        MarginFigures.putNotes(n, side.margins());
        org.loopform.analysis.LoopStability st = side.stability();
        if (!st.isStable()) {
            // the margins are null: say why, as for any margin that does not exist
            String why = "the loop is " + st.verdict().word() + ": margins are figures of safety only for a stable loop";
            n.put("gain_margin_note", why);
            n.put("phase_margin_note", why);
            n.put("delay_margin_note", why);
        }
        n.put("stability", st.verdict().word());
        n.put("stability_test", st.test().describe());
        if (st.unstablePoles() == Integer.MAX_VALUE) {
            n.put("unstable_poles", "infinite");
        } else {
            n.put("unstable_poles", st.unstablePoles());
        }
        Json.putNumber(n, "largest_pole_magnitude", st.largestPoleMagnitude().isPresent()
                ? st.largestPoleMagnitude().getAsDouble() : null);
        for (LoopFigure.Group g : LoopFigure.Group.values()) {
            if (!g.response()) {
                continue;
            }
            ObjectNode o = n.putObject(g.jsonObject());
            // null for a loop that is not stable: its responses are held only by its output limits (LoopFigure.read)
            LoopFigure.inGroup(g).forEach(f -> f.putJson(o, side));
        }
        return n;
    }

    public static ObjectNode node(CheckResult r) {
        ObjectNode n = Json.object();
        Conversion c = r.conversion();
        n.put("tag", r.loop().tag());
        n.put("verdict", r.verdict().id());
        n.put("scan_s", r.scanSeconds());
        ObjectNode p = n.putObject("parameters");
        p.put("from", c.from().id());
        p.put("to", c.to().id());
        p.put("exact", c.exact());
        ConversionReport.putValues(p.putObject("converted"), c.parameters());
        ConversionReport.putEntered(p.putObject("entered"), c);
        if (!c.refused().isEmpty()) {
            ObjectNode dne = p.putObject("do_not_enter");
            c.refused().forEach(dne::put);
        }
        ObjectNode units = p.putObject("units");
        c.parameters().values().keySet().forEach(k -> units.put(k, FormUnits.of(c.to(), k)));
        if (c.entered().action() != null) {
            p.put("action", c.entered().action().id());
        }
        ObjectNode dev = p.putObject("deviation");
        dev.put("gain_db", c.deviation().gainDb());
        dev.put("phase_deg", c.deviation().phaseDegrees());
        if (r.hasProcess()) {
            n.set("design", figures(LoopSide.design(r)));
            n.set("target", figures(LoopSide.target(r)));
        } else {
            n.putNull("design");
            n.putNull("target");
        }
        ObjectNode mm = n.putObject("controller_mismatch");
        mm.put("gain_db", r.mismatch().gainDb());
        mm.put("phase_deg", r.mismatch().phaseDegrees());
        if (r.hasProcess()) {
            ObjectNode steps = n.putObject("steps");
            steps.put("setpoint_pct", r.steps().setpointStepPercent());
            steps.put("load_pct", r.steps().loadStepPercent());
            ObjectNode ref = n.putObject("reference");
            ref.put("step_s", r.referenceStepSeconds());
            ref.put("pv_error_pct", r.referenceErrorPercent());
        }
        com.fasterxml.jackson.databind.node.ArrayNode as = n.putArray("assumptions");
        c.assumptions().forEach(as::add);
        n.set("findings", Json.findings(r.findings()));
        return n;
    }

    public static String json(CheckResult r) {
        return Json.write(node(r));
    }

    /** Where the steps start: "about 50 %" (PV and output), or the output named when it is not 50 %. */
    static String aboutOperatingPoint(org.loopform.simulate.StepTest steps) {
        return steps.operatingOutputPercent() == steps.operatingPvPercent()
                ? "about " + fmt(steps.operatingPvPercent(), 3) + " %"
                : "about " + fmt(steps.operatingPvPercent(), 3) + " % PV and " + fmt(steps.operatingOutputPercent(), 3)
                        + " % output (the middle of the new form's output limits)";
    }
}

package org.loopform.report;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.OptionalDouble;
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

    private static String fmt(OptionalDouble v, int digits) {
        return v.isPresent() ? Numbers.significant(v.getAsDouble(), digits) : "none";
    }

    private static String fmt(double v, int digits) {
        return Numbers.significant(v, digits);
    }

    public static String text(CheckResult r) {
        String nl = System.lineSeparator();
        Conversion c = r.conversion();
        StringBuilder sb = new StringBuilder();
        sb.append(r.loop().tag()).append(": ").append(c.from().id()).append(" -> ").append(c.to().id()).append(" at a ")
                .append(Numbers.plain(r.scanSeconds())).append(" s scan").append("    verdict: ")
                .append(r.verdict().id().toUpperCase(java.util.Locale.ROOT)).append(nl).append(nl);
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
                + Numbers.deviation(c.deviation().gainDb()) + " dB and " + Numbers.deviation(c.deviation().phaseDegrees()) + " deg").append(nl);
        sb.append("  new controller as run vs old law: up to ").append(Numbers.deviation(r.mismatch().gainDb())).append(" dB, ")
                .append(Numbers.deviation(r.mismatch().phaseDegrees())).append(" deg").append(nl).append(nl);
        if (r.hasProcess()) {
            TextTable t = new TextTable("figure", "as-found", "as-left", "unit");
            LoopMargins d = r.designMargins();
            LoopMargins g = r.targetMargins();
            t.row("phase margin", MarginFigures.phaseMargin(d, 3), MarginFigures.phaseMargin(g, 3), "deg");
            t.row("gain margin", MarginFigures.gainMargin(d, 3), MarginFigures.gainMargin(g, 3), "ratio");
            if (MarginFigures.hasLowerGainMargin(d, g)) {
                t.row("lower gain margin", MarginFigures.lowerGainMargin(d, 3), MarginFigures.lowerGainMargin(g, 3),
                        "ratio");
            }
            t.row("crossover", MarginFigures.crossover(d, 3), MarginFigures.crossover(g, 3), "rad/s");
            t.row("max sensitivity Ms", fmt(d.maximumSensitivity(), 3), fmt(g.maximumSensitivity(), 3), "ratio");
            t.row("delay margin", MarginFigures.delayMargin(d, 3), MarginFigures.delayMargin(g, 3), "s");
            t.row("delay margin in scans", MarginFigures.delayMarginScans(d, designScanSeconds(r), 3),
                    MarginFigures.delayMarginScans(g, r.scanSeconds(), 3), "scans");
            StepMetrics ds = r.designSetpoint();
            StepMetrics ts = r.targetSetpoint();
            t.row("setpoint step IAE", fmt(ds.integralAbsoluteErrorPercentSeconds(), 4),
                    fmt(ts.integralAbsoluteErrorPercentSeconds(), 4), "%*s");
            t.row("setpoint overshoot", fmt(ds.overshootPercent(), 3), fmt(ts.overshootPercent(), 3), "% of step");
            t.row("setpoint settling (2 %)", fmt(ds.settlingTimeSeconds(), 4), fmt(ts.settlingTimeSeconds(), 4), "s");
            StepMetrics dl = r.designLoad();
            StepMetrics tl = r.targetLoad();
            t.row("load step IAE", fmt(dl.integralAbsoluteErrorPercentSeconds(), 4),
                    fmt(tl.integralAbsoluteErrorPercentSeconds(), 4), "%*s");
            t.row("load step peak", fmt(dl.peakDeviationPercent(), 4), fmt(tl.peakDeviationPercent(), 4), "%");
            t.row("output travel (load)", fmt(dl.outputTravelPercent(), 4), fmt(tl.outputTravelPercent(), 4), "%");
            sb.append(t.render(2));
            var sp = r.targetRun().setpoint();
            sb.append("  Steps of ").append(fmt(r.steps().setpointStepPercent(), 3)).append(" % (setpoint) and ")
                    .append(fmt(r.steps().loadStepPercent(), 3)).append(" % at the process input (load) ").append(aboutOperatingPoint(r.steps())).append(", over ")
                    .append(fmt(sp.timeSeconds(sp.size() - 1), 4)).append(" s; ");
            if (r.referenceStepSeconds() > 0 && r.loop().sourceScanSeconds() == null) {
                sb.append("no scan was given for the old controller, so the as-found loop runs its law continuously: simulated on ").append(fmt(r.referenceStepSeconds(), 3))
                        .append(" s and ").append(fmt(2 * r.referenceStepSeconds(), 3))
                        .append(" s steps and extrapolated; estimated PV error under ")
                        .append(fmt(r.referenceErrorPercent(), 2)).append(" %.");
            } else {
                sb.append("the as-found loop runs the old controller's own algorithm at its scan.");
            }
            sb.append(nl);
            sb.append("  Stability: as-found ").append(r.designStability().verdict().word()).append(" (")
                    .append(r.designStability().test().describe()).append("); as-left ")
                    .append(r.targetStability().verdict().word()).append(" (")
                    .append(r.targetStability().test().describe()).append(")").append(nl)
                    .append("    as-left: ").append(r.targetStability().explanation()).append(nl);
            if (!r.designStability().isStable() || !r.targetStability().isStable()) {
                boolean design = !r.designStability().isStable();
                sb.append("  ").append((design ? r.designStability() : r.targetStability()).verdict().word()
                        .toUpperCase(java.util.Locale.ROOT)).append(": ").append(design ? "the as-found loop"
                        : "the as-left loop").append(" is not stable; its responses are held only by the output limits"
                        + " and are not figures to compare.").append(nl);
            }
        } else {
            sb.append("  No process model: only the controller and the sampling rules were checked.").append(nl);
        }
        sb.append(nl).append(ConversionReport.assumptionsText(c.assumptions()));
        sb.append(FindingText.render(r.findings()));
        sb.append(nl).append(Cautions.SHORT).append(nl);
        return sb.toString();
    }

    private static void put(ObjectNode n, String key, OptionalDouble v) {
        Json.putNumber(n, key, v.isPresent() ? v.getAsDouble() : null);
    }

    /** The scan of the design loop when it runs the source's own algorithm; NaN for the continuous design. */
    static double designScanSeconds(CheckResult r) {
        Double s = r.loop().sourceScanSeconds();
        return s != null ? s : Double.NaN;
    }

    static ObjectNode figures(LoopMargins m, org.loopform.analysis.LoopStability st, StepMetrics sp,
                              StepMetrics load, double scanSeconds) {
        ObjectNode n = Json.object();
        put(n, "phase_margin_deg", m.phaseMarginDegrees());
        put(n, "gain_margin", m.gainMargin());
        put(n, "crossover_rad_s", m.crossoverRadPerSecond());
        Json.putNumber(n, "ms", m.maximumSensitivity());
        put(n, "delay_margin_s", m.delayMarginSeconds());
        MarginFigures.putJson(n, m, scanSeconds);
        n.put("stability", st.verdict().word());
        n.put("stability_test", st.test().describe());
        if (st.unstablePoles() == Integer.MAX_VALUE) {
            n.put("unstable_poles", "infinite");
        } else {
            n.put("unstable_poles", st.unstablePoles());
        }
        put(n, "largest_pole_magnitude", st.largestPoleMagnitude());
        if (!st.isStable()) {
            // the responses of an unstable loop (held only by its output limits) describe nothing to compare
            ObjectNode s = n.putObject("setpoint");
            s.putNull("iae");
            s.putNull("overshoot_pct");
            s.putNull("settling_s");
            ObjectNode l = n.putObject("load");
            l.putNull("iae");
            l.putNull("peak");
            l.putNull("output_travel");
            return n;
        }
        ObjectNode s = n.putObject("setpoint");
        Json.putNumber(s, "iae", sp.integralAbsoluteErrorPercentSeconds());
        put(s, "overshoot_pct", sp.overshootPercent());
        put(s, "settling_s", sp.settlingTimeSeconds());
        ObjectNode l = n.putObject("load");
        Json.putNumber(l, "iae", load.integralAbsoluteErrorPercentSeconds());
        Json.putNumber(l, "peak", load.peakDeviationPercent());
        Json.putNumber(l, "output_travel", load.outputTravelPercent());
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
        ConversionReport.putValues(p.putObject("entered"), c.entered());
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
            n.set("design", figures(r.designMargins(), r.designStability(), r.designSetpoint(), r.designLoad(),
                    designScanSeconds(r)));
            n.set("target", figures(r.targetMargins(), r.targetStability(), r.targetSetpoint(), r.targetLoad(),
                    r.scanSeconds()));
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

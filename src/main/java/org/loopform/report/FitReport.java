package org.loopform.report;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import org.loopform.identify.DataFinding;
import org.loopform.identify.GraphicalEstimate;
import org.loopform.identify.ModelFit;
import org.loopform.identify.ModelKind;
import org.loopform.identify.RelayResult;
import org.loopform.identify.StepTestResult;
import org.loopform.units.Numbers;
import org.loopform.units.Span;

/** What {@code loopform fit} found: models with intervals, estimates, findings; or a relay test's cycle. */
public final class FitReport {

    private FitReport() {
    }

    /**
     * How {@code fit} read its record, stated in every output so that no scaling or time unit is assumed unseen.
     *
     * @param pvSpan the PV's span in the record's units (0..100 when the record was declared in percent)
     * @param outputSpan the output's span in the record's units
     * @param percentDeclared true when the record was declared already in percent of span (--percent-of-span)
     * @param timeColumn the time column's name
     * @param timeReadAs how it was read: "ISO-8601 timestamps" or "numbers in s" (min, h)
     */
    public record Reading(Span pvSpan, Span outputSpan, boolean percentDeclared, String timeColumn,
                          String timeReadAs) {

        /** One line of text, ending with a line separator. */
        String text() {
            String nl = System.lineSeparator();
            String spans = percentDeclared
                    ? "PV and output declared already in % of span (--percent-of-span)"
                    : "PV span " + pvSpan + " and output span " + outputSpan + " in the record's units (--pv-range,"
                    + " --out-range), put in % of span";
            return "Record read: " + spans + "; time column '" + timeColumn + "' read as " + timeReadAs + "." + nl;
        }

        ObjectNode json() {
            ObjectNode o = Json.object();
            o.put("spans_from", percentDeclared ? "percent-of-span" : "ranges");
            o.put("pv_span", pvSpan.toString());
            o.put("output_span", outputSpan.toString());
            o.put("time_column", timeColumn);
            o.put("time_read_as", timeReadAs);
            return o;
        }

        String comment() {
            return percentDeclared ? "# the record was declared already in % of span (--percent-of-span)\n"
                    : "# the record was read with PV span " + pvSpan + " and output span " + outputSpan
                    + " (its units), time as " + timeReadAs + "\n";
        }
    }

    private static String v(double x) {
        return Double.isFinite(x) ? Numbers.significant(x, 4) : "-";
    }

    private static String interval(double lo, double hi) {
        return Double.isFinite(lo) && Double.isFinite(hi) ? v(lo) + " .. " + v(hi) : "not determined";
    }

    public static String text(StepTestResult r, Reading reading) {
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder(reading.text());
        sb.append("Step test: first output step ").append(v(r.stepPercent())).append(" % of span; PV noise ")
                .append(v(r.noisePercent())).append(" % of span (standard deviation)").append(nl);
        for (GraphicalEstimate e : r.estimates()) {
            sb.append("  ").append(e.method()).append(" two-point estimate: K = ").append(v(e.gain())).append(" %/%, T = ")
                    .append(v(e.timeConstantSeconds())).append(" s, L = ").append(v(e.deadTimeSeconds())).append(" s")
                    .append(nl);
        }
        for (ModelFit f : r.fits()) {
            sb.append(nl).append(f.kind().title()).append(f.kind() == r.recommended() ? "  (recommended)" : "")
                    .append(nl);
            TextTable t = new TextTable("parameter", "value", "95 % interval", "unit");
            if (f.kind() == ModelKind.IPDT) {
                t.row("slope Kv", v(f.gain()), interval(f.gainLow(), f.gainHigh()), "%/s per %");
            } else {
                t.row("gain K", v(f.gain()), interval(f.gainLow(), f.gainHigh()), "%/%");
                t.row("time constant", v(f.lagSeconds()), interval(f.lagLow(), f.lagHigh()), "s");
            }
            if (f.kind() == ModelKind.SOPDT) {
                t.row("time constant 2", v(f.secondLagSeconds()), interval(f.secondLagLow(), f.secondLagHigh()), "s");
            }
            t.row("dead time", v(f.deadTimeSeconds()), interval(f.deadTimeLow(), f.deadTimeHigh()) + " (profile)", "s");
            t.row("RMS error", v(f.rmsErrorPercent()), "", "% of span");
            t.row("R^2", v(f.rSquared()), "", "");
            sb.append(t.render(2));
        }
        sb.append(nl).append("Recommended: ").append(r.reason()).append('.').append(nl);
        findings(sb, r.findings());
        sb.append(nl).append("Intervals assume the model's form is right and the noise independent of the output (a"
                + " lag-one residual correlation widens them), and the output's moves logged when they happen (the"
                + " dead time's upper end allows one logging interval); check the fit against the record (--plot)"
                + " before tuning on it.")
                .append(nl).append(Cautions.SHORT).append(nl);
        return sb.toString();
    }

    private static void findings(StringBuilder sb, List<DataFinding> fs) {
        String nl = System.lineSeparator();
        if (fs.isEmpty()) {
            return;
        }
        sb.append(nl).append("Findings:").append(nl);
        for (DataFinding f : fs) {
            sb.append("  [").append(f.severity().id()).append("] ").append(f.code()).append(": ").append(f.message())
                    .append(nl);
        }
    }

    private static void put(ObjectNode n, String k, double x) {
        Json.putNumber(n, k, Double.isFinite(x) ? x : null);
    }

    private static ArrayNode findingsJson(List<DataFinding> fs) {
        ArrayNode a = Json.object().arrayNode();
        for (DataFinding f : fs) {
            ObjectNode o = a.addObject();
            o.put("topic", f.code());
            o.put("severity", f.severity().id());
            o.put("message", f.message());
        }
        return a;
    }

    public static String json(StepTestResult r, Reading reading) {
        ObjectNode n = jsonNode(r);
        n.set("record", reading.json());
        return Json.write(n);
    }

    /** {@code fit}'s JSON of a step test as a node, for documents that carry a fit (the demo's chain). */
    public static ObjectNode jsonNode(StepTestResult r) {
        ObjectNode n = Json.object();
        n.put("test", "step");
        put(n, "step_pct", r.stepPercent());
        put(n, "noise_pct", r.noisePercent());
        ArrayNode est = n.putArray("estimates");
        for (GraphicalEstimate e : r.estimates()) {
            ObjectNode o = est.addObject();
            o.put("method", e.method());
            put(o, "gain", e.gain());
            put(o, "time_constant_s", e.timeConstantSeconds());
            put(o, "dead_time_s", e.deadTimeSeconds());
        }
        ArrayNode fits = n.putArray("models");
        for (ModelFit f : r.fits()) {
            ObjectNode o = fits.addObject();
            o.put("model", f.kind().id());
            ObjectNode p = o.putObject("parameters");
            ObjectNode lo = o.putObject("low");
            ObjectNode hi = o.putObject("high");
            String g = f.kind() == ModelKind.IPDT ? "slope_per_s" : "gain";
            put(p, g, f.gain());
            put(lo, g, f.gainLow());
            put(hi, g, f.gainHigh());
            if (f.kind() != ModelKind.IPDT) {
                put(p, "time_constant_s", f.lagSeconds());
                put(lo, "time_constant_s", f.lagLow());
                put(hi, "time_constant_s", f.lagHigh());
            }
            if (f.kind() == ModelKind.SOPDT) {
                put(p, "time_constant_2_s", f.secondLagSeconds());
                put(lo, "time_constant_2_s", f.secondLagLow());
                put(hi, "time_constant_2_s", f.secondLagHigh());
            }
            put(p, "dead_time_s", f.deadTimeSeconds());
            put(lo, "dead_time_s", f.deadTimeLow());
            put(hi, "dead_time_s", f.deadTimeHigh());
            put(o, "rms_error_pct", f.rmsErrorPercent());
            put(o, "r_squared", f.rSquared());
            put(o, "aic", f.aic());
        }
        if (r.recommended() != null) {
            n.put("recommended", r.recommended().id());
        } else {
            n.putNull("recommended");
        }
        n.put("reason", r.reason());
        n.set("findings", findingsJson(r.findings()));
        return n;
    }

    public static String relayText(RelayResult r, Reading reading) {
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder(reading.text()).append("Relay test: ");
        if (r.cycles() == 0) {
            sb.append("no ultimate cycle could be read.").append(nl);
        } else {
            sb.append(r.cycles()).append(" cycles").append(nl)
                    .append("  relay amplitude d = ").append(v(r.relayAmplitudePercent())).append(" % of output span")
                    .append(nl).append("  PV amplitude a = ").append(v(r.pvAmplitudePercent())).append(" % of PV span")
                    .append(nl).append("  ultimate gain Ku = 4 d / (pi a) = ").append(v(r.ultimateGain())).append(" %/%")
                    .append(nl).append("  ultimate period Tu = ").append(v(r.ultimatePeriodSeconds())).append(" s")
                    .append(nl).append("  ").append(RelayResult.CAVEAT).append(nl);
        }
        findings(sb, r.findings());
        sb.append(nl).append(Cautions.SHORT).append(nl);
        return sb.toString();
    }

    public static String relayJson(RelayResult r, Reading reading) {
        ObjectNode n = Json.object();
        n.put("test", "relay");
        n.set("record", reading.json());
        if (r.cycles() > 0) {
            n.put("ku", r.ultimateGain());
            n.put("tu_s", r.ultimatePeriodSeconds());
        } else {
            n.putNull("ku");
            n.putNull("tu_s");
        }
        n.put("relay_amplitude_pct", r.relayAmplitudePercent());
        n.put("pv_amplitude_pct", r.pvAmplitudePercent());
        n.put("cycles", r.cycles());
        n.put("caveat", RelayResult.CAVEAT);
        n.set("findings", findingsJson(r.findings()));
        return Json.write(n);
    }

    /** One {@code key: LO..HI} line; an interval the fit did not determine is left out (and said so). */
    private static void interval(StringBuilder sb, String key, double lo, double hi) {
        if (Double.isFinite(lo) && Double.isFinite(hi) && hi > lo) {
            sb.append("  ").append(key).append(": ").append(Numbers.significant(lo, 6)).append("..")
                    .append(Numbers.significant(hi, 6)).append('\n');
        } else {
            sb.append("  # ").append(key).append(": not determined by the fit").append('\n');
        }
    }

    /** A loop file's process block for {@code f}, marked as written by loopform. */
    public static String processBlock(ModelFit f, String recordName, Reading reading) {
        String nl = "\n";
        StringBuilder sb = new StringBuilder("# written by loopform fit from " + recordName + "; gains in %/% of the"
                + " spans" + nl + reading.comment() + "process:" + nl);
        sb.append("  model: ").append(f.kind().id()).append(nl);
        sb.append("  gain: ").append(Numbers.significant(f.gain(), 6)).append(nl);
        if (f.kind() != ModelKind.IPDT) {
            sb.append("  time_constant: ").append(Numbers.significant(f.lagSeconds(), 6)).append(" s").append(nl);
        }
        if (f.kind() == ModelKind.SOPDT) {
            sb.append("  time_constant_2: ").append(Numbers.significant(f.secondLagSeconds(), 6)).append(" s").append(nl);
        }
        sb.append("  dead_time: ").append(Numbers.significant(f.deadTimeSeconds(), 6)).append(" s").append(nl);
        sb.append("# the fit's 95 % intervals (gain as above, times in s); tune --robust checks a tuning at the corners")
                .append(nl).append("intervals:").append(nl);
        interval(sb, "gain", f.gainLow(), f.gainHigh());
        if (f.kind() != ModelKind.IPDT) {
            interval(sb, "time_constant", f.lagLow(), f.lagHigh());
        }
        if (f.kind() == ModelKind.SOPDT) {
            interval(sb, "time_constant_2", f.secondLagLow(), f.secondLagHigh());
        }
        interval(sb, "dead_time", f.deadTimeLow(), f.deadTimeHigh());
        return sb.toString();
    }
}

package org.loopform.report;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.loopform.check.CheckResult;
import org.loopform.check.ScanSweep;
import org.loopform.scan.ScanFacts;
import org.loopform.units.Numbers;

/** A scan-time sweep as a table and as JSON. */
public final class SweepReport {
    private SweepReport() {
    }

    private static double nhTd(CheckResult r) {
        var s = r.conversion().targetSetting();
        return ScanFacts.of(s, r.conversion().to().algorithm().derivative(), r.scanSeconds()).nhOverTd();
    }

    public static String text(ScanSweep.Result sweep) {
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder();
        CheckResult first = sweep.checks().get(0);
        sb.append(first.loop().tag()).append(": target ").append(first.conversion().to().id())
                .append(" across scan times").append(nl).append(nl);
        TextTable t = new TextTable("scan, s", "h*wc, rad", "N h/Td", "PM, deg", "GM", "Ms", "setpoint IAE, %*s",
                "verdict", "within policy");
        for (CheckResult r : sweep.checks()) {
            // the as-left loop's figures as the catalogue reads them: "unstable" for a loop that is not stable
            LoopSide g = r.hasProcess() ? LoopSide.target(r) : null;
            var wcReading = g == null ? null : LoopFigure.CROSSOVER.read(g);
            double wc = wcReading instanceof LoopFigure.Reading.Number x ? x.value() : Double.NaN;
            double nh = nhTd(r);
            t.row(Numbers.significant(r.scanSeconds(), 3), Double.isFinite(wc) ? Numbers.significant(wc * r.scanSeconds(), 3)
                    : "-", Double.isFinite(nh) ? Numbers.significant(nh, 3) : "-",
                    g == null ? "-" : LoopFigure.PHASE_MARGIN.text(g), g == null ? "-" : LoopFigure.GAIN_MARGIN.text(g),
                    g == null ? "-" : LoopFigure.MAX_SENSITIVITY.text(g), g == null ? "-" : LoopFigure.SETPOINT_IAE.text(g),
                    r.verdict().id(), ScanSweep.acceptable(r.findings()) ? "yes" : "no");
        }
        sb.append(t.render(2)).append(nl);
        if (sweep.longestAcceptableSeconds() != null) {
            sb.append("Longest scan within the policy: ").append(Numbers.significant(sweep.longestAcceptableSeconds(), 3))
                    .append(" s (no warning on sampling, derivative, discretization or robustness).").append(nl);
        } else {
            sb.append("No scan in this range keeps the loop within the policy; try shorter scans or retune.").append(nl);
        }
        sb.append(nl).append(Cautions.SHORT).append(nl);
        return sb.toString();
    }

    public static String json(ScanSweep.Result sweep) {
        ObjectNode n = Json.object();
        n.put("tag", sweep.checks().get(0).loop().tag());
        Json.putNumber(n, "longest_scan_s", sweep.longestAcceptableSeconds());
        ArrayNode a = n.putArray("scans");
        for (CheckResult r : sweep.checks()) {
            ObjectNode c = CheckReport.node(r);
            c.put("within_policy", ScanSweep.acceptable(r.findings()));
            a.add(c);
        }
        return Json.write(n);
    }
}

package org.loopform.report;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.OptionalDouble;
import org.loopform.tuning.RobustResult;
import org.loopform.units.Numbers;

/** {@code tune --robust}: the tuning on the corners of the fit's 95 % box, worst figures first. */
public final class RobustReport {

    /** What the corners of a box do and do not show. */
    public static final String CAVEAT = "The corners sample the fit's 95 % box; they bound neither every model inside"
            + " it nor the real process, and the box assumes the model's form is right.";

    private RobustReport() {
    }

    private static String v(OptionalDouble x, String unit) {
        return x.isPresent() ? Numbers.significant(x.getAsDouble(), 4) + (unit.isEmpty() ? "" : " " + unit) : "none";
    }

    public static String text(RobustResult r) {
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder(nl);
        sb.append("Robustness over the fit's 95 % box (").append(r.corners().size()).append(" corners, ")
                .append(r.target() ? "target loop at its scan" : "design loop").append("):").append(nl);
        if (r.unstableCorners() > 0) {
            sb.append("  UNSTABLE at ").append(r.unstableCorners()).append(" of ").append(r.corners().size())
                    .append(" corners: the tuning does not hold over the fit's uncertainty; detune it or refit.")
                    .append(nl);
        }
        sb.append("  worst Ms ").append(Double.isNaN(r.worstMs()) ? "none" : Numbers.significant(r.worstMs(), 4))
                .append(", worst gain margin ").append(v(r.worstGainMargin(), ""))
                .append(", worst phase margin ").append(v(r.worstPhaseMarginDegrees(), "deg"))
                .append(", worst delay margin ").append(v(r.worstDelayMarginSeconds(), "s")).append(nl);
        RobustResult.Corner worst = r.worstMsCorner();
        if (worst != null) {
            sb.append("  largest Ms at");
            worst.values().forEach((k, x) -> sb.append(' ').append(k).append(" = ").append(Numbers.significant(x, 4))
                    .append(k.equals("gain") ? "" : " s"));
            sb.append(nl);
        }
        sb.append("  ").append(CAVEAT).append(nl);
        return sb.toString();
    }

    public static ObjectNode json(RobustResult r) {
        ObjectNode n = Json.object();
        n.put("model", r.model());
        n.put("loop", r.target() ? "target" : "design");
        n.put("corners_checked", r.corners().size());
        n.put("unstable_corners", r.unstableCorners());
        Json.putNumber(n, "worst_ms", Double.isNaN(r.worstMs()) ? null : r.worstMs());
        Json.putNumber(n, "worst_gain_margin", r.worstGainMargin().isPresent() ? r.worstGainMargin().getAsDouble() : null);
        Json.putNumber(n, "worst_phase_margin_deg", r.worstPhaseMarginDegrees().isPresent()
                ? r.worstPhaseMarginDegrees().getAsDouble() : null);
        Json.putNumber(n, "worst_delay_margin_s", r.worstDelayMarginSeconds().isPresent()
                ? r.worstDelayMarginSeconds().getAsDouble() : null);
        ArrayNode cs = n.putArray("corners");
        for (RobustResult.Corner c : r.corners()) {
            ObjectNode o = cs.addObject();
            c.values().forEach(o.putObject("process")::put);
            o.put("stable", c.stable());
            // Ms is a figure of safety only for a stable loop (see LoopFigure.Reading.NotStable)
            Json.putNumber(o, "ms", c.stable() ? c.margins().maximumSensitivity() : null);
        }
        n.put("caveat", CAVEAT);
        return n;
    }
}

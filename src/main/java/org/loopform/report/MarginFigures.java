package org.loopform.report;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.Optional;
import java.util.OptionalDouble;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.MarginNote;
import org.loopform.units.Numbers;

/**
 * How a loop's margins are written, once for text, HTML, CSV and JSON: a margin that does not
 * exist is "none" followed by the reason, never a bare blank that could read as infinite.
 */
final class MarginFigures {

    /** Why there is no lower gain margin: no phase crossover where the gain could shrink to the limit. */
    static final String NO_LOWER_GAIN_MARGIN = "no -180 deg crossing with |L| > 1";

    private MarginFigures() {
    }

    static String gainMargin(LoopMargins m, int digits) {
        return orNone(m.gainMargin(), m.gainMarginNote(), digits);
    }

    static String lowerGainMargin(LoopMargins m, int digits) {
        return m.lowerGainMargin().isPresent() ? Numbers.significant(m.lowerGainMargin().getAsDouble(), digits)
                : "none (" + NO_LOWER_GAIN_MARGIN + ")";
    }

    static String phaseMargin(LoopMargins m, int digits) {
        return orNone(m.phaseMarginDegrees(), m.phaseMarginNote(), digits);
    }

    /** The gain crossover where the phase margin is read; missing for the same reason it is. */
    static String crossover(LoopMargins m, int digits) {
        return orNone(m.crossoverRadPerSecond(), m.phaseMarginNote(), digits);
    }

    static String delayMargin(LoopMargins m, int digits) {
        return orNone(m.delayMarginSeconds(), m.delayMarginNote(), digits);
    }

    /** The delay margin in scans of a sampled loop; "-" for a continuous one (NaN scan). */
    static String delayMarginScans(LoopMargins m, double scanSeconds, int digits) {
        if (!(scanSeconds > 0)) {
            return "-";
        }
        return orNone(m.delayMarginScans(scanSeconds), m.delayMarginNote(), digits);
    }

    /** True when the loop can lose gain and reach the limit, so its lower gain margin is worth a row. */
    static boolean hasLowerGainMargin(LoopMargins... loops) {
        for (LoopMargins m : loops) {
            if (m != null && m.lowerGainMargin().isPresent()) {
                return true;
            }
        }
        return false;
    }

    /**
     * The margin keys beside the existing ones: {@code lower_gain_margin}, {@code delay_margin_scans}
     * (null for a continuous loop, {@code scanSeconds} NaN) and the notes {@code gain_margin_note},
     * {@code phase_margin_note}, {@code delay_margin_note} (null where the margin exists).
     */
    static void putJson(ObjectNode n, LoopMargins m, double scanSeconds) {
        put(n, "lower_gain_margin", m.lowerGainMargin());
        put(n, "delay_margin_scans", scanSeconds > 0 ? m.delayMarginScans(scanSeconds) : OptionalDouble.empty());
        note(n, "gain_margin_note", m.gainMarginNote());
        note(n, "phase_margin_note", m.phaseMarginNote());
        note(n, "delay_margin_note", m.delayMarginNote());
    }

    private static String orNone(OptionalDouble v, Optional<MarginNote> why, int digits) {
        if (v.isPresent()) {
            return Numbers.significant(v.getAsDouble(), digits);
        }
        return why.map(w -> "none (" + w.text() + ")").orElse("none");
    }

    private static void put(ObjectNode n, String key, OptionalDouble v) {
        Json.putNumber(n, key, v.isPresent() ? v.getAsDouble() : null);
    }

    private static void note(ObjectNode n, String key, Optional<MarginNote> why) {
        if (why.isPresent()) {
            n.put(key, why.get().text());
        } else {
            n.putNull(key);
        }
    }
}

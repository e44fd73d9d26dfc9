package org.loopform.report;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.Optional;
import java.util.OptionalDouble;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.MarginNote;

/**
 * A loop's margins written alone, for tables other than the check's (a tuning's design loop, a
 * scan sweep), the way the figure catalogue ({@link LoopFigure}) writes them: a margin that does
 * not exist is "none" followed by the reason, never a bare blank that could read as infinite; and
 * the notes beside the margins in JSON.
 */
final class MarginFigures {

    /** Why there is no lower gain margin: no phase crossover where the gain could shrink to the limit. */
    static final String NO_LOWER_GAIN_MARGIN = "no -180 deg crossing with |L| > 1";

    private MarginFigures() {
    }

    static String gainMargin(LoopMargins m, int digits) {
        return orNone(m.gainMargin(), m.gainMarginNote(), digits);
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

    /**
     * The notes beside a loop's margin keys: {@code gain_margin_note}, {@code phase_margin_note},
     * {@code delay_margin_note} (null where the margin exists).
     */
    static void putNotes(ObjectNode n, LoopMargins m) {
        note(n, "gain_margin_note", m.gainMarginNote());
        note(n, "phase_margin_note", m.phaseMarginNote());
        note(n, "delay_margin_note", m.delayMarginNote());
    }

    private static String orNone(OptionalDouble v, Optional<MarginNote> why, int digits) {
        return LoopFigure.text(LoopFigure.Reading.orNone(v, why), digits);
    }

    private static void note(ObjectNode n, String key, Optional<MarginNote> why) {
        if (why.isPresent()) {
            n.put(key, why.get().text());
        } else {
            n.putNull(key);
        }
    }
}

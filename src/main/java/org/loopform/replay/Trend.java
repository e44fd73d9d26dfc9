package org.loopform.replay;

import java.time.LocalDateTime;

/**
 * A logged record of one loop: setpoint, PV and controller output in the loop's engineering units,
 * and the mode (automatic throughout when the record has none). Times are seconds from the
 * record's first row; {@code origin} is that row's timestamp when the record had timestamps
 * (timestamps with a zone are taken to UTC), or null when it gave seconds.
 */
public record Trend(Signal setpoint, Signal pv, Signal output, ModeTrack mode, LocalDateTime origin) {

    public Trend {
        if (setpoint == null || pv == null || output == null) {
            throw new IllegalArgumentException("a record needs setpoint, PV and output");
        }
        mode = mode == null ? ModeTrack.ALWAYS_AUTOMATIC : mode;
    }

    /** The first instant at which all three signals have been logged, s. */
    public double startSeconds() {
        return Math.max(setpoint.firstSeconds(), Math.max(pv.firstSeconds(), output.firstSeconds()));
    }

    /** The last instant at which all three signals are still logged, s. */
    public double endSeconds() {
        return Math.min(setpoint.lastSeconds(), Math.min(pv.lastSeconds(), output.lastSeconds()));
    }
}

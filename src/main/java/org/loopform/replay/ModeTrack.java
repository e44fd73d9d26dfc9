package org.loopform.replay;

import java.util.Arrays;
import java.util.List;

/**
 * The logged mode over time: a mode holds from its point until the next (sample and hold, since
 * a mode is a state, not a quantity to interpolate); before the first point the first mode holds.
 * Immutable.
 */
public final class ModeTrack {

    /** A record without a mode column: automatic throughout. */
    public static final ModeTrack ALWAYS_AUTOMATIC = new ModeTrack(new double[] {0.0}, List.of(Mode.AUTOMATIC));

    private final double[] timesSeconds;
    private final Mode[] modes;

    /** @param timesSeconds strictly increasing; {@code modes} one per time */
    public ModeTrack(double[] timesSeconds, List<Mode> modes) {
        if (timesSeconds == null || modes == null || timesSeconds.length != modes.size() || modes.isEmpty()) {
            throw new IllegalArgumentException("a mode track needs at least one point and one mode a time");
        }
        for (int k = 1; k < timesSeconds.length; k++) {
            if (!(timesSeconds[k] > timesSeconds[k - 1])) {
                throw new IllegalArgumentException("mode track: times must increase (point " + k + ")");
            }
        }
        this.timesSeconds = timesSeconds.clone();
        this.modes = modes.toArray(new Mode[0]);
    }

    /** The mode in force at {@code t} seconds. */
    public Mode at(double t) {
        int k = Arrays.binarySearch(timesSeconds, t);
        if (k >= 0) {
            return modes[k];
        }
        int after = -k - 1;
        return modes[Math.max(0, after - 1)];
    }

    /** True when any point is not automatic. */
    public boolean hasManual() {
        for (Mode m : modes) {
            if (!m.isAutomatic()) {
                return true;
            }
        }
        return false;
    }
}

package org.loopform.io;

/**
 * Which columns of a record hold what: time, setpoint, PV, controller output, and the optional
 * mode (auto/manual/cascade) and tracking (on/off) columns. Names are matched without regard to
 * case; a mode or tracking column that is absent from the header is simply not used.
 */
public record TrendColumns(String time, String setpoint, String pv, String output, String mode, String tracking) {

    /** Each column under its own name: time, setpoint, pv, output, mode, tracking. */
    public static final TrendColumns DEFAULT = new TrendColumns("time", "setpoint", "pv", "output", "mode", "tracking");

    public TrendColumns {
        for (String c : new String[] {time, setpoint, pv, output, mode, tracking}) {
            if (c == null || c.isBlank()) {
                throw new IllegalArgumentException("every record column needs a name");
            }
        }
    }
}

package org.loopform.replay;

/**
 * The controller's mode at a logged instant. In {@link #AUTOMATIC} and {@link #CASCADE} (automatic
 * with a remote setpoint) the controller computes its output from setpoint and PV, so the replay
 * compares it; in {@link #MANUAL} and {@link #TRACKING} (output forced from outside) the output is
 * not the controller's and the replay follows it instead (bumpless tracking).
 */
public enum Mode {
    AUTOMATIC, CASCADE, MANUAL, TRACKING;

    /** True when the controller computes the output itself. */
    public boolean isAutomatic() {
        return this == AUTOMATIC || this == CASCADE;
    }
}

package org.loopform.form;

/**
 * Where the derivative filter acts. On the derivative term alone: Td s / (1 + Tf s). On the
 * measurement: the whole feedback path is multiplied by 1 / (1 + Tf s) and the setpoint passes
 * unfiltered (which needs c = 0: a setpoint derivative would be unfiltered). For the series
 * structure both mean the lead-lag (1 + Td s) / (1 + Tf s).
 */
public enum FilterPlacement {
    DERIVATIVE,
    MEASUREMENT
}

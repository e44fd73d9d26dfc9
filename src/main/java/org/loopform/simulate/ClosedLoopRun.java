package org.loopform.simulate;

import org.loopform.analysis.SampledResponse;

/** The responses of one loop to the setpoint step and to the load step, sampled at the loop's step. */
public record ClosedLoopRun(SampledResponse setpoint, SampledResponse load, double stepSeconds) {
}

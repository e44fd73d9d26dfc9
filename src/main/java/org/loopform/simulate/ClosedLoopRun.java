package org.loopform.simulate;


/**
 * The responses of one loop to the setpoint step and to the load step. {@code stepSeconds} is
 * the controller's step (the scan); the responses hold the PV at each step, and for a run between
 * scans ({@link LoopSimulator#runBetweenScans}) also at the sub-instants within each scan.
 */
public record ClosedLoopRun(SampledResponse setpoint, SampledResponse load, double stepSeconds) {
}

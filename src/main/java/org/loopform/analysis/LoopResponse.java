package org.loopform.analysis;

import org.loopform.lti.FrequencyBand;

import java.util.Objects;
import org.loopform.lti.TransferFunction;

/**
 * The open-loop frequency response {@code L(i omega)} of a loop, omega in rad/s. A continuous
 * loop supplies {@code C(i omega) P(i omega) e^(-i omega L)}; a sampled loop with scan time h
 * supplies {@code L(e^(i omega h))} and is analysed over a band ending at the Nyquist
 * frequency {@code pi / h} (see {@link FrequencyBand#belowNyquist}).
 */
@FunctionalInterface
public interface LoopResponse {

    /** Writes {@code L(i omega)} into {@code reIm} as {re, im}; must not allocate. */
    void at(double omegaRadPerSecond, double[] reIm);

    /** The response of a rational open loop without dead time. */
    static LoopResponse of(TransferFunction openLoop) {
        Objects.requireNonNull(openLoop, "openLoop");
        return openLoop::responseAt;
    }

    /**
     * The response of a rational open loop in series with a dead time:
     * {@code G(i omega) e^(-i omega deadTimeSeconds)}.
     */
    static LoopResponse of(TransferFunction openLoop, double deadTimeSeconds) {
        Objects.requireNonNull(openLoop, "openLoop");
        if (!(deadTimeSeconds >= 0) || Double.isInfinite(deadTimeSeconds)) {
            throw new IllegalArgumentException(
                    "dead time must be finite and >= 0 s (got " + deadTimeSeconds + " s)");
        }
        if (deadTimeSeconds == 0) {
            return of(openLoop);
        }
        return (omegaRadPerSecond, reIm) -> {
            openLoop.responseAt(omegaRadPerSecond, reIm);
            double lagRadians = omegaRadPerSecond * deadTimeSeconds;
            double cos = Math.cos(lagRadians);
            double sin = Math.sin(lagRadians);
            double re = reIm[0];
            double im = reIm[1];
            // (re + i im)(cos - i sin)
            reIm[0] = re * cos + im * sin;
            reIm[1] = im * cos - re * sin;
        };
    }
}

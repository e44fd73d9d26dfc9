package org.loopform.check;

import java.util.OptionalDouble;
import org.loopform.analysis.GainCrossover;
import org.loopform.analysis.LoopMargins;
import org.loopform.analysis.MarginAnalysis;
import org.loopform.analysis.SampledStability;
import org.loopform.lti.SampledStateSpace;
import org.loopform.lti.TransferFunction;
import org.loopform.lti.ZeroOrderHold;
import org.loopform.scan.PulseLaw;

/**
 * The delay margin of a sampled loop: the least extra process dead time {@code Delta} that puts the
 * loop on the stability boundary, with the process sampled exactly at each dead time.
 *
 * <p>Reading it as {@code PM / omega_c} from the sampled response treats the extra dead time as
 * {@code e^(-i omega Delta)} on {@code L(e^(i omega h))}, which is exact only for a whole number of
 * scans: a fraction delta of a scan changes the zero-order-hold sampled process in magnitude too
 * (its aliases turn by {@code e^(-i (omega + 2 pi k / h) delta)}, not by a common factor). On a
 * coarse scan that reading was found up to a third too large (FOPDT 1 %/%, 1 s, 0.3323 s under an
 * ideal PID kc 1.256, ti 1.763 s, td 0.2664 s, N 10 at a 0.6115 s scan, invented: PM / omega_c gives
 * 1.158 s where the loop becomes unstable at 0.881 s; src/test/python/hunt_false_pass.py, confirmed
 * by a fine time-domain simulation).
 *
 * <p>Exact search. Write {@code Delta = j h + delta}, j whole, {@code 0 <= delta < h}. With the
 * process sampled at dead time {@code L + delta}, {@code L_delta(z)}, the extra whole scans give
 * {@code z^-j}, so the loop is on the boundary when {@code L_delta} has a gain crossover omega with
 * {@code (PM mod 360 in rad) = j omega h}, that is when {@code F(delta) = DM_delta / h} (the
 * {@code PM / omega_c} reading of {@code L_delta} in scans, over its crossovers) is the whole number
 * j, or when {@code L_delta} itself turns unstable (j = 0; its closed-loop poles counted by
 * {@link SampledStability}). F and the stability are evaluated on {@value #FRACTION_STEPS} steps of delta over one scan and each event is
 * bisected; the least {@code j h + delta} is the margin (Astrom and Wittenmark, Computer-Controlled
 * Systems, 3rd ed., 1997, ch. 2, sampling a process with a time delay - from memory). A crossover born
 * or lost inside a step can only make the margin found smaller (on the safe side), never larger. Above
 * {@value #MAX_EXACT_SCANS} scans the reading PM / wc is kept.
 */
final class SampledDelayMargin {

    /**
     * Beyond this many scans the reading PM / wc is kept: one more scan than it is always unstable, so it
     * is at most a scan too small, and a fraction of a scan changes F by about that fraction when many
     * scans fit in the margin (the crossover far below the Nyquist frequency, where the sampled response
     * is close to the continuous one). Measured on the 225 target loops of the stability cross-check
     * (src/test/python/write_stability_crosscheck.py, exact margins from the closed-loop eigenvalues): every
     * reading of 3 scans or more lay within 0.8 % (0.057 scans) of the exact margin, while below 2 scans
     * the exact margin was 0.34 to 5.6 times the reading. The policy's default thresholds are 1 and 2 scans.
     * The exact search costs some 30 to 70 margin analyses, so it runs only where it can matter: a 2,000-loop
     * audit took 4.9 times the CPU with the bound at 20 scans, 1.35 times with this one (bench/jar-pair.sh).
     */
    static final double MAX_EXACT_SCANS = 3;
    /**
     * Below how many scans the margin is searched exactly under {@code policy}: {@link #MAX_EXACT_SCANS}, or a
     * scan above the policy's delay-margin warning when that is higher, so that a reading near any threshold
     * the policy judges is never the one judged.
     */
    static double exactBelowScans(org.loopform.findings.CheckPolicy policy) {
        return Math.max(MAX_EXACT_SCANS, policy.delayMarginWarnScans() + 1);
    }

    /** Steps of the fractional dead time over one scan. */
    static final int FRACTION_STEPS = 16;
    /** Halvings of a step: 2^-24 of a 16th of a scan (4e-9 scans), far below any printed digit. */
    private static final int BISECTIONS = 24;

    private final PulseLaw pulse;
    private final TransferFunction rational;
    private final double deadTimeSeconds;
    private final double scanSeconds;
    private final MarginAnalysis analysis;

    private SampledDelayMargin(PulseLaw pulse, TransferFunction rational, double deadTimeSeconds, double scanSeconds,
                               MarginAnalysis analysis) {
        this.pulse = pulse;
        this.rational = rational;
        this.deadTimeSeconds = deadTimeSeconds;
        this.scanSeconds = scanSeconds;
        this.analysis = analysis;
    }

    /**
     * {@code margins} with the delay margin replaced by the exact one of the sampled loop
     * {@code pulse} and {@code rational e^(-s L)} at {@code scanSeconds}; unchanged when it has none.
     */
    static LoopMargins exact(LoopMargins margins, PulseLaw pulse, TransferFunction rational, double deadTimeSeconds,
                             double scanSeconds, MarginAnalysis analysis, double belowScans) {
        if (margins.delayMarginSeconds().isEmpty()
                || margins.delayMarginSeconds().getAsDouble() > belowScans * scanSeconds) {
            return margins;
        }
        OptionalDouble exact = new SampledDelayMargin(pulse, rational, deadTimeSeconds, scanSeconds, analysis)
                .search(margins);
        return exact.isPresent() ? margins.withDelayMarginSeconds(exact.getAsDouble()) : margins;
    }

    /** One fractional dead time's figures: F in scans (infinite without a crossover) and whether L_delta is stable. */
    private record Point(double fractionSeconds, double scans, boolean stable) {
    }

    private Point at(double fractionSeconds, LoopMargins known) {
        SampledStateSpace sampled = sampledAt(fractionSeconds);
        LoopMargins m = known != null ? known : analysis.analyze(LoopBand.sampledLoop(pulse, sampled));
        return new Point(fractionSeconds, scans(m), stable(sampled));
    }

    private SampledStateSpace sampledAt(double fractionSeconds) {
        return ZeroOrderHold.of(rational, deadTimeSeconds + fractionSeconds, scanSeconds);
    }

    /** F: the least PM / omega_c over the gain crossovers, in scans (infinite without one). */
    private double scans(LoopMargins m) {
        double least = Double.POSITIVE_INFINITY;
        for (GainCrossover c : m.gainCrossovers()) {
            least = Math.min(least, c.delayMarginSeconds());
        }
        return least / scanSeconds;
    }

    /** F at a fractional dead time, without the pole count (a bisection on F needs only F). */
    private double scansAt(double fractionSeconds) {
        return scans(analysis.analyze(LoopBand.sampledLoop(pulse, sampledAt(fractionSeconds))));
    }

    /** Whether L_delta is stable, without its margins (a bisection on stability needs only that). */
    private boolean stableAt(double fractionSeconds) {
        return stable(sampledAt(fractionSeconds));
    }

    private boolean stable(SampledStateSpace sampled) {
        return SampledStability.of(new SampledOpenLoop(pulse, sampled)).isStable();
    }

    private OptionalDouble search(LoopMargins atZero) {
        double best = Double.POSITIVE_INFINITY;
        Point previous = at(0.0, atZero);
        for (int k = 1; k <= FRACTION_STEPS; k++) {
            Point current = at(scanSeconds * k / FRACTION_STEPS, null);
            // j = 0: L_delta itself turns unstable within this step (a crossover through -1, or |L| passing 1
            // where the response is real and negative, at z = -1, which gives birth to a crossover there)
            if (previous.stable() && !current.stable()) {
                best = Math.min(best, boundary(previous, current, this::stableAt));
                break;  // every later event is at least this far: j h + delta with j >= 1 exceeds a scan
            }
            // j >= 1: F passes the whole number j within this step
            double low = Math.min(previous.scans(), current.scans());
            double high = Math.max(previous.scans(), current.scans());
            if (Double.isFinite(low) && Double.isFinite(high)) {
                double j = Math.max(1.0, Math.ceil(low));
                if (j <= high) {
                    boolean previousAbove = previous.scans() >= j;
                    double delta = boundary(previous, current, d -> (scansAt(d) >= j) == previousAbove);
                    best = Math.min(best, j * scanSeconds + delta);
                }
            }
            previous = current;
        }
        return Double.isFinite(best) ? OptionalDouble.of(best) : OptionalDouble.empty();
    }

    /** The fractional dead time where {@code sameAsLow} stops holding, between two points where it changes. */
    private double boundary(Point low, Point high, java.util.function.DoublePredicate sameAsLow) {
        double a = low.fractionSeconds();
        double b = high.fractionSeconds();
        for (int i = 0; i < BISECTIONS; i++) {
            double mid = 0.5 * (a + b);
            if (sameAsLow.test(mid)) {
                a = mid;
            } else {
                b = mid;
            }
        }
        return b;
    }
}

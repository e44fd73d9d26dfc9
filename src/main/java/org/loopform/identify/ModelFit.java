package org.loopform.identify;

import org.loopform.process.FirstOrderPlusDeadTime;
import org.loopform.process.IntegratingPlusDeadTime;
import org.loopform.process.ProcessModel;
import org.loopform.process.SecondOrderPlusDeadTime;

/**
 * One model fitted to a record, with 95 % intervals. Gains %/% (integrating: %/s per %), times s.
 * The gain's and time constants' intervals come from the Jacobian at the optimum, the dead time among its
 * columns (the covariance {@code s^2 (J^T J)^-1}, positive parameters fitted by their logarithm, the variance
 * inflated by {@code (1 + r1)/(1 - r1)} for residuals correlated at lag one); the dead time's from its own
 * profile (the dead times whose best cost stays within the 95 % likelihood-ratio bound), its upper end
 * widened by the logging interval before the output's moves (a move shows at the first sample after it).
 *
 * @param kind the model
 * @param gain K or Kv
 * @param gainLow lower 95 % bound
 * @param gainHigh upper 95 % bound
 * @param lagSeconds T (T1 for SOPDT), NaN for IPDT
 * @param lagLow lower bound
 * @param lagHigh upper bound
 * @param secondLagSeconds T2 for SOPDT, NaN otherwise
 * @param secondLagLow lower bound
 * @param secondLagHigh upper bound
 * @param deadTimeSeconds L
 * @param deadTimeLow lower bound from the profile
 * @param deadTimeHigh upper bound from the profile
 * @param rmsErrorPercent root-mean-square residual, % of PV span
 * @param rSquared 1 - SSR/SST
 * @param aic Akaike's criterion {@code n ln(SSR/n) + 2 p}
 */
public record ModelFit(ModelKind kind, double gain, double gainLow, double gainHigh,
                       double lagSeconds, double lagLow, double lagHigh,
                       double secondLagSeconds, double secondLagLow, double secondLagHigh,
                       double deadTimeSeconds, double deadTimeLow, double deadTimeHigh,
                       double rmsErrorPercent, double rSquared, double aic) {

    public ModelFit {
        if (!Double.isFinite(gain) || !Double.isFinite(deadTimeSeconds) || !Double.isFinite(rmsErrorPercent)) {
            throw new IllegalArgumentException("a fit must be finite");
        }
    }

    /**
     * The fitted model at its best estimates, as a process model: what {@code fit --write-process} writes
     * and a loop file's process block reads back (gains %/% of the spans, times s).
     */
    public ProcessModel toProcessModel() {
        return switch (kind) {
            case FOPDT -> new FirstOrderPlusDeadTime(gain, lagSeconds, deadTimeSeconds);
            case SOPDT -> SecondOrderPlusDeadTime.ofTimeConstants(gain, lagSeconds, secondLagSeconds, deadTimeSeconds);
            case IPDT -> new IntegratingPlusDeadTime(gain, deadTimeSeconds);
        };
    }
}

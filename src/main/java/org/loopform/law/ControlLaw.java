package org.loopform.law;

import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

/**
 * A continuous two-degree-of-freedom control law {@code u = C_r(s) r - C_y(s) y}, the canonical
 * object that every controller form writes down. Held by its {@link PidTerms}; its transfer
 * functions are built from them, and two laws are compared as rational functions
 * ({@link #sameAs}), never by re-applying conversion formulas.
 */
public record ControlLaw(PidTerms terms) {

    /** Two laws whose rational functions agree to this relative tolerance are the same law. */
    public static final double SAME_LAW_TOLERANCE = 1e-9;

    public ControlLaw {
        if (terms == null) {
            throw new IllegalArgumentException("a control law needs its terms");
        }
    }

    /** C_y(s), the feedback path, as a rational function of s (seconds). */
    public TransferFunction feedback() {
        return path(terms.p(), terms.d());
    }

    /** C_r(s), the setpoint path, as a rational function of s (seconds). */
    public TransferFunction setpoint() {
        return path(terms.pr(), terms.dr());
    }

    private TransferFunction path(double proportional, double derivative) {
        // (d s + p + i/s) / (1 + tf s) = (d s^2 + p s + i) / (s (1 + tf s)); without integral the s cancels.
        Polynomial filter = Polynomial.ofAscending(1.0, terms.tf());
        if (terms.hasIntegral()) {
            return new TransferFunction(Polynomial.ofAscending(terms.i(), proportional, derivative),
                    Polynomial.ofAscending(0.0, 1.0).times(filter));
        }
        return new TransferFunction(Polynomial.ofAscending(proportional, derivative), filter);
    }

    /** True when both paths are the same rational functions as {@code other}'s, within {@code relativeTolerance}. */
    public boolean sameAs(ControlLaw other, double relativeTolerance) {
        return feedback().sameAs(other.feedback(), relativeTolerance)
                && setpoint().sameAs(other.setpoint(), relativeTolerance);
    }

    /** True when the feedback paths are the same rational function. */
    public boolean sameFeedbackAs(ControlLaw other, double relativeTolerance) {
        return feedback().sameAs(other.feedback(), relativeTolerance);
    }

    /**
     * True when the setpoint path is the feedback path to the bit ({@code pr = p} and {@code dr = d}),
     * so that {@link #setpointAt} gives exactly what {@link #feedbackAt} gives.
     */
    public boolean setpointPathIsFeedbackPath() {
        return Double.doubleToLongBits(terms.pr()) == Double.doubleToLongBits(terms.p())
                && Double.doubleToLongBits(terms.dr()) == Double.doubleToLongBits(terms.d());
    }

    /**
     * C_y(i omega) written into {@code out} as {re, im}, without allocating.
     */
    public void feedbackAt(double omegaRadPerSecond, double[] out) {
        evaluate(terms.p(), terms.d(), omegaRadPerSecond, out);
    }

    /** C_r(i omega) written into {@code out} as {re, im}, without allocating. */
    public void setpointAt(double omegaRadPerSecond, double[] out) {
        evaluate(terms.pr(), terms.dr(), omegaRadPerSecond, out);
    }

    private void evaluate(double proportional, double derivative, double w, double[] out) {
        // numerator: p + i(d w - i/w) ... written out: d (i w) + p + i/(i w) = p + i (d w - i_coef / w)
        double nr = proportional;
        double ni = derivative * w - (terms.hasIntegral() ? terms.i() / w : 0.0);
        double dr = 1.0;
        double di = terms.tf() * w;
        double mag2 = dr * dr + di * di;
        out[0] = (nr * dr + ni * di) / mag2;
        out[1] = (ni * dr - nr * di) / mag2;
    }
}

package org.loopform.lti;

/**
 * A continuous-time rational transfer function {@code G(s) = num(s) / den(s)}, time in seconds.
 * The denominator is never the zero polynomial. Two transfer functions are compared by
 * cross-multiplication ({@link #sameAs}), so common factors and scale do not matter.
 */
public record TransferFunction(Polynomial numerator, Polynomial denominator) {

    public TransferFunction {
        if (numerator == null || denominator == null) {
            throw new IllegalArgumentException("transfer function needs a numerator and a denominator");
        }
        if (denominator.isZero()) {
            throw new IllegalArgumentException("transfer function denominator must not be zero");
        }
    }

    /** The constant gain {@code k}. */
    public static TransferFunction gain(double k) {
        return new TransferFunction(Polynomial.constant(k), Polynomial.ONE);
    }

    /** Builds from coefficients in descending powers, highest first, as scipy and Octave write them. */
    public static TransferFunction ofDescending(double[] num, double[] den) {
        return new TransferFunction(Polynomial.ofDescending(num), Polynomial.ofDescending(den));
    }

    public TransferFunction times(TransferFunction other) {
        return new TransferFunction(numerator.times(other.numerator), denominator.times(other.denominator));
    }

    public TransferFunction plus(TransferFunction other) {
        return new TransferFunction(
                numerator.times(other.denominator).plus(other.numerator.times(denominator)),
                denominator.times(other.denominator));
    }

    /** True when the relative degree is not negative (a physically realizable law). */
    public boolean isProper() {
        return numerator.degree() <= denominator.degree();
    }

    /**
     * Frequency response at {@code s = i omega}, omega in rad/s, written into {@code out} as
     * {re, im}. Nothing is allocated.
     */
    public void responseAt(double omegaRadPerSecond, double[] out) {
        numerator.valueAtImaginary(omegaRadPerSecond, out);
        double nr = out[0];
        double ni = out[1];
        denominator.valueAtImaginary(omegaRadPerSecond, out);
        double dr = out[0];
        double di = out[1];
        double mag2 = dr * dr + di * di;
        out[0] = (nr * dr + ni * di) / mag2;
        out[1] = (ni * dr - nr * di) / mag2;
    }

    /** Frequency response at {@code i omega} as a new {re, im} pair. */
    public double[] responseAt(double omegaRadPerSecond) {
        double[] out = new double[2];
        responseAt(omegaRadPerSecond, out);
        return out;
    }

    /**
     * True when this and {@code other} are the same rational function: the cross products
     * {@code n1 d2} and {@code n2 d1} agree coefficient by coefficient, each within
     * {@code relativeTolerance} of its own size (a coefficient far below the largest one,
     * under {@code relativeTolerance} squared of it, counts as rounding noise).
     */
    public boolean sameAs(TransferFunction other, double relativeTolerance) {
        Polynomial left = numerator.times(other.denominator);
        Polynomial right = other.numerator.times(denominator);
        double scale = Math.max(left.maxAbsCoefficient(), right.maxAbsCoefficient());
        if (scale == 0) {
            return true;
        }
        double floor = relativeTolerance * relativeTolerance * scale;
        int n = Math.max(left.degree(), right.degree());
        for (int k = 0; k <= n; k++) {
            double a = left.coefficient(k);
            double b = right.coefficient(k);
            double size = Math.max(Math.abs(a), Math.abs(b));
            if (Math.abs(a - b) > relativeTolerance * size + floor) {
                return false;
            }
        }
        return true;
    }

    @Override
    public String toString() {
        return "(" + numerator + ") / (" + denominator + ")";
    }
}

package org.loopform.lti;

import org.apache.commons.math3.linear.LUDecomposition;
import org.apache.commons.math3.linear.MatrixUtils;
import org.apache.commons.math3.linear.RealMatrix;

/**
 * The matrix exponential by diagonal Pade approximation with scaling and squaring (Golub &amp;
 * Van Loan, Matrix Computations, 3rd ed., 1996, section 11.3, Algorithm 11.3.1 - from memory).
 * The matrix is scaled by 2^-j until its infinity norm is at most 1/2, where the (6,6) Pade
 * approximant is accurate to about 3.4e-16 relative to the norm; the result is squared j times.
 */
final class MatrixExponential {

    /** Pade degree: q = 6 gives an error bound of about 3.4e-16 at norm 1/2 (the book's choice for double precision). */
    private static final int PADE_DEGREE = 6;
    /** Norm the scaled matrix must not exceed. */
    private static final double SCALED_NORM_LIMIT = 0.5;

    private MatrixExponential() {
    }

    /** {@code e^M} for a square matrix M with finite entries. */
    static RealMatrix of(RealMatrix m) {
        if (!m.isSquare()) {
            throw new IllegalArgumentException("matrix exponential needs a square matrix (got "
                    + m.getRowDimension() + "x" + m.getColumnDimension() + ")");
        }
        double norm = m.getNorm(); // Commons Math: maximum absolute row sum
        if (!Double.isFinite(norm)) {
            throw new IllegalArgumentException("matrix exponential needs finite entries (norm " + norm + ")");
        }
        int squarings = 0;
        while (norm > SCALED_NORM_LIMIT) {
            norm /= 2.0;
            squarings++;
        }
        RealMatrix scaled = m.scalarMultiply(Math.scalb(1.0, -squarings));
        int n = m.getRowDimension();
        RealMatrix numerator = MatrixUtils.createRealIdentityMatrix(n);
        RealMatrix denominator = MatrixUtils.createRealIdentityMatrix(n);
        RealMatrix power = MatrixUtils.createRealIdentityMatrix(n);
        double coefficient = 1.0;
        for (int k = 1; k <= PADE_DEGREE; k++) {
            coefficient *= (double) (PADE_DEGREE - k + 1) / ((2 * PADE_DEGREE - k + 1) * k);
            power = scaled.multiply(power);
            RealMatrix term = power.scalarMultiply(coefficient);
            numerator = numerator.add(term);
            denominator = k % 2 == 0 ? denominator.add(term) : denominator.subtract(term);
        }
        RealMatrix result = new LUDecomposition(denominator).getSolver().solve(numerator);
        for (int i = 0; i < squarings; i++) {
            result = result.multiply(result);
        }
        return result;
    }
}

package org.loopform.lti;

/**
 * Solves a small dense complex system {@code M x = r} by Gaussian elimination with partial
 * pivoting (Golub &amp; Van Loan, Matrix Computations, 3rd ed., 1996, section 3.4 - from memory),
 * real and imaginary parts held in separate arrays. Overwrites M and puts x in r.
 */
final class ComplexLinearSolve {

    private ComplexLinearSolve() {
    }

    static void solveInPlace(int n, double[] mRe, double[] mIm, double[] rRe, double[] rIm) {
        for (int col = 0; col < n; col++) {
            int pivot = col;
            double best = -1.0;
            for (int row = col; row < n; row++) {
                // the squared modulus picks the same pivot as the modulus (the pivot's squared modulus
                // divides below anyway) without StrictMath's slow hypot
                double re = mRe[row * n + col];
                double im = mIm[row * n + col];
                double size = re * re + im * im;
                if (size > best) {
                    best = size;
                    pivot = row;
                }
            }
            if (pivot != col) {
                swapRows(n, mRe, pivot, col);
                swapRows(n, mIm, pivot, col);
                swap(rRe, pivot, col);
                swap(rIm, pivot, col);
            }
            double pRe = mRe[col * n + col];
            double pIm = mIm[col * n + col];
            double pMag2 = pRe * pRe + pIm * pIm;
            for (int row = col + 1; row < n; row++) {
                double aRe = mRe[row * n + col];
                double aIm = mIm[row * n + col];
                // factor = a / p
                double fRe = (aRe * pRe + aIm * pIm) / pMag2;
                double fIm = (aIm * pRe - aRe * pIm) / pMag2;
                for (int j = col; j < n; j++) {
                    double cRe = mRe[col * n + j];
                    double cIm = mIm[col * n + j];
                    mRe[row * n + j] -= fRe * cRe - fIm * cIm;
                    mIm[row * n + j] -= fRe * cIm + fIm * cRe;
                }
                double bRe = rRe[col];
                double bIm = rIm[col];
                rRe[row] -= fRe * bRe - fIm * bIm;
                rIm[row] -= fRe * bIm + fIm * bRe;
            }
        }
        for (int row = n - 1; row >= 0; row--) {
            double sRe = rRe[row];
            double sIm = rIm[row];
            for (int j = row + 1; j < n; j++) {
                double cRe = mRe[row * n + j];
                double cIm = mIm[row * n + j];
                sRe -= cRe * rRe[j] - cIm * rIm[j];
                sIm -= cRe * rIm[j] + cIm * rRe[j];
            }
            double pRe = mRe[row * n + row];
            double pIm = mIm[row * n + row];
            double pMag2 = pRe * pRe + pIm * pIm;
            rRe[row] = (sRe * pRe + sIm * pIm) / pMag2;
            rIm[row] = (sIm * pRe - sRe * pIm) / pMag2;
        }
    }

    private static void swapRows(int n, double[] m, int a, int b) {
        for (int j = 0; j < n; j++) {
            double t = m[a * n + j];
            m[a * n + j] = m[b * n + j];
            m[b * n + j] = t;
        }
    }

    private static void swap(double[] v, int a, int b) {
        double t = v[a];
        v[a] = v[b];
        v[b] = t;
    }
}

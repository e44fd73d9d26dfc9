package org.loopform.lti;

import java.util.Arrays;

/**
 * A real polynomial in one variable, held by its coefficients in ascending powers:
 * {@code p(x) = c[0] + c[1] x + ... + c[n] x^n}. Immutable; trailing zero coefficients are
 * dropped so that {@link #degree()} is exact (the zero polynomial has degree -1).
 */
public final class Polynomial {

    /** The zero polynomial. */
    static final Polynomial ZERO = new Polynomial(new double[0]);
    /** The constant one. */
    public static final Polynomial ONE = new Polynomial(new double[] {1.0});

    private final double[] ascending;

    private Polynomial(double[] ascending) {
        int n = ascending.length;
        while (n > 0 && ascending[n - 1] == 0.0) {
            n--;
        }
        this.ascending = Arrays.copyOf(ascending, n);
    }

    /** Builds a polynomial from coefficients in ascending powers of x. */
    public static Polynomial ofAscending(double... coefficients) {
        for (double c : coefficients) {
            if (!Double.isFinite(c)) {
                throw new IllegalArgumentException("polynomial coefficient must be finite (got " + c + ")");
            }
        }
        return new Polynomial(coefficients.clone());
    }

    /** Builds a polynomial from coefficients in descending powers, highest first (as scipy and Octave write them). */
    public static Polynomial ofDescending(double... coefficients) {
        double[] asc = new double[coefficients.length];
        for (int i = 0; i < coefficients.length; i++) {
            asc[i] = coefficients[coefficients.length - 1 - i];
        }
        return ofAscending(asc);
    }

    /** The constant polynomial {@code value}. */
    public static Polynomial constant(double value) {
        return ofAscending(value);
    }

    /** Degree; -1 for the zero polynomial. */
    public int degree() {
        return ascending.length - 1;
    }

    public boolean isZero() {
        return ascending.length == 0;
    }

    /** Coefficient of x^power; zero beyond the degree. */
    public double coefficient(int power) {
        return power < ascending.length && power >= 0 ? ascending[power] : 0.0;
    }

    /** A copy of the coefficients, ascending powers. */
    public double[] ascending() {
        return ascending.clone();
    }

    /** A copy of the coefficients, descending powers (highest first). */
    public double[] descending() {
        double[] d = new double[ascending.length];
        for (int i = 0; i < ascending.length; i++) {
            d[i] = ascending[ascending.length - 1 - i];
        }
        return d;
    }

    /** Largest absolute coefficient, the scale used for relative comparisons. */
    public double maxAbsCoefficient() {
        double m = 0;
        for (double c : ascending) {
            m = Math.max(m, Math.abs(c));
        }
        return m;
    }

    public Polynomial plus(Polynomial other) {
        double[] r = new double[Math.max(ascending.length, other.ascending.length)];
        for (int i = 0; i < r.length; i++) {
            r[i] = coefficient(i) + other.coefficient(i);
        }
        return new Polynomial(r);
    }

    public Polynomial minus(Polynomial other) {
        return plus(other.times(-1.0));
    }

    public Polynomial times(double factor) {
        double[] r = ascending.clone();
        for (int i = 0; i < r.length; i++) {
            r[i] *= factor;
        }
        return new Polynomial(r);
    }

    public Polynomial times(Polynomial other) {
        if (isZero() || other.isZero()) {
            return ZERO;
        }
        double[] r = new double[ascending.length + other.ascending.length - 1];
        for (int i = 0; i < ascending.length; i++) {
            for (int j = 0; j < other.ascending.length; j++) {
                r[i + j] += ascending[i] * other.ascending[j];
            }
        }
        return new Polynomial(r);
    }

    /** Value at a real point, by Horner's rule. */
    public double valueAt(double x) {
        double v = 0;
        for (int i = ascending.length - 1; i >= 0; i--) {
            v = v * x + ascending[i];
        }
        return v;
    }

    /** Value at the imaginary point {@code i omega}, written into {@code out} as {re, im} (no allocation). */
    public void valueAtImaginary(double omega, double[] out) {
        double re = 0;
        double im = 0;
        for (int i = ascending.length - 1; i >= 0; i--) {
            // (re + i im)(i omega) = -im omega + i re omega
            double nre = -im * omega + ascending[i];
            double nim = re * omega;
            re = nre;
            im = nim;
        }
        out[0] = re;
        out[1] = im;
    }

    /** Value at the complex point {@code x + i y}, written into {@code out} as {re, im}. */
    public void valueAtComplex(double x, double y, double[] out) {
        double re = 0;
        double im = 0;
        for (int i = ascending.length - 1; i >= 0; i--) {
            double nre = re * x - im * y + ascending[i];
            double nim = re * y + im * x;
            re = nre;
            im = nim;
        }
        out[0] = re;
        out[1] = im;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Polynomial p && Arrays.equals(ascending, p.ascending);
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(ascending);
    }

    @Override
    public String toString() {
        if (isZero()) {
            return "0";
        }
        StringBuilder sb = new StringBuilder();
        for (int i = ascending.length - 1; i >= 0; i--) {
            double c = ascending[i];
            if (c == 0) {
                continue;
            }
            if (sb.length() > 0) {
                sb.append(c < 0 ? " - " : " + ");
            } else if (c < 0) {
                sb.append('-');
            }
            sb.append(Math.abs(c));
            if (i >= 1) {
                sb.append(" s");
            }
            if (i >= 2) {
                sb.append('^').append(i);
            }
        }
        return sb.toString();
    }
}

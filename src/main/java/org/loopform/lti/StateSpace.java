package org.loopform.lti;

/**
 * A continuous-time single-input single-output state-space model, time in seconds:
 * {@code dx/dt = A x + B u, y = C x + D u}. Immutable; accessors return copies. Order 0 (a pure
 * gain) is allowed.
 */
final class StateSpace {

    private final double[][] a;
    private final double[] b;
    private final double[] c;
    private final double d;

    private StateSpace(double[][] a, double[] b, double[] c, double d) {
        int n = b.length;
        if (a.length != n || c.length != n) {
            throw new IllegalArgumentException("state-space sizes disagree: A has " + a.length
                    + " rows, B has " + n + " entries, C has " + c.length);
        }
        this.a = new double[n][];
        for (int i = 0; i < n; i++) {
            if (a[i].length != n) {
                throw new IllegalArgumentException("A must be square " + n + "x" + n + " (row " + i
                        + " has " + a[i].length + " entries)");
            }
            this.a[i] = a[i].clone();
            requireFinite("A", this.a[i]);
        }
        this.b = b.clone();
        this.c = c.clone();
        requireFinite("B", this.b);
        requireFinite("C", this.c);
        if (!Double.isFinite(d)) {
            throw new IllegalArgumentException("D must be finite (got " + d + ")");
        }
        this.d = d;
    }

    /** The model with the given matrices (copied). */
    static StateSpace of(double[][] a, double[] b, double[] c, double d) {
        return new StateSpace(a, b, c, d);
    }

    /**
     * The controllable canonical realization of a proper transfer function (Kailath, Linear
     * Systems, 1980, section 2.1 - from memory): with the denominator made monic,
     * {@code s^n + a(n-1) s^(n-1) + ... + a0}, the last state row is {@code -a0 ... -a(n-1)},
     * B is the last unit vector, D is the ratio of leading coefficients and C holds the
     * coefficients of the strictly proper remainder {@code N(s) - D den(s)}.
     */
    static StateSpace of(TransferFunction g) {
        if (!g.isProper()) {
            throw new IllegalArgumentException("only a proper transfer function has a state-space realization (got " + g + ")");
        }
        Polynomial den = g.denominator();
        Polynomial num = g.numerator();
        int n = den.degree();
        double lead = den.coefficient(n);
        double feedthrough = num.coefficient(n) / lead;
        double[][] a = new double[n][n];
        double[] b = new double[n];
        double[] c = new double[n];
        for (int i = 0; i + 1 < n; i++) {
            a[i][i + 1] = 1.0;
        }
        for (int j = 0; j < n; j++) {
            double monic = den.coefficient(j) / lead;
            a[n - 1][j] = -monic;
            c[j] = num.coefficient(j) / lead - feedthrough * monic;
        }
        if (n > 0) {
            b[n - 1] = 1.0;
        }
        return new StateSpace(a, b, c, feedthrough);
    }

    /** Number of states. */
    public int order() {
        return b.length;
    }

    public double[][] a() {
        double[][] copy = new double[a.length][];
        for (int i = 0; i < a.length; i++) {
            copy[i] = a[i].clone();
        }
        return copy;
    }

    public double[] b() {
        return b.clone();
    }

    public double[] c() {
        return c.clone();
    }

    public double d() {
        return d;
    }

    private static void requireFinite(String name, double[] values) {
        for (double v : values) {
            if (!Double.isFinite(v)) {
                throw new IllegalArgumentException(name + " entries must be finite (got " + v + ")");
            }
        }
    }
}

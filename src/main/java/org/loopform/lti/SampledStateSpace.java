package org.loopform.lti;

/**
 * A process sampled through a zero-order hold at scan time h, with its dead time
 * {@code L = d h + tau} ({@code 0 <= tau < h}) carried exactly:
 *
 * <pre>
 *   x(k+1) = A x(k) + B0 u(k-d) + B1 u(k-d-1)
 *   y(k)   = C x(k) + D u(k-d-1)
 * </pre>
 *
 * where u(k) is the input held over scan k, {@code [k h, (k+1) h)}, and y(k) is the output
 * sampled at {@code t = k h} just before u(k) takes effect. B1 carries the input still arriving
 * through the delay during the first tau of a scan, B0 the one arriving for the remaining
 * {@code h - tau} (Astrom &amp; Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 2,
 * sampling with a time delay - from memory). Immutable; accessors return copies.
 */
public final class SampledStateSpace {

    private final int order;
    private final double[] stateRowMajor;
    private final double[] inputNow;
    private final double[] inputPrevious;
    private final double[] output;
    private final double feedthrough;
    private final int delayScans;
    private final double fractionalDelaySeconds;
    private final double scanSeconds;

    SampledStateSpace(double[][] a, double[] b0, double[] b1, double[] c, double d,
            DelaySplit delay, double scanSeconds) {
        DelaySplit.requireScan(scanSeconds);
        this.order = b0.length;
        this.stateRowMajor = new double[order * order];
        for (int i = 0; i < order; i++) {
            for (int j = 0; j < order; j++) {
                stateRowMajor[i * order + j] = a[i][j];
            }
        }
        this.inputNow = b0.clone();
        this.inputPrevious = b1.clone();
        this.output = c.clone();
        this.feedthrough = d;
        this.delayScans = delay.delayScans();
        this.fractionalDelaySeconds = delay.fractionSeconds();
        this.scanSeconds = scanSeconds;
        requireFinite("A", stateRowMajor);
        requireFinite("B0", inputNow);
        requireFinite("B1", inputPrevious);
        requireFinite("C", output);
        requireFinite("D", new double[] {d});
    }

    /** Number of states (not counting the delay line). */
    public int order() {
        return order;
    }

    /** A = e^(A_c h). */
    public double[][] a() {
        double[][] copy = new double[order][order];
        for (int i = 0; i < order; i++) {
            System.arraycopy(stateRowMajor, i * order, copy[i], 0, order);
        }
        return copy;
    }

    /** B0: the input u(k-d), effective over the last {@code h - tau} of the scan. */
    public double[] b0() {
        return inputNow.clone();
    }

    /** B1: the input u(k-d-1), still effective over the first tau of the scan; zero when tau = 0. */
    public double[] b1() {
        return inputPrevious.clone();
    }

    public double[] c() {
        return output.clone();
    }

    /** Direct feedthrough D of the continuous model; it acts on u(k-d-1) at the sample instant. */
    public double d() {
        return feedthrough;
    }

    /** Whole scans d of the dead time. */
    public int delayScans() {
        return delayScans;
    }

    /** The remainder tau of the dead time, seconds, in [0, h). */
    public double fractionalDelaySeconds() {
        return fractionalDelaySeconds;
    }

    public double scanSeconds() {
        return scanSeconds;
    }

    /** A fresh simulator of this model, at rest. */
    public SampledProcess newProcess() {
        return new SampledProcess(this);
    }

    /**
     * Frequency response of the pulse transfer function at {@code z = e^(i omega h)}, omega in
     * rad/s, written into {@code out} as {re, im}:
     * {@code H(z) = z^-d [C (zI - A)^-1 (B0 + B1 z^-1) + D z^-1]}.
     * Allocates a small complex work matrix (see {@link #newWorkspace} for a reusable one); infinite
     * or NaN at a pole on the unit circle
     * (omega = 0 for an integrating process).
     */
    public void responseAt(double omegaRadPerSecond, double[] out) {
        responseAt(omegaRadPerSecond, newWorkspace(), out);
    }

    /** Scratch space for {@link #responseAt(double, Workspace, double[])} with this model's order. */
    public Workspace newWorkspace() {
        return new Workspace(order);
    }

    /**
     * As {@link #responseAt(double, double[])}, with the work matrix in {@code workspace} (from
     * {@link #newWorkspace}), so that it allocates nothing; the same numbers to the last bit.
     */
    public void responseAt(double omegaRadPerSecond, Workspace workspace, double[] out) {
        double theta = omegaRadPerSecond * scanSeconds;
        double cos = Math.cos(theta);
        double sin = Math.sin(theta);
        solve(0.0, cos, sin, cos > 0 ? sin * sin / (1 + cos) : 1 - cos, workspace);
        // z^-d = e^(-i d theta)
        double delayPhase = -delayScans * theta;
        double dc = Math.cos(delayPhase);
        double ds = Math.sin(delayPhase);
        out[0] = workspace.hRe * dc - workspace.hIm * ds;
        out[1] = workspace.hRe * ds + workspace.hIm * dc;
    }

    /**
     * The pulse transfer function anywhere in the plane, for the argument principle: at
     * {@code z = (1 + radiusOffset) e^(i theta)} writes {@code {Re H, Im H, Re H z^d, Im H z^d}}
     * into {@code out} (the second pair without the whole-scan delay). The diagonal of
     * {@code zI - A} is formed as {@code (1 - a) + radiusOffset cos theta - 2 sin^2(theta/2)} so that
     * points a hair from a pole near z = 1 keep their precision. Allocates nothing with a workspace.
     */
    public void responseAtRadius(double radiusOffset, double theta, Workspace workspace, double[] out) {
        double cos = Math.cos(theta);
        double sin = Math.sin(theta);
        rationalAtPoint(radiusOffset, cos, sin, cos > 0 ? sin * sin / (1 + cos) : 1 - cos, workspace, out);
        double hRe = out[2];
        double hIm = out[3];
        // z^-d = radius^-d e^(-i d theta)
        double scale = Math.exp(-delayScans * Math.log1p(radiusOffset));
        double delayPhase = -delayScans * theta;
        double dc = Math.cos(delayPhase) * scale;
        double ds = Math.sin(delayPhase) * scale;
        out[0] = hRe * dc - hIm * ds;
        out[1] = hRe * ds + hIm * dc;
    }

    /**
     * {@code H z^d} (the pulse transfer function without its whole-scan delay) at
     * {@code z = (1 + radiusOffset) e^(i theta)}, the angle given by its cosine, sine and
     * {@code 1 - cos} (computed without cancellation by the caller), into {@code out[2], out[3]}.
     */
    public void rationalAtPoint(double radiusOffset, double cos, double sin, double oneMinusCos, Workspace workspace,
                                double[] out) {
        solve(radiusOffset, cos, sin, oneMinusCos, workspace);
        out[2] = workspace.hRe;
        out[3] = workspace.hIm;
    }

    /**
     * {@code C (zI - A)^-1 (B0 + B1 z^-1) + D z^-1} at {@code z = (1 + radiusOffset) e^(i theta)} into the
     * workspace's {@code hRe, hIm}; the diagonal of {@code zI - A} is {@code (1 - a) + (z - 1)} with
     * {@code z - 1 = radiusOffset cos - (1 - cos) + i radius sin}, so points near z = 1 keep their precision.
     */
    private void solve(double radiusOffset, double cos, double sin, double oneMinusCos, Workspace workspace) {
        int n = order;
        if (workspace.order != n) {
            throw new IllegalArgumentException("workspace is for order " + workspace.order + ", the model has order "
                    + n + "; take it from this model's newWorkspace()");
        }
        double radius = 1 + radiusOffset;
        // z - 1 = radiusOffset cos - (1 - cos) + i radius sin
        double zMinusOneRe = radiusOffset * cos - oneMinusCos;
        double zIm = radius * sin;
        // z^-1 = e^(-i theta) / radius
        double invRe = cos / radius;
        double invIm = -sin / radius;
        if (n == 1) {
            solveFirstOrder(zMinusOneRe, zIm, invRe, invIm, workspace);
            return;
        }
        double[] mRe = workspace.matrixRe;
        double[] mIm = workspace.matrixIm;
        double[] rRe = workspace.vectorRe;
        double[] rIm = workspace.vectorIm;
        java.util.Arrays.fill(mIm, 0.0);
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                mRe[i * n + j] = -stateRowMajor[i * n + j];
            }
            mRe[i * n + i] = (1 - stateRowMajor[i * n + i]) + zMinusOneRe;
            mIm[i * n + i] = zIm;
            rRe[i] = inputNow[i] + inputPrevious[i] * invRe;
            rIm[i] = inputPrevious[i] * invIm;
        }
        ComplexLinearSolve.solveInPlace(n, mRe, mIm, rRe, rIm);
        double hRe = feedthrough * invRe;
        double hIm = feedthrough * invIm;
        for (int i = 0; i < n; i++) {
            hRe += output[i] * rRe[i];
            hIm += output[i] * rIm[i];
        }
        workspace.hRe = hRe;
        workspace.hIm = hIm;
    }

    /**
     * The general solve written out for order 1, operation for operation (same rounding):
     * {@code x = (b0 + b1 / z) / (z - a)} and {@code H = c x + d / z}.
     */
    private void solveFirstOrder(double zMinusOneRe, double zIm, double invRe, double invIm, Workspace workspace) {
        double pRe = (1 - stateRowMajor[0]) + zMinusOneRe;
        double pIm = zIm;
        double sRe = inputNow[0] + inputPrevious[0] * invRe;
        double sIm = inputPrevious[0] * invIm;
        double pMag2 = pRe * pRe + pIm * pIm;
        double xRe = (sRe * pRe + sIm * pIm) / pMag2;
        double xIm = (sIm * pRe - sRe * pIm) / pMag2;
        double hRe = feedthrough * invRe;
        double hIm = feedthrough * invIm;
        workspace.hRe = hRe + output[0] * xRe;
        workspace.hIm = hIm + output[0] * xIm;
    }

    /** The eigenvalues of A, the sampled process's poles other than the delay line's at z = 0, as {re, im} pairs. */
    public double[][] poles() {
        if (order == 1) {
            return new double[][] {{stateRowMajor[0], 0.0}};
        }
        if (order == 0) {
            return new double[0][];
        }
        org.apache.commons.math3.linear.EigenDecomposition eig = new org.apache.commons.math3.linear.EigenDecomposition(
                org.apache.commons.math3.linear.MatrixUtils.createRealMatrix(a()));
        double[] re = eig.getRealEigenvalues();
        double[] im = eig.getImagEigenvalues();
        double[][] out = new double[order][];
        for (int k = 0; k < order; k++) {
            out[k] = new double[] {re[k], im[k]};
        }
        return out;
    }

    /** Frequency response at {@code z = e^(i omega h)} as a new {re, im} pair. */
    public double[] responseAt(double omegaRadPerSecond) {
        double[] out = new double[2];
        responseAt(omegaRadPerSecond, out);
        return out;
    }

    // Package-private views for the simulator, which copies them once.
    double[] stateRowMajor() {
        return stateRowMajor;
    }

    double[] inputNowVector() {
        return inputNow;
    }

    double[] inputPreviousVector() {
        return inputPrevious;
    }

    double[] outputVector() {
        return output;
    }

    /** The complex work matrix and vector of one frequency-response evaluation; one thread at a time. */
    public static final class Workspace {

        private final int order;
        private final double[] matrixRe;
        private final double[] matrixIm;
        private final double[] vectorRe;
        private final double[] vectorIm;
        /** The last solve's result. */
        private double hRe;
        private double hIm;

        private Workspace(int order) {
            this.order = order;
            this.matrixRe = new double[order * order];
            this.matrixIm = new double[order * order];
            this.vectorRe = new double[order];
            this.vectorIm = new double[order];
        }
    }

    private static void requireFinite(String name, double[] values) {
        for (double v : values) {
            if (!Double.isFinite(v)) {
                throw new IllegalArgumentException("sampled model " + name + " entries must be finite (got " + v
                        + "); the scan time may be far too long for the process's fastest unstable mode");
            }
        }
    }
}

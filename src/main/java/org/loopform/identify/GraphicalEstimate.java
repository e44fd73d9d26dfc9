package org.loopform.identify;

/**
 * An FOPDT read from two points of a step response, times from the step:
 * <pre>
 *   Smith (1972):                      T = 1.5 (t63.2 - t28.3),    L = t63.2 - T
 *   Sundaresan &amp; Krishnaswamy (1978): T = 0.67 (t85.3 - t35.3),   L = 1.3 t35.3 - 0.29 t85.3
 * </pre>
 * (Seborg, Edgar &amp; Mellichamp, Process Dynamics and Control, 2nd ed., 2004, sec. 7.2 - from memory),
 * the gain {@code K = delta PV / delta output} in both.
 *
 * @param method "smith" or "sundaresan-krishnaswamy"
 * @param gain K, %/%
 * @param timeConstantSeconds T, s
 * @param deadTimeSeconds L, s (may come out slightly negative on noisy data; it is then 0)
 */
public record GraphicalEstimate(String method, double gain, double timeConstantSeconds, double deadTimeSeconds) {

    static GraphicalEstimate smith(double gain, double t283, double t632) {
        double t = 1.5 * (t632 - t283);
        return new GraphicalEstimate("smith", gain, t, Math.max(0, t632 - t));
    }

    static GraphicalEstimate sundaresanKrishnaswamy(double gain, double t353, double t853) {
        return new GraphicalEstimate("sundaresan-krishnaswamy", gain, 0.67 * (t853 - t353),
                Math.max(0, 1.3 * t353 - 0.29 * t853));
    }
}

package org.loopform.form;

import org.loopform.law.ControlLaw;
import org.loopform.law.PidTerms;

/**
 * The maps between a structure's own coordinates ({@link PidSetting}) and the canonical law
 * ({@link PidTerms}: C_y = (d s + p + i/s)/(1 + tf s), C_r = (dr s + pr + i/s)/(1 + tf s)).
 * Each map is the structure's definition multiplied out; for the ideal, parallel and series forms
 * without filter these are the relations of Astrom and Hagglund, PID Controllers: Theory, Design
 * and Tuning, 2nd ed., ISA 1995, section 3.4 (controller parameterizations).
 *
 * <pre>
 * ideal, filter on the derivative:  K (1 + 1/(Ti s) + Td s/(1 + Tf s)) on y; K (b + 1/(Ti s) + c Td s/(1 + Tf s)) on r
 *   p = K (1 + Tf/Ti), i = K/Ti, d = K (Tf + Td), pr = K (b + Tf/Ti), dr = K (b Tf + c Td)
 * ideal, filter on the measurement: K (1 + 1/(Ti s) + Td s)/(1 + Tf s) on y; K (b + 1/(Ti s)) on r (c = 0)
 *   p = K, i = K/Ti, d = K Td, pr = K (b + Tf/Ti), dr = K b Tf
 * parallel, filter on the derivative: kp + ki/s + kd s/(1 + Tf s) on y; b kp + ki/s + c kd s/(1 + Tf s) on r
 *   p = kp + ki Tf, i = ki, d = kp Tf + kd, pr = b kp + ki Tf, dr = b kp Tf + c kd
 * parallel, filter on the measurement: (kp + ki/s + kd s)/(1 + Tf s) on y; b kp + ki/s on r
 *   p = kp, i = ki, d = kd, pr = b kp + ki Tf, dr = b kp Tf
 * series: K (1 + 1/(Ti s)) (1 + Td s)/(1 + Tf s) on y; K (b + 1/(Ti s)) (1 + g s)/(1 + Tf s) on r,
 *   g = Td when c = 1 (derivative on error), g = Tf when c = 0 (derivative on measurement)
 *   p = K (1 + Td/Ti), i = K/Ti, d = K Td, pr = K (b + g/Ti), dr = K b g
 * </pre>
 */
public final class StructureLaw {

    private StructureLaw() {
    }

    /** The law a setting writes down. */
    public static ControlLaw toLaw(PidSetting s, FilterPlacement placement) {
        return new ControlLaw(toTerms(s, placement));
    }

    static PidTerms toTerms(PidSetting s, FilterPlacement placement) {
        double tf = s.filterSeconds();
        double b = s.b();
        double c = s.c();
        switch (s.structure()) {
            case IDEAL -> {
                double k = s.gain();
                double invTi = s.hasIntegral() ? 1.0 / s.integral() : 0.0;
                double td = s.derivative();
                if (placement == FilterPlacement.DERIVATIVE) {
                    return terms(k * (1 + tf * invTi), k * invTi, k * (tf + td),
                            tf, k * (b + tf * invTi), k * (b * tf + c * td));
                }
                return terms(k, k * invTi, k * td, tf, k * (b + tf * invTi), k * b * tf);
            }
            case PARALLEL -> {
                double kp = s.gain();
                double ki = s.integral();
                double kd = s.derivative();
                if (placement == FilterPlacement.DERIVATIVE) {
                    return terms(kp + ki * tf, ki, kp * tf + kd, tf, b * kp + ki * tf, b * kp * tf + c * kd);
                }
                return terms(kp, ki, kd, tf, b * kp + ki * tf, b * kp * tf);
            }
            case SERIES -> {
                double k = s.gain();
                double invTi = s.hasIntegral() ? 1.0 / s.integral() : 0.0;
                double td = s.derivative();
                double g = c == 1.0 ? td : tf;
                return terms(k * (1 + td * invTi), k * invTi, k * td, tf, k * (b + g * invTi), k * b * g);
            }
            default -> throw new IllegalStateException("unknown structure " + s.structure());
        }
    }

    /**
     * The law's terms, or bad input when a product of the written values overflows (values such as
     * 1e200 s): the tuning then cannot be computed with at all, whatever the form.
     */
    private static PidTerms terms(double p, double i, double d, double tf, double pr, double dr) {
        if (!(Double.isFinite(p) && Double.isFinite(i) && Double.isFinite(d) && Double.isFinite(tf)
                && Double.isFinite(pr) && Double.isFinite(dr))) {
            throw new FormException("the values are too large or too small to compute with (a term of the law"
                    + " they write overflows); check their magnitudes and units");
        }
        return new PidTerms(p, i, d, tf, pr, dr);
    }

    /**
     * The setting of {@code structure} that writes the feedback path of {@code t} exactly, with the
     * filter time constant of {@code t}, and the setpoint weights that reproduce its setpoint path
     * where they can ({@code seriesC} is the series form's fixed derivative weight, 0 or 1).
     * Returns null when no such setting exists: a series structure needs real zeros,
     * p^2 >= 4 d i, which for an ideal law without filter is Ti >= 4 Td (Astrom and Hagglund 1995,
     * section 3.4); a setting also needs a non-zero gain and a derivative time >= 0.
     */
    static PidSetting fromTerms(PidTerms t, Structure structure, FilterPlacement placement, double seriesC) {
        double tf = t.tf();
        double i = t.i();
        switch (structure) {
            case IDEAL -> {
                double k = placement == FilterPlacement.DERIVATIVE ? t.p() - tf * i : t.p();
                if (k == 0) {
                    return null;
                }
                double ti = i == 0 ? Double.POSITIVE_INFINITY : k / i;
                double td = placement == FilterPlacement.DERIVATIVE ? t.d() / k - tf : t.d() / k;
                if (!(ti > 0) || td < -ROUNDING * Math.abs(ti == Double.POSITIVE_INFINITY ? td : ti)) {
                    return null;
                }
                td = Math.max(td, 0.0);
                double b = (t.pr() - tf * i) / k;
                double c = placement == FilterPlacement.DERIVATIVE && td > 0 ? (t.dr() / k - b * tf) / td : 0.0;
                return new PidSetting(structure, k, ti, td, tf, b, c);
            }
            case PARALLEL -> {
                double kp = placement == FilterPlacement.DERIVATIVE ? t.p() - tf * i : t.p();
                if (kp == 0) {
                    return null;
                }
                double kd = placement == FilterPlacement.DERIVATIVE ? t.d() - kp * tf : t.d();
                if (kd / kp < -ROUNDING * Math.abs(t.d() / kp)) {
                    return null;
                }
                if (kd / kp < 0) {
                    kd = 0.0;
                }
                double b = (t.pr() - i * tf) / kp;
                double c = placement == FilterPlacement.DERIVATIVE && kd != 0 ? (t.dr() - b * kp * tf) / kd : 0.0;
                return new PidSetting(structure, kp, i, kd, tf, b, c);
            }
            case SERIES -> {
                double p = t.p();
                double discriminant = p * p - 4 * t.d() * i;
                if (discriminant < 0 || p == 0) {
                    return null;
                }
                // K^2 - p K + d i = 0; the root of larger magnitude gives Ti >= Td
                double k = (p + Math.copySign(Math.sqrt(discriminant), p)) / 2;
                double ti = i == 0 ? Double.POSITIVE_INFINITY : k / i;
                double td = t.d() / k;
                if (!(ti > 0) || td < 0) {
                    return null;
                }
                double g = seriesC == 1.0 ? td : tf;
                double b = t.pr() / k - (Double.isFinite(ti) ? g / ti : 0.0);
                return new PidSetting(structure, k, ti, td, tf, b, seriesC);
            }
            default -> throw new IllegalStateException("unknown structure " + structure);
        }
    }

    /** Relative size below which a negative derivative time is rounding noise. */
    private static final double ROUNDING = 1e-12;

    /** The discriminant test for a series realization: p^2 - 4 d i, >= 0 for real zeros. */
    static double seriesDiscriminant(PidTerms t) {
        return t.p() * t.p() - 4 * t.d() * t.i();
    }
}

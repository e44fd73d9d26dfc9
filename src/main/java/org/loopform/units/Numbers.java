package org.loopform.units;

import java.math.BigDecimal;
import java.math.MathContext;

/** Number formatting shared by every printed figure. */
public final class Numbers {
    private Numbers() {
    }

    /** Shortest plain decimal (no exponent for ordinary magnitudes), e.g. 0.5, 150, 1.2e-07. */
    public static String plain(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e15) {
            return Long.toString((long) v);
        }
        String s = Double.toString(v);
        if (s.contains("E")) {
            double a = Math.abs(v);
            if (a >= 1e-4 && a < 1e15) {
                return new BigDecimal(v).round(MathContext.DECIMAL64).stripTrailingZeros().toPlainString();
            }
        }
        return s;
    }

    /**
     * Digits kept in machine-readable output (JSON, CSV figures): far beyond any controller's
     * resolution or any model's accuracy, and short of the last two digits of a double, where
     * binary noise lives (117.99999999999999 is 118).
     */
    public static final int MACHINE_DIGITS = 10;

    /** Deviations below this (dB or deg) print as "< 0.001": smaller is noise, not a figure worth reading. */
    static final double SMALLEST_DEVIATION = 0.0005;

    /** {@code v} rounded to {@link #MACHINE_DIGITS} significant digits (non-finite values unchanged). */
    public static double tidy(double v) {
        if (!Double.isFinite(v) || v == 0) {
            return v + 0.0;
        }
        return new BigDecimal(v).round(new MathContext(MACHINE_DIGITS)).doubleValue();
    }

    /**
     * A deviation (dB or deg, a magnitude >= 0) to three significant digits; below
     * {@link #SMALLEST_DEVIATION} it reads "< 0.001" rather than "0" (the results compared differ) or
     * "2.89E-15" (the difference is rounding noise).
     */
    public static String deviation(double v) {
        if (Double.isFinite(v) && Math.abs(v) < SMALLEST_DEVIATION) {
            return "< 0.001";
        }
        return significant(v, 3);
    }

    /** {@code v} to {@code significant} significant digits, plainly written. */
    public static String significant(double v, int significant) {
        if (!Double.isFinite(v)) {
            return Double.toString(v);
        }
        if (v == 0) {
            return "0";
        }
        BigDecimal d = new BigDecimal(v).round(new MathContext(significant)).stripTrailingZeros();
        double a = Math.abs(v);
        if (a >= 1e-6 && a < 1e12) {
            return d.toPlainString();
        }
        return d.toString();
    }
}

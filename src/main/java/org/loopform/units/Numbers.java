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

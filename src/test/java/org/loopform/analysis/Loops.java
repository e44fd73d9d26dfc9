package org.loopform.analysis;

import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

/** Loops for the analysis tests, built from their textbook parts. */
final class Loops {

    private Loops() {
    }

    /**
     * Ideal PID with derivative filter, {@code K (1 + 1/(Ti s) + Td s / (1 + s Td/N))}, over the
     * common denominator {@code Ti s (1 + s Tf)}, Tf = Td/N; {@code ti = 0} means no integral
     * action and {@code td = 0} no derivative action.
     */
    static TransferFunction idealPid(double k, double ti, double td, double n) {
        TransferFunction law = TransferFunction.gain(k);
        if (ti > 0) {
            law = law.plus(new TransferFunction(Polynomial.constant(k), Polynomial.ofAscending(0, ti)));
        }
        if (td > 0) {
            law = law.plus(new TransferFunction(Polynomial.ofAscending(0, k * td), Polynomial.ofAscending(1, td / n)));
        }
        return law;
    }

    /** {@code 1 / (s + 1)^order}. */
    static TransferFunction lag(int order) {
        Polynomial den = Polynomial.ONE;
        for (int i = 0; i < order; i++) {
            den = den.times(Polynomial.ofAscending(1, 1));
        }
        return new TransferFunction(Polynomial.ONE, den);
    }

    /** A sampled loop {@code num(z) / den(z)} evaluated at {@code z = e^(i omega h)}. */
    static LoopResponse sampled(Polynomial num, Polynomial den, double scanSeconds) {
        double[] scratch = new double[2];
        return (omega, reIm) -> {
            double x = Math.cos(omega * scanSeconds);
            double y = Math.sin(omega * scanSeconds);
            num.valueAtComplex(x, y, scratch);
            double nr = scratch[0];
            double ni = scratch[1];
            den.valueAtComplex(x, y, scratch);
            double dr = scratch[0];
            double di = scratch[1];
            double mag2 = dr * dr + di * di;
            reIm[0] = (nr * dr + ni * di) / mag2;
            reIm[1] = (ni * dr - nr * di) / mag2;
        };
    }
}

package org.loopform.scan;

import java.util.ArrayList;
import java.util.List;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.AntiWindup;
import org.loopform.form.DiscreteAlgorithm;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;
import org.loopform.form.Structure;

/** Settings, algorithms and the table of structure x placement x discretization cases the scan tests share. */
final class Setups {

    private Setups() {
    }

    static final Discretization[] INTEGRAL_METHODS = {
            Discretization.FORWARD, Discretization.BACKWARD, Discretization.TRAPEZOIDAL};

    static PidSetting ideal(double k, double ti, double td, double tf, double b, double c) {
        return new PidSetting(Structure.IDEAL, k, ti, td, tf, b, c);
    }

    static PidSetting series(double k, double ti, double td, double tf, double b, double c) {
        return new PidSetting(Structure.SERIES, k, ti, td, tf, b, c);
    }

    static PidSetting parallel(double kp, double ki, double kd, double tf, double b, double c) {
        return new PidSetting(Structure.PARALLEL, kp, ki, kd, tf, b, c);
    }

    static DiscreteAlgorithm algorithm(AlgorithmKind kind, Discretization integral, Discretization derivative,
                                       AntiWindup antiWindup, double trackingSeconds) {
        return new DiscreteAlgorithm(kind, integral, derivative, antiWindup, trackingSeconds, 0.0, 100.0,
                List.of(), 0.0, Double.MAX_VALUE);
    }

    static DiscreteAlgorithm algorithm(AlgorithmKind kind, Discretization integral, Discretization derivative) {
        return algorithm(kind, integral, derivative, AntiWindup.CLAMPING, 0.0);
    }

    /** One linear controller to exercise: a setting, where its filter acts, and the two discretizations. */
    record Case(PidSetting setting, FilterPlacement placement, Discretization integral, Discretization derivative) {

        DiscreteAlgorithm algorithm(AlgorithmKind kind) {
            return Setups.algorithm(kind, integral, derivative);
        }

        @Override
        public String toString() {
            return setting.structure() + " c=" + setting.c() + " tf=" + setting.filterSeconds() + " on " + placement
                    + ", integral " + integral + ", derivative " + derivative;
        }
    }

    /** Every structure and placement, with and without a filter, under every pair of discretizations. */
    static List<Case> allCases() {
        List<PidSetting> derivativeFiltered = List.of(
                ideal(1.7, 6.0, 1.2, 0.3, 0.6, 0.4),
                ideal(-0.8, 4.0, 0.9, 0.0, 1.0, 1.0),
                parallel(2.0, 0.25, 1.5, 0.2, 0.7, 0.5),
                series(1.3, 5.0, 1.1, 0.25, 0.8, 1.0),
                series(1.3, 5.0, 1.1, 0.25, 0.8, 0.0),
                series(0.9, 7.0, 0.6, 0.0, 1.0, 0.0));
        List<PidSetting> measurementFiltered = List.of(
                ideal(1.7, 6.0, 1.2, 0.3, 0.6, 0.0),
                parallel(2.0, 0.25, 1.5, 0.2, 0.7, 0.0),
                ideal(1.1, Double.POSITIVE_INFINITY, 0.8, 0.4, 1.0, 0.0));
        List<Case> cases = new ArrayList<>();
        for (Discretization integral : INTEGRAL_METHODS) {
            for (Discretization derivative : Discretization.values()) {
                for (PidSetting s : derivativeFiltered) {
                    cases.add(new Case(s, FilterPlacement.DERIVATIVE, integral, derivative));
                }
                for (PidSetting s : measurementFiltered) {
                    cases.add(new Case(s, FilterPlacement.MEASUREMENT, integral, derivative));
                }
            }
        }
        return cases;
    }
}

package org.loopform.scan;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;

@DisplayName("The velocity form")
class VelocityFormTest {

    private static final double TOL = 1e-11;
    private static final int SCANS = 400;

    /** An input that moves in steps and ramps, %, so every term is exercised. */
    static double setpoint(int k) {
        return 50 + (k >= 20 ? 10 : 0) + (k >= 150 ? -25 : 0) + (k >= 300 ? 0.2 * (k - 300) : 0);
    }

    static double pv(int k) {
        return 48 + 7 * Math.sin(0.07 * k) + 3 * Math.cos(0.31 * k + 1) + (k % 37 == 0 ? 2 : 0);
    }

    // Wittenmark, Astrom & Arzen, "Computer Control: An Overview", IFAC Professional Brief, 2002
    // (docs/references.md 4): for the ideal PID without filter, backward differences,
    // du(k) = K [e(k) - e(k-1) + (h/Ti) e(k) + (Td/h)(e(k) - 2 e(k-1) + e(k-2))], e = r - y (b = c = 1)
    @Test
    void increments_follow_the_published_velocity_equation() {
        double k = 2.0;
        double ti = 5.0;
        double td = 0.8;
        double h = 0.2;
        PidSetting pid = Setups.ideal(k, ti, td, 0.0, 1.0, 1.0);
        ScanController c = ScanController.unlimited(pid, FilterPlacement.DERIVATIVE,
                Setups.algorithm(AlgorithmKind.VELOCITY, Discretization.BACKWARD, Discretization.BACKWARD), h);
        double e1 = 0;
        double e2 = 0;
        double previousOutput = c.outputPercent();
        for (int i = 0; i < SCANS; i++) {
            double e = setpoint(i) - pv(i);
            double du = k * (e - e1 + (h / ti) * e + (td / h) * (e - 2 * e1 + e2));
            double u = c.update(setpoint(i), pv(i));
            assertThat(u - previousOutput).as("scan %d", i).isCloseTo(du, within(TOL));
            previousOutput = u;
            e2 = e1;
            e1 = e;
        }
    }

    static List<Setups.Case> cases() {
        return Setups.allCases();
    }

    // summing the increments of u(k) = P(k) + I(k) + D(k) gives back u(k): the velocity form is the
    // positional one differenced (Astrom & Wittenmark, Computer-Controlled Systems, 3rd ed., 1997,
    // ch. 8 - from memory), so without limits both write the same outputs
    @ParameterizedTest
    @MethodSource("cases")
    void without_limits_writes_the_same_outputs_as_the_positional_form(Setups.Case c) {
        double h = 0.1;
        ScanController positional = ScanController.unlimited(c.setting(), c.placement(),
                c.algorithm(AlgorithmKind.POSITIONAL), h);
        ScanController velocity = ScanController.unlimited(c.setting(), c.placement(),
                c.algorithm(AlgorithmKind.VELOCITY), h);
        positional.reset(42.0, setpoint(0), pv(0));
        velocity.reset(42.0, setpoint(0), pv(0));
        for (int i = 0; i < SCANS; i++) {
            double up = positional.update(setpoint(i), pv(i));
            double uv = velocity.update(setpoint(i), pv(i));
            assertThat(uv).as("scan %d", i).isCloseTo(up, within(1e-9 * Math.max(1, Math.abs(up))));
        }
    }
}

package org.loopform.scan;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import net.jqwik.api.constraints.DoubleRange;
import org.loopform.form.Discretization;
import org.loopform.form.FilterPlacement;
import org.loopform.form.PidSetting;
import org.loopform.form.Structure;
import org.loopform.form.StructureLaw;
import org.loopform.law.ControlLaw;

/**
 * As the scan time shrinks, each discretization's pulse response at a fixed frequency approaches
 * the continuous law's: z = e^(i omega h) and every map s -> (z - 1)/h, (z - 1)/(z h),
 * (2/h)(z - 1)/(z + 1) agrees with i omega to first order in omega h (Astrom & Wittenmark,
 * Computer-Controlled Systems, 3rd ed., 1997, ch. 8 - from memory; Wittenmark, Astrom & Arzen,
 * "Computer Control: An Overview", IFAC Professional Brief, 2002, Table 3). The continuous law is
 * the one {@code form.StructureLaw} writes for the setting.
 */
class ContinuousLimitProperties {

    /** h is 1e-4 of the shortest time in the setting and of 1/omega, so first-order errors are about 1e-4. */
    private static final double SCAN_FRACTION = 1e-4;
    private static final double REL_TOL = 1e-3;

    @Property(tries = 400, seed = "20260317")
    void pulse_response_approaches_the_continuous_law(
            @ForAll Structure structure,
            @ForAll FilterPlacement placement,
            @ForAll boolean reverse,
            @ForAll @DoubleRange(min = 0.1, max = 10) double gainMagnitude,
            @ForAll boolean integralOn,
            @ForAll @DoubleRange(min = 0.5, max = 100) double ti,
            @ForAll @DoubleRange(min = 0, max = 20) double td,
            @ForAll boolean filterOn,
            @ForAll @DoubleRange(min = 2, max = 20) double n,
            @ForAll @DoubleRange(min = 0, max = 1) double b,
            @ForAll @DoubleRange(min = 0, max = 1) double c,
            @ForAll("integralMethods") Discretization integral,
            @ForAll Discretization derivative,
            @ForAll @DoubleRange(min = 0.01, max = 5) double omega) {
        double k = reverse ? gainMagnitude : -gainMagnitude;
        double tf = filterOn ? Math.max(td, 1.0) / n : 0.0;
        double weightC = structure == Structure.SERIES ? (c > 0.5 ? 1.0 : 0.0)
                : (placement == FilterPlacement.MEASUREMENT ? 0.0 : c);
        PidSetting setting = structure == Structure.PARALLEL
                ? new PidSetting(structure, k, integralOn ? k / ti : 0.0, k * td, tf, b, weightC)
                : new PidSetting(structure, k, integralOn ? ti : Double.POSITIVE_INFINITY, td, tf, b, weightC);

        double shortest = 1 / omega;
        shortest = integralOn ? Math.min(shortest, ti) : shortest;
        shortest = td > 0 ? Math.min(shortest, td) : shortest;
        shortest = tf > 0 ? Math.min(shortest, tf) : shortest;
        double h = SCAN_FRACTION * shortest;

        PulseLaw discrete = PulseLaw.of(setting, placement, integral, derivative, h);
        ControlLaw continuous = StructureLaw.toLaw(setting, placement);
        double scale = gainMagnitude * (1 + (integralOn ? 1 / (omega * ti) : 0)) * (1 + omega * (td + tf));
        double[] got = new double[2];
        double[] expected = new double[2];

        discrete.feedbackAt(omega, got);
        continuous.feedbackAt(omega, expected);
        assertThat(got[0]).as("C_y re").isCloseTo(expected[0], within(REL_TOL * scale));
        assertThat(got[1]).as("C_y im").isCloseTo(expected[1], within(REL_TOL * scale));

        discrete.setpointAt(omega, got);
        continuous.setpointAt(omega, expected);
        assertThat(got[0]).as("C_r re").isCloseTo(expected[0], within(REL_TOL * scale));
        assertThat(got[1]).as("C_r im").isCloseTo(expected[1], within(REL_TOL * scale));
    }

    @Provide
    Arbitrary<Discretization> integralMethods() {
        return Arbitraries.of(Setups.INTEGRAL_METHODS);
    }
}

package org.loopform.lti;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Source: scipy 1.17 as an independent reference library. Delay-free processes against scipy 1.17: {@code scipy.signal.cont2discrete(method='zoh')},
 * simulated with {@code scipy.signal.dlsim} and evaluated with {@code scipy.signal.dfreqresp}.
 * Regenerate the golden files with {@code python3 src/test/python/write_sampling_golden.py}.
 */
@DisplayName("Zero-order hold against scipy's cont2discrete")
class ZeroOrderHoldGoldenTest {

    private static final String DIR = "/org/loopform/lti/";
    /** Both sides are exact up to rounding; the golden values are printed with 17 significant digits. */
    private static final double TOL = 1e-11;

    static Stream<String> cases() {
        return GoldenCsv.rows(DIR + "zoh-golden-cases.csv").stream().map(r -> r[0]);
    }

    private static SampledStateSpace sampled(String name) {
        for (String[] r : GoldenCsv.rows(DIR + "zoh-golden-cases.csv")) {
            if (r[0].equals(name)) {
                TransferFunction g = TransferFunction.ofDescending(GoldenCsv.numbers(r[1]), GoldenCsv.numbers(r[2]));
                return ZeroOrderHold.of(g, 0.0, Double.parseDouble(r[3]));
            }
        }
        throw new IllegalArgumentException("no golden case " + name);
    }

    @Test
    void the_golden_files_hold_four_cases() {
        assertThat(cases()).containsExactly(
                "first_order", "second_order_underdamped", "third_order_lag", "lead_lag_numerator");
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("cases")
    void samples_the_same_output_sequence(String name) {
        SampledProcess process = sampled(name).newProcess();
        List<String[]> rows = GoldenCsv.rows(DIR + "zoh-golden-steps.csv").stream()
                .filter(r -> r[0].equals(name)).toList();
        assertThat(rows).hasSize(60);
        double y = process.output();
        for (String[] r : rows) {
            assertThat(y).as("%s, k = %s", name, r[1]).isCloseTo(Double.parseDouble(r[3]), within(TOL));
            y = process.step(Double.parseDouble(r[2]));
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("cases")
    void has_the_same_pulse_frequency_response(String name) {
        SampledStateSpace s = sampled(name);
        double[] out = new double[2];
        List<String[]> rows = GoldenCsv.rows(DIR + "zoh-golden-frequency.csv").stream()
                .filter(r -> r[0].equals(name)).toList();
        assertThat(rows).hasSize(7);
        for (String[] r : rows) {
            s.responseAt(Double.parseDouble(r[1]), out);
            assertThat(out[0]).as("%s re at %s rad/s", name, r[1]).isCloseTo(Double.parseDouble(r[2]), within(TOL));
            assertThat(out[1]).as("%s im at %s rad/s", name, r[1]).isCloseTo(Double.parseDouble(r[3]), within(TOL));
        }
    }
}

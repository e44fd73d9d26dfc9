package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.junit.jupiter.api.DisplayName;
import org.loopform.lti.TransferFunction;

/**
 * Continuous loops {@code R(s) e^(-s L)} (PI/PID on first order, second order, resonant,
 * integrating and open-loop unstable processes; biproper loops without a derivative filter; loops
 * without dead time) against an independent numpy reference: the number of closed-loop poles in
 * the right half plane by the argument principle on a rectangle round every zero of
 * {@code den R + num R e^(-s L)} with {@code Re s >= 0} (Astrom and Murray, Feedback Systems, 2008,
 * ch. 9 - from memory for the section), numpy.roots without dead time, and the hand-derived rows
 * the script writes out (an integrator under proportional control at its ultimate gain pi/(2 L),
 * a root at s = i pi/(2 L); the neutral chain at Re s = ln|c|/L, Hale and Verduyn Lunel,
 * Introduction to Functional Differential Equations, 1993, ch. 9 - from memory). Regenerate with
 * {@code python3 src/test/python/write_delay_loop_golden.py} from the repository root.
 */
@DisplayName("Continuous dead-time loops: right-half-plane poles agree with the numpy reference")
class DelayLoopGoldenTest {

    record Golden(String id, TransferFunction rational, double deadTimeSeconds, double slowestRadPerSecond,
            Stability verdict, int unstablePoles) {
        @Override
        public String toString() {
            return id;
        }
    }

    static Stream<Golden> goldenLoops() {
        return read().stream();
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("goldenLoops")
    void verdict_and_count_match_the_reference(Golden golden) {
        LoopStability s = ContinuousStability.of(golden.rational(), golden.deadTimeSeconds(),
                golden.slowestRadPerSecond());

        assertThat(s.verdict()).isEqualTo(golden.verdict());
        assertThat(s.unstablePoles()).isEqualTo(golden.unstablePoles() < 0 ? Integer.MAX_VALUE : golden.unstablePoles());
        assertThat(s.largestPoleMagnitude()).isEmpty();
        int relativeDegree = golden.rational().denominator().degree() - golden.rational().numerator().degree();
        StabilityTest expectedTest = golden.deadTimeSeconds() == 0 ? StabilityTest.POLYNOMIAL_ROOTS
                : relativeDegree == 0 && golden.verdict() != Stability.STABLE ? StabilityTest.HIGH_FREQUENCY_GAIN
                : StabilityTest.NYQUIST;
        assertThat(s.test()).isEqualTo(expectedTest);
        if (golden.verdict() == Stability.UNSTABLE && golden.unstablePoles() > 0) {
            assertThat(s.explanation()).contains(golden.unstablePoles() == 1 ? "One closed-loop pole"
                    : golden.unstablePoles() + " closed-loop poles");
        }
    }

    private static List<Golden> read() {
        var stream = DelayLoopGoldenTest.class.getResourceAsStream("delay-loop-golden.csv");
        if (stream == null) {
            throw new IllegalStateException("delay-loop-golden.csv missing; run src/test/python/write_delay_loop_golden.py");
        }
        List<Golden> rows = new ArrayList<>();
        try (BufferedReader in = new BufferedReader(new InputStreamReader(stream, StandardCharsets.UTF_8))) {
            in.readLine();
            for (String line = in.readLine(); line != null; line = in.readLine()) {
                String[] f = line.split(",", -1);
                rows.add(new Golden(f[0], TransferFunction.ofDescending(numbers(f[1]), numbers(f[2])),
                        Double.parseDouble(f[3]), Double.parseDouble(f[4]),
                        Stability.valueOf(f[5].toUpperCase(java.util.Locale.ROOT)), Integer.parseInt(f[6])));
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return rows;
    }

    private static double[] numbers(String field) {
        return Arrays.stream(field.trim().split(" ")).mapToDouble(Double::parseDouble).toArray();
    }
}

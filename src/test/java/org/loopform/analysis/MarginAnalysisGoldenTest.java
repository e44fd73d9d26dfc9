package org.loopform.analysis;

import org.loopform.lti.FrequencyBand;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.OptionalDouble;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;

/**
 * Margins of benchmark loops against an independent reference: numpy on a grid of two million
 * points, refined by scipy's brentq and minimize_scalar. Regenerate the reference with
 * {@code python3 src/test/python/write_margin_golden.py} (from the repository root); the script
 * names the benchmark source (Astrom and Hagglund, "Benchmark systems for PID control", 2000,
 * from memory) and the shared conventions.
 */
@DisplayName("Margin analysis agrees with the numpy/scipy reference")
class MarginAnalysisGoldenTest {

    /** The stated accuracy of every refined frequency, and so of the margins read there. */
    private static final double RELATIVE = MarginAnalysis.STATED_FREQUENCY_RELATIVE_ACCURACY;
    /** A relative frequency error of 1e-6 moves the phase by far less than this. */
    private static final double PHASE_DEGREES = 1e-4;

    record Golden(String id, LoopResponse loop, FrequencyBand band, OptionalDouble gainMargin,
            OptionalDouble phaseCrossover, OptionalDouble phaseMarginDegrees, OptionalDouble crossover,
            OptionalDouble delayMarginSeconds, double ms, double msRadPerSecond, int unstablePoles,
            OptionalDouble lowerGainMargin, TransferFunction rational, double deadTimeSeconds) {
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
    void margins_match_the_dense_grid_reference(Golden golden) {
        LoopMargins margins = MarginAnalysis.over(golden.band()).analyze(golden.loop());

        assertCloseRelative(margins.gainMargin(), golden.gainMargin());
        assertCloseRelative(margins.lowerGainMargin(), golden.lowerGainMargin());
        assertCloseRelative(margins.phaseCrossoverRadPerSecond(), golden.phaseCrossover());
        assertThat(margins.phaseMarginDegrees().isPresent()).isEqualTo(golden.phaseMarginDegrees().isPresent());
        if (golden.phaseMarginDegrees().isPresent()) {
            assertThat(margins.phaseMarginDegrees().getAsDouble())
                    .isCloseTo(golden.phaseMarginDegrees().getAsDouble(), within(PHASE_DEGREES));
        }
        assertCloseRelative(margins.crossoverRadPerSecond(), golden.crossover());
        assertCloseRelative(margins.delayMarginSeconds(), golden.delayMarginSeconds());
        // Ms sits at a minimum of |1 + L|, so a frequency error of 1e-6 moves it by about 1e-12
        assertThat(margins.maximumSensitivity()).isCloseTo(golden.ms(), within(RELATIVE * golden.ms()));
        assertThat(margins.maximumSensitivityRadPerSecond())
                .isCloseTo(golden.msRadPerSecond(), within(RELATIVE * golden.msRadPerSecond()));
    }

    /**
     * The reference counts closed-loop poles by the argument principle on 1 + L, or by numpy.roots;
     * loopform decides the continuous loops' stability from their poles too (the sampled rows are
     * covered by the stability cross-check).
     */
    @ParameterizedTest(name = "{0}")
    @MethodSource("goldenLoops")
    void stability_verdict_matches_the_closed_loop_pole_count(Golden golden) {
        org.junit.jupiter.api.Assumptions.assumeTrue(golden.rational() != null, "sampled row");
        LoopStability s = ContinuousStability.of(golden.rational(), golden.deadTimeSeconds(), golden.band().lowRadPerSecond());
        assertThat(s.unstablePoles()).isEqualTo(golden.unstablePoles());
        assertThat(s.isStable()).isEqualTo(golden.unstablePoles() == 0);
    }

    private static void assertCloseRelative(OptionalDouble actual, OptionalDouble expected) {
        assertThat(actual.isPresent()).as("present").isEqualTo(expected.isPresent());
        if (expected.isPresent()) {
            double e = expected.getAsDouble();
            assertThat(actual.getAsDouble()).isCloseTo(e, within(RELATIVE * Math.abs(e)));
        }
    }

    private static List<Golden> read() {
        var stream = MarginAnalysisGoldenTest.class.getResourceAsStream("margin-golden.csv");
        if (stream == null) {
            throw new IllegalStateException("margin-golden.csv missing; run src/test/python/write_margin_golden.py");
        }
        List<Golden> rows = new ArrayList<>();
        try (BufferedReader in = new BufferedReader(new InputStreamReader(stream, StandardCharsets.UTF_8))) {
            in.readLine();
            for (String line = in.readLine(); line != null; line = in.readLine()) {
                rows.add(parse(line.split(",", -1)));
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return rows;
    }

    private static Golden parse(String[] f) {
        Polynomial num = Polynomial.ofDescending(coefficients(f[2]));
        Polynomial den = Polynomial.ofDescending(coefficients(f[3]));
        double deadTimeSeconds = Double.parseDouble(f[4]);
        double k = Double.parseDouble(f[5]);
        double ti = Double.parseDouble(f[6]);
        double td = Double.parseDouble(f[7]);
        double n = Double.parseDouble(f[8]);
        double scanSeconds = Double.parseDouble(f[9]);
        FrequencyBand band = FrequencyBand.of(Double.parseDouble(f[10]), Double.parseDouble(f[11]));
        TransferFunction rational = f[1].equals("z") ? null : Loops.idealPid(k, ti, td, n).times(new TransferFunction(num, den));
        LoopResponse loop = f[1].equals("z")
                ? Loops.sampled(num.times(k), den, scanSeconds)
                : LoopResponse.of(rational, deadTimeSeconds);
        return new Golden(f[0], loop, band, optional(f[12]), optional(f[13]), optional(f[14]), optional(f[15]),
                optional(f[16]), Double.parseDouble(f[17]), Double.parseDouble(f[18]),
                Integer.parseInt(f[19]), optional(f[20]), rational, deadTimeSeconds);
    }

    private static double[] coefficients(String field) {
        return Arrays.stream(field.trim().split(" ")).mapToDouble(Double::parseDouble).toArray();
    }

    private static OptionalDouble optional(String field) {
        return field.isEmpty() ? OptionalDouble.empty() : OptionalDouble.of(Double.parseDouble(field));
    }
}

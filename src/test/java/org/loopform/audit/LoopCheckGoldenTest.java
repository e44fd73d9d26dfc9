package org.loopform.audit;

import org.loopform.check.LoopSpec;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.UncheckedIOException;
import java.net.URISyntaxException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalDouble;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.loopform.analysis.LoopMargins;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.LoopFileReader;

/**
 * {@link LoopCheck#run} on invented loops against an independent numpy/scipy evaluation: the
 * design loop C(s) P(s) e^(-sL) from the ideal PID's definition, and the target loop C(z) P(z)
 * with P(z) from scipy's zero-order-hold sampling plus the dead time by state augmentation
 * (Astrom and Wittenmark, Computer-Controlled Systems, 3rd ed., 1997, ch. 2 - from memory) and
 * C(z) the backward-difference PID with backward-difference filtered derivative (Wittenmark,
 * Astrom and Arzen, "Computer Control: An Overview", IFAC 2002, Table 3), each on a grid of two
 * million points refined by brentq. Regenerate the loop files and the reference with
 * {@code python3 src/test/python/write_check_golden.py} (from the repository root).
 */
@DisplayName("A loop check's design and target margins agree with the numpy/scipy reference")
class LoopCheckGoldenTest {

    /**
     * loopform refines each crossing to a relative frequency accuracy of 1e-6 (it promises no
     * more: {@code MarginAnalysis.STATED_FREQUENCY_RELATIVE_ACCURACY}); gain margin, delay margin
     * and Ms read there inherit it. Measured: 5e-10 or better on the five loops, so this leaves room.
     */
    private static final double RELATIVE = 1e-6;
    /** A relative frequency error of 1e-6 moves the phase by far less than this. */
    private static final double PHASE_DEGREES = 1e-4;

    record Golden(String file, String which, OptionalDouble gainMargin, OptionalDouble phaseCrossover,
                  OptionalDouble phaseMarginDegrees, OptionalDouble crossover, OptionalDouble delayMargin,
                  double ms, double msRadPerSecond, OptionalDouble lowerGainMargin) {
        @Override
        public String toString() {
            return file + " " + which;
        }
    }

    static Stream<Golden> goldenLoops() {
        return read().stream();
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("goldenLoops")
    void margins_match_the_reference(Golden golden) {
        CheckResult result = LoopCheck.run(loop(golden.file()), CheckPolicy.DEFAULT);
        LoopMargins m = golden.which().equals("design") ? result.designMargins() : result.targetMargins();

        assertCloseRelative("gain margin", m.gainMargin(), golden.gainMargin());
        assertCloseRelative("lower gain margin", m.lowerGainMargin(), golden.lowerGainMargin());
        assertCloseRelative("phase crossover", m.phaseCrossoverRadPerSecond(), golden.phaseCrossover());
        assertThat(m.phaseMarginDegrees().isPresent()).isEqualTo(golden.phaseMarginDegrees().isPresent());
        if (golden.phaseMarginDegrees().isPresent()) {
            assertThat(m.phaseMarginDegrees().getAsDouble()).as("phase margin")
                    .isCloseTo(golden.phaseMarginDegrees().getAsDouble(), within(PHASE_DEGREES));
        }
        assertCloseRelative("crossover", m.crossoverRadPerSecond(), golden.crossover());
        if (golden.which().equals("target") && m.delayMarginSeconds().isPresent()
                && m.delayMarginSeconds().getAsDouble() > 3 * result.scanSeconds()) {
            // above 3 scans loopform keeps the reading PM / wc (check.SampledDelayMargin.MAX_EXACT_SCANS); the
            // reference's margin is exact (closed-loop eigenvalues), and readings of 3 scans and more were seen
            // within 0.8 % of it (write_stability_crosscheck.py's 225 target loops)
            assertThat(m.delayMarginSeconds().getAsDouble()).as("delay margin (read)")
                    .isCloseTo(golden.delayMargin().getAsDouble(), within(0.01 * golden.delayMargin().getAsDouble()));
        } else {
            assertCloseRelative("delay margin", m.delayMarginSeconds(), golden.delayMargin());
        }
        assertThat(m.maximumSensitivity()).as("Ms").isCloseTo(golden.ms(), within(RELATIVE * golden.ms()));
        // |1 + L| is flat at its minimum, so both minimizers place it to about 1e-8 relative only (measured 3e-8)
        assertThat(m.maximumSensitivityRadPerSecond()).as("Ms frequency")
                .isCloseTo(golden.msRadPerSecond(), within(RELATIVE * golden.msRadPerSecond()));
    }

    /**
     * Hand check, derived: with Ti = T the PI zero cancels the process pole, L(s) = (Kc K / (T s))
     * e^(-sL), so wc = Kc K / T = 0.38 rad/s and PM = 90 deg - wc L = 90 - 0.494 rad = 61.70 deg.
     */
    @Test
    void pole_cancelling_pi_has_the_crossover_and_margin_worked_by_hand() {
        CheckResult result = LoopCheck.run(loop("golden-fopdt-pi-fractional.yaml"), CheckPolicy.DEFAULT);

        assertThat(result.designMargins().crossoverRadPerSecond().getAsDouble()).isCloseTo(0.38, within(1e-7));
        assertThat(result.designMargins().phaseMarginDegrees().getAsDouble())
                .isCloseTo(90 - Math.toDegrees(0.38 * 1.3), within(PHASE_DEGREES));
    }

    static LoopSpec loop(String file) {
        try {
            Path p = Path.of(LoopCheckGoldenTest.class.getResource(file).toURI());
            return LoopFileReader.readOne(p, file);
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }

    private static void assertCloseRelative(String what, OptionalDouble actual, OptionalDouble expected) {
        assertThat(actual.isPresent()).as(what + " present").isEqualTo(expected.isPresent());
        if (expected.isPresent()) {
            double e = expected.getAsDouble();
            assertThat(actual.getAsDouble()).as(what).isCloseTo(e, within(RELATIVE * Math.abs(e)));
        }
    }

    private static List<Golden> read() {
        var stream = LoopCheckGoldenTest.class.getResourceAsStream("check-golden.csv");
        if (stream == null) {
            throw new IllegalStateException("check-golden.csv missing; run src/test/python/write_check_golden.py");
        }
        List<Golden> rows = new ArrayList<>();
        try (BufferedReader in = new BufferedReader(new InputStreamReader(stream, StandardCharsets.UTF_8))) {
            in.readLine();
            for (String line = in.readLine(); line != null; line = in.readLine()) {
                String[] f = line.split(",", -1);
                rows.add(new Golden(f[0], f[1], optional(f[2]), optional(f[3]), optional(f[4]), optional(f[5]),
                        optional(f[6]), Double.parseDouble(f[7]), Double.parseDouble(f[8]), optional(f[9])));
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return rows;
    }

    private static OptionalDouble optional(String field) {
        return field.isEmpty() ? OptionalDouble.empty() : OptionalDouble.of(Double.parseDouble(field));
    }
}

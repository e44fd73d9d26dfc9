package org.loopform.analysis;

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
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.loopform.lti.FrequencyBand;
import org.loopform.lti.Polynomial;

/**
 * Sampled loops (ZOH-sampled FOPDT, SOPDT, integrating and open-loop unstable processes with
 * fractional dead time, under discrete PI/PID) against an independent numpy/scipy reference:
 * closed-loop poles by numpy.roots of the characteristic polynomial (Astrom and Wittenmark,
 * Computer-Controlled Systems, 3rd ed., 1997, ch. 2-3: ZOH sampling with a time delay, stability of
 * sampled systems - from memory for the chapters), crossings refined by brentq and the margins as
 * defined in Astrom and Murray, Feedback Systems, 2008, ch. 9-10 (from memory for the sections).
 * Regenerate the reference with {@code python3 src/test/python/write_sampled_loop_golden.py} from
 * the repository root; the script writes out the loops, the sampling and the edge cases.
 */
@DisplayName("Sampled loops agree with the numpy/scipy closed-loop pole and margin reference")
class SampledLoopGoldenTest {

    /** The stated accuracy of every refined frequency, and so of the margins read there. */
    private static final double RELATIVE = MarginAnalysis.STATED_FREQUENCY_RELATIVE_ACCURACY;
    /** A relative frequency error of 1e-6 moves the phase by far less than this. */
    private static final double PHASE_DEGREES = 1e-4;
    /**
     * The largest pole is stated to {@link SampledStability#RELATIVE_LOG_TOLERANCE} of |ln r|
     * (or 1e-12 absolute); numpy.roots of these polynomials of degree at most 25 is good to about
     * 1e-13, so twice the stated tolerance leaves room for both.
     */
    private static final double LOG_RADIUS = 2 * SampledStability.RELATIVE_LOG_TOLERANCE;
    /** Circles this close (relative) to a reference pole are skipped: the count there is a tie. */
    private static final double TIE = 1e-6;
    /** A reference largest pole below this is a pole at 0 as far as double rounding can tell. */
    private static final double DEADBEAT = 1e-15;
    /** Above this Ms the peak is narrower than the stated frequency accuracy can resolve. */
    private static final double SHARP_PEAK = 1e6;
    private static final double[] RADIUS_OFFSETS = {-0.95, -0.8, -0.5, -0.2, -0.1, -0.03, -1e-3, 1e-3, 0.03, 0.1, 0.3};

    record Golden(String id, double scanSeconds, int delayScans, Polynomial num, Polynomial den,
            List<Complex> openLoopPoles, double lowRadPerSecond, int unstablePoles, double largestPole,
            OptionalDouble gainMargin, OptionalDouble phaseCrossover, OptionalDouble lowerGainMargin,
            OptionalDouble phaseMarginDegrees, OptionalDouble crossover, OptionalDouble delayMarginSeconds,
            double ms, double msRadPerSecond, int gainCrossovers, int phaseCrossovers, double[] poleMagnitudes,
            List<double[]> eachGainCrossover, List<double[]> eachPhaseCrossover, double loopGainAtLow) {
        @Override
        public String toString() {
            return id;
        }

        /** {@code L(z) = num(z) / den(z) z^-d} anywhere in the plane. */
        SampledLoop loop() {
            double[] n = new double[2];
            double[] dd = new double[2];
            return new SampledLoop() {
                @Override
                public void at(double radiusOffset, double theta, double[] out) {
                    double r = 1 + radiusOffset;
                    double x = r * Math.cos(theta);
                    double y = r * Math.sin(theta);
                    num.valueAtComplex(x, y, n);
                    den.valueAtComplex(x, y, dd);
                    double m = dd[0] * dd[0] + dd[1] * dd[1];
                    double rr = (n[0] * dd[0] + n[1] * dd[1]) / m;
                    double ri = (n[1] * dd[0] - n[0] * dd[1]) / m;
                    double s = Math.pow(r, -delayScans);
                    double c = Math.cos(-delayScans * theta) * s;
                    double sn = Math.sin(-delayScans * theta) * s;
                    out[0] = rr * c - ri * sn;
                    out[1] = rr * sn + ri * c;
                    out[2] = rr;
                    out[3] = ri;
                }

                @Override
                public List<Complex> openLoopPoles() {
                    return openLoopPoles;
                }

                @Override
                public int delayScans() {
                    return delayScans;
                }
            };
        }

        /** {@code L(e^(i omega h))}: the same loop on the unit circle, z^-d folded into the denominator. */
        LoopResponse response() {
            double[] zd = new double[delayScans + 1];
            zd[delayScans] = 1;
            return Loops.sampled(num, den.times(Polynomial.ofAscending(zd)), scanSeconds);
        }
    }

    static Stream<Golden> goldenLoops() {
        return read().stream();
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("goldenLoops")
    void verdict_and_largest_pole_match_the_roots_of_the_characteristic_polynomial(Golden golden) {
        LoopStability s = SampledStability.of(golden.loop());

        assertThat(s.test()).isEqualTo(StabilityTest.SAMPLED_POLES);
        assertThat(s.largestPoleMagnitude()).isPresent();
        if (Math.abs(golden.largestPole() - 1) <= SampledStability.MARGINAL_TOLERANCE) {
            // a pole within the documented ring round the unit circle: neither settles nor runs away
            assertThat(s.verdict()).isEqualTo(Stability.MARGINAL);
            assertThat(s.unstablePoles()).isZero();
            assertThat(s.largestPoleMagnitude().getAsDouble()).isEqualTo(1.0);
            return;
        }
        assertThat(s.unstablePoles()).isEqualTo(golden.unstablePoles());
        assertThat(s.verdict()).isEqualTo(golden.unstablePoles() == 0 ? Stability.STABLE : Stability.UNSTABLE);
        if (golden.largestPole() < DEADBEAT) {
            // 1 + L = z / (z - 0.5), evaluated as 1 + 0.5 / (z - 0.5), carries a rounding error of
            // about 1e-16 near z = 0: any |z| below 1e-15 is indistinguishable from the pole at 0, and
            // magnitudes below the documented floor e^-25 are reported at the floor
            assertThat(s.largestPoleMagnitude().getAsDouble()).isEqualTo(Math.exp(SampledStability.SMALLEST_LOG_RADIUS));
            return;
        }
        // beyond e^40 the magnitude is documented to be reported at the bound
        double logRef = Math.min(SampledStability.LARGEST_LOG_RADIUS, Math.log(golden.largestPole()));
        assertThat(Math.log(s.largestPoleMagnitude().getAsDouble()))
                .isCloseTo(logRef, within(LOG_RADIUS * Math.abs(logRef) + 1e-11));
        assertThat(s.explanation()).contains(golden.unstablePoles() == 0 ? "inside" : "outside");
    }

    /** The count outside circles other than the unit circle, against the reference's pole magnitudes. */
    @ParameterizedTest(name = "{0}")
    @MethodSource("goldenLoops")
    void poles_outside_any_circle_match_the_reference_magnitudes(Golden golden) {
        SampledLoop loop = golden.loop();
        for (double offset : RADIUS_OFFSETS) {
            double radius = 1 + offset;
            if (Arrays.stream(golden.poleMagnitudes()).anyMatch(m -> Math.abs(m - radius) <= TIE * radius)) {
                continue;
            }
            long expected = Arrays.stream(golden.poleMagnitudes()).filter(m -> m > radius).count();
            assertThat(SampledStability.polesOutside(loop, offset)).as("poles outside |z| = %s", radius)
                    .isEqualTo((int) expected);
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("goldenLoops")
    void margins_match_the_brentq_reference(Golden golden) {
        LoopMargins margins = MarginAnalysis.over(FrequencyBand.belowNyquist(golden.lowRadPerSecond(), golden.scanSeconds()))
                .analyze(golden.response());

        assertCloseRelative(margins.gainMargin(), golden.gainMargin());
        assertCloseRelative(margins.phaseCrossoverRadPerSecond(), golden.phaseCrossover());
        assertCloseRelative(margins.lowerGainMargin(), golden.lowerGainMargin());
        assertThat(margins.phaseMarginDegrees().isPresent()).isEqualTo(golden.phaseMarginDegrees().isPresent());
        if (golden.phaseMarginDegrees().isPresent()) {
            assertThat(margins.phaseMarginDegrees().getAsDouble())
                    .isCloseTo(golden.phaseMarginDegrees().getAsDouble(), within(PHASE_DEGREES));
        }
        assertCloseRelative(margins.crossoverRadPerSecond(), golden.crossover());
        assertCloseRelative(margins.delayMarginSeconds(), golden.delayMarginSeconds());
        assertThat(margins.gainCrossovers()).hasSize(golden.gainCrossovers());
        assertThat(margins.phaseCrossovers()).hasSize(golden.phaseCrossovers());
        for (int k = 0; k < golden.gainCrossovers(); k++) {
            GainCrossover c = margins.gainCrossovers().get(k);
            double[] e = golden.eachGainCrossover().get(k);
            assertThat(c.radPerSecond()).as("gain crossover %d", k).isCloseTo(e[0], within(RELATIVE * e[0]));
            assertThat(c.phaseMarginDegrees()).as("its phase margin").isCloseTo(e[1], within(PHASE_DEGREES));
            assertThat(c.delayMarginSeconds()).as("its delay margin").isCloseTo(e[2], within(RELATIVE * e[2] + 1e-12));
        }
        for (int k = 0; k < golden.phaseCrossovers(); k++) {
            PhaseCrossover c = margins.phaseCrossovers().get(k);
            double[] e = golden.eachPhaseCrossover().get(k);
            assertThat(c.radPerSecond()).as("phase crossover %d", k).isCloseTo(e[0], within(RELATIVE * e[0]));
            assertThat(c.gainFactor()).as("its gain factor").isCloseTo(e[1], within(RELATIVE * e[1]));
        }
        // why a margin is missing, from the reference's crossings (definitions in LoopMargins)
        if (golden.gainMargin().isEmpty()) {
            assertThat(margins.gainMarginNote()).contains(golden.phaseCrossovers() == 0
                    ? MarginNote.PHASE_NEVER_REACHES_MINUS_180 : MarginNote.NO_UPPER_GAIN_LIMIT);
        }
        if (golden.phaseMarginDegrees().isEmpty()) {
            assertThat(margins.phaseMarginNote()).contains(golden.loopGainAtLow() < 1
                    ? MarginNote.GAIN_STAYS_BELOW_ONE : MarginNote.GAIN_STAYS_ABOVE_ONE);
        }
        if (golden.ms() > SHARP_PEAK) {
            // a closed-loop pole 1e-10 from the circle: |1 + L| = sqrt(e^2 + (c dw)^2) near the peak,
            // whose width (1e-10 relative) is far below the stated frequency accuracy, so only the
            // order of Ms is promised (hand derivation: Ms ~ 1 / (|dL/dz| (|z_p| - 1)))
            assertThat(margins.maximumSensitivity()).isBetween(golden.ms() / 2, golden.ms() * 2);
        } else {
            // Ms sits at a minimum of |1 + L|, so a frequency error of 1e-6 moves it by far less than 1e-6
            assertThat(margins.maximumSensitivity()).isCloseTo(golden.ms(), within(RELATIVE * golden.ms()));
        }
        assertThat(margins.maximumSensitivityRadPerSecond())
                .isCloseTo(golden.msRadPerSecond(), within(RELATIVE * golden.msRadPerSecond()));
    }

    private static void assertCloseRelative(OptionalDouble actual, OptionalDouble expected) {
        assertThat(actual.isPresent()).as("present").isEqualTo(expected.isPresent());
        if (expected.isPresent()) {
            double e = expected.getAsDouble();
            assertThat(actual.getAsDouble()).isCloseTo(e, within(RELATIVE * Math.abs(e)));
        }
    }

    private static List<Golden> read() {
        var stream = SampledLoopGoldenTest.class.getResourceAsStream("sampled-loop-golden.csv");
        if (stream == null) {
            throw new IllegalStateException("sampled-loop-golden.csv missing; run src/test/python/write_sampled_loop_golden.py");
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
        List<Complex> poles = new ArrayList<>();
        for (String p : f[5].trim().split(" ")) {
            String[] reIm = p.split(":");
            poles.add(new Complex(Double.parseDouble(reIm[0]), Double.parseDouble(reIm[1])));
        }
        return new Golden(f[0], Double.parseDouble(f[1]), Integer.parseInt(f[2]),
                Polynomial.ofDescending(numbers(f[3])), Polynomial.ofDescending(numbers(f[4])), List.copyOf(poles),
                Double.parseDouble(f[6]), Integer.parseInt(f[7]), Double.parseDouble(f[8]),
                optional(f[9]), optional(f[10]), optional(f[11]), optional(f[12]), optional(f[13]), optional(f[14]),
                Double.parseDouble(f[15]), Double.parseDouble(f[16]), Integer.parseInt(f[17]), Integer.parseInt(f[18]),
                numbers(f[19]), pairs(f[20]), pairs(f[21]), Double.parseDouble(f[22]));
    }

    private static List<double[]> pairs(String field) {
        List<double[]> out = new ArrayList<>();
        for (String p : field.trim().split(" ")) {
            if (!p.isEmpty()) {
                out.add(Arrays.stream(p.split(":")).mapToDouble(Double::parseDouble).toArray());
            }
        }
        return out;
    }

    private static double[] numbers(String field) {
        return Arrays.stream(field.trim().split(" ")).mapToDouble(Double::parseDouble).toArray();
    }

    private static OptionalDouble optional(String field) {
        return field.isEmpty() ? OptionalDouble.empty() : OptionalDouble.of(Double.parseDouble(field));
    }
}

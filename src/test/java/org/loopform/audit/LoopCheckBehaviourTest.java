package org.loopform.audit;

import org.loopform.check.Verdict;
import org.loopform.check.ScanSweep;
import org.loopform.check.LoopSpec;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;
import org.loopform.analysis.LoopMargins;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.io.LoopFileReader;
import org.loopform.io.PolicyFileReader;
import org.loopform.report.CheckReport;
import org.loopform.simulate.StepTest;

/**
 * How a loop check behaves as the scan time, the target's algorithm and the policy change. The
 * loops are the invented ones of {@link LoopCheckGoldenTest} (written by
 * {@code src/test/python/write_check_golden.py}) and small form and loop files written here.
 */
@DisplayName("A loop check")
class LoopCheckBehaviourTest {

    private static final String PID_LOOP = "golden-fopdt-pid-whole-scans.yaml";
    private static final String PI_LOOP = "golden-fopdt-pi-fractional.yaml";

    @TempDir
    Path dir;

    private static CheckResult check(String file, double scanSeconds) {
        return LoopCheck.run(LoopCheckGoldenTest.loop(file).withTargetScan(scanSeconds), CheckPolicy.DEFAULT);
    }

    private static List<Finding> findings(CheckResult r, Topic topic) {
        return r.findings().stream().filter(f -> f.topic() == topic).toList();
    }

    private static double pm(LoopMargins m) {
        return m.phaseMarginDegrees().getAsDouble();
    }

    private Path write(String name, String text) throws IOException {
        return Files.writeString(dir.resolve(name), text);
    }

    private CheckResult checkFile(Path loopFile) {
        // the reader resolves a form path beside the name it shows, so show the full path
        return LoopCheck.run(LoopFileReader.readOne(loopFile, loopFile.toString()), CheckPolicy.DEFAULT);
    }

    @Nested
    @DisplayName("as the scan time goes to zero")
    class FastScan {

        /**
         * The zero-order hold acts as a delay of h/2 (Wittenmark, Astrom and Arzen, "Computer
         * Control: An Overview", IFAC 2002, verified): the target loop loses about wc h / 2 rad of
         * phase at crossover, so the loss halves with the scan. The band 0.8..1.4 leaves room for
         * what the backward-difference integral (a lead of wh/2 on the integral term) and the
         * sampled derivative add or take away.
         */
        @ParameterizedTest(name = "{0}")
        @ValueSource(strings = {PID_LOOP, PI_LOOP})
        void target_phase_margin_falls_short_of_the_design_by_the_holds_half_scan_delay(String file) {
            for (double h : new double[] {0.4, 0.1, 0.025, 0.00625}) {
                CheckResult r = check(file, h);
                double wc = r.designMargins().crossoverRadPerSecond().getAsDouble();
                double holdDegrees = Math.toDegrees(wc * h / 2);
                double lostDegrees = pm(r.designMargins()) - pm(r.targetMargins());
                assertThat(lostDegrees / holdDegrees).as("phase lost / hold delay at h = %s s", h)
                        .isBetween(0.8, 1.4);
            }
        }

        /** Derived from the h/2 delay: every figure's gap to the design loop shrinks with the scan. */
        @ParameterizedTest(name = "{0}")
        @ValueSource(strings = {PID_LOOP, PI_LOOP})
        void target_margins_approach_the_design_margins(String file) {
            CheckResult slow = check(file, 0.4);
            CheckResult fast = check(file, 0.00625);
            for (CheckResult r : List.of(slow, fast)) {
                assertThat(r.targetMargins().gainMargin()).isPresent();
            }
            double slowGm = gap(slow.targetMargins().gainMargin().getAsDouble(),
                    slow.designMargins().gainMargin().getAsDouble());
            double fastGm = gap(fast.targetMargins().gainMargin().getAsDouble(),
                    fast.designMargins().gainMargin().getAsDouble());
            double slowMs = gap(slow.targetMargins().maximumSensitivity(), slow.designMargins().maximumSensitivity());
            double fastMs = gap(fast.targetMargins().maximumSensitivity(), fast.designMargins().maximumSensitivity());
            // the gaps are first order in h: a 64 times shorter scan leaves well under a tenth of them
            assertThat(fastGm).isLessThan(slowGm / 10).isLessThan(0.005);
            assertThat(fastMs).isLessThan(slowMs / 10).isLessThan(0.005);
            assertThat(gap(fast.targetMargins().crossoverRadPerSecond().getAsDouble(),
                    fast.designMargins().crossoverRadPerSecond().getAsDouble())).isLessThan(0.001);
        }

        /**
         * The design loop's step responses are a fine-step simulation of the continuous law; the
         * target's approach them as h shrinks. Tolerances: the design reference itself runs on a
         * step of up to 0.1 s here (its own hold costs 0.1 deg at crossover), so the fastest target
         * is compared within 1 % (IAE, settling, load peak) and 0.2 points of overshoot.
         */
        @ParameterizedTest(name = "{0}")
        @ValueSource(strings = {PID_LOOP, PI_LOOP})
        void target_step_responses_approach_the_design_responses(String file) {
            CheckResult slow = check(file, 0.4);
            CheckResult fast = check(file, 0.00625);

            double designIae = fast.designSetpoint().integralAbsoluteErrorPercentSeconds();
            assertThat(fast.targetSetpoint().integralAbsoluteErrorPercentSeconds())
                    .isCloseTo(designIae, within(0.01 * designIae));
            assertThat(fast.targetSetpoint().overshootPercent().getAsDouble())
                    .isCloseTo(fast.designSetpoint().overshootPercent().getAsDouble(), within(0.2));
            assertThat(Math.abs(fast.targetSetpoint().overshootPercent().getAsDouble()
                    - fast.designSetpoint().overshootPercent().getAsDouble()))
                    .isLessThan(Math.abs(slow.targetSetpoint().overshootPercent().getAsDouble()
                            - slow.designSetpoint().overshootPercent().getAsDouble()));
            double designSettling = fast.designSetpoint().settlingTimeSeconds().getAsDouble();
            assertThat(fast.targetSetpoint().settlingTimeSeconds().getAsDouble())
                    .isCloseTo(designSettling, within(0.01 * designSettling));
            double designPeak = fast.designLoad().peakDeviationPercent();
            assertThat(fast.targetLoad().peakDeviationPercent()).isCloseTo(designPeak, within(0.01 * designPeak));
        }

        private static double gap(double target, double design) {
            return Math.abs(target / design - 1);
        }
    }

    /**
     * With integral action the integral must end up cancelling a load step d at the process
     * input, so the integrated error is d Ti / Kc whatever the scan (Astrom and Hagglund, PID
     * Controllers, 2nd ed., ISA 1995, ch. 4, IE = 1/ki - from memory); for these well-damped
     * loads the error keeps its sign, so IAE equals it. 0.1 %: the horizon cuts the tail.
     */
    @ParameterizedTest(name = "{0}")
    @ValueSource(strings = {PID_LOOP, PI_LOOP, "golden-sopdt-pid-fractional.yaml"})
    void load_step_iae_is_the_load_times_ti_over_kc(String file) {
        CheckResult r = LoopCheck.run(LoopCheckGoldenTest.loop(file), CheckPolicy.DEFAULT);
        double kc = Double.parseDouble(r.loop().tuning().get("kc"));
        double ti = Double.parseDouble(r.loop().tuning().get("ti"));
        double expected = StepTest.standard(1).loadStepPercent() * ti / kc;
        assertThat(r.targetLoad().integralAbsoluteErrorPercentSeconds()).isCloseTo(expected, within(1e-3 * expected));
        assertThat(r.designLoad().integralAbsoluteErrorPercentSeconds()).isCloseTo(expected, within(1e-3 * expected));
    }

    @Nested
    @DisplayName("finds what the scan and the algorithm do to the derivative")
    class Derivative {

        /**
         * N h / Td above 0.6 spoils the derivative (Astrom and Wittenmark, Computer-Controlled
         * Systems, 3rd ed., 1997, ch. 8 - from memory; the policy default): Td = 4 s, N = 10.
         */
        @Test
        void a_slow_scan_spoils_the_derivative() {
            CheckResult slow = check(PID_LOOP, 0.5);
            CheckResult fast = check(PID_LOOP, 0.05);

            assertThat(findings(slow, Topic.DERIVATIVE)).singleElement().satisfies(f -> {
                assertThat(f.severity()).isEqualTo(Severity.WARN);
                // the target stores values to six significant digits where its form names no resolution
                // (td 4 s written in minutes is entered as 0.0666667 min), so the figure is 1.25 to about 1e-6
                assertThat(f.figure()).isCloseTo(10 * 0.5 / 4, within(1e-5));
                assertThat(f.threshold()).isEqualTo(0.6);
            });
            assertThat(findings(fast, Topic.DERIVATIVE)).isEmpty();
        }

        /**
         * Trapezoidal filtered derivative: pole (2Tf - h)/(2Tf + h), negative for h > 2 Tf, so it
         * rings; forward: pole 1 - h/Tf, outside the unit circle for h > 2 Tf (Wittenmark, Astrom
         * and Arzen 2002, Table 3). Tf = Td/N = 0.4 s; h = 1 s gives h / Tf = 2.5. Below, the
         * trapezoidal pole is positive for h < 2 Tf and the forward one for h < Tf.
         */
        @ParameterizedTest(name = "{0}")
        @CsvSource({"trapezoidal, WARN, 0.5 s", "forward, FAIL, 0.25 s"})
        void a_derivative_beyond_h_equal_2_tf_rings_or_goes_unstable(String method, Severity expected,
                                                                    String quietScan) throws IOException {
            CheckResult beyond = checkWith(method, "1 s");
            CheckResult quiet = checkWith(method, quietScan);

            assertThat(findings(beyond, Topic.DISCRETIZATION)).filteredOn(f -> f.severity() == expected)
                    .singleElement().satisfies(f -> {
                        assertThat(f.figure()).isCloseTo(2.5, within(1e-12));
                        assertThat(f.threshold()).isEqualTo(2.0);
                        assertThat(f.message()).contains(method);
                        assertThat(f.source()).contains("Wittenmark").contains("Table 3");
                    });
            assertThat(findings(quiet, Topic.DISCRETIZATION)).noneMatch(f -> f.threshold() != null
                    && f.unit().equals("ratio"));
            if (expected == Severity.FAIL) {
                assertThat(beyond.verdict()).isEqualTo(Verdict.FAIL);
            }
        }

        /** Forward pole 1 - h/Tf: negative, so ringing though stable, for Tf < h < 2 Tf (same Table 3). */
        @Test
        void a_forward_derivative_between_tf_and_2_tf_rings() throws IOException {
            CheckResult r = checkWith("forward", "0.5 s");

            assertThat(findings(r, Topic.DISCRETIZATION)).filteredOn(f -> f.unit().equals("ratio"))
                    .singleElement().satisfies(f -> {
                        assertThat(f.severity()).isEqualTo(Severity.WARN);
                        assertThat(f.figure()).isCloseTo(1.25, within(1e-12));
                        assertThat(f.threshold()).isEqualTo(1.0);
                        assertThat(f.message()).contains("forward").doesNotContain("trapezoidal");
                    });
        }

        private CheckResult checkWith(String method, String scan) throws IOException {
            write(method + "-ideal.yaml", "id: " + method + "-ideal\n"
                    + "title: Test form, ideal PID with a " + method + " derivative\n"
                    + "structure: ideal\n"
                    + "algorithm: {derivative: " + method + "}\n");
            return checkFile(write("loop.yaml", "tag: TIC-1\n"
                    + "process: {model: fopdt, gain: 2.0, time_constant: 60 s, dead_time: 10 s}\n"
                    + "tuning: {form: ideal, kc: 1.2, ti: 60, td: 4, n: 10}\n"
                    + "target: {form: " + method + "-ideal.yaml, scan: " + scan + "}\n"));
        }
    }

    /** The form's list of scan times is the target's own rule (common practice: a fixed set of task rates). */
    @Test
    void a_scan_the_form_does_not_allow_fails_sampling() throws IOException {
        write("tasks.yaml", "id: tasks\ntitle: Test form with fixed task rates\nstructure: ideal\n"
                + "algorithm: {scan: {allowed: [0.5 s, 1 s]}}\n");
        String loop = "tag: TIC-2\n"
                + "process: {model: fopdt, gain: 2.0, time_constant: 60 s, dead_time: 10 s}\n"
                + "tuning: {form: ideal, kc: 1.2, ti: 60, td: 4, n: 10}\n"
                + "target: {form: tasks.yaml, scan: %s}\n";

        CheckResult off = checkFile(write("off.yaml", loop.formatted("0.25 s")));
        CheckResult on = checkFile(write("on.yaml", loop.formatted("0.5 s")));

        assertThat(findings(off, Topic.SAMPLING)).anySatisfy(f -> {
            assertThat(f.severity()).isEqualTo(Severity.FAIL);
            assertThat(f.figure()).isEqualTo(0.25);
            assertThat(f.message()).contains("tasks");
        });
        assertThat(off.verdict()).isEqualTo(Verdict.FAIL);
        assertThat(findings(on, Topic.SAMPLING)).noneMatch(f -> f.severity() == Severity.FAIL);
    }

    @Nested
    @DisplayName("across a sweep of scan times")
    class Sweep {

        private final ScanSweep.Result sweep = ScanSweep.run(LoopCheckGoldenTest.loop(PID_LOOP), 0.05, 5,
                CheckPolicy.DEFAULT);

        @Test
        void names_a_longest_scan_that_is_itself_acceptable() {
            Double longest = sweep.longestAcceptableSeconds();
            assertThat(longest).isNotNull();
            CheckResult atLongest = sweep.checks().stream().filter(c -> c.scanSeconds() == longest).findFirst()
                    .orElseThrow();
            assertThat(ScanSweep.acceptable(atLongest.findings())).isTrue();
            assertThat(sweep.checks()).filteredOn(c -> c.scanSeconds() > longest)
                    .isNotEmpty()
                    .allMatch(c -> !ScanSweep.acceptable(c.findings()));
            // here the derivative rule binds. Its filter corner N/Td = 2.5 rad/s lies more than a decade above
            // this loop's crossover, so N h / Td above 0.6 (policy default, from memory) is only information
            // until the filter is shorter than one scan, N h / Td > 1: h <= Td/N = 0.4 s (common practice)
            assertThat(longest).isLessThanOrEqualTo(4.0 / 10).isGreaterThan(0.6 * 4 / 10);
        }

        /** The hold's h/2 delay grows with h (Wittenmark, Astrom and Arzen 2002): more phase lost each step. */
        @Test
        void longer_scans_lose_more_phase() {
            List<CheckResult> checks = sweep.checks();
            for (int k = 1; k < checks.size(); k++) {
                CheckResult shorter = checks.get(k - 1);
                CheckResult longer = checks.get(k);
                assertThat(longer.scanSeconds()).isGreaterThan(shorter.scanSeconds());
                double lostShorter = pm(shorter.designMargins()) - pm(shorter.targetMargins());
                double lostLonger = pm(longer.designMargins()) - pm(longer.targetMargins());
                assertThat(lostLonger).as("phase lost at %s s", longer.scanSeconds()).isGreaterThan(lostShorter);
            }
        }
    }

    @Nested
    @DisplayName("without a process model")
    class NoProcess {

        private CheckResult controllerOnly() throws IOException {
            return checkFile(write("no-process.yaml", "tag: FIC-3\n"
                    + "tuning: {form: ideal, kc: 1.2, ti: 60, td: 4, n: 10}\n"
                    + "target: {form: ideal-pb-repeats, scan: 0.5 s}\n"));
        }

        @Test
        void compares_the_controllers_and_applies_the_sampling_rules() throws IOException {
            CheckResult r = controllerOnly();

            assertThat(r.hasProcess()).isFalse();
            assertThat(r.designMargins()).isNull();
            assertThat(r.targetMargins()).isNull();
            assertThat(r.mismatch()).isNotNull();
            assertThat(r.mismatch().gainDb()).isGreaterThan(0);
            // N h / Td = 1.25 needs no process to be found
            assertThat(findings(r, Topic.DERIVATIVE)).isNotEmpty();
        }

        @Test
        void reports_null_loops_and_a_controller_mismatch_in_json() throws IOException {
            JsonNode json = new ObjectMapper().readTree(CheckReport.json(controllerOnly()));

            assertThat(json.get("design").isNull()).isTrue();
            assertThat(json.get("target").isNull()).isTrue();
            assertThat(json.get("controller_mismatch").get("gain_db").isNumber()).isTrue();
            assertThat(json.get("controller_mismatch").get("phase_deg").isNumber()).isTrue();
        }
    }

    /** The policy file's thresholds replace the defaults; the rule and its figure stay the same. */
    @Test
    void a_policy_file_overrides_a_threshold() throws IOException {
        Path policyFile = write("policy.yaml", "derivative_nh_td_warn: 2\nsampling_warn: 0.01\n");
        CheckPolicy policy = PolicyFileReader.read(policyFile, "policy.yaml");
        LoopSpec loop = LoopCheckGoldenTest.loop(PID_LOOP);

        CheckResult byDefault = LoopCheck.run(loop, CheckPolicy.DEFAULT);
        CheckResult byPolicy = LoopCheck.run(loop, policy);

        assertThat(findings(byDefault, Topic.DERIVATIVE)).isNotEmpty();
        assertThat(findings(byPolicy, Topic.DERIVATIVE)).isEmpty();
        assertThat(findings(byDefault, Topic.SAMPLING)).isEmpty();
        assertThat(findings(byPolicy, Topic.SAMPLING)).singleElement().satisfies(f -> {
            assertThat(f.severity()).isEqualTo(Severity.WARN);
            assertThat(f.threshold()).isEqualTo(0.01);
        });
    }
}

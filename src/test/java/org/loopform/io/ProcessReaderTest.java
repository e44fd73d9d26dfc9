// plumbing: no published source needed (source: none), except the unit facts named beside a check
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.process.FirstOrderPlusDeadTime;
import org.loopform.process.GeneralTransferFunction;
import org.loopform.process.IntegratingPlusDeadTime;
import org.loopform.process.ProcessModel;
import org.loopform.process.SecondOrderPlusDeadTime;
import org.loopform.units.Span;

/**
 * A process block read into a model: each model kind, units on times (1 min = 60 s), an
 * engineering-unit gain put on the percent basis (K% = K_eu * output span / PV span, common
 * practice), two time constants as a second-order model (zeta = (T1 + T2) / (2 sqrt(T1 T2)),
 * the damping of (T1 s + 1)(T2 s + 1), from the definition), and every refusal with its key.
 */
class ProcessReaderTest {

    private static ProcessModel read(String inline) {
        return ProcessReader.fromOption(inline, "--process", null, null);
    }

    @Test
    void a_first_order_model_with_times_in_their_units() {
        FirstOrderPlusDeadTime p = (FirstOrderPlusDeadTime) read("{model: FOPDT, gain: -1.5, time_constant: 2 min, dead_time: 10 s}");
        assertThat(p.gain()).isEqualTo(-1.5);
        assertThat(p.timeConstantSeconds()).isEqualTo(120.0);
        assertThat(p.deadTimeSeconds()).isEqualTo(10.0);
        // a bare number is seconds, and no dead time is none
        FirstOrderPlusDeadTime q = (FirstOrderPlusDeadTime) read("{model: fopdt, gain: 2, time_constant: 30}");
        assertThat(q.timeConstantSeconds()).isEqualTo(30.0);
        assertThat(q.deadTimeSeconds()).isZero();
    }

    @Test
    void an_engineering_gain_is_scaled_by_output_span_over_pv_span() {
        // 0.5 PV units per output unit, PV 0..200, output 0..100: 0.5 * 100 / 200 = 0.25 %/%
        ProcessModel p = ProcessReader.fromOption("{model: fopdt, gain: 0.5, gain_units: engineering, time_constant: 60 s}",
                "--process", new Span(0, 200), new Span(0, 100));
        assertThat(((FirstOrderPlusDeadTime) p).gain()).isCloseTo(0.25, within(1e-15));
        assertThatThrownBy(() -> read("{model: fopdt, gain: 0.5, gain_units: engineering, time_constant: 60 s}"))
                .hasMessageContaining("gain_units: engineering-unit process gains need ranges");
        assertThatThrownBy(() -> read("{model: fopdt, gain: 0.5, gain_units: kg, time_constant: 60 s}"))
                .hasMessageContaining("must be percent or engineering (got 'kg')");
    }

    @Test
    void a_second_order_model_from_two_time_constants_or_a_damping_and_frequency() {
        // T1 = 10 s, T2 = 40 s: T = sqrt(400) = 20 s, zeta = 50 / 40 = 1.25
        SecondOrderPlusDeadTime s = (SecondOrderPlusDeadTime) read(
                "{model: sopdt, gain: 1, time_constant: 10 s, time_constant_2: 40 s, dead_time: 5 s}");
        assertThat(s.timeConstantSeconds()).isCloseTo(20, within(1e-12));
        assertThat(s.dampingRatio()).isCloseTo(1.25, within(1e-12));
        assertThat(s.deadTimeSeconds()).isEqualTo(5.0);
        // 3 rad/min = 0.05 rad/s, so T = 20 s
        SecondOrderPlusDeadTime w = (SecondOrderPlusDeadTime) read(
                "{model: sopdt, gain: 1, damping: 0.5, natural_frequency: 3 rad/min}");
        assertThat(w.naturalFrequencyRadPerSecond()).isCloseTo(0.05, within(1e-15));
        assertThat(w.dampingRatio()).isEqualTo(0.5);
        assertThat(((SecondOrderPlusDeadTime) read("{model: sopdt, gain: 1, damping: 0.5, natural_frequency: 2}"))
                .naturalFrequencyRadPerSecond()).isEqualTo(2.0);
        assertThatThrownBy(() -> read("{model: sopdt, gain: 1, damping: 0, natural_frequency: 2}"))
                .hasMessageContaining("damping: must be finite and > 0 (got '0')");
        assertThatThrownBy(() -> read("{model: sopdt, gain: 1, damping: 0.5, natural_frequency: 2 Hz}"))
                .hasMessageContaining("natural_frequency: unknown unit 'hz'; write rad/s or rad/min");
        assertThatThrownBy(() -> read("{model: sopdt, gain: 1, damping: 0.5, natural_frequency: 1e9}"))
                .hasMessageContaining("must lie within 1e-7 rad/s to 1e6 rad/s");
    }

    @Test
    void an_integrating_model_with_an_optional_lag() {
        IntegratingPlusDeadTime i = (IntegratingPlusDeadTime) read("{model: integrating, gain: 0.02, dead_time: 3 s, lag: 0}");
        assertThat(i.slopePerSecond()).isEqualTo(0.02);
        assertThat(i.deadTimeSeconds()).isEqualTo(3.0);
        assertThat(i.lagSeconds()).isZero();
        assertThat(((IntegratingPlusDeadTime) read("{model: integrating, gain: 0.02, lag: 1 min}")).lagSeconds())
                .isEqualTo(60.0);
    }

    @Test
    void a_transfer_function_highest_power_first_with_its_gain_scaled() {
        // 2 / (10 s + 1) in engineering units, PV 0..50 and output 0..100: numerator 2 * 100/50 = 4
        GeneralTransferFunction g = (GeneralTransferFunction) ProcessReader.fromOption(
                "{model: tf, num: [2], den: [10, 1], gain_units: engineering, dead_time: 1 s}", "--process",
                new Span(0, 50), new Span(0, 100));
        assertThat(g.transferFunction().numerator().ascending()).containsExactly(4.0);
        assertThat(g.transferFunction().denominator().ascending()).containsExactly(1.0, 10.0);
        assertThat(g.deadTimeSeconds()).isEqualTo(1.0);
        // leading zeros do not count in a degree
        assertThat(read("{model: tf, num: [0, 1], den: [1, 1]}")).isInstanceOf(GeneralTransferFunction.class);
        assertThatThrownBy(() -> read("{model: tf, num: [1, 0, 0], den: [1, 1]}"))
                .hasMessageContaining("num: must not have a higher power of s than den (got degree 2 over 1)");
        assertThatThrownBy(() -> read("{model: tf, num: [0, 0], den: [1, 1]}")).hasMessageContaining("num: must not be all zeros");
        assertThatThrownBy(() -> read("{model: tf, num: [1], den: [0]}")).hasMessageContaining("den: must not be all zeros");
        assertThatThrownBy(() -> read("{model: tf, num: [1, x], den: [1, 1]}"))
                .hasMessageContaining("num: must be a list of numbers, highest power of s first, e.g. [1, 3, 1] (got 'x')");
        assertThatThrownBy(() -> read("{model: tf, num: '[]', den: [1, 1]}")).hasMessageContaining("must list at least one");
        assertThatThrownBy(() -> read("{model: tf, num: [Infinity], den: [1, 1]}")).hasMessageContaining("got 'Infinity'");
    }

    @Test
    void every_refusal_names_its_key() {
        assertThatThrownBy(() -> read("{gain: 1}")).hasMessageContaining("process.model: required; one of fopdt");
        assertThatThrownBy(() -> read("{model: soap, gain: 1}")).hasMessageContaining("model: must be fopdt, sopdt,"
                + " integrating or tf (got 'soap')");
        assertThatThrownBy(() -> read("{model: fopdt, time_constant: 1}")).hasMessageContaining("gain: required for model fopdt");
        assertThatThrownBy(() -> read("{model: fopdt, gain: '  ', time_constant: 1}")).hasMessageContaining("gain: required");
        assertThatThrownBy(() -> read("{model: fopdt, gain: two, time_constant: 1}")).hasMessageContaining("gain: must be a number (got 'two')");
        assertThatThrownBy(() -> read("{model: fopdt, gain: NaN, time_constant: 1}")).hasMessageContaining("must be a finite number");
        assertThatThrownBy(() -> read("{model: fopdt, gain: 0, time_constant: 1}")).hasMessageContaining("gain: must lie within 1e-9 to 1e9 in magnitude (got '0')");
        assertThatThrownBy(() -> read("{model: fopdt, gain: 1e300, time_constant: 1}")).hasMessageContaining("gain: must lie");
        assertThatThrownBy(() -> read("{model: fopdt, gain: 1, time_constant: 0}")).hasMessageContaining("time_constant: must be a finite time > 0");
        assertThatThrownBy(() -> read("{model: fopdt, gain: 1, time_constant: -1 s}")).hasMessageContaining("time_constant:");
        assertThatThrownBy(() -> read("{model: fopdt, gain: 1, time_constant: 1 furlong}")).hasMessageContaining("time_constant:");
        assertThatThrownBy(() -> read("{model: fopdt, gain: 1, time_constant: 1e12 s}")).hasMessageContaining("time_constant: must lie");
        assertThatThrownBy(() -> read("{model: fopdt, gain: 1, time_constant: 1, dead_time: 1e12 s}"))
                .hasMessageContaining("dead_time: must be 0 or lie");
        assertThatThrownBy(() -> read("{model: fopdt, gain: 1, time_constant: 1, colour: red}"))
                .hasMessageContaining("colour: unknown key");
        // a dead time of 0 is no dead time, not an error
        assertThat(((FirstOrderPlusDeadTime) read("{model: fopdt, gain: 1, time_constant: 1, dead_time: 0 s}"))
                .deadTimeSeconds()).isZero();
    }

    @Test
    void a_file_or_a_loop_files_process_block_is_read_too(@TempDir Path dir) throws IOException {
        Path f = dir.resolve("p.yaml");
        Files.writeString(f, "tag: TIC-1\nprocess:\n  model: fopdt\n  gain: 2\n  time_constant: 60 s\n");
        assertThat(((FirstOrderPlusDeadTime) ProcessReader.fromOption(f.toString(), "--process", null, null)).gain())
                .isEqualTo(2.0);
        assertThatThrownBy(() -> ProcessReader.fromOption(dir.resolve("none.yaml").toString(), "--process", null, null))
                .hasMessageContaining("is neither an inline mapping");
        Path list = dir.resolve("l.yaml");
        Files.writeString(list, "- 1\n- 2\n");
        assertThatThrownBy(() -> ProcessReader.fromOption(list.toString(), "--process", null, null))
                .hasMessageContaining("must be a mapping such as {model: fopdt");
        Path bad = dir.resolve("b.yaml");
        Files.writeString(bad, "model: fopdt\ngain: 2\ntime_constant: 0\n");
        assertThatThrownBy(() -> ProcessReader.fromOption(bad.toString(), "--process", null, null))
                .hasMessageStartingWith(bad + ":3: time_constant:");
    }
}

package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code fit} never assumes how a record is scaled or timed: the spans (or the declaration that the record is in
 * percent of span) are required and stated, values outside a span are a finding, and the time column's unit is
 * said. The records are written here from the first-order-plus-dead-time step response
 * {@code y(t) = y0 + K du (1 - exp(-(t - ts - L) / T))} for {@code t > ts + L} (Seborg, Edgar and Mellichamp,
 * Process Dynamics and Control, ch. 5 and 6), in engineering units, with a little seeded noise.
 */
class FitSpansTest {

    /** A step record: output {@code u0 -> u1} at 100 s, PV from {@code y0} rising by {@code dy}, T = 60 s, L = 10 s. */
    private static Path record(Path dir, String name, String timeHeader, double timeScale, double u0, double u1,
                               double y0, double dy, double noise) throws Exception {
        StringBuilder sb = new StringBuilder(timeHeader + ",output,pv\n");
        Random rnd = new Random(7);
        for (int k = 0; k <= 900; k++) {
            double t = k;
            double u = t >= 100 ? u1 : u0;
            double y = y0 + (t > 110 ? dy * (1 - Math.exp(-(t - 110) / 60.0)) : 0) + noise * rnd.nextGaussian();
            sb.append(String.format(Locale.ROOT, "%.6f,%.4f,%.5f%n", t / timeScale, u, y));
        }
        Path f = dir.resolve(name);
        Files.writeString(f, sb.toString());
        return f;
    }

    private static JsonNode json(CliRun r) throws Exception {
        return new ObjectMapper().readTree(r.out());
    }

    @Test
    void a_record_in_bar_without_spans_is_refused_and_with_them_gives_the_gain_in_percent_per_percent(
            @TempDir Path dir) throws Exception {
        // PV in bar over a 0..25 bar transmitter, output in % (0..100). The output steps 35 -> 45 % (10 % of span)
        // and the PV rises 10 -> 15 bar: 5 bar is 5/25 = 20 % of span, so K = 20 % / 10 % = 2 %/% (hand
        // derivation). Read as if in percent, the same record gives 5 % / 10 % = 0.5 %/%: four times too small.
        Path f = record(dir, "bump-bar.csv", "time", 1, 35, 45, 10, 5, 0.02);
        Path process = dir.resolve("process.yaml");
        CliRun refused = CliRun.of("fit", f.toString(), "--write-process", process.toString());
        assertThat(refused.exitCode()).isEqualTo(2);
        assertThat(refused.err()).contains("--pv-range").contains("--out-range").contains("--percent-of-span")
                .doesNotContain("Exception");
        assertThat(refused.out()).isEmpty();
        assertThat(process).doesNotExist();

        CliRun one = CliRun.of("fit", f.toString(), "--pv-range", "0..25");
        assertThat(one.exitCode()).isEqualTo(2);
        assertThat(one.err()).contains("--out-range: missing");

        CliRun fit = CliRun.of("fit", f.toString(), "--pv-range", "0..25", "--out-range", "0..100", "--format", "json",
                "--write-process", process.toString());
        assertThat(fit.exitCode()).as(fit.err()).isZero();
        JsonNode n = json(fit);
        assertThat(n.get("models").get(0).get("model").asText()).isEqualTo("fopdt");
        assertThat(n.get("models").get(0).get("parameters").get("gain").asDouble()).isCloseTo(2.0, within(0.02));
        assertThat(n.get("models").get(0).get("parameters").get("time_constant_s").asDouble())
                .isCloseTo(60, within(1.5));
        assertThat(n.get("record").get("spans_from").asText()).isEqualTo("ranges");
        assertThat(n.get("record").get("pv_span").asText()).isEqualTo("0..25");
        assertThat(n.get("record").get("output_span").asText()).isEqualTo("0..100");
        assertThat(n.get("record").get("time_read_as").asText()).isEqualTo("numbers in s");
        String file = Files.readString(process);
        assertThat(file).contains("PV span 0..25 and output span 0..100");
        var m = java.util.regex.Pattern.compile("\n  gain: ([0-9.eE+-]+)\n").matcher(file);
        assertThat(m.find()).as(file).isTrue();
        double gain = Double.parseDouble(m.group(1));
        assertThat(gain).isCloseTo(2.0, within(0.02));

        CliRun text = CliRun.of("fit", f.toString(), "--pv-range", "0..25", "--out-range", "0..100");
        assertThat(text.out()).startsWith("Record read: PV span 0..25 and output span 0..100 in the record's units")
                .contains("time column 'time' read as numbers in s");
    }

    @Test
    void an_output_in_its_own_units_needs_its_span_and_outside_the_span_is_a_failing_finding(@TempDir Path dir)
            throws Exception {
        // output logged over 0..250 units: 87.5 -> 112.5 is 35 -> 45 % (a 10 % step); PV in % rising 40 -> 60 %
        // gives K = 20 % / 10 % = 2 %/% (hand derivation). Declared in percent, 112.5 lies beyond 100 % of span.
        Path f = record(dir, "bump-out250.csv", "time", 1, 87.5, 112.5, 40, 20, 0.1);
        CliRun fit = CliRun.of("fit", f.toString(), "--out-range", "0..250", "--pv-range", "0..100", "--format",
                "json");
        assertThat(fit.exitCode()).as(fit.err()).isZero();
        assertThat(json(fit).get("models").get(0).get("parameters").get("gain").asDouble())
                .isCloseTo(2.0, within(0.02));

        Path process = dir.resolve("p.yaml");
        CliRun wrong = CliRun.of("fit", f.toString(), "--percent-of-span", "--write-process", process.toString());
        assertThat(wrong.exitCode()).isEqualTo(1);
        // counted by hand: the output is 112.5 at every whole second from t = 100 s to 900 s, 801 samples
        assertThat(wrong.out()).contains("[fail] outside-span: 801 sample(s) of the output lie outside its span")
                .contains("PV and output declared already in % of span (--percent-of-span)");
        assertThat(process).doesNotExist();
    }

    @Test
    void a_pv_beyond_its_span_is_a_failing_finding(@TempDir Path dir) throws Exception {
        // PV 10 -> 15 bar against a span given as 0..12 bar: every sample above 12 bar is beyond 100 % of span
        Path f = record(dir, "bump-bar.csv", "time", 1, 35, 45, 10, 5, 0.0);
        CliRun fit = CliRun.of("fit", f.toString(), "--pv-range", "0..12", "--out-range", "0..100");
        assertThat(fit.exitCode()).isEqualTo(1);
        assertThat(fit.out()).contains("outside-span").contains("of the PV lie outside its span");
    }

    @Test
    void a_relay_test_needs_its_spans_and_a_pv_beyond_its_span_fails_it() {
        // the bundled relay test's PV runs 57.2..62.8 degC: over a span given as 0..60 degC, the samples above
        // 60 degC lie beyond 100 % of span, so Ku in %/% read from them is wrong by the span's error
        CliRun none = CliRun.of("fit", "examples/records/tic-104-relay.csv", "--relay");
        assertThat(none.exitCode()).isEqualTo(2);
        assertThat(none.err()).contains("--pv-range LO..HI and --out-range LO..HI");
        CliRun wrong = CliRun.of("fit", "examples/records/tic-104-relay.csv", "--relay", "--pv-range", "0..60",
                "--out-range", "0..100");
        assertThat(wrong.exitCode()).isEqualTo(1);
        assertThat(wrong.out()).contains("[fail] outside-span:").contains("of the PV lie outside its span")
                .startsWith("Record read: PV span 0..60 and output span 0..100");
    }

    @Test
    void a_time_column_in_minutes_is_read_with_time_unit_and_its_name_warns_without(@TempDir Path dir)
            throws Exception {
        // times logged in minutes (t / 60): T = 60 s is 1 min; read as seconds it would be 1 s, 60 times too short
        Path f = record(dir, "bump-min.csv", "time_min", 60, 35, 45, 40, 20, 0.1);
        CliRun minutes = CliRun.of("fit", f.toString(), "--percent-of-span", "--time", "time_min", "--time-unit", "min",
                "--format", "json");
        assertThat(minutes.exitCode()).as(minutes.err()).isZero();
        JsonNode n = json(minutes);
        assertThat(n.get("models").get(0).get("parameters").get("time_constant_s").asDouble())
                .isCloseTo(60, within(1.5));
        assertThat(n.get("record").get("time_read_as").asText()).isEqualTo("numbers in min");
        assertThat(n.get("findings").toString()).doesNotContain("time-unit");

        CliRun seconds = CliRun.of("fit", f.toString(), "--percent-of-span", "--time", "time_min");
        assertThat(seconds.out()).contains("time column 'time_min' read as numbers in s")
                .contains("[warn] time-unit: The time column 'time_min' was read in s (the default), but its name"
                        + " suggests min");
    }

    @Test
    void column_names_suggest_their_units() {
        // plumbing: the words of a column's name
        assertThat(FitCommand.timeUnitFinding("time_min", null)).isNotNull();
        assertThat(FitCommand.timeUnitFinding("t [h]", null)).isNotNull();
        assertThat(FitCommand.timeUnitFinding("elapsedMs", null)).isNotNull();
        assertThat(FitCommand.timeUnitFinding("Hours", org.loopform.units.TimeUnit.HOURS)).isNull();
        assertThat(FitCommand.timeUnitFinding("time_s", null)).isNull();
        assertThat(FitCommand.timeUnitFinding("time", null)).isNull();
        assertThat(FitCommand.timeUnitFinding("timestamp", null)).isNull();
        assertThat(FitCommand.timeUnitFinding("time_s", org.loopform.units.TimeUnit.MINUTES)).isNotNull();
    }
}

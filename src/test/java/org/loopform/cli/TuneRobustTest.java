package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code tune --robust}: the tuning checked at the corners of a fit's 95 % box. The loop is the one of
 * {@code TuneCommandTest}: SIMC's PID on SOPDT k = -2, tau1 = 6 s, tau2 = 2 s, theta = 1 s (Skogestad 2003)
 * cancels both lags, so at a corner with gain k and dead time theta the loop is
 * {@code L = (k / -2) 0.5 e^(-theta s) / s}: crossover {@code wc = 0.25 |k|}, phase margin
 * {@code 90 deg - wc theta}, gain margin {@code (pi / (2 theta)) / wc}, delay margin {@code (pi/2 - wc theta) / wc}
 * (hand derivation). The time constants' intervals are made tiny, so the cancellation holds at every corner.
 */
class TuneRobustTest {

    private static Path fitFile(Path dir, String deadTimeInterval) throws Exception {
        Path f = dir.resolve("process.yaml");
        Files.writeString(f, "# written by loopform fit from test.csv\nprocess:\n  model: sopdt\n  gain: -2\n"
                + "  time_constant: 6 s\n  time_constant_2: 2 s\n  dead_time: 1 s\nintervals:\n  gain: -2.4..-2\n"
                + "  time_constant: 6..6.000001\n  time_constant_2: 2..2.000001\n  dead_time: " + deadTimeInterval + "\n");
        return f;
    }

    @Test
    void worst_margins_are_those_of_the_corner_with_the_largest_gain_and_dead_time(@TempDir Path dir) throws Exception {
        Path f = fitFile(dir, "1..1.5");
        CliRun r = CliRun.of("tune", "--process", f.toString(), "--rule", "simc", "--controller", "pid", "--robust",
                "--format", "json");
        assertThat(r.exitCode()).as(r.err()).isEqualTo(0);
        JsonNode robust = new ObjectMapper().readTree(r.out()).get("robust");
        assertThat(robust.get("corners_checked").asInt()).isEqualTo(16);
        assertThat(robust.get("unstable_corners").asInt()).isZero();
        double wc = 0.25 * 2.4;
        double theta = 1.5;
        assertThat(robust.get("worst_phase_margin_deg").asDouble()).isCloseTo(90 - Math.toDegrees(wc * theta),
                within(0.05));
        assertThat(robust.get("worst_gain_margin").asDouble()).isCloseTo(Math.PI / (2 * theta) / wc, within(2e-3));
        assertThat(robust.get("worst_delay_margin_s").asDouble()).isCloseTo((Math.PI / 2 - wc * theta) / wc,
                within(2e-3));
    }

    @Test
    void a_box_reaching_instability_fails(@TempDir Path dir) throws Exception {
        // theta = 4 s: wc theta = 2 rad (k = -2) and 2.4 rad (k = -2.4), both beyond pi/2: unstable
        Path f = fitFile(dir, "1..4");
        CliRun r = CliRun.of("tune", "--process", f.toString(), "--rule", "simc", "--controller", "pid", "--robust");
        assertThat(r.exitCode()).as(r.err()).isEqualTo(1);
        assertThat(r.out()).contains("UNSTABLE at 8 of 16 corners");
    }

    @Test
    void an_unstable_corner_has_no_ms_in_json(@TempDir Path dir) throws Exception {
        // the same box: the 8 corners at theta = 4 s are unstable (wc theta beyond pi/2, see above); Ms is a
        // figure of safety only for a stable loop, so theirs is null, while a stable corner keeps its number
        CliRun r = CliRun.of("tune", "--process", fitFile(dir, "1..4").toString(), "--rule", "simc", "--controller",
                "pid", "--robust", "--format", "json");
        assertThat(r.exitCode()).as(r.err()).isEqualTo(1);
        JsonNode corners = new ObjectMapper().readTree(r.out()).get("robust").get("corners");
        int unstable = 0;
        for (JsonNode c : corners) {
            if (c.get("stable").asBoolean()) {
                assertThat(c.get("ms").isNumber()).as(c.toString()).isTrue();
            } else {
                unstable++;
                assertThat(c.get("ms").isNull()).as(c.toString()).isTrue();
            }
        }
        assertThat(unstable).isEqualTo(8);
    }

    @Test
    void robust_without_intervals_is_refused(@TempDir Path dir) {
        // plumbing: the message says where the intervals come from
        CliRun r = CliRun.of("tune", "--process", "{model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}",
                "--rule", "simc", "--robust");
        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err()).contains("fit --write-process");
    }
}

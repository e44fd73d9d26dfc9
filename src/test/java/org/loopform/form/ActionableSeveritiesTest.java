// source: deviations of the PI law before and after rounding evaluated independently with numpy (figures beside each check); severity thresholds: loopform policy (common practice)
package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.loopform.findings.ConversionRules;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.io.CatalogLoader;
import org.loopform.io.FormFileReader;

/**
 * Findings an engineer can act on. Rounding to the target's resolution is the best the target can
 * store, so it is info up to the resolution margin (rounding_warn_db 0.5 dB / rounding_warn_deg
 * 3 deg) and warns beyond it; a setpoint path the target cannot weight (derivative on the
 * measurement, c fixed at 0) is info unless the feedback path changes too where the loop lives.
 * Figures: the PI law K(1 + 1/(Ti s)) before and after rounding, evaluated independently with numpy
 * over the band the tuning implies (a decade either side of the integral corner 1/Ti; common
 * practice), written beside each check. The target is the invented examples/plant-k7-target.yaml
 * (resolution 0.01 for kc and ti in minutes, c fixed at 0, N fixed at 10).
 */
class ActionableSeveritiesTest {

    private static final FormDefinition TARGET = FormFileReader.read(Path.of("examples/plant-k7-target.yaml"),
            "examples/plant-k7-target.yaml");

    private static Conversion convert(String from, String text) {
        Map<String, String> values = new LinkedHashMap<>();
        for (String pair : text.split(" ")) {
            values.put(pair.split("=")[0], pair.split("=")[1]);
        }
        return Converter.convert(CatalogLoader.bundled().find(from).orElseThrow(), values, TARGET,
                WritingContext.NONE);
    }

    private static Finding only(Conversion c, Topic topic) {
        return ConversionRules.findings(c).stream().filter(f -> f.topic() == topic).reduce((a, b) -> {
            throw new AssertionError("more than one " + topic + " finding");
        }).orElseThrow();
    }

    /**
     * pb 210 % is kc 0.47619, reset 6/min is ti 0.166667 min; entered 0.48 and 0.17 min. The law
     * moves most at the band's low end, 0.01 rad/s: numpy gives 0.10106 dB and 0.567 deg, just
     * above rounding_info_db 0.1 dB, far below the 0.5 dB margin.
     */
    @Test
    void a_rounding_within_the_resolution_margin_is_info() {
        Finding f = only(convert("ideal-pb-repeats", "pb=210 reset=6 td=0"), Topic.ROUNDING);
        assertThat(f.figure()).isCloseTo(0.10106, within(0.0005));
        assertThat(f.severity()).isEqualTo(Severity.INFO);
        assertThat(f.message()).contains("no value can be entered more precisely");
    }

    /** ti 0.025 min entered as 0.03 min (half up): the integral gain falls by 0.025/0.03; numpy 1.565 dB, 5.22 deg. */
    @Test
    void a_rounding_beyond_the_resolution_margin_warns() {
        Finding f = only(convert("ideal-min", "kc=1 ti=0.025 td=0"), Topic.ROUNDING);
        assertThat(f.figure()).isCloseTo(1.565, within(0.005));
        assertThat(f.severity()).isEqualTo(Severity.WARN);
        assertThat(f.message()).contains("finer resolution");
    }

    /**
     * Series pb 60 %, ti 6 min, td 0.3 min (N = 10) into an ideal form with N fixed at 10 and the
     * derivative on the measurement: the feedback path is fitted within the fit_warn limits where the
     * loop lives (0.0646 dB and 1.27 deg, numpy on the fitted values), so the setpoint path's change
     * is info.
     */
    @Test
    void derivative_moved_to_the_measurement_alone_is_info() {
        Conversion c = convert("series-pb-min", "pb=60 ti=6 td=0.3");
        Finding f = ConversionRules.findings(c).stream().filter(x -> x.topic() == Topic.REALIZABILITY
                && x.message().contains("cannot weight the setpoint")).findFirst().orElseThrow();
        assertThat(f.severity()).isEqualTo(Severity.INFO);
        assertThat(f.message()).contains("which does not change there");
    }

    /**
     * Ideal kc 2, ti 60 s, td 20 s with n = 2 cannot be held with N = 10: the feedback path itself
     * moves beyond fit_warn where the loop lives, so the setpoint finding warns with it.
     */
    @Test
    void derivative_moved_to_the_measurement_warns_when_the_feedback_path_changes_too() {
        Conversion c = convert("ideal", "kc=2 ti=60 td=20 n=2");
        assertThat(c.loopDeviation().gainDb() > 0.25 || c.loopDeviation().phaseDegrees() > 3).isTrue();
        Finding f = ConversionRules.findings(c).stream().filter(x -> x.topic() == Topic.REALIZABILITY
                && x.message().contains("cannot weight the setpoint")).findFirst().orElseThrow();
        assertThat(f.severity()).isEqualTo(Severity.WARN);
        assertThat(f.message()).contains("which changes too");
    }
}

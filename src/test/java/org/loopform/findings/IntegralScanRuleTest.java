// source: the series-to-ideal relation Ti = Ti' + Td' (Astrom & Hagglund, PID Controllers, 1995, sec. 3.4); kp/ki = Ti (same); the one-scan threshold is common practice
package org.loopform.findings;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.form.Discretization;
import org.loopform.form.PidSetting;
import org.loopform.form.Structure;
import org.loopform.io.CatalogLoader;
import org.loopform.scan.ScanFacts;

/**
 * Without a process model, an integral time shorter than the scan is flagged (a list whose integral
 * times were typed in minutes for a form in seconds would otherwise pass on its conversion alone).
 * With a model the margins and the sampling rule judge the loop, and this rule stays quiet.
 */
@DisplayName("integral time against the scan, without a process model")
class IntegralScanRuleTest {

    private static PidSetting ideal(double kc, double ti, double td) {
        return new PidSetting(Structure.IDEAL, kc, ti, td, td / 10, 1, 0);
    }

    private static List<Finding> rules(ScanFacts facts, Optional<ScanFacts> source, boolean withModel) {
        var in = new CheckRules.Inputs(CatalogLoader.resolve("ideal", "test"), facts.scanSeconds(), facts,
                withModel ? Optional.of(RobustnessRulesTest.margins(5, 60, 20, 1.3)) : Optional.empty(),
                withModel ? Optional.of(RobustnessRulesTest.margins(5, 60, 20, 1.3)) : Optional.empty(),
                Optional.empty(), 1.0, true, source, Optional.empty());
        return CheckRules.evaluate(in, CheckPolicy.DEFAULT).stream().filter(f -> f.topic() == Topic.SAMPLING).toList();
    }

    private static ScanFacts at(PidSetting s, double scanSeconds) {
        return ScanFacts.of(s, Discretization.BACKWARD, scanSeconds);
    }

    // Ti 0.5 s (say 0.5 min typed into a form in seconds) at a 1 s scan: h / Ti = 2, a warning.
    @Test
    void an_integral_time_shorter_than_the_scan_is_a_warning_without_a_model() {
        List<Finding> f = rules(at(ideal(2, 0.5, 0), 1.0), Optional.empty(), false);

        assertThat(f).hasSize(1);
        assertThat(f.get(0).severity()).isEqualTo(Severity.WARN);
        assertThat(f.get(0).figure()).isCloseTo(2.0, within(1e-12));
        assertThat(f.get(0).message()).contains("Ti = 0.5 s").contains("h / Ti = 2").contains("minutes read as seconds");
    }

    // Ti 30 s at a 1 s scan (h / Ti = 1/30) and no integral at all: nothing to say.
    @Test
    void an_integral_of_several_scans_or_none_is_quiet() {
        assertThat(rules(at(ideal(2, 30, 0), 1.0), Optional.empty(), false)).isEmpty();
        assertThat(rules(at(ideal(2, Double.POSITIVE_INFINITY, 0), 1.0), Optional.empty(), false)).isEmpty();
    }

    // With a process model the loop's own margins speak: no finding from this rule.
    @Test
    void with_a_model_the_rule_stays_quiet() {
        assertThat(rules(at(ideal(2, 0.5, 0), 1.0), Optional.empty(), true)).isEmpty();
    }

    // The old controller ran the same integral at a 2 s scan (h / Ti = 4): the new one at 1 s (2) does not make
    // it worse, so the finding is information.
    @Test
    void a_condition_the_old_controller_had_is_information() {
        List<Finding> f = rules(at(ideal(2, 0.5, 0), 1.0), Optional.of(at(ideal(2, 0.5, 0), 2.0)), false);

        assertThat(f).hasSize(1);
        assertThat(f.get(0).severity()).isEqualTo(Severity.INFO);
        assertThat(f.get(0).message()).contains("h / Ti = 4").contains("does not make it worse");
    }
}

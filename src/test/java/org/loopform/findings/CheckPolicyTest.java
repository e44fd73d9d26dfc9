package org.loopform.findings;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/** Source: plumbing tests (the policy's keys, overrides and the warn/fail ordering); no published figure. */
class CheckPolicyTest {

    @Test
    void every_key_has_a_default_a_unit_a_meaning_and_a_source() {
        for (PolicyKey k : PolicyKey.values()) {
            assertThat(k.id()).matches("[a-z_]+");
            assertThat(k.unit()).as(k.id()).isNotBlank();
            assertThat(k.meaning()).as(k.id()).isNotBlank();
            assertThat(k.source()).as(k.id()).isNotBlank();
            assertThat(CheckPolicy.DEFAULT.asMap()).containsEntry(k.id(), k.defaultValue());
        }
    }

    @Test
    void an_override_replaces_only_its_key() {
        CheckPolicy p = CheckPolicy.DEFAULT.with(Map.of("ms_fail", 4.0));
        assertThat(p.msFail()).isEqualTo(4.0);
        assertThat(p.msWarn()).isEqualTo(CheckPolicy.DEFAULT.msWarn());
    }

    @ParameterizedTest(name = "{0} = {1}")
    @CsvSource({
            "phase_margin_fail_deg, 35, phase_margin_warn_deg",
            "gain_margin_fail, 2.5, gain_margin_warn",
            "delay_margin_fail_scans, 3, delay_margin_warn_scans",
            "ms_fail, 1.5, ms_warn",
            "sampling_fail, 0.4, sampling_warn"})
    void a_fail_threshold_laxer_than_its_warning_is_refused_naming_both_keys(String key, double value, String warn) {
        assertThatThrownBy(() -> CheckPolicy.DEFAULT.with(Map.of(key, value)))
                .isInstanceOf(PolicyException.class)
                .hasMessageContaining(key + ": must not be")
                .hasMessageContaining(warn)
                .hasMessageContaining("fail only where it would also warn");
    }

    @ParameterizedTest(name = "{0} = {1}")
    @CsvSource({
            "ms_warn, 1000, ms_fail, 1000, above 10",
            "gain_margin_warn, 1, gain_margin_fail, 1, below 1.1",
            "phase_margin_warn_deg, 0, phase_margin_fail_deg, 0, below 5"})
    void no_policy_switches_off_the_edge_of_instability(String warn, double warnValue, String fail, double value,
            String says) {
        // loopform policy (common practice): Ms 10, GM 1.1 or PM 5 deg is the edge of instability
        assertThatThrownBy(() -> CheckPolicy.DEFAULT.with(Map.of(warn, warnValue, fail, value)))
                .isInstanceOf(PolicyException.class)
                .hasMessageContaining(fail + ": must not be " + says)
                .hasMessageContaining("fails whatever the policy");
        double laxest = Double.parseDouble(says.substring(6));
        assertThat(CheckPolicy.DEFAULT.with(Map.of(warn, laxest, fail, laxest)).get(PolicyKey.byId(fail)))
                .isEqualTo(laxest);
    }

    @Test
    void a_fail_threshold_equal_to_its_warning_is_allowed() {
        assertThat(CheckPolicy.DEFAULT.with(Map.of("gain_margin_fail", 2.0)).gainMarginFail()).isEqualTo(2.0);
    }

    @Test
    void an_unknown_key_names_the_known_ones() {
        assertThatThrownBy(() -> CheckPolicy.DEFAULT.with(Map.of("pm_fail", 10.0)))
                .hasMessageContaining("pm_fail: unknown policy key").hasMessageContaining("phase_margin_fail_deg");
    }

    @Test
    void a_negative_value_is_refused_naming_its_key() {
        assertThatThrownBy(() -> CheckPolicy.DEFAULT.with(Map.of("iae_rise_warn", -0.1)))
                .hasMessageContaining("iae_rise_warn: must be a finite number >= 0");
    }
}

// plumbing: no published source needed (source: none); it checks the record's validation
package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.OptionalDouble;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

@DisplayName("Loop margins record")
class LoopMarginsTest {

    private static final OptionalDouble NONE = OptionalDouble.empty();

    @Test
    void rejects_a_negative_gain_margin_and_names_it() {
        assertThatThrownBy(() -> new LoopMargins(OptionalDouble.of(-2), OptionalDouble.of(1), NONE, NONE, NONE,
                1.2, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("gain margin")
                .hasMessageContaining("got -2.0");
    }

    @Test
    void rejects_a_phase_margin_without_its_crossover() {
        assertThatThrownBy(() -> new LoopMargins(NONE, NONE, OptionalDouble.of(45), NONE, NONE,
                1.2, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("must come together");
    }

    // the delay margin replaced by a finer figure (a sampled loop's exact one): only it changes, and a loop
    // without a gain crossover has none to replace
    @Test
    void replaces_only_the_delay_margin() {
        LoopMargins m = new LoopMargins(OptionalDouble.of(3), OptionalDouble.of(2), OptionalDouble.of(50),
                OptionalDouble.of(0.5), OptionalDouble.of(1.7), 1.4, 0.6);

        LoopMargins r = m.withDelayMarginSeconds(1.2);

        assertThat(r.delayMarginSeconds()).hasValue(1.2);
        assertThat(r.gainMargin()).isEqualTo(m.gainMargin());
        assertThat(r.phaseMarginDegrees()).isEqualTo(m.phaseMarginDegrees());
        assertThat(r.crossoverRadPerSecond()).isEqualTo(m.crossoverRadPerSecond());
        assertThat(r.maximumSensitivity()).isEqualTo(1.4);
        assertThatThrownBy(() -> new LoopMargins(NONE, NONE, NONE, NONE, NONE, 1.2, 1).withDelayMarginSeconds(1))
                .isInstanceOf(IllegalStateException.class).hasMessageContaining("no delay margin");
    }

    // 1 + L vanishing on the band (a closed-loop pole on the boundary) makes Ms infinite: a figure, not an error
    @Test
    void takes_an_infinite_maximum_sensitivity_and_rejects_nan() {
        assertThat(new LoopMargins(NONE, NONE, NONE, NONE, NONE, Double.POSITIVE_INFINITY, 1).maximumSensitivity()).isInfinite();
        assertThatThrownBy(() -> new LoopMargins(NONE, NONE, NONE, NONE, NONE,
                Double.NaN, 1))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("got NaN");
    }
}

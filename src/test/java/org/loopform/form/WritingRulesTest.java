package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.units.TimeUnit;

/**
 * How a form writes each action, one writing at a time. Sources: PB % = 100 / Kc with Kc in %/%
 * (ISA InTech, Oct 2022, citing Goettsche (ed.), Maintenance of Instruments and Systems, 2nd ed.,
 * ISA 2005; docs/references.md 2); reset rate = 1/Ti repeats per unit time, ki = Kc/Ti, kd = Kc Td
 * (Astrom and Hagglund 1995, sec. 3.4); an engineering-unit gain times PV span / output span is
 * the %/% gain, and a per-scan gain is ki h or kd/h (common practice, from the definitions).
 * 1 min = 60 s, 1 h = 3600 s. Every expected value is worked out in its comment.
 */
class WritingRulesTest {

    private static final double TOL = 1e-12;

    @Nested
    @DisplayName("the proportional action")
    class Gain {

        @Test
        void a_gain_is_named_kp_in_a_parallel_form_and_kc_otherwise() {
            assertThat(GainWriting.GAIN.name(Structure.PARALLEL)).isEqualTo("kp");
            assertThat(GainWriting.GAIN.name(Structure.IDEAL)).isEqualTo("kc");
            assertThat(GainWriting.GAIN.name(Structure.SERIES)).isEqualTo("kc");
            assertThat(GainWriting.GAIN.meaning(Structure.PARALLEL)).isEqualTo("proportional gain");
            assertThat(GainWriting.GAIN.meaning(Structure.IDEAL)).isEqualTo("controller gain");
            assertThat(GainWriting.BAND.name(Structure.IDEAL)).isEqualTo("pb");
            assertThat(GainWriting.BAND.meaning(Structure.SERIES)).isEqualTo("proportional band");
        }

        @Test
        void units_follow_the_basis() {
            assertThat(GainWriting.GAIN.unit(GainBasis.PERCENT)).isEqualTo("%/%");
            assertThat(GainWriting.GAIN.unit(GainBasis.ENGINEERING)).isEqualTo("out/PV");
            assertThat(GainWriting.BAND.unit(GainBasis.PERCENT)).isEqualTo("%");
            assertThat(GainWriting.GAIN.inOwnUnit("%/%", 2.5)).contains(2.5);
            assertThat(GainWriting.GAIN.inOwnUnit("%", 2.5)).isEmpty();
            assertThat(GainWriting.BAND.inOwnUnit("%", 50)).contains(50.0);
            assertThat(GainWriting.BAND.inOwnUnit("%/%", 50)).isEmpty();
            assertThat(GainWriting.GAIN.unitHint()).contains("bare number");
        }

        @Test
        void a_gain_times_the_basis_factor_is_the_percent_gain() {
            // engineering gain 2 out/PV with PV span 200 and output span 100: 2 * 200/100 = 4 %/%
            assertThat(GainWriting.GAIN.toGain("kc", 2, 2.0)).isEqualTo(4.0);
            assertThat(GainWriting.GAIN.toGain("kc", -2, 1.0)).isEqualTo(-2.0);
            assertThat(GainWriting.GAIN.fromGain(4, true, 2.0)).isEqualTo(2.0);
            // an unsigned form writes the magnitude; its action flag carries the sign
            assertThat(GainWriting.GAIN.fromGain(-4, false, 2.0)).isEqualTo(2.0);
            assertThat(GainWriting.GAIN.fromGain(-4, true, 2.0)).isEqualTo(-2.0);
        }

        @Test
        void a_zero_gain_is_refused() {
            assertThatThrownBy(() -> GainWriting.GAIN.toGain("kp", 0, 1)).isInstanceOf(FormException.class)
                    .hasMessageContaining("kp: gain must not be 0");
        }

        @Test
        void a_band_is_100_over_the_gain() {
            // PB 50 % -> Kc = 100/50 = 2; Kc = -4 -> PB = 100/4 = 25 % (the band carries no sign)
            assertThat(GainWriting.BAND.toGain("pb", 50, 3.0)).isEqualTo(2.0);
            assertThat(GainWriting.BAND.fromGain(-4, true, 3.0)).isEqualTo(25.0);
            assertThat(GainWriting.BAND.fromGain(4, false, 3.0)).isEqualTo(25.0);
        }

        @Test
        void a_band_must_be_positive() {
            assertThatThrownBy(() -> GainWriting.BAND.toGain("pb", 0, 1)).hasMessageContaining("> 0 % (got 0.0 %)");
            assertThatThrownBy(() -> GainWriting.BAND.toGain("pb", -10, 1)).hasMessageContaining("got -10.0 %");
            assertThatThrownBy(() -> GainWriting.BAND.toGain("pb", Double.NaN, 1)).isInstanceOf(FormException.class);
        }
    }

    @Nested
    @DisplayName("the integral action")
    class Integral {

        private static final java.util.function.DoubleSupplier SCAN_HALF_SECOND = () -> 0.5;

        @Test
        void names_meanings_and_structure_rules() {
            assertThat(IntegralWriting.TIME.parameter()).isEqualTo("ti");
            assertThat(IntegralWriting.RATE.parameter()).isEqualTo("reset");
            assertThat(IntegralWriting.GAIN.parameter()).isEqualTo("ki");
            assertThat(IntegralWriting.PER_SCAN.parameter()).isEqualTo("ki");
            assertThat(IntegralWriting.TIME.meaning()).isEqualTo("integral time per repeat");
            assertThat(IntegralWriting.TIME.parallelOnly()).isFalse();
            assertThat(IntegralWriting.RATE.parallelOnly()).isFalse();
            assertThat(IntegralWriting.GAIN.parallelOnly()).isTrue();
            assertThat(IntegralWriting.PER_SCAN.parallelOnly()).isTrue();
            assertThat(IntegralWriting.TIME.isTime()).isTrue();
            assertThat(IntegralWriting.RATE.isTime()).isFalse();
            assertThat(IntegralWriting.TIME.unitHint()).contains("90s");
            assertThat(IntegralWriting.PER_SCAN.unitHint()).contains("bare number");
        }

        @Test
        void unit_texts() {
            assertThat(IntegralWriting.TIME.unit(GainBasis.PERCENT, TimeUnit.MINUTES)).isEqualTo("min/repeat");
            assertThat(IntegralWriting.RATE.unit(GainBasis.PERCENT, TimeUnit.MINUTES)).isEqualTo("repeats/min");
            assertThat(IntegralWriting.GAIN.unit(GainBasis.PERCENT, TimeUnit.SECONDS)).isEqualTo("1/s");
            assertThat(IntegralWriting.GAIN.unit(GainBasis.ENGINEERING, TimeUnit.SECONDS)).isEqualTo("out/PV/s");
            assertThat(IntegralWriting.PER_SCAN.unit(GainBasis.PERCENT, TimeUnit.SECONDS)).isEqualTo("per scan");
            assertThat(IntegralWriting.PER_SCAN.unit(GainBasis.ENGINEERING, TimeUnit.SECONDS))
                    .isEqualTo("out/PV per scan");
        }

        @Test
        void a_value_typed_with_its_own_unit_is_put_into_the_forms_unit() {
            // 90 s/repeat in a form that writes minutes: 1.5 min
            assertThat(IntegralWriting.TIME.inOwnUnit("s/repeat", 90, TimeUnit.MINUTES).orElseThrow())
                    .isCloseTo(1.5, within(TOL));
            // 2 repeats/min in a form that writes per second: 2/60 = 0.0333 /s
            assertThat(IntegralWriting.RATE.inOwnUnit("repeats/min", 2, TimeUnit.SECONDS).orElseThrow())
                    .isCloseTo(2.0 / 60, within(TOL));
            // 0.05 /s in a form that writes per minute: 0.05 * 60 = 3 /min
            assertThat(IntegralWriting.GAIN.inOwnUnit("1/s", 0.05, TimeUnit.MINUTES).orElseThrow())
                    .isCloseTo(3, within(TOL));
            assertThat(IntegralWriting.PER_SCAN.inOwnUnit("/scan", 0.2, TimeUnit.SECONDS)).contains(0.2);
            assertThat(IntegralWriting.PER_SCAN.inOwnUnit("/s", 0.2, TimeUnit.SECONDS)).isEmpty();
            assertThat(IntegralWriting.RATE.inOwnUnit("min", 2, TimeUnit.SECONDS)).isEmpty();
        }

        @Test
        void a_time_is_ti_and_its_inverse_is_ki_per_unit_gain() {
            // ti 2 min = 120 s; parallel coordinate 1/120 1/s
            assertThat(IntegralWriting.TIME.toCoordinate(2, TimeUnit.MINUTES, false, SCAN_HALF_SECOND)).isEqualTo(120.0);
            assertThat(IntegralWriting.TIME.toCoordinate(2, TimeUnit.MINUTES, true, SCAN_HALF_SECOND))
                    .isCloseTo(1.0 / 120, within(TOL));
            assertThat(IntegralWriting.TIME.fromCoordinate(120, TimeUnit.MINUTES, false, SCAN_HALF_SECOND)).isEqualTo(2.0);
            assertThat(IntegralWriting.TIME.fromCoordinate(1.0 / 120, TimeUnit.MINUTES, true, SCAN_HALF_SECOND))
                    .isCloseTo(2.0, within(TOL));
        }

        @Test
        void a_reset_rate_is_one_over_ti() {
            // 0.5 repeats/min: Ti = 60/0.5 = 120 s; in a parallel form 0.5/60 1/s
            assertThat(IntegralWriting.RATE.toCoordinate(0.5, TimeUnit.MINUTES, false, SCAN_HALF_SECOND)).isEqualTo(120.0);
            assertThat(IntegralWriting.RATE.toCoordinate(0.5, TimeUnit.MINUTES, true, SCAN_HALF_SECOND))
                    .isCloseTo(0.5 / 60, within(TOL));
            assertThat(IntegralWriting.RATE.fromCoordinate(120, TimeUnit.MINUTES, false, SCAN_HALF_SECOND)).isEqualTo(0.5);
            assertThat(IntegralWriting.RATE.fromCoordinate(0.5 / 60, TimeUnit.MINUTES, true, SCAN_HALF_SECOND))
                    .isCloseTo(0.5, within(TOL));
        }

        @Test
        void an_integral_gain_per_minute_is_sixty_times_the_one_per_second() {
            // ki 3 /min = 0.05 /s
            assertThat(IntegralWriting.GAIN.toCoordinate(3, TimeUnit.MINUTES, true, SCAN_HALF_SECOND))
                    .isCloseTo(0.05, within(TOL));
            assertThat(IntegralWriting.GAIN.fromCoordinate(0.05, TimeUnit.MINUTES, true, SCAN_HALF_SECOND))
                    .isCloseTo(3, within(TOL));
        }

        @Test
        void a_per_scan_gain_is_ki_times_the_scan_time() {
            // ki h = 0.1 with h = 0.5 s: ki = 0.2 /s
            assertThat(IntegralWriting.PER_SCAN.toCoordinate(0.1, TimeUnit.SECONDS, true, SCAN_HALF_SECOND))
                    .isCloseTo(0.2, within(TOL));
            assertThat(IntegralWriting.PER_SCAN.fromCoordinate(0.2, TimeUnit.SECONDS, true, SCAN_HALF_SECOND))
                    .isCloseTo(0.1, within(TOL));
        }
    }

    @Nested
    @DisplayName("the derivative action")
    class Derivative {

        private static final java.util.function.DoubleSupplier SCAN_QUARTER_SECOND = () -> 0.25;

        @Test
        void names_units_and_structure_rules() {
            assertThat(DerivativeWriting.TIME.parameter()).isEqualTo("td");
            assertThat(DerivativeWriting.GAIN.parameter()).isEqualTo("kd");
            assertThat(DerivativeWriting.TIME.meaning()).isEqualTo("derivative time");
            assertThat(DerivativeWriting.TIME.parallel()).isFalse();
            assertThat(DerivativeWriting.GAIN.parallel()).isTrue();
            assertThat(DerivativeWriting.PER_SCAN.parallel()).isTrue();
            assertThat(DerivativeWriting.TIME.unit(GainBasis.PERCENT, TimeUnit.MINUTES)).isEqualTo("min");
            assertThat(DerivativeWriting.GAIN.unit(GainBasis.PERCENT, TimeUnit.SECONDS)).isEqualTo("s");
            assertThat(DerivativeWriting.GAIN.unit(GainBasis.ENGINEERING, TimeUnit.SECONDS)).isEqualTo("out*s/PV");
            assertThat(DerivativeWriting.PER_SCAN.unit(GainBasis.PERCENT, TimeUnit.SECONDS)).isEqualTo("scans");
            assertThat(DerivativeWriting.PER_SCAN.unit(GainBasis.ENGINEERING, TimeUnit.SECONDS))
                    .isEqualTo("out/PV scans");
            assertThat(DerivativeWriting.TIME.unitHint()).contains("30s");
            assertThat(DerivativeWriting.PER_SCAN.unitHint()).contains("bare number");
        }

        @Test
        void a_value_typed_with_its_own_unit_is_put_into_the_forms_unit() {
            // 30 s in a form that writes minutes: 0.5 min
            assertThat(DerivativeWriting.TIME.inOwnUnit("s", 30, TimeUnit.MINUTES).orElseThrow())
                    .isCloseTo(0.5, within(TOL));
            assertThat(DerivativeWriting.PER_SCAN.inOwnUnit("scans", 4, TimeUnit.SECONDS)).contains(4.0);
            assertThat(DerivativeWriting.PER_SCAN.inOwnUnit("s", 4, TimeUnit.SECONDS)).isEmpty();
        }

        @Test
        void coordinates() {
            // td 0.5 min = 30 s
            assertThat(DerivativeWriting.TIME.toCoordinate(0.5, TimeUnit.MINUTES, 2, SCAN_QUARTER_SECOND)).isEqualTo(30.0);
            assertThat(DerivativeWriting.TIME.fromCoordinate(30, TimeUnit.MINUTES, 2, SCAN_QUARTER_SECOND)).isEqualTo(0.5);
            // kd 0.5 min in engineering units with factor 2: 30 s * 2 = 60 s on the percent basis
            assertThat(DerivativeWriting.GAIN.toCoordinate(0.5, TimeUnit.MINUTES, 2, SCAN_QUARTER_SECOND)).isEqualTo(60.0);
            assertThat(DerivativeWriting.GAIN.fromCoordinate(60, TimeUnit.MINUTES, 2, SCAN_QUARTER_SECOND)).isEqualTo(0.5);
            // kd/h = 8 scans with h = 0.25 s and factor 2: kd = 8 * 0.25 * 2 = 4 s
            assertThat(DerivativeWriting.PER_SCAN.toCoordinate(8, TimeUnit.SECONDS, 2, SCAN_QUARTER_SECOND)).isEqualTo(4.0);
            assertThat(DerivativeWriting.PER_SCAN.fromCoordinate(4, TimeUnit.SECONDS, 2, SCAN_QUARTER_SECOND)).isEqualTo(8.0);
        }
    }
}

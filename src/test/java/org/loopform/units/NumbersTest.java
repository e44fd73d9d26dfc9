// plumbing: number formatting; the expected strings are the decimal values written out by hand
package org.loopform.units;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;

/** Printed numbers carry sensible digits: no binary noise, no "0 dB" for results that differ, no "E-15". */
class NumbersTest {

    @Test
    void a_deviation_of_rounding_noise_reads_below_a_thousandth_never_zero_or_an_exponent() {
        assertThat(Numbers.deviation(2.89e-15)).isEqualTo("< 0.001");
        assertThat(Numbers.deviation(0.0004)).isEqualTo("< 0.001");
        assertThat(Numbers.deviation(0.0005)).isEqualTo("0.0005");
        assertThat(Numbers.deviation(0.10105596)).isEqualTo("0.101");
        assertThat(Numbers.deviation(22.616)).isEqualTo("22.6");
    }

    @Test
    void machine_output_loses_binary_noise_and_keeps_ten_digits() {
        assertThat(Numbers.tidy(117.99999999999999)).isEqualTo(118.0);
        assertThat(Numbers.tidy(700.8000000000001)).isEqualTo(700.8);
        assertThat(Numbers.tidy(1.4949152542372883)).isEqualTo(1.494915254);
        assertThat(Numbers.tidy(4.0526376287282974e-05)).isEqualTo(4.052637629e-05);
        assertThat(Numbers.tidy(0.0)).isEqualTo(0.0);
    }

    @Test
    void significant_digits_are_written_plainly() {
        assertThat(Numbers.significant(1.7436702884375173, 6)).isEqualTo("1.74367");
        assertThat(Numbers.significant(0.000265, 3)).isEqualTo("0.000265");
        assertThat(Numbers.significant(360.0, 6)).isEqualTo("360");
    }
}

// plumbing: how many digits a printed value carries; no published source needed
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;

/**
 * A converted value is printed to at most six significant digits in text, whether or not the target
 * names a resolution (a resolution governs the values to enter, not the unrounded conversion shown
 * beside them): no "1.7459463691836428" in convert's or check's table.
 */
class PrintedDigitsTest {

    /** Plain decimal numbers with more than {@code max} significant digits in {@code text}. */
    static List<String> longNumbers(String text, int max) {
        List<String> found = new ArrayList<>();
        Matcher m = Pattern.compile("(?<![\\w.])\\d+\\.\\d+(?![\\w.])").matcher(text);
        while (m.find()) {
            String digits = m.group().replace(".", "").replaceFirst("^0+", "");
            if (digits.length() > max) {
                found.add(m.group());
            }
        }
        return found;
    }

    @Test
    void convert_into_a_target_with_a_resolution_prints_six_digits() {
        CliRun r = CliRun.of("convert", "--from", "series-pb-min", "--to", "examples/plant-k7-target.yaml",
                "pb=60", "ti=6", "td=0.3");
        assertThat(r.exitCode()).isZero();
        assertThat(r.out()).contains("kc ");
        assertThat(longNumbers(r.out(), 6)).isEmpty();
    }

    @Test
    void check_prints_the_converted_column_to_six_digits() {
        CliRun r = CliRun.of("check", "examples/loops/tic-301.yaml");
        assertThat(r.exitCode()).isZero();
        assertThat(r.out()).contains("converted");
        assertThat(longNumbers(r.out(), 6)).isEmpty();
    }

    @Test
    void the_number_scanner_finds_what_it_should() {
        assertThat(longNumbers("kc 1.7459463691836428 %/% and 1.74 and 0.000265 and 6.28", 6))
                .containsExactly("1.7459463691836428");
    }
}

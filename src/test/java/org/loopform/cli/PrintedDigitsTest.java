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

    /**
     * The textbook line says "the values kept" only where the structure is the same (ideal into
     * ideal), never for series into ideal, where the textbook relations (Astrom & Hagglund 1995
     * sec. 3.4) change every value. Plumbing of the wording; the figures are tested in
     * form.ExplainedConversionTest.
     */
    @Test
    void the_textbook_line_says_values_kept_only_for_the_same_structure() {
        CliRun series = CliRun.of("convert", "--from", "series", "--to", "ideal-unfiltered", "kc=2", "ti=10", "td=2");
        assertThat(series.out()).contains("textbook:").doesNotContain("values kept")
                .contains("the textbook values as the new form holds them deviate by up to 0.243 dB and 13.5 deg where the loop lives");
        CliRun ideal = CliRun.of("convert", "--from", "ideal", "--to", "ideal-fixed-n8", "kc=1", "ti=60", "td=10");
        assertThat(ideal.out()).contains("that is the values kept")
                .contains("the textbook values as the new form holds them deviate by up to 0.107 dB and 2.08 deg where the loop lives");
    }

    /**
     * JSON's entered values are what the text says to enter: six significant digits for a form
     * without a resolution. Series 2/10/2 (N = 10) into ideal is exact with Td = 4/2.36 - 0.2 =
     * 1.4949152... s (derived in form.ExplainedConversionTest), entered as 1.49492 s; the converted
     * value keeps its ten digits.
     */
    @Test
    void json_entered_values_are_the_values_the_text_says_to_enter() throws Exception {
        CliRun r = CliRun.of("convert", "--from", "series", "--to", "ideal", "kc=2", "ti=10", "td=2", "--format", "json");
        assertThat(r.exitCode()).isZero();
        var json = new com.fasterxml.jackson.databind.ObjectMapper().readTree(r.out());
        assertThat(json.get("entered").get("td").asDouble()).isEqualTo(1.49492);
        assertThat(json.get("entered").get("kc").asDouble()).isEqualTo(2.36);
        assertThat(json.get("parameters").get("td").asDouble())
                .isCloseTo(4 / 2.36 - 0.2, org.assertj.core.api.Assertions.within(1e-9));
        CliRun text = CliRun.of("convert", "--from", "series", "--to", "ideal", "kc=2", "ti=10", "td=2");
        assertThat(text.out()).containsPattern("td\\s+1\\.49492\\s+s\\s+1\\.49492");
    }

    /** check's conversion line gives the nearest fit's deviation where the loop lives before the whole band's. */
    @Test
    void check_says_how_close_the_fit_is_where_the_loop_lives() {
        CliRun r = CliRun.of("check", "examples/loops/tic-301.yaml");
        assertThat(r.out()).containsPattern("conversion: nearest setting, feedback path within [0-9.<> ]+ dB and [0-9.<> ]+"
                + " deg where the loop lives \\([0-9.]+ to [0-9.]+ rad/s\\), [0-9.]+ dB and [0-9.]+ deg over the whole band");
    }

    /** A source value typed with its own unit is not shown beside the form's unit. */
    @Test
    void a_value_typed_with_its_unit_is_not_labelled_with_the_forms_unit() {
        CliRun r = CliRun.of("convert", "--from", "series-pb-min", "--to", "ideal", "pb=50%", "ti=120s", "td=0.1h");
        assertThat(r.out()).containsPattern("ti\\s+120s\\s+as typed").doesNotContain("120s   min/repeat");
        CliRun plain = CliRun.of("convert", "--from", "series-pb-min", "--to", "ideal", "pb=50", "ti=2", "td=6");
        assertThat(plain.out()).containsPattern("ti\\s+2\\s+min/repeat");
    }

    @Test
    void the_number_scanner_finds_what_it_should() {
        assertThat(longNumbers("kc 1.7459463691836428 %/% and 1.74 and 0.000265 and 6.28", 6))
                .containsExactly("1.7459463691836428");
    }
}

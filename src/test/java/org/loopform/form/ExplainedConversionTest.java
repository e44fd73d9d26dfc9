package org.loopform.form;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.findings.ConversionRules;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.io.CatalogLoader;
import org.loopform.law.ControlLaw;

/** Conversions that explain themselves: textbook values, filter changes, "no filter", a fit where the loop lives. */
class ExplainedConversionTest {

    private static FormDefinition form(String id) {
        return CatalogLoader.bundled().find(id).orElseThrow();
    }

    private static Map<String, String> values(String text) {
        Map<String, String> m = new LinkedHashMap<>();
        for (String pair : text.split(" ")) {
            String[] kv = pair.split("=");
            m.put(kv[0], kv[1]);
        }
        return m;
    }

    private static Conversion convert(String from, String values, String to) {
        return Converter.convert(form(from), values(values), form(to), WritingContext.NONE);
    }

    @Nested
    @DisplayName("series kc=2 ti=10 td=2 (N = 10) to ideal")
    class SeriesToIdeal {

        private final Conversion c = convert("series", "kc=2 ti=10 td=2", "ideal");

        /**
         * Source: Astrom & Hagglund, PID Controllers: Theory, Design and Tuning, 2nd ed., ISA 1995,
         * sec. 3.4: series Kc', Ti', Td' to ideal Kc = Kc'(1 + Td'/Ti') = 2.4, Ti = Ti' + Td' = 12 s,
         * Td = Ti'Td'/(Ti' + Td') = 20/12 = 1.6667 s.
         */
        @Test
        void shows_the_textbook_values_beside_the_exact_ones() {
            assertThat(c.textbook()).isNotNull();
            assertThat(c.textbook().values().get("kc")).isCloseTo(2.4, within(1e-12));
            assertThat(c.textbook().values().get("ti")).isCloseTo(12.0, within(1e-12));
            assertThat(c.textbook().values().get("td")).isCloseTo(20.0 / 12.0, within(1e-12));
        }

        /**
         * Derived by hand. The series law with Tf = Td'/N = 0.2 s is
         * Kc'(1 + 1/(Ti' s))(1 + Td' s)/(1 + Tf s) = (d s + p + i/s)/(1 + Tf s) with
         * p = Kc'(1 + Td'/Ti') = 2.4, i = Kc'/Ti' = 0.2 /s, d = Kc' Td' = 4 s. The ideal law with its
         * filter on the derivative, Kc(1 + 1/(Ti s) + Td s/(1 + Tf s)), multiplied out over (1 + Tf s),
         * has p = Kc(1 + Tf/Ti), i = Kc/Ti, d = Kc(Tf + Td). Same Tf, so Kc = p - Tf i = 2.36,
         * Ti = Kc/i = 11.8 s, Td = d/Kc - Tf = 4/2.36 - 0.2 = 1.494915 s, N = Td/Tf = 7.474576.
         */
        @Test
        void is_exact_with_the_filtered_relations() {
            assertThat(c.exact()).isTrue();
            assertThat(c.parameters().values().get("kc")).isCloseTo(2.36, within(1e-12));
            assertThat(c.parameters().values().get("ti")).isCloseTo(11.8, within(1e-12));
            assertThat(c.parameters().values().get("td")).isCloseTo(4 / 2.36 - 0.2, within(1e-12));
            assertThat(c.parameters().values().get("n")).isCloseTo((4 / 2.36 - 0.2) / 0.2, within(1e-9));
        }

        @Test
        void says_that_the_filter_ratio_changes_and_what_the_default_would_cost() {
            assertThat(ConversionRules.findings(c)).filteredOn(f -> f.topic() == Topic.FILTER).singleElement().satisfies(f -> {
                assertThat(f.severity()).isEqualTo(Severity.INFO);
                assertThat(f.message()).contains("n = 7.475").contains("default n = 10").contains("dB");
                assertThat(f.figure()).isGreaterThan(0.0);
            });
        }

        /**
         * The textbook values entered with the target's default n = 10 are the ideal law
         * 2.4 (1 + 1/(12 s) + 1.6667 s/(1 + s 1.6667/10)), compared with the series law
         * 2 (1 + 1/(10 s))(1 + 2 s)/(1 + 0.2 s) where the loop lives (half the ideal law's integral
         * corner 1/12 to twice its derivative corner 1/1.6667: 0.04167 to 1.2 rad/s). Evaluated
         * independently with numpy (4000 log-spaced points): 0.783 dB and 4.12 deg, both at 1.2 rad/s.
         * The same ideal values kept at the series filter time Tf = 0.2 s (N = 8.33) would read
         * 0.847 dB and 3.33 deg, which is not what the finding says it measures (n = 10).
         * The relations: Astrom & Hagglund 1995 sec. 3.4 (textbook values), the laws as written above.
         */
        @Test
        void prices_the_textbook_values_with_the_default_filter_it_names() {
            ConversionNote.FilterSettingNeeded note = c.notes().stream()
                    .filter(ConversionNote.FilterSettingNeeded.class::isInstance)
                    .map(ConversionNote.FilterSettingNeeded.class::cast).findFirst().orElseThrow();
            assertThat(note.textbookCost()).isPresent();
            assertThat(note.textbookCost().get().gainDb()).isCloseTo(0.783, within(0.003));
            assertThat(note.textbookCost().get().phaseDegrees()).isCloseTo(4.12, within(0.02));
            assertThat(ConversionRules.findings(c)).filteredOn(f -> f.topic() == Topic.FILTER).singleElement()
                    .satisfies(f -> assertThat(f.message()).contains("with n = 10 would move it by up to 0.783 dB"
                            + " and 4.12 deg"));
        }

        /**
         * A proportional-band case in mixed units, series-pb-min pb=50 % ti=120 s td=0.1 h (Kc' = 2, Ti' = 120 s,
         * Td' = 360 s, Tf = 36 s) into ideal: exact with n = 1.703 (derived as above, with
         * p = Kc'(1 + Td'/Ti') = 8, i = 1/60, d = 720: Kc = p - Tf i = 7.4, Ti = Kc/i = 444 s,
         * Td = d/Kc - Tf = 61.297 s, N = 1.7027). Where the loop lives (0.5/480 to 2/90 rad/s, the
         * textbook law's corners) numpy gives: the exact values with n = 10, 1.07 dB and 22.6 deg;
         * the textbook values (8, 480 s, 90 s; sec. 3.4) with n = 10, 2.70 dB and 29.2 deg.
         */
        @Test
        void prices_both_settings_with_n_10_for_the_band_case() {
            Conversion pb = convert("series-pb-min", "pb=50% ti=120s td=0.1h", "ideal");
            assertThat(pb.exact()).isTrue();
            assertThat(pb.parameters().values().get("n")).isCloseTo(1.7027, within(1e-4));
            ConversionNote.FilterSettingNeeded note = pb.notes().stream()
                    .filter(ConversionNote.FilterSettingNeeded.class::isInstance)
                    .map(ConversionNote.FilterSettingNeeded.class::cast).findFirst().orElseThrow();
            assertThat(note.defaultCost().gainDb()).isCloseTo(1.07, within(0.01));
            assertThat(note.defaultCost().phaseDegrees()).isCloseTo(22.6, within(0.1));
            assertThat(note.textbookCost().orElseThrow().gainDb()).isCloseTo(2.70, within(0.01));
            assertThat(note.textbookCost().orElseThrow().phaseDegrees()).isCloseTo(29.2, within(0.1));
        }

        @Test
        void states_the_assumed_source_filter() {
            assertThat(c.assumptions()).anySatisfy(a -> assertThat(a).contains("N = 10").contains("series"));
        }

        /** With n=off the series law has no filter, and the textbook relations (sec. 3.4) are exact. */
        @Test
        void without_a_filter_the_textbook_values_are_exact_and_n_is_off() {
            Conversion off = convert("series", "kc=2 ti=10 td=2 n=off", "ideal");
            assertThat(off.exact()).isTrue();
            assertThat(off.textbook()).isNull();
            assertThat(off.parameters().values().get("kc")).isCloseTo(2.4, within(1e-12));
            assertThat(off.parameters().values().get("ti")).isCloseTo(12.0, within(1e-12));
            assertThat(off.parameters().values().get("td")).isCloseTo(20.0 / 12.0, within(1e-12));
            assertThat(FormCodec.isFilterOff("n", off.parameters().values().get("n"))).isTrue();
            assertThat(FormCodec.asText(off.parameters())).containsEntry("n", "off");
            assertThat(off.assumptions()).noneSatisfy(a -> assertThat(a).contains("No n"));
        }
    }

    @Nested
    @DisplayName("filtered and unfiltered laws")
    class NoFilter {

        @Test
        void a_filtered_law_into_the_unfiltered_form_is_a_nearest_fit_with_its_deviation() {
            Conversion c = convert("ideal", "kc=1 ti=60 td=10", "ideal-unfiltered");
            assertThat(c.exact()).isFalse();
            assertThat(c.deviation().gainDb()).isGreaterThan(0.0);
            assertThat(ConversionRules.findings(c)).anySatisfy(f -> assertThat(f.topic()).isEqualTo(Topic.FILTER));
        }

        @Test
        void an_unfiltered_law_into_an_adjustable_filter_is_exact_with_n_off() {
            Conversion c = convert("ideal-unfiltered", "kc=1 ti=60 td=10", "ideal");
            assertThat(c.exact()).isTrue();
            assertThat(FormCodec.asText(c.entered())).containsEntry("n", "off");
        }

        /**
         * What the filter finding says must be true of the law: an unfiltered source has no filter
         * time to be "a different share" of anything, and an ideal source with n = 7 into an ideal
         * form keeps its own ratio (Tf = Td/N, Astrom & Hagglund 1995 sec. 3.4: the same ratio, the
         * same law). Plumbing of the wording; the figures are tested above.
         */
        @Test
        void the_filter_finding_explains_an_unfiltered_or_kept_filter_truthfully() {
            for (Conversion c : List.of(convert("series", "kc=2 ti=10 td=2 n=off", "ideal"),
                    convert("ideal-unfiltered", "kc=1 ti=60 td=10", "ideal"))) {
                assertThat(ConversionRules.findings(c)).filteredOn(f -> f.topic() == Topic.FILTER).singleElement()
                        .satisfies(f -> assertThat(f.message()).contains("the old law has no derivative filter")
                                .contains("n = off").doesNotContain("different share").doesNotContain("Tf = 0"));
            }
            Conversion kept = convert("ideal", "kc=2 ti=10 td=2 n=7", "ideal");
            assertThat(ConversionRules.findings(kept)).filteredOn(f -> f.topic() == Topic.FILTER).singleElement()
                    .satisfies(f -> assertThat(f.message()).contains("own filter (Tf = 0.2857 s) is kept")
                            .doesNotContain("different share"));
        }

        /**
         * The textbook values beside a nearest fit are priced where the loop lives, so the reader can
         * see the trade the fit made. Series 2/10/2 (N = 10) into the unfiltered ideal form: the
         * textbook values 2.4, 12 s, 1.667 s (Astrom & Hagglund 1995 sec. 3.4) deviate from
         * 2 (1 + 1/(10 s))(1 + 2 s)/(1 + 0.2 s) by 0.243 dB and 13.5 deg over 0.04167 to 1.2 rad/s
         * (numpy, 4000 points). Ideal 1/60/10 (N = 10) into ideal-fixed-n8: the values kept, with
         * N = 8, deviate by 0.107 dB and 2.08 deg over 0.0082 to 0.185 rad/s (numpy).
         */
        @Test
        void prices_the_textbook_values_beside_the_nearest_fit() {
            Conversion unfiltered = convert("series", "kc=2 ti=10 td=2", "ideal-unfiltered");
            assertThat(unfiltered.exact()).isFalse();
            assertThat(unfiltered.textbookLoopDeviation().orElseThrow().gainDb()).isCloseTo(0.243, within(0.002));
            assertThat(unfiltered.textbookLoopDeviation().orElseThrow().phaseDegrees()).isCloseTo(13.5, within(0.05));
            Conversion kept = convert("ideal", "kc=1 ti=60 td=10", "ideal-fixed-n8");
            assertThat(kept.textbookLoopDeviation().orElseThrow().gainDb()).isCloseTo(0.107, within(0.002));
            assertThat(kept.textbookLoopDeviation().orElseThrow().phaseDegrees()).isCloseTo(2.08, within(0.02));
        }

        @Test
        void n_off_reads_as_no_filter() {
            PidSetting s = FormCodec.decode(form("ideal"), values("kc=1 ti=60 td=10 n=off"), WritingContext.NONE,
                    "source");
            assertThat(s.filterSeconds()).isZero();
        }
    }

    /**
     * Source: numpy, by {@code python3 src/test/python/write_nearest_fit_golden.py}: the source law's
     * response and the deviation of the values kept (textbook relations, Astrom & Hagglund 1995
     * sec. 3.4, with the target's fixed N = 8) at frequencies near the loop's crossover. The nearest
     * fit must be no worse there than keeping the values (plus 0.01 dB / 0.1 deg of slack for the
     * fit's own tolerance).
     */
    @Nested
    @DisplayName("the nearest fit where the loop lives")
    class WhereTheLoopLives {

        record Row(String id, String from, String values, String to, double omega, double re, double im,
                   double keptDb, double keptDeg) {
        }

        static List<Row> golden() throws IOException {
            List<Row> rows = new ArrayList<>();
            try (var in = ExplainedConversionTest.class.getResourceAsStream("nearest-fit-golden.csv");
                 var r = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8))) {
                r.readLine();
                for (String line = r.readLine(); line != null; line = r.readLine()) {
                    String[] f = line.split(",");
                    rows.add(new Row(f[0], f[1], f[2], f[3], Double.parseDouble(f[4]), Double.parseDouble(f[5]),
                            Double.parseDouble(f[6]), Double.parseDouble(f[7]), Double.parseDouble(f[8])));
                }
            }
            return rows;
        }

        @Test
        void is_never_worse_than_keeping_the_values_near_crossover() throws IOException {
            List<Row> rows = golden();
            assertThat(rows).hasSizeGreaterThanOrEqualTo(10);
            for (String id : rows.stream().map(Row::id).distinct().toList()) {
                List<Row> mine = rows.stream().filter(r -> r.id().equals(id)).toList();
                Row first = mine.get(0);
                Conversion c = convert(first.from(), first.values(), first.to());
                ControlLaw law = c.targetLaw();
                double worstKeptDb = 0;
                double worstKeptDeg = 0;
                double worstFitDb = 0;
                double worstFitDeg = 0;
                double[] out = new double[2];
                for (Row r : mine) {
                    law.feedbackAt(r.omega(), out);
                    // the source law's response is numpy's, not loopform's
                    double ratioRe = (out[0] * r.re() + out[1] * r.im()) / (r.re() * r.re() + r.im() * r.im());
                    double ratioIm = (out[1] * r.re() - out[0] * r.im()) / (r.re() * r.re() + r.im() * r.im());
                    worstFitDb = Math.max(worstFitDb, Math.abs(20 * Math.log10(Math.hypot(ratioRe, ratioIm))));
                    worstFitDeg = Math.max(worstFitDeg, Math.abs(Math.toDegrees(Math.atan2(ratioIm, ratioRe))));
                    worstKeptDb = Math.max(worstKeptDb, r.keptDb());
                    worstKeptDeg = Math.max(worstKeptDeg, r.keptDeg());
                }
                assertThat(worstFitDb).as(id + ": gain deviation near crossover, dB").isLessThanOrEqualTo(worstKeptDb + 0.01);
                assertThat(worstFitDeg).as(id + ": phase deviation near crossover, deg").isLessThanOrEqualTo(worstKeptDeg + 0.1);
            }
        }

        /** The case: 1 / 60 / 10 into N = 8 must not come back as kc 1.11 (+11 %). */
        @Test
        void does_not_trade_the_crossover_for_the_high_frequency_gain() {
            Conversion c = convert("ideal", "kc=1 ti=60 td=10", "ideal-fixed-n8");
            assertThat(c.parameters().values().get("kc")).isCloseTo(1.0, within(0.03));
            assertThat(ConversionRules.findings(c)).filteredOn(f -> f.topic() == Topic.FILTER).singleElement()
                    .satisfies(f -> assertThat(f.message()).contains("high-frequency derivative gain"));
        }
    }
}

// source: the invented records examples/records/generate.py (numpy, independent of loopform) wrote from known controllers
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Pattern;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code audit --records DIR} with the record columns {@code replay} takes ({@code --time},
 * {@code --setpoint}, {@code --pv}, {@code --output}, {@code --mode}, {@code --tracking}), with
 * {@code --fit-tuning}, and with records that match no loop. The records are the invented ones
 * {@code examples/records/generate.py} (numpy, independent of loopform) wrote from known controllers:
 * FIC-105's reset really ran at 15 s where the draft list says 15 min (a series PB form in minutes),
 * PIC-401 and TIC-301 ran as listed.
 */
class AuditRecordOptionsTest {

    @TempDir
    Path dir;

    static final String DRAFT = "examples/records/replay-loops.csv";
    static final String RECORDS = "examples/records/replay";
    static final String TARGET = "examples/plant-k7-target.yaml";
    static final List<String> TAGS = List.of("FIC-105", "PIC-401", "TIC-301");

    /** The draft's records, copied with their header renamed as a historian export names it. */
    private Path historianRecords() throws Exception {
        Path d = Files.createDirectories(dir.resolve("historian"));
        for (String t : TAGS) {
            List<String> lines = Files.readAllLines(Path.of(RECORDS, t + ".csv"));
            assertThat(lines.get(0)).isEqualTo("time,setpoint,pv,output,mode");
            lines.set(0, "Timestamp,SP,PV.Value,OUT,Status");
            Files.write(d.resolve(t + ".csv"), lines);
        }
        return d;
    }

    private static final String[] COLUMNS = {"--time", "Timestamp", "--setpoint", "SP", "--pv", "PV.Value",
        "--output", "OUT", "--mode", "Status"};

    private static String[] args(String[] head, String... tail) {
        String[] all = new String[head.length + COLUMNS.length + tail.length];
        System.arraycopy(head, 0, all, 0, head.length);
        System.arraycopy(COLUMNS, 0, all, head.length, COLUMNS.length);
        System.arraycopy(tail, 0, all, head.length + COLUMNS.length, tail.length);
        return all;
    }

    private static JsonNode loop(JsonNode doc, String tag) {
        for (JsonNode l : doc.get("loops")) {
            if (l.get("tag").asText().equals(tag)) {
                return l;
            }
        }
        throw new AssertionError("no loop " + tag);
    }

    @Nested
    @DisplayName("record columns named as replay names them")
    class Columns {

        @Test
        void renamed_columns_are_read_and_the_generators_facts_come_out() throws Exception {
            Path records = historianRecords();
            Path out = dir.resolve("out");
            CliRun r = CliRun.of(args(new String[] {"audit", DRAFT, "--to", TARGET, "--records", records.toString()},
                    "--out", out.toString()));
            assertThat(r.exitCode()).as(r.err()).isEqualTo(1);
            assertThat(r.out()).contains("3 loops replayed (2 reproduced, 0 not confirmed, 1 refuted)");
            JsonNode doc = new ObjectMapper().readTree(out.resolve("loops.json").toFile());
            assertThat(loop(doc, "FIC-105").get("replay").get("explanations").get(0).get("description").asText())
                    .isEqualTo("ti is 15 s, not min");
            assertThat(loop(doc, "TIC-301").get("replay").get("as_found_verdict").asText()).isEqualTo("reproduced");
        }

        @Test
        void without_the_column_options_a_renamed_record_is_its_loops_problem_naming_the_option() throws Exception {
            Path records = historianRecords();
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--records", records.toString(), "--out",
                    out.toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("FIC-105.csv:1").contains("no such column").contains("--time");
        }

        @Test
        void a_column_option_without_records_is_bad_input_and_nothing_is_written() {
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--pv", "PV.Value", "--out", out.toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("--pv: applies to the records of --records only");
            assertThat(out).doesNotExist();
        }

        @Test
        void fit_tuning_without_records_is_bad_input_and_nothing_is_written() {
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--fit-tuning", "--out", out.toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("--fit-tuning: applies to the records of --records only");
            assertThat(out).doesNotExist();
        }

        @Test
        void an_empty_column_name_is_bad_input_and_nothing_is_written() {
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--records", RECORDS, "--time", " ", "--out",
                    out.toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("--time: needs a column name");
            assertThat(out).doesNotExist();
        }
    }

    @Nested
    @DisplayName("--fit-tuning")
    class FitTuning {

        @Test
        void fits_fic_105s_old_tuning_to_its_log_and_finds_the_15_s_reset() throws Exception {
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--records", RECORDS, "--fit-tuning", "--out",
                    out.toString());
            assertThat(r.exitCode()).as(r.err()).isEqualTo(1);
            JsonNode doc = new ObjectMapper().readTree(out.resolve("loops.json").toFile());
            JsonNode fit = loop(doc, "FIC-105").get("replay").get("fitted_tuning");
            assertThat(fit.isObject()).as(fit.toString()).isTrue();
            // the generator's controller: PB 250 %, reset 15 s = 0.25 min (series-pb-min writes ti in min)
            int checked = 0;
            for (JsonNode v : fit.get("values")) {
                String name = v.get("name").asText();
                double truth = switch (name) {
                    case "pb" -> 250;
                    case "ti" -> 0.25;
                    default -> Double.NaN;
                };
                if (Double.isNaN(truth)) {
                    continue;
                }
                assertThat(v.get("value").asDouble()).as(name).isCloseTo(truth, within(0.02 * truth));
                assertThat(truth).as(name + " inside its 95 % interval (log kept to 4 decimals)")
                        .isBetween(v.get("low_95").asDouble() - 1e-3 * truth, v.get("high_95").asDouble() + 1e-3 * truth);
                checked++;
            }
            assertThat(checked).as(fit.toString()).isEqualTo(2);
            String html = Files.readString(out.resolve("report.html"));
            assertThat(html).contains("Old controller fitted to the log").contains("95 % interval");
            assertThat(Pattern.compile("<table class=\"figures replay-fit\">").matcher(html).results().count())
                    .isEqualTo(3);
        }
    }

    @Nested
    @DisplayName("records that match no loop")
    class Unmatched {

        @Test
        void are_named_once_on_stderr_in_the_summary_and_in_the_report() throws Exception {
            Path records = Files.createDirectories(dir.resolve("records"));
            for (String t : TAGS) {
                Files.copy(Path.of(RECORDS, t + ".csv"), records.resolve(t + ".csv"));
            }
            // a record named after a tag the list does not hold (a typo: FIC-150 for FIC-105), and a stray one
            Files.copy(Path.of(RECORDS, "FIC-105.csv"), records.resolve("FIC-150.csv"));
            Files.copy(Path.of(RECORDS, "PIC-402.csv"), records.resolve("PIC-402.csv"));
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--records", records.toString(), "--out",
                    out.toString(), "--threads", "2");
            assertThat(r.exitCode()).as(r.err()).isEqualTo(1);
            String fic150 = records + "/FIC-150.csv";
            String pic402 = records + "/PIC-402.csv";
            assertThat(r.err().split(Pattern.quote(fic150), -1)).hasSize(2);
            assertThat(r.err()).contains("2 records match no loop of the list").contains(pic402);
            assertThat(r.out()).contains("2 records match no loop of the list, so they were not replayed: " + fic150
                    + ", " + pic402);
            JsonNode summary = new ObjectMapper().readTree(out.resolve("loops.json").toFile()).get("summary")
                    .get("replay");
            assertThat(summary.get("records_without_loop")).hasSize(2);
            assertThat(summary.get("records_without_loop").get(0).asText()).isEqualTo(fic150);
            assertThat(summary.get("replayed").asInt()).isEqualTo(3);
            assertThat(Files.readString(out.resolve("report.html"))).contains("<p class=\"unmatched\">")
                    .contains("FIC-150.csv");
        }

        @Test
        void a_record_of_a_bad_row_is_not_called_unmatched() throws Exception {
            Path list = dir.resolve("list.csv");
            List<String> lines = Files.readAllLines(Path.of(DRAFT));
            // plumbing: TIC-301's pb made negative, so its row is bad; its record still belongs to a loop
            lines.set(3, lines.get(3).replace("series-pb-min,60,", "series-pb-min,-60,"));
            Files.write(list, lines);
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", list.toString(), "--to", TARGET, "--records", RECORDS, "--out",
                    out.toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("list.csv:4").doesNotContain("TIC-301.csv")
                    .contains("1 record matches no loop of the list").contains("PIC-402.csv");
        }
    }
}

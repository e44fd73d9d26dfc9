// source: records written by examples/records/generate.py (numpy, independent of loopform) from known controllers; positional PID and bumpless start as in Astrom & Hagglund, Advanced PID Control, ISA 2006, ch. 3 (chapter from memory)
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVRecord;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code audit --records DIR} and the demo's replay evidence, on the invented records that
 * {@code examples/records/generate.py} (numpy, independent of loopform's code) wrote from known
 * controllers: FIC-105's reset really ran at 15 s (the draft list {@code replay-loops.csv} says 15
 * min), PIC-402's at 0.8 repeats per minute, 75 s (the demo list says 0.8 min per repeat), PIC-401
 * and TIC-301 as listed. The expected verdicts and explanations are those facts of the generator.
 */
class AuditRecordsTest {

    @TempDir
    Path dir;

    static final String DRAFT = "examples/records/replay-loops.csv";
    static final String RECORDS = "examples/records/replay";
    static final String TARGET = "examples/plant-k7-target.yaml";

    private static JsonNode json(Path out) throws Exception {
        return new ObjectMapper().readTree(out.resolve("loops.json").toFile());
    }

    private static JsonNode loop(JsonNode doc, String tag) {
        for (JsonNode l : doc.get("loops")) {
            if (l.get("tag").asText().equals(tag)) {
                return l;
            }
        }
        throw new AssertionError("no loop " + tag);
    }

    private static Map<String, CSVRecord> csv(Path out) throws Exception {
        Map<String, CSVRecord> m = new HashMap<>();
        try (var p = CSVFormat.RFC4180.builder().setHeader().setSkipHeaderRecord(true).get()
                .parse(Files.newBufferedReader(out.resolve("loops.csv")))) {
            p.forEach(r -> m.put(r.get("tag"), r));
        }
        return m;
    }

    private Path copyRecords(String... tags) throws Exception {
        Path d = Files.createDirectories(dir.resolve("records"));
        for (String t : tags) {
            Files.copy(Path.of(RECORDS, t + ".csv"), d.resolve(t + ".csv"));
        }
        return d;
    }

    @Nested
    @DisplayName("with a record for every loop")
    class EveryLoop {

        @Test
        void the_wrong_reset_unit_fails_its_loop_with_the_right_explanation_first() throws Exception {
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--records", RECORDS, "--out", out.toString());
            assertThat(r.exitCode()).as(r.err()).isEqualTo(1);
            assertThat(r.out()).contains("3 loops replayed (2 reproduced, 0 not confirmed, 1 refuted)")
                    .contains("Every loop has a record.");
            JsonNode fic = loop(json(out), "FIC-105");
            assertThat(fic.get("verdict").asText()).isEqualTo("fail");
            JsonNode replay = fic.get("replay");
            assertThat(replay.get("record").asText()).isEqualTo("found");
            assertThat(replay.get("as_found_verdict").asText()).isEqualTo("refuted");
            JsonNode best = replay.get("explanations").get(0);
            assertThat(best.get("description").asText()).isEqualTo("ti is 15 s, not min");
            // the log keeps 4 decimals: the true controller reproduces it far inside replay_rms_warn_pct (0.5 %)
            assertThat(best.get("agreement").get("rms_pct").asDouble()).isLessThan(0.01);
            assertThat(fic.get("findings").toString()).contains("\"topic\":\"replay\"");
            for (String tag : List.of("PIC-401", "TIC-301")) {
                assertThat(loop(json(out), tag).get("replay").get("as_found_verdict").asText()).as(tag)
                        .isEqualTo("reproduced");
            }
            Map<String, CSVRecord> rows = csv(out);
            assertThat(rows.get("FIC-105").get("replay_as_found")).isEqualTo("refuted");
            assertThat(rows.get("FIC-105").get("replay_best_explanation")).isEqualTo("ti is 15 s, not min");
            assertThat(Double.parseDouble(rows.get("TIC-301").get("replay_as_found_rms_pct"))).isLessThan(0.01);
            assertThat(rows.get("TIC-301").get("replay_as_left_rms_pct")).isNotEmpty();
            String html = Files.readString(out.resolve("report.html"));
            assertThat(html).contains("id=\"replay-summary\"").contains("Replay of the logged record")
                    .contains("the record refutes the listed old controller").contains("ti is 15 s, not min")
                    .contains("This replay is open loop").contains("RMS (%)")
                    .contains("FIC-105: controller output, open-loop replay on the logged SP and PV");
            assertThat(html.split("<div class=\"replay\">", -1)).hasSize(4);
            // the provenance names every record read, with the SHA-256 of its bytes (the JDK's digest)
            JsonNode inputs = json(out).get("provenance").get("inputs");
            List<String> records = new ArrayList<>();
            for (JsonNode i : inputs) {
                if (i.get("role").asText().equals("record")) {
                    String file = i.get("file").asText();
                    records.add(file);
                    byte[] digest = java.security.MessageDigest.getInstance("SHA-256")
                            .digest(Files.readAllBytes(Path.of(file)));
                    assertThat(i.get("sha256").asText()).isEqualTo(java.util.HexFormat.of().formatHex(digest));
                }
            }
            assertThat(records).containsExactly(RECORDS + "/FIC-105.csv", RECORDS + "/PIC-401.csv",
                    RECORDS + "/TIC-301.csv");
        }

        @Test
        void an_audit_without_records_writes_no_replay_columns_or_keys() throws Exception {
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--out", out.toString());
            assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
            assertThat(Files.readAllLines(out.resolve("loops.csv")).get(0)).doesNotContain("replay");
            assertThat(loop(json(out), "FIC-105").has("replay")).isFalse();
            assertThat(json(out).get("summary").has("replay")).isFalse();
            assertThat(Files.readString(out.resolve("report.html"))).doesNotContain("replay-summary");
        }
    }

    @Nested
    @DisplayName("with records missing or unreadable")
    class Gaps {

        @Test
        void loops_without_a_record_are_named_once_in_the_summary_not_as_findings() throws Exception {
            Path records = copyRecords("FIC-105", "PIC-401");
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--records", records.toString(), "--out",
                    out.toString());
            assertThat(r.exitCode()).as(r.err()).isEqualTo(1);
            assertThat(r.out()).contains("1 loop has no record").contains(": TIC-301.");
            JsonNode tic = loop(json(out), "TIC-301");
            assertThat(tic.get("replay").isNull()).isTrue();
            assertThat(tic.get("findings").toString()).doesNotContain("\"topic\":\"replay\"");
            JsonNode summary = json(out).get("summary").get("replay");
            assertThat(summary.get("without_record").asInt()).isEqualTo(1);
            assertThat(summary.get("without_record_tags").get(0).asText()).isEqualTo("TIC-301");
            assertThat(csv(out).get("TIC-301").get("replay_record")).isEqualTo("none");
        }

        @Test
        void a_record_that_cannot_be_read_is_that_loops_problem_with_file_and_line() throws Exception {
            Path records = copyRecords("FIC-105", "PIC-401");
            // plumbing: a decimal comma on the fourth line of TIC-301's record
            Files.writeString(records.resolve("TIC-301.csv"),
                    "time,setpoint,pv,output\n0,60,60,26\n1,60,60,26\n2,60,\"59,5\",26\n");
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--records", records.toString(), "--out",
                    out.toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("TIC-301.csv:4");
            JsonNode doc = json(out);
            // TIC-301 passes with a readable record; without the evidence asked for it must not pass clean
            assertThat(loop(doc, "TIC-301").get("verdict").asText()).isEqualTo("warn");
            assertThat(loop(doc, "TIC-301").get("findings").toString()).contains("could not be read or replayed");
            assertThat(loop(doc, "TIC-301").get("replay").get("record").asText()).isEqualTo("unreadable");
            assertThat(loop(doc, "TIC-301").get("replay").get("as_found_verdict").asText()).isEqualTo("bad_input");
            assertThat(csv(out).get("TIC-301").get("verdict")).isEqualTo("warn");
            assertThat(csv(out).get("TIC-301").get("replay_as_found")).isEqualTo("bad_input");
            assertThat(r.out()).contains("2 loops replayed (")
                    .contains("Every loop has a record, but not every record was replayed (below).")
                    .contains("1 record could not be read or replayed");
            assertThat(loop(doc, "FIC-105").get("replay").get("as_found_verdict").asText()).isEqualTo("refuted");
            assertThat(csv(out).get("TIC-301").get("replay_problems")).contains("TIC-301.csv:4");
            assertThat(Files.readString(out.resolve("report.html"))).contains("could not be read");
        }

        @Test
        void a_lone_unreadable_record_gives_no_loop_replayed_and_a_warning_not_a_pass() throws Exception {
            Path records = Files.createDirectories(dir.resolve("records"));
            // plumbing: a decimal comma on line 2
            Files.writeString(records.resolve("TIC-301.csv"), "time,setpoint,pv,output\n0,60,60,\"26,5\"\n1,60,60,26\n");
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--records", records.toString(), "--out",
                    out.toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.out()).contains("Replay of the records in " + records + ": no loop replayed.")
                    .doesNotContain("0 loops replayed").doesNotContain("Every loop has a record.");
            assertThat(csv(out).get("TIC-301").get("verdict")).isNotEqualTo("pass");
            assertThat(Files.readString(out.resolve("report.html"))).contains(": no loop replayed.");
        }

        @Test
        void a_record_is_matched_to_its_tag_without_regard_to_case() throws Exception {
            Path records = copyRecords("FIC-105", "PIC-401");
            Files.copy(Path.of(RECORDS, "TIC-301.csv"), records.resolve("tic-301.CSV"));
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--records", records.toString(), "--out",
                    out.toString());
            assertThat(r.exitCode()).as(r.err()).isEqualTo(1);
            assertThat(loop(json(out), "TIC-301").get("replay").get("as_found_verdict").asText())
                    .isEqualTo("reproduced");
        }

        @Test
        void two_records_that_match_a_tag_only_without_regard_to_case_are_that_loops_problem() throws Exception {
            Path records = copyRecords("FIC-105", "PIC-401");
            Files.copy(Path.of(RECORDS, "TIC-301.csv"), records.resolve("tic-301.csv"));
            Files.copy(Path.of(RECORDS, "TIC-301.csv"), records.resolve("Tic-301.csv"));
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--records", records.toString(), "--out",
                    out.toString());
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("all match tag TIC-301 without regard to case");
            assertThat(loop(json(out), "TIC-301").get("replay").get("record").asText()).isEqualTo("unreadable");
        }

        @Test
        void a_records_path_that_is_not_a_folder_is_bad_input() {
            CliRun r = CliRun.of("audit", DRAFT, "--to", TARGET, "--records", DRAFT);
            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("--records: not a folder");
        }
    }

    @Nested
    @DisplayName("the demo")
    class Demo {

        @Test
        void replays_the_bundled_records_and_finds_the_reset_in_the_wrong_unit() throws Exception {
            Path out = dir.resolve("demo");
            CliRun r = CliRun.of("demo", "--out", out.toString());
            assertThat(r.exitCode()).as(r.err()).isZero();
            assertThat(r.out()).contains("4 loops replayed (3 reproduced, 0 not confirmed, 1 refuted)")
                    .contains("29 loops have no record");
            JsonNode pic = loop(json(out), "PIC-402");
            assertThat(pic.get("verdict").asText()).isEqualTo("fail");
            assertThat(pic.get("replay").get("as_found_verdict").asText()).isEqualTo("refuted");
            assertThat(pic.get("replay").get("explanations").get(0).get("description").asText())
                    .isEqualTo("ti 0.8 is a reset rate in repeats per min, not min per repeat");
            for (String tag : List.of("FIC-105", "PIC-401", "TIC-301")) {
                assertThat(loop(json(out), tag).get("replay").get("as_found_verdict").asText()).as(tag)
                        .isEqualTo("reproduced");
            }
            assertThat(Files.readString(out.resolve("report.html"))).contains("id=\"replay-summary\"")
                    .contains("ti 0.8 is a reset rate in repeats per min, not min per repeat");
        }

        @Test
        void keeps_every_other_result_of_the_audit_without_records() throws Exception {
            Path demo = dir.resolve("demo");
            Path plain = dir.resolve("plain");
            assertThat(CliRun.of("demo", "--out", demo.toString()).exitCode()).isZero();
            assertThat(CliRun.of("audit", "examples/plant-k7-loops.csv", "--to", TARGET, "--out", plain.toString())
                    .exitCode()).isEqualTo(1);
            JsonNode withRecords = json(demo);
            JsonNode without = json(plain);
            int compared = 0;
            for (JsonNode l : without.get("loops")) {
                String tag = l.get("tag").asText();
                JsonNode d = loop(withRecords, tag);
                assertThat(nonReplay(d.get("findings"))).as(tag).isEqualTo(nonReplay(l.get("findings")));
                if (!tag.equals("PIC-402")) {
                    assertThat(d.get("verdict").asText()).as(tag).isEqualTo(l.get("verdict").asText());
                }
                compared++;
            }
            assertThat(compared).isEqualTo(33);
        }

        private List<String> nonReplay(JsonNode findings) {
            List<String> out = new ArrayList<>();
            findings.forEach(f -> {
                if (!f.get("topic").asText().equals("replay")) {
                    out.add(f.toString());
                }
            });
            return out;
        }
    }

    @Nested
    @DisplayName("records that cannot confirm a controller")
    class NothingToConfirm {

        /** Invented: FIC-105 listed in series-pb-min, pb 250, ti 15 min, ranges and an FOPDT model. */
        static final String LIST = "tag,form,pb,ti,td,scan,pv_range,output_range,model,process_gain,time_constant,"
                + "dead_time,target_scan\nFIC-105,series-pb-min,250,15,0,1 s,0..80,0..100,fopdt,1.3,6 s,2 s,0.5 s\n";

        /**
         * A record whose setpoint, PV and output never move: the error is zero at every scan, so any
         * controller started at the logged output holds it (hand derivation: each scan's increment
         * Kc (e_k - e_{k-1}) + Kc h/Ti e_k is 0); the record confirms no controller.
         */
        @Test
        void a_still_record_is_not_confirmed_in_every_output_never_reproduced() throws Exception {
            Path list = Files.writeString(dir.resolve("list.csv"), LIST);
            Path records = Files.createDirectories(dir.resolve("records"));
            StringBuilder rec = new StringBuilder("time,setpoint,pv,output,mode\n");
            for (int k = 0; k <= 1200; k++) {
                rec.append(k).append(",32,32.00,30.7,auto\n");
            }
            Files.writeString(records.resolve("FIC-105.csv"), rec);
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", list.toString(), "--to", TARGET, "--records", records.toString(), "--out",
                    out.toString());
            assertThat(r.exitCode()).as(r.err()).isEqualTo(0);
            assertThat(r.out()).contains("1 loop replayed (0 reproduced, 1 not confirmed (1 on a record too quiet to"
                    + " tell controllers apart), 0 refuted)").doesNotContain("1 loops replayed");
            assertThat(csv(out).get("FIC-105").get("replay_as_found")).isEqualTo("not_confirmed");
            assertThat(csv(out).get("FIC-105").get("verdict")).isEqualTo("warn");
            JsonNode doc = json(out);
            JsonNode replay = loop(doc, "FIC-105").get("replay");
            assertThat(replay.get("as_found_verdict").asText()).isEqualTo("not_confirmed");
            assertThat(replay.get("quiet_record").asBoolean()).isTrue();
            assertThat(loop(doc, "FIC-105").get("findings").toString()).doesNotContain("reproduces the logged output");
            assertThat(doc.get("summary").get("replay").get("quiet_records").asInt()).isEqualTo(1);
            assertThat(doc.get("summary").get("replay").get("reproduced").asInt()).isZero();
            String html = Files.readString(out.resolve("report.html"));
            assertThat(html).contains("the record does not confirm the listed old controller: the logged output hardly"
                    + " moves").contains("1 loop replayed;").doesNotContain("reproduces the logged output");
        }

        /**
         * A new loop tuned by rule (examples/new-loops.csv) never ran an old controller: its record
         * is read (and listed in the provenance) but not replayed, and the loop's verdict is the one
         * the audit gives it without records.
         */
        @Test
        void a_new_loop_tuned_by_rule_does_not_use_its_record() throws Exception {
            Path records = Files.createDirectories(dir.resolve("records"));
            StringBuilder rec = new StringBuilder("time,setpoint,pv,output\n");
            for (int k = 0; k <= 600; k++) {
                double pv = 32 + 2 * Math.sin(k / 20.0);
                rec.append(k).append(",32,").append(pv).append(',').append(30 + 5 * Math.cos(k / 15.0)).append('\n');
            }
            Files.writeString(records.resolve("FIC-110.csv"), rec);
            Path plain = dir.resolve("plain");
            CliRun without = CliRun.of("audit", "examples/new-loops.csv", "--to", TARGET, "--out", plain.toString(),
                    "--no-report");
            Path out = dir.resolve("out");
            CliRun r = CliRun.of("audit", "examples/new-loops.csv", "--to", TARGET, "--records", records.toString(),
                    "--out", out.toString());
            assertThat(r.exitCode()).as(r.err()).isEqualTo(without.exitCode());
            CSVRecord row = csv(out).get("FIC-110");
            assertThat(row.get("verdict")).isEqualTo(csv(plain).get("FIC-110").get("verdict"));
            assertThat(row.get("replay_record")).isEqualTo("not_used");
            assertThat(row.get("replay_as_found")).isEmpty();
            assertThat(row.get("replay_best_explanation")).isEmpty();
            JsonNode doc = json(out);
            JsonNode fic = loop(doc, "FIC-110");
            assertThat(fic.get("findings").toString()).doesNotContain("\"topic\":\"replay\"");
            assertThat(fic.get("replay").get("record").asText()).isEqualTo("not_used");
            assertThat(fic.get("replay").get("reason").asText()).contains("no old controller");
            JsonNode summary = doc.get("summary").get("replay");
            assertThat(summary.get("replayed").asInt()).isZero();
            assertThat(summary.get("not_used_tags").get(0).asText()).isEqualTo("FIC-110");
            assertThat(r.out()).contains("no loop replayed").contains("1 new loop has a record that was not used:"
                    + " FIC-110").doesNotContain("refute");
            assertThat(Files.readString(out.resolve("report.html"))).contains("Record not used: a new loop tuned by"
                    + " rule has no old controller to validate");
            assertThat(doc.get("provenance").get("inputs").toString()).contains("FIC-110.csv");
            // replay --list on the same list says the same and replays nothing
            CliRun replay = CliRun.of("replay", records.toString(), "--list", "examples/new-loops.csv", "--to", TARGET,
                    "--format", "json");
            assertThat(replay.exitCode()).as(replay.err()).isEqualTo(0);
            JsonNode listed = new ObjectMapper().readTree(replay.out());
            assertThat(listed.get("loops")).isEmpty();
            assertThat(listed.get("not_used").get(0).asText()).isEqualTo("FIC-110");
        }
    }
}

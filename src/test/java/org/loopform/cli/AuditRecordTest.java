package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.io.Fingerprint;

/** The audit as a record to sign and file: the sign-off block and the provenance of its inputs. */
class AuditRecordTest {

    @TempDir
    Path dir;

    private static final String LOOPS = "tag,form,kc,ti,td,pv_range,output_range,model,process_gain,time_constant,"
            + "dead_time\nFIC-1,ideal,0.5,10,0,0..50,0..100,fopdt,1,5 s,1 s\n";

    private JsonNode json(Path out) throws Exception {
        return new ObjectMapper().readTree(out.resolve("loops.json").toFile());
    }

    @Test
    @DisplayName("SHA-256 is the published digest: FIPS 180-2, Appendix B.1, message \"abc\"")
    void sha256_of_abc_is_the_published_digest() {
        assertThat(Fingerprint.sha256("abc".getBytes(StandardCharsets.US_ASCII)))
                .isEqualTo("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    }

    @Test
    void options_override_the_signoff_file_and_fill_the_block_and_the_json() throws Exception {
        Path list = Files.writeString(dir.resolve("loops.csv"), LOOPS);
        Path signoff = Files.writeString(dir.resolve("signoff.yaml"),
                "prepared_by: A. Engineer\nchecked_by: B. Checker\nchange: MOC-1\nrevision: A\n");
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("audit", list.toString(), "--to", "ideal", "--scan", "1s", "--out", out.toString(), "--signoff",
                signoff.toString(), "--revision", "B", "--approved-by", "C. Approver");
        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        JsonNode s = json(out).get("signoff");
        assertThat(s.get("prepared_by").asText()).isEqualTo("A. Engineer");
        assertThat(s.get("checked_by").asText()).isEqualTo("B. Checker");
        assertThat(s.get("approved_by").asText()).isEqualTo("C. Approver");
        assertThat(s.get("change").asText()).isEqualTo("MOC-1");
        assertThat(s.get("revision").asText()).isEqualTo("B");
        String html = Files.readString(out.resolve("report.html"));
        assertThat(html).contains("id=\"signoff\"").contains("A. Engineer").contains("C. Approver")
                .contains("MOC-1");
    }

    @Test
    void without_names_the_block_keeps_blank_lines_to_sign() throws Exception {
        Path list = Files.writeString(dir.resolve("loops.csv"), LOOPS);
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("audit", list.toString(), "--to", "ideal", "--scan", "1s", "--out", out.toString());
        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        String html = Files.readString(out.resolve("report.html"));
        assertThat(html).contains("<th>prepared by</th><td class=\"sign\"></td>")
                .contains("<th>checked by</th><td class=\"sign\"></td>")
                .contains("<th>approved by</th><td class=\"sign\"></td>");
        assertThat(json(out).get("signoff").get("approved_by").asText()).isEmpty();
    }

    @Test
    void every_input_file_is_listed_with_the_sha256_of_its_bytes() throws Exception {
        Path list = Files.writeString(dir.resolve("loops.csv"), LOOPS);
        Path policy = Files.writeString(dir.resolve("policy.yaml"), "ms_warn: 1.9\n");
        Path form = dir.resolve("target.yaml");
        Files.copy(Path.of("examples/plant-k7-target.yaml"), form);
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("audit", list.toString(), "--to", form.toString(), "--scan", "1s", "--policy", policy.toString(),
                "--out", out.toString());
        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        JsonNode p = json(out).get("provenance");
        assertThat(p.get("loopform_version").asText()).isNotBlank();
        // date, time, offset and zone
        assertThat(p.get("written_at").asText()).matches("\\d{4}-\\d\\d-\\d\\d \\d\\d:\\d\\d:\\d\\d [+-]\\d\\d:\\d\\d \\(.+\\)");
        assertThat(p.get("policy").get("ms_warn").asDouble()).isEqualTo(1.9);
        JsonNode inputs = p.get("inputs");
        assertThat(inputs).hasSize(3);
        // the digests are checked against the JDK's own SHA-256 of the bytes on disk, outside loopform's reading
        for (JsonNode f : inputs) {
            byte[] bytes = Files.readAllBytes(Path.of(f.get("file").asText()));
            String expected = java.util.HexFormat.of().formatHex(
                    java.security.MessageDigest.getInstance("SHA-256").digest(bytes));
            assertThat(f.get("sha256").asText()).as(f.get("file").asText()).isEqualTo(expected);
        }
        assertThat(inputs.findValuesAsText("role")).containsExactly("loop list", "form", "policy");
        String html = Files.readString(out.resolve("report.html"));
        assertThat(html).contains("id=\"provenance\"").contains(p.get("input_fingerprint").asText())
                .contains(inputs.get(0).get("sha256").asText());
    }

    @Test
    void a_form_file_named_in_the_list_is_fingerprinted_too() throws Exception {
        Files.copy(Path.of("examples/plant-k7-target.yaml"), dir.resolve("k7.yaml"));
        Path list = Files.writeString(dir.resolve("loops.csv"), "tag,form,kc,ti,td,target_form\n"
                + "FIC-1,ideal,0.5,10,0,k7.yaml\n");
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("audit", list.toString(), "--scan", "1s", "--out", out.toString());
        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        JsonNode inputs = json(out).get("provenance").get("inputs");
        String expected = java.util.HexFormat.of().formatHex(java.security.MessageDigest.getInstance("SHA-256")
                .digest(Files.readAllBytes(dir.resolve("k7.yaml"))));
        assertThat(inputs.findValuesAsText("sha256")).contains(expected);
    }

    @Test
    @DisplayName("SOURCE_DATE_EPOCH fixes the written time (reproducible-builds.org specification): "
            + "1,700,000,000 s after 1970-01-01 UTC is 2023-11-14 22:13:20 UTC")
    void a_reproducible_time_is_read_from_source_date_epoch_and_a_bad_one_refused() {
        assertThat(AuditRunner.writtenAt("1700000000")).isEqualTo("2023-11-14 22:13:20 +00:00 (UTC)");
        assertThat(AuditRunner.writtenAt(null)).matches("\\d{4}-\\d\\d-\\d\\d \\d\\d:\\d\\d:\\d\\d [+-]\\d\\d:\\d\\d \\(.+\\)");
        org.assertj.core.api.Assertions.assertThatThrownBy(() -> AuditRunner.writtenAt("yesterday"))
                .isInstanceOf(org.loopform.units.BadInput.class).hasMessageContaining("SOURCE_DATE_EPOCH")
                .hasMessageContaining("whole number of seconds");
    }
}

package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.io.XlsxTestFiles;

/**
 * "No filter" (n=off) is read alike from a loop file, a CSV list and an xlsx list. The invented
 * series tuning Kc' = 2, Ti' = 100 s, Td' = 20 s without a filter is, by the textbook relations for
 * unfiltered laws (Astrom & Hagglund 1995 sec. 3.4), the ideal Kc = 2 (1 + 20/100) = 2.4,
 * Ti = 100 + 20 = 120 s, Td = 100 * 20 / 120 = 16.667 s, exactly; into a form with an adjustable
 * ratio it keeps n off.
 */
class NoFilterInputsTest {

    @TempDir
    Path dir;

    private static final String HEADER = "tag,form,kc,ti,td,n,scan,pv_range,output_range,model,process_gain,"
            + "time_constant,dead_time,target_form,target_scan";
    private static final String ROWS = "TIC-901,series,2,100,20,off,1 s,0..100,0..100,fopdt,1.5,300 s,30 s,"
            + "ideal-unfiltered,1 s\n"
            + "TIC-902,series,2,100,20,off,1 s,0..100,0..100,fopdt,1.5,300 s,30 s,ideal,1 s\n";

    private static void textbookValues(JsonNode parameters) {
        assertThat(parameters.get("exact").asBoolean()).isTrue();
        JsonNode converted = parameters.get("converted");
        assertThat(converted.get("kc").asDouble()).isCloseTo(2.4, within(1e-6));
        assertThat(converted.get("ti").asDouble()).isCloseTo(120.0, within(1e-6));
        assertThat(converted.get("td").asDouble()).isCloseTo(2000.0 / 120.0, within(1e-6));
    }

    private void auditedAlike(Path list) throws Exception {
        Path out = dir.resolve("out-" + list.getFileName());
        CliRun r = CliRun.of("audit", list.toString(), "--out", out.toString());
        assertThat(r.exitCode()).as(r.err()).isZero();
        JsonNode loops = new ObjectMapper().readTree(out.resolve("loops.json").toFile()).get("loops");
        assertThat(loops).hasSize(2);
        textbookValues(loops.get(0).get("parameters"));
        textbookValues(loops.get(1).get("parameters"));
        assertThat(loops.get(1).get("parameters").get("entered").get("n").asText()).isEqualTo("off");
        // no assumed source filter: the list said there is none
        assertThat(loops.get(0).get("assumptions").toString()).doesNotContain("No n was given");
        assertThat(Files.readString(out.resolve("loops.csv"))).contains("n=off");
    }

    @Test
    void a_loop_file_says_no_filter_with_n_off() throws Exception {
        Path file = Files.writeString(dir.resolve("loop.yaml"), "tag: TIC-900\n"
                + "process: {model: fopdt, gain: 1.5, time_constant: 300 s, dead_time: 30 s}\n"
                + "tuning: {form: series, kc: 2, ti: 100, td: 20, n: off}\n"
                + "target: {form: ideal, scan: 1 s}\nranges: {pv: 0..100, output: 0..100}\n");
        CliRun r = CliRun.of("check", file.toString(), "--format", "json");
        assertThat(r.exitCode()).as(r.err()).isZero();
        JsonNode parameters = new ObjectMapper().readTree(r.out()).get("parameters");
        textbookValues(parameters);
        assertThat(parameters.get("entered").get("n").asText()).isEqualTo("off");
    }

    @Test
    void a_csv_list_says_no_filter_with_n_off() throws Exception {
        auditedAlike(Files.writeString(dir.resolve("loops.csv"), HEADER + "\n" + ROWS));
    }

    @Test
    void an_xlsx_list_says_no_filter_with_off_in_a_text_cell() throws Exception {
        auditedAlike(XlsxTestFiles.write(dir.resolve("loops.xlsx"), "Loops",
                ws -> XlsxTestFiles.csvRows(ws, 0, HEADER + "\n" + ROWS)));
    }
}

package org.loopform.report;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;

/**
 * Writes the sample report to {@code target/sample-report/report.html}, for the browser check
 * ({@code scripts/browser-check.sh target/sample-report/report.html target/sample-report/report.png}).
 * Plumbing: no published source needed (source: none, it only writes a sample file).
 */
class SampleReportTest {

    static final Path REPORT = Path.of("target", "sample-report", "report.html");

    @Test
    void the_sample_report_is_written_through_the_streaming_path() throws Exception {
        SampleAudit.writeReport(REPORT);
        String html = Files.readString(REPORT);
        assertThat(html).startsWith("<!DOCTYPE html>").endsWith("</html>\n");
        assertThat(html).contains("id=\"summary\"", "<polyline");
    }
}

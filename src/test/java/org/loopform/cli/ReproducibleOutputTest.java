package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.File;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import java.util.zip.ZipEntry;
import java.util.zip.ZipFile;
import org.dhatim.fastexcel.reader.ReadableWorkbook;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * With {@code SOURCE_DATE_EPOCH} set (reproducible-builds.org specification: seconds since
 * 1970-01-01 00:00:00 UTC), two audits of the same inputs write the same bytes in every file of
 * their folders, the entry sheet's workbook included (all but loopform's own hidden marker, which
 * holds the files' times on disk). Runs loopform in a child JVM, the only way
 * to give it an environment variable.
 */
class ReproducibleOutputTest {

    @TempDir
    Path dir;

    private int audit(Path out, String epoch) throws Exception {
        String java = ProcessHandle.current().info().command().orElse("java");
        ProcessBuilder pb = new ProcessBuilder(java, "-cp", System.getProperty("java.class.path"),
                "org.loopform.cli.Main", "audit", "examples/plant-k7-loops.csv", "--to",
                "examples/plant-k7-target.yaml", "--out", out.toString(), "--threads", "2")
                .redirectErrorStream(true).redirectOutput(dir.resolve(out.getFileName() + ".log").toFile());
        pb.environment().put("SOURCE_DATE_EPOCH", epoch);
        pb.environment().remove("CI");
        return pb.start().waitFor();
    }

    private static List<String> files(Path folder) throws Exception {
        List<String> names = new ArrayList<>();
        try (Stream<Path> s = Files.list(folder)) {
            s.forEach(p -> names.add(p.getFileName().toString()));
        }
        names.sort(null);
        return names;
    }

    @Test
    void two_audits_write_the_same_bytes_entry_sheet_included() throws Exception {
        Path a = dir.resolve("a");
        Path b = dir.resolve("b");
        assertThat(audit(a, "1700000000")).as(Files.readString(dir.resolve("a.log"))).isEqualTo(1);
        Thread.sleep(1100); // a clock that leaked into either file would now read another second
        assertThat(audit(b, "1700000000")).as(Files.readString(dir.resolve("b.log"))).isEqualTo(1);
        assertThat(files(a)).contains("entry-sheet.xlsx", "loops.json", "report.html").isEqualTo(files(b));
        for (String f : files(a)) {
            if (f.equals(".loopform-output")) {
                // loopform's marker records each file's size and time on disk, to tell later whether it was changed
                continue;
            }
            assertThat(Files.readAllBytes(a.resolve(f))).as(f).isEqualTo(Files.readAllBytes(b.resolve(f)));
        }
        // 1,700,000,000 s after 1970-01-01 00:00:00 UTC is 2023-11-14 22:13:20 UTC (86,400 s a day, from memory
        // checked by hand: 19,675 days = 2023-11-14, and 80,000 s = 22:13:20)
        try (ZipFile zip = new ZipFile(a.resolve("entry-sheet.xlsx").toFile())) {
            String core = new String(zip.getInputStream(zip.getEntry("docProps/core.xml")).readAllBytes(),
                    StandardCharsets.UTF_8);
            assertThat(core).contains(">2023-11-14T22:13:20Z</dcterms:created>");
            for (ZipEntry e : java.util.Collections.list(zip.entries())) {
                assertThat(e.getTimeLocal()).as(e.getName()).isEqualTo(java.time.LocalDateTime.of(2023, 11, 14, 22,
                        13, 20));
            }
        }
        // still a workbook a spreadsheet reads: the header and one row per parameter to enter
        try (ReadableWorkbook wb = new ReadableWorkbook(new File(a.resolve("entry-sheet.xlsx").toString()))) {
            long rows;
            try (var s = wb.getFirstSheet().openStream()) {
                rows = s.count();
            }
            assertThat(rows).isEqualTo(Files.readAllLines(a.resolve("entry-sheet.csv")).size());
        }
    }
}

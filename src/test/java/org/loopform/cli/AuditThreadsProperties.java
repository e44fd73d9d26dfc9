// plumbing: the parallel audit's determinism; no published source needed (source: none)
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.regex.Pattern;
import net.jqwik.api.Arbitraries;
import net.jqwik.api.Arbitrary;
import net.jqwik.api.Combinators;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.Provide;
import org.loopform.io.CatalogLoader;

/**
 * An audit's outputs do not depend on how many threads checked the loops: {@code --threads 1} and
 * {@code --threads 2} on the same generated list write {@code loops.csv}, {@code loops.json} and
 * {@code entry-sheet.csv} byte for byte alike, and {@code report.html} alike but for the time it was
 * written (a clock reading, masked; the settings line does not name the thread count). The lists mix good loops, loops without a process and bad rows.
 */
class AuditThreadsProperties {

    private static final List<String> FORMS = CatalogLoader.bundled().ids().stream()
            .filter(id -> !id.equals("parallel-scan") && !id.equals("parallel-eu")).toList();
    private static final String HEADER = "tag,form,kc,ti,td,n,pv_range,output_range,model,process_gain,"
            + "time_constant,dead_time,target_form,target_scan\n";
    /** The "written" time of the report and of loops.json: date, time and offset (then the zone). */
    private static final Pattern WRITTEN_AT =
            Pattern.compile("\\d{4}-\\d\\d-\\d\\d[T ]\\d\\d:\\d\\d:\\d\\d ?(Z|[+-]\\d\\d:\\d\\d)");

    @Provide
    Arbitrary<String> rows() {
        Arbitrary<String> good = Combinators.combine(
                Arbitraries.doubles().between(0.05, 5).ofScale(4),
                Arbitraries.doubles().between(2, 600).ofScale(3),
                Arbitraries.doubles().between(0, 0.2).ofScale(3),
                Arbitraries.of("fopdt", ""),
                Arbitraries.doubles().between(0.2, 4).ofScale(3),
                Arbitraries.doubles().between(1, 900).ofScale(2),
                Arbitraries.doubles().between(0.1, 100).ofScale(2),
                Arbitraries.of(FORMS)).as((kc, ti, tdShare, model, k, lag, dead, target) -> String.format(
                        Locale.ROOT, "ideal,%s,%s,%s,10,0..200,0..100,%s,%s,%s,%s,%s,%s s", kc, ti, ti * tdShare,
                        model, model.isEmpty() ? "" : k, model.isEmpty() ? "" : lag + " s",
                        model.isEmpty() ? "" : dead + " s", target, Math.max(0.1, Math.min(5, dead / 4))));
        Arbitrary<String> bad = Arbitraries.of(
                "ideal,1,-5,0,10,0..200,0..100,fopdt,1,10 s,1 s,ideal,1 s",
                "nosuchform,1,5,0,10,0..200,0..100,,,,,ideal,1 s",
                "ideal,1,5,0,10,0..200,0..100,fopdt,1,10 s,1 s");
        return Arbitraries.frequencyOf(net.jqwik.api.Tuple.of(9, good), net.jqwik.api.Tuple.of(1, bad));
    }

    @Provide
    Arbitrary<List<String>> lists() {
        return rows().list().ofMinSize(5).ofMaxSize(8);
    }

    @Property(tries = 2, seed = "20261205")
    void outputs_are_byte_identical_for_one_or_two_threads(@ForAll("lists") List<String> rows) throws IOException {
        Path dir = Files.createTempDirectory("loopform-threads");
        try {
            StringBuilder csv = new StringBuilder(HEADER);
            for (int i = 0; i < rows.size(); i++) {
                csv.append("L-").append(i).append(',').append(rows.get(i)).append('\n');
            }
            Path list = Files.writeString(dir.resolve("loops.csv"), csv);
            Path one = dir.resolve("one");
            Path two = dir.resolve("two");
            CliRun a = CliRun.of("audit", list.toString(), "--threads", "1", "--out", one.toString());
            CliRun b = CliRun.of("audit", list.toString(), "--threads", "2", "--out", two.toString());
            assertThat(a.exitCode()).as(a.err()).isIn(0, 1, 2);
            assertThat(b.exitCode()).isEqualTo(a.exitCode());
            assertThat(b.err()).isEqualTo(a.err());
            for (String file : List.of("loops.csv", "entry-sheet.csv")) {
                assertThat(Files.readAllBytes(two.resolve(file))).as(file).isEqualTo(Files.readAllBytes(one.resolve(file)));
            }
            // loops.json and the report carry the clock reading: two runs a second apart differ there only
            assertThat(masked(two, "loops.json")).isEqualTo(masked(one, "loops.json"));
            assertThat(masked(two, "report.html")).isEqualTo(masked(one, "report.html"));
        } finally {
            delete(dir);
        }
    }

    /** An output with the clock reading masked. */
    private static String masked(Path folder, String file) throws IOException {
        String text = Files.readString(folder.resolve(file));
        assertThat(WRITTEN_AT.matcher(text).find()).as(file + " carries its written time").isTrue();
        return WRITTEN_AT.matcher(text).replaceAll("WRITTEN-AT");
    }

    private static void delete(Path dir) throws IOException {
        try (var paths = Files.walk(dir)) {
            paths.sorted(java.util.Comparator.reverseOrder()).forEach(p -> {
                try {
                    Files.delete(p);
                } catch (IOException e) {
                    throw new UncheckedIOException(e);
                }
            });
        }
    }
}

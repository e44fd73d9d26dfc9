// plumbing: no published source needed
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assumptions.assumeThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Outputs that cannot destroy: loopform replaces only folders and files it wrote, compares paths
 * through links, and leaves no temporary folder behind. Black-box, through {@link Main}.
 */
@DisplayName("outputs never destroy what loopform did not write")
class OutputSafetyTest {

    private static final String MARKER = ".loopform-output";
    private static final String LOOPS = "tag,form,kc,ti,td\nFIC-1,ideal,0.5,10,0\nTIC-2,ideal,1.5,240,0\n";

    @TempDir
    Path dir;

    private Path loops() throws IOException {
        return Files.writeString(dir.resolve("loops.csv"), LOOPS);
    }

    private CliRun audit(Path out, String... more) throws IOException {
        String[] args = Stream.concat(Stream.of("audit", loops().toString(), "--to", "ideal", "--scan", "1s",
                "--no-report", "--out", out.toString()), Stream.of(more)).toArray(String[]::new);
        return CliRun.of(args);
    }

    private List<String> scratchFolders() throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.map(p -> p.getFileName().toString()).filter(n -> n.contains(".loopform-")).toList();
        }
    }

    @Nested
    @DisplayName("with the marker")
    class Marked {

        @Test
        void every_output_folder_holds_the_marker_listing_what_loopform_wrote() throws IOException {
            Path out = dir.resolve("out");
            CliRun r = audit(out);

            assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
            assertThat(out.resolve(MARKER)).content().contains("file: ").contains("loops.csv")
                    .contains("entry-sheet.csv").contains("loops.json");
            assertThat(scratchFolders()).isEmpty();
        }

        @Test
        void an_earlier_output_needs_force_and_is_then_replaced() throws IOException {
            Path out = dir.resolve("out");
            audit(out);

            CliRun again = audit(out);
            assertThat(again.exitCode()).isEqualTo(2);
            assertThat(again.err()).contains(out.toString()).contains("earlier loopform output").contains("--force");

            CliRun forced = audit(out, "--force");
            assertThat(forced.exitCode()).as(forced.err()).isIn(0, 1);
            assertThat(out.resolve(MARKER)).exists();
            assertThat(scratchFolders()).isEmpty();
        }

        @Test
        void a_file_the_user_added_to_an_earlier_output_stops_the_replacement() throws IOException {
            Path out = dir.resolve("out");
            audit(out);
            Files.writeString(out.resolve("my-notes.txt"), "signed off by J.");

            CliRun forced = audit(out, "--force");

            assertThat(forced.exitCode()).isEqualTo(2);
            assertThat(forced.err()).contains("loopform did not write").contains("my-notes.txt");
            assertThat(out.resolve("my-notes.txt")).hasContent("signed off by J.");
            assertThat(scratchFolders()).isEmpty();
        }

        @Test
        void an_output_file_the_user_changed_stops_the_replacement() throws IOException {
            Path out = dir.resolve("out");
            audit(out);
            Files.writeString(out.resolve("entry-sheet.csv"), "edited by hand\n");

            CliRun forced = audit(out, "--force");

            assertThat(forced.exitCode()).isEqualTo(2);
            assertThat(forced.err()).contains("entry-sheet.csv");
            assertThat(out.resolve("entry-sheet.csv")).hasContent("edited by hand");
        }

        @Test
        void a_second_demo_replaces_the_first() {
            Path out = dir.resolve("demo");
            assertThat(CliRun.of("demo", "--out", out.toString()).exitCode()).isZero();

            CliRun again = CliRun.of("demo", "--out", out.toString());

            assertThat(again.exitCode()).as(again.err()).isZero();
            assertThat(out.resolve("report.html")).exists();
        }
    }

    @Nested
    @DisplayName("without the marker")
    class Unmarked {

        @Test
        void demo_never_replaces_a_users_folder_because_it_holds_a_report_html() throws IOException {
            Path out = Files.createDirectories(dir.resolve("reports"));
            Files.writeString(out.resolve("report.html"), "<p>my own report</p>");
            Files.writeString(out.resolve("budget.xlsx"), "mine");

            CliRun r = CliRun.of("demo", "--out", out.toString());

            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains(out.toString()).contains("loopform did not write it");
            assertThat(out.resolve("report.html")).hasContent("<p>my own report</p>");
            assertThat(out.resolve("budget.xlsx")).hasContent("mine");
            assertThat(scratchFolders()).isEmpty();
        }

        @Test
        void a_plot_never_replaces_a_file_loopform_did_not_write_but_replaces_its_own() throws IOException {
            Path loop = Files.writeString(dir.resolve("loop.yaml"), """
                    tag: TIC-7
                    process: {model: fopdt, gain: 2.0, time_constant: 60 s, dead_time: 10 s}
                    tuning: {form: ideal, kc: 1.2, ti: 60, td: 0}
                    target: {form: ideal, scan: 0.5 s}
                    """);
            Path mine = Files.writeString(dir.resolve("drawing.svg"), "<svg/>");
            CliRun refused = CliRun.of("check", loop.toString(), "--plot", mine.toString());
            assertThat(refused.exitCode()).isEqualTo(2);
            assertThat(refused.err()).contains("loopform did not write it");
            assertThat(mine).hasContent("<svg/>");

            Path plot = dir.resolve("plot.svg");
            assertThat(CliRun.of("check", loop.toString(), "--plot", plot.toString()).exitCode()).isZero();
            CliRun again = CliRun.of("check", loop.toString(), "--plot", plot.toString());
            assertThat(again.exitCode()).as(again.err()).isZero();
        }
    }

    @Nested
    @DisplayName("through links")
    class Links {

        @Test
        void an_input_reached_through_a_link_inside_the_output_folder_is_refused() throws IOException {
            Path out = Files.createDirectories(dir.resolve("out"));
            Path policy = Files.writeString(out.resolve("policy.yaml"), "ms_warn: 1.8\n");
            Path link = Files.createSymbolicLink(dir.resolve("policy-link.yaml"), policy);

            CliRun r = audit(out, "--policy", link.toString(), "--force");

            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("holds an input");
            assertThat(policy).hasContent("ms_warn: 1.8\n");
        }

        @Test
        void a_target_form_named_in_a_row_inside_an_earlier_output_is_never_deleted() throws IOException {
            Path out = dir.resolve("out");
            audit(out);
            Path form = Files.copy(Path.of("forms-catalog/ideal.yaml"), out.resolve("my-target.yaml"));
            Path link = Files.createSymbolicLink(dir.resolve("target.yaml"), form);
            Path list = Files.writeString(dir.resolve("rows.csv"),
                    "tag,form,kc,ti,td,target_form,target_scan\nFIC-1,ideal,0.5,10,0," + link + ",1 s\n");

            CliRun r = CliRun.of("audit", list.toString(), "--no-report", "--out", out.toString(), "--force");

            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains("my-target.yaml");
            assertThat(form).exists();
        }

        @Test
        void out_onto_a_dangling_link_is_bad_input_and_creates_nothing() throws IOException {
            Path link = Files.createSymbolicLink(dir.resolve("out"), dir.resolve("nowhere"));

            CliRun r = audit(link);

            assertThat(r.exitCode()).isEqualTo(2);
            assertThat(r.err()).contains(link.toString()).contains("link to").contains("does not exist");
            assertThat(dir.resolve("nowhere")).doesNotExist();
            assertThat(scratchFolders()).isEmpty();
        }

        @Test
        void out_through_a_link_writes_where_it_points_and_keeps_the_link() throws IOException {
            Path real = Files.createDirectories(dir.resolve("real"));
            Path link = Files.createSymbolicLink(dir.resolve("out"), real);

            CliRun first = audit(link);
            CliRun second = audit(link, "--force");

            assertThat(first.exitCode()).as(first.err()).isIn(0, 1);
            assertThat(second.exitCode()).as(second.err()).isIn(0, 1);
            assertThat(Files.isSymbolicLink(link)).isTrue();
            assertThat(real.resolve("loops.csv")).exists();
        }
    }

    @Nested
    @DisplayName("temporary folders")
    class Temporaries {

        @Test
        void a_stale_temporary_folder_of_a_killed_run_is_swept_and_anything_else_is_left() throws Exception {
            Process gone = new ProcessBuilder("true").start();
            gone.waitFor();
            Path stale = Files.createDirectories(dir.resolve(".out.loopform-tmp-12345"));
            Files.writeString(stale.resolve(MARKER), "loopform output folder\nwriting-pid: " + gone.pid() + "\n");
            Files.writeString(stale.resolve("loops.csv"), "half written");
            Path unmarked = Files.createDirectories(dir.resolve(".other.loopform-tmp-999"));
            Files.writeString(unmarked.resolve("keep.txt"), "not loopform's");

            CliRun r = audit(dir.resolve("out"));

            assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
            assertThat(stale).doesNotExist();
            assertThat(unmarked.resolve("keep.txt")).exists();
        }

        @Test
        void a_run_that_fails_midway_leaves_no_temporary_and_no_folder_it_created() throws IOException {
            Path list = Files.writeString(dir.resolve("broken.csv"), LOOPS + "\"TIC-9,ideal,1,10,0\n");
            Path out = dir.resolve("new").resolve("deeper").resolve("out");

            CliRun r = CliRun.of("audit", list.toString(), "--to", "ideal", "--scan", "1s", "--out", out.toString());

            assertThat(r.exitCode()).as(r.err()).isEqualTo(2);
            assertThat(dir.resolve("new")).doesNotExist();
            assertThat(scratchFolders()).isEmpty();
        }

        @Test
        void an_unwritable_folder_is_bad_input_named_by_the_users_path() throws Exception {
            Path locked = Files.createDirectories(dir.resolve("locked"));
            // tests may run as root, whom permissions do not stop: then the immutable attribute is used
            boolean root = "root".equals(System.getProperty("user.name"));
            if (root) {
                assumeThat(run("chattr", "+i", locked.toString())).as("chattr +i available").isZero();
            } else {
                Files.setPosixFilePermissions(locked, PosixFilePermissions.fromString("r-xr-xr-x"));
            }
            try {
                assumeThat(canCreateIn(locked)).as("the folder really refuses writes").isFalse();
                Path out = locked.resolve("out");

                CliRun r = audit(out);

                assertThat(r.exitCode()).isEqualTo(2);
                assertThat(r.err()).contains(out.toString()).doesNotContain("loopform-tmp");
                assertThat(r.err().lines()).hasSize(1);
            } finally {
                if (root) {
                    run("chattr", "-i", locked.toString());
                } else {
                    Files.setPosixFilePermissions(locked, PosixFilePermissions.fromString("rwxr-xr-x"));
                }
            }
        }

        private static boolean canCreateIn(Path folder) {
            try {
                Files.delete(Files.createFile(folder.resolve("probe")));
                return true;
            } catch (IOException e) {
                return false;
            }
        }

        private static int run(String... command) throws Exception {
            try {
                return new ProcessBuilder(command).redirectErrorStream(true).start().waitFor();
            } catch (IOException e) {
                return -1;
            }
        }
    }
}

// plumbing: no published source needed (source: none)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.audit.SignOff;
import org.loopform.tuning.ConfidenceBox;

/** The files read beside a check or an audit: the sign-off names and the fit's interval box. */
class SideFilesReaderTest {

    @TempDir
    Path dir;

    private Path file(String name, String text) throws IOException {
        Path f = dir.resolve(name);
        Files.writeString(f, text);
        return f;
    }

    @Test
    void a_sign_off_file_gives_each_name_and_leaves_the_others_blank() throws IOException {
        SignOff s = SignOffFileReader.read(file("s.yaml", "prepared_by: A. Smith\nrevision: 3\n"), "s.yaml");
        assertThat(s.preparedBy()).isEqualTo("A. Smith");
        assertThat(s.revision()).isEqualTo("3");
        assertThat(s.checkedBy()).isEmpty();
        assertThat(s.approvedBy()).isEmpty();
        assertThat(s.change()).isEmpty();
    }

    @Test
    void a_sign_off_entry_is_one_line_of_a_known_key() throws IOException {
        assertThatThrownBy(() -> SignOffFileReader.read(file("a.yaml", "prepared_by: [A, B]\n"), "a.yaml"))
                .hasMessageContaining("a.yaml:1: prepared_by: must be one line of text (got a list or mapping)");
        assertThatThrownBy(() -> SignOffFileReader.read(file("b.yaml", "change: |\n  one\n  two\n"), "b.yaml"))
                .hasMessageContaining("change: must be one line of text (got several lines)");
        assertThatThrownBy(() -> SignOffFileReader.read(file("c.yaml", "signed_by: X\n"), "c.yaml"))
                .hasMessageContaining("c.yaml:1: signed_by: unknown key");
    }

    @Test
    void a_confidence_box_is_read_beside_its_process() throws IOException {
        Path f = file("p.yaml", """
                process: {model: FOPDT, gain: 2, time_constant: 60 s, dead_time: 10 s}
                intervals:
                  gain: 1.9..2.1
                  time_constant: 55..65
                  dead_time: 9..11
                """);
        ConfidenceBox b = ConfidenceBoxReader.read(f.toString(), "--process");
        assertThat(b.model()).isEqualTo("fopdt");
        assertThat(b.intervals().get("gain").low()).isEqualTo(1.9);
        assertThat(b.intervals().get("dead_time").high()).isEqualTo(11.0);
    }

    @Test
    void a_confidence_box_needs_a_file_with_intervals() throws IOException {
        assertThatThrownBy(() -> ConfidenceBoxReader.read("{model: fopdt}", "--process"))
                .hasMessageContaining("--robust: needs --process FILE");
        assertThatThrownBy(() -> ConfidenceBoxReader.read(dir.resolve("none.yaml").toString(), "--process"))
                .hasMessageContaining("--robust: needs --process FILE");
        Path noBox = file("n.yaml", "process: {model: fopdt, gain: 2, time_constant: 60 s}\n");
        assertThatThrownBy(() -> ConfidenceBoxReader.read(noBox.toString(), "--process"))
                .hasMessageContaining("no 'intervals:' block beside 'process:'");
        Path noProcess = file("q.yaml", "intervals: {gain: 1..2}\n");
        assertThatThrownBy(() -> ConfidenceBoxReader.read(noProcess.toString(), "--process"))
                .hasMessageContaining("no 'intervals:' block beside 'process:'");
        Path list = file("l.yaml", "process: {model: fopdt}\nintervals: [1, 2]\n");
        assertThatThrownBy(() -> ConfidenceBoxReader.read(list.toString(), "--process"))
                .hasMessageContaining("l.yaml:2: intervals: must be a mapping");
        Path unknown = file("u.yaml", "process: {model: fopdt}\nintervals: {gain: 1..2, lag: 1..2}\n");
        assertThatThrownBy(() -> ConfidenceBoxReader.read(unknown.toString(), "--process"))
                .hasMessageContaining("intervals.lag: unknown key");
        Path bad = file("b.yaml", "process: {model: fopdt}\nintervals: {gain: two}\n");
        assertThatThrownBy(() -> ConfidenceBoxReader.read(bad.toString(), "--process"))
                .hasMessageContaining("b.yaml:2: intervals.gain:");
        Path missing = file("m.yaml", "process: {model: fopdt}\nintervals: {gain: 1..2}\n");
        assertThatThrownBy(() -> ConfidenceBoxReader.read(missing.toString(), "--process"))
                .hasMessageContaining("m.yaml: intervals.time_constant: missing");
        assertThatThrownBy(() -> ConfidenceBoxReader.read(file("t.yaml", "- 1\n").toString(), "--process"))
                .hasMessageContaining("no 'intervals:' block");
    }
}

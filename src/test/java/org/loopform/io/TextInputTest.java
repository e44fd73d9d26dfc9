// plumbing: no published source needed (source: none)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A whole text read once, up to a character limit that is itself allowed. */
class TextInputTest {

    @Test
    void a_text_of_exactly_the_limit_is_read_and_one_more_character_is_refused(@TempDir Path dir) throws IOException {
        Path f = dir.resolve("t.txt");
        Files.writeString(f, "0123456789");
        assertThat(TextInput.readAll(f, "t.txt", 10, "too large")).isEqualTo("0123456789");
        assertThatThrownBy(() -> TextInput.readAll(f, "t.txt", 9, "t.txt: too large")).hasMessage("t.txt: too large");
        // characters, not bytes: five two-byte letters fit a limit of five
        Files.writeString(f, "\u00e9\u00e9\u00e9\u00e9\u00e9");
        assertThat(TextInput.readAll(f, "t.txt", 5, "too large")).hasSize(5);
    }

    @Test
    void a_folder_is_not_a_file() {
        assertThatThrownBy(() -> TextInput.readAll(Path.of("."), "here", 10, "x"))
                .hasMessage("here: is a folder, not a file; give the path of the file itself");
        assertThat(TextInput.unreadable(new java.nio.file.NoSuchFileException("x"), "x.csv").getMessage())
                .isEqualTo("x.csv: no such file; check the path");
        assertThat(TextInput.unreadable(new java.nio.file.AccessDeniedException("x"), "x.csv").getMessage())
                .startsWith("x.csv: permission denied; make the file readable");
        assertThat(TextInput.unreadable(new IOException("disk gone"), "x.csv").getMessage())
                .isEqualTo("x.csv: cannot be read (disk gone)");
    }
}

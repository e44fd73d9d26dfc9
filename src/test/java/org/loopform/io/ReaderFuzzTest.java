// plumbing: the readers' contract under arbitrary bytes; no published source needed (source: none)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;

import com.code_intelligence.jazzer.junit.FuzzTest;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Timeout;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;
import org.loopform.check.LoopSpec;
import org.loopform.findings.CheckPolicy;
import org.loopform.form.FormDefinition;
import org.loopform.units.BadInput;

/**
 * Fuzz targets for the file readers (the xlsx ones write each input to a file in an empty folder). The contract of every reader: for any bytes, either a result
 * or {@link BadInput} with a message; never another exception (a bug: exit 3), never a hang (the
 * {@link Timeout} becomes Jazzer's per-input timeout).
 *
 * <p>{@code mvn verify} replays the committed inputs under
 * {@code src/test/resources/org/loopform/io/ReaderFuzzTestInputs/<method>/} (seeds and any input
 * that once failed); {@code scripts/fuzz.sh} fuzzes each target for a set time.
 */
class ReaderFuzzTest {

    /** Forms named by path in a fuzzed list are looked up here: an empty folder. */
    private static final Path EMPTY_FOLDER = emptyFolder();

    private static Path emptyFolder() {
        try {
            Path p = Files.createTempDirectory("loopform-fuzz");
            p.toFile().deleteOnExit();
            return p;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static String text(byte[] bytes) {
        return new String(bytes, StandardCharsets.UTF_8);
    }

    /** A refusal is a message a user can read: it names something and is not blank. */
    private static void assertUsable(BadInput e) {
        assertThat(e.getMessage()).isNotBlank();
        assertThat(e.problems()).isNotEmpty().allSatisfy(p -> assertThat(p).isNotBlank());
    }

    @FuzzTest
    @Timeout(10)
    void formFile(byte[] bytes) {
        try {
            FormDefinition f = FormFileReader.parse(text(bytes), "form.yaml");
            assertThat(f.id()).isNotBlank();
        } catch (BadInput e) {
            assertUsable(e);
        }
    }

    @FuzzTest
    @Timeout(10)
    void loopFile(byte[] bytes) {
        try {
            List<LoopSpec> loops = LoopFileReader.parseAll(text(bytes), "loop.yaml");
            assertThat(loops).allSatisfy(l -> assertThat(l.sourceForm()).isNotNull());
        } catch (BadInput e) {
            assertUsable(e);
        }
    }

    @FuzzTest
    @Timeout(10)
    void csvLoopList(byte[] bytes) {
        try (LoopCsvReader r = LoopCsvReader.of(new ByteArrayInputStream(bytes), "loops.csv", EMPTY_FOLDER,
                LoopDefaults.NONE)) {
            while (r.hasNext()) {
                assertRow(r.next());
            }
        } catch (BadInput e) {
            assertUsable(e);
        }
    }

    @FuzzTest
    @Timeout(10)
    void yamlLoopList(byte[] bytes) {
        try (LoopYamlReader r = LoopYamlReader.of(text(bytes), "loops.yaml", LoopDefaults.NONE)) {
            while (r.hasNext()) {
                assertRow(r.next());
            }
        } catch (BadInput e) {
            assertUsable(e);
        }
    }

    /** Any bytes as an .xlsx loop list (the reader needs a file: a workbook is read by random access). */
    @FuzzTest
    @Timeout(10)
    void xlsxLoopList(byte[] bytes) throws IOException {
        readXlsx(Files.write(EMPTY_FOLDER.resolve("loops.xlsx"), bytes));
    }

    /**
     * Any bytes as the XML of the one sheet of a valid workbook, where the reader's own cell rules
     * are (a fuzzed zip rarely gets past its checksums).
     */
    @FuzzTest
    @Timeout(10)
    void xlsxSheetXml(byte[] bytes) throws IOException {
        Path f = XlsxTestFiles.write(EMPTY_FOLDER.resolve("sheet.xlsx"), "Loops", ws -> ws.value(0, 0, "tag"));
        XlsxTestFiles.editSheet(f, xml -> text(bytes));
        readXlsx(f);
    }

    private static void readXlsx(Path file) {
        try (LoopXlsxReader r = LoopXlsxReader.open(file, "loops.xlsx", null, LoopDefaults.NONE)) {
            while (r.hasNext()) {
                assertRow(r.next());
            }
        } catch (BadInput e) {
            assertUsable(e);
        }
    }

    @FuzzTest
    @Timeout(10)
    void policyFile(byte[] bytes) {
        try {
            CheckPolicy p = PolicyFileReader.parse(text(bytes), "policy.yaml");
            assertThat(p.asMap().values()).allSatisfy(v -> assertThat(v).isFinite());
        } catch (BadInput e) {
            assertUsable(e);
        }
    }

    /** A row is either a loop or a bad row that says why. */
    private static void assertRow(LoopRow row) {
        if (row.ok()) {
            assertThat(row.loop()).isNotNull();
        } else {
            assertThat(row.problems()).isNotEmpty().allSatisfy(p -> assertThat(p).isNotBlank());
        }
    }
}

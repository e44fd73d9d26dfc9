// source: the test inputs themselves (each expected line, byte offset, count and message part is read off the text the test writes), RFC 4180 section 2 (records, fields, separators) and RFC 3629 section 3 (0xE9 alone is no UTF-8 sequence)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.Reader;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.csv.CSVException;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;

/** A CSV loop list's first line, its source's failures part-way, and the file or stream it is read from being closed. */
class LoopCsvStreamTest {

    private static final String HEADER = "tag,form,kc,ti,td,target_form\n";
    private static final String ROW = "A,ideal,1,60,0,ideal\n";

    @TempDir
    Path dir;

    private static List<LoopRow> all(LoopCsvReader r) {
        List<LoopRow> rows = new ArrayList<>();
        try (r) {
            r.forEachRemaining(rows::add);
        }
        return rows;
    }

    private static LoopCsvReader of(String text) {
        return LoopCsvReader.of(new StringReader(text), "loops.csv", null, LoopDefaults.NONE);
    }

    @Nested
    @DisplayName("the first line")
    class FirstLine {

        @Test
        void an_empty_file_says_it_is_empty() {
            assertThatThrownBy(() -> of("")).isInstanceOf(InputException.class)
                    .hasMessage("loops.csv:1: the file is empty; the first line must be a header such as"
                            + " tag,form,kc,ti,td,scan");
        }

        @Test
        void a_blank_first_line_says_it_is_blank() {
            assertThatThrownBy(() -> of("  \n" + HEADER + ROW)).isInstanceOf(InputException.class)
                    .hasMessage("loops.csv:1: the first line is blank; the first line must be a header such as"
                            + " tag,form,kc,ti,td,scan");
        }
    }

    @Nested
    @DisplayName("rows")
    class Rows {

        @Test
        void rows_good_and_bad_are_numbered_from_0_in_file_order() {
            assertThat(all(of(HEADER + ROW + "B,ideal\n" + "C,ideal,1,60,0,ideal\n")))
                    .extracting(LoopRow::index).containsExactly(0, 1, 2);
        }

        // RFC 4180, 2: fields are separated by the separator; a row written with another one is one field
        @Test
        void a_row_whose_only_comma_comes_first_is_still_seen_as_written_with_commas() {
            List<LoopRow> rows = all(of("tag;form;kc;ti;td;target_form\n,FIC-1\n"));
            assertThat(rows.get(0).problems()).singleElement().asString()
                    .startsWith("loops.csv:2: 1 cell, the header has 6; the row seems separated by ',' but the header"
                            + " by ';'");
        }

        @Test
        void a_reader_of_text_counts_no_bytes() {
            try (LoopCsvReader r = of(HEADER + ROW)) {
                assertThat(r.bytesRead()).isEqualTo(-1);
            }
        }
    }

    @Nested
    @DisplayName("a source that fails part-way")
    class Failures {

        /** The text {@code text}, then {@code failure} on the read after it. */
        private Reader failingAfter(String text, IOException failure) {
            return new Reader() {
                private final StringReader head = new StringReader(text);

                @Override
                public int read(char[] buffer, int offset, int length) throws IOException {
                    int n = head.read(buffer, offset, length);
                    if (n == -1) {
                        throw failure;
                    }
                    return n;
                }

                @Override
                public void close() {
                    head.close();
                }
            };
        }

        @Test
        void a_read_error_of_the_source_says_the_file_cannot_be_read() {
            LoopCsvReader r = LoopCsvReader.of(failingAfter(HEADER + ROW, new IOException("device gone")), "loops.csv",
                    null, LoopDefaults.NONE);
            assertThatThrownBy(() -> all(r)).isInstanceOf(InputException.class)
                    .hasMessage("loops.csv: cannot be read (device gone)");
        }

        @Test
        void a_csv_error_in_words_loopform_does_not_know_says_not_valid_csv_at_the_line() {
            LoopCsvReader r = LoopCsvReader.of(failingAfter(HEADER + ROW, new CSVException("odd input %d", 7)),
                    "loops.csv", null, LoopDefaults.NONE);
            assertThatThrownBy(() -> all(r)).isInstanceOf(InputException.class)
                    .hasMessage("loops.csv:3: not valid CSV near this line; check its quotes and separators");
        }

        // RFC 3629, 3: 0xE9 followed by an ASCII letter is no UTF-8 sequence. The byte lies past the first 64 KiB,
        // which the header's reading takes in, so it is met while the rows are read.
        @Test
        void a_byte_that_is_not_utf8_far_into_the_file_is_named_with_its_line_and_offset() {
            StringBuilder text = new StringBuilder(HEADER);
            for (int k = 0; k < 4000; k++) {
                text.append("TIC-").append(k).append(",ideal,1,60,0,ideal\n");
            }
            String before = text.toString();
            long line = before.chars().filter(ch -> ch == '\n').count() + 1;
            byte[] head = before.getBytes(StandardCharsets.UTF_8);
            byte[] bytes = java.util.Arrays.copyOf(head, head.length + 3);
            bytes[head.length] = 'X';
            bytes[head.length + 1] = (byte) 0xE9;
            bytes[head.length + 2] = 'Y';
            assertThat(head.length).isGreaterThan(1 << 16);
            LoopCsvReader r = LoopCsvReader.of(new ByteArrayInputStream(bytes), "loops.csv", null, LoopDefaults.NONE);
            assertThatThrownBy(() -> all(r)).isInstanceOf(InputException.class)
                    .hasMessageStartingWith("loops.csv:" + line + ": not UTF-8 text (byte 0xE9 at byte "
                            + (head.length + 1) + ")");
        }
    }

    @Nested
    @DisplayName("what is closed")
    class Closing {

        /** A stream of {@code text} that notes its closing. */
        private static final class Watched extends ByteArrayInputStream {
            boolean closed;

            Watched(byte[] bytes) {
                super(bytes);
            }

            @Override
            public void close() throws IOException {
                closed = true;
                super.close();
            }
        }

        @Test
        void closing_the_reader_closes_its_stream() {
            Watched in = new Watched((HEADER + ROW).getBytes(StandardCharsets.UTF_8));
            all(LoopCsvReader.of(in, "loops.csv", null, LoopDefaults.NONE));
            assertThat(in.closed).isTrue();
        }

        @Test
        void a_stream_whose_header_is_not_utf8_or_not_a_header_is_closed() {
            Watched latin1 = new Watched("tag,f\u00f6rm\n".getBytes(StandardCharsets.ISO_8859_1));
            assertThatThrownBy(() -> LoopCsvReader.of(latin1, "loops.csv", null, LoopDefaults.NONE))
                    .isInstanceOf(InputException.class).hasMessageStartingWith("loops.csv:1: not UTF-8 text (byte 0xF6");
            assertThat(latin1.closed).isTrue();
            Watched unknown = new Watched("tag,form,gain\n".getBytes(StandardCharsets.UTF_8));
            assertThatThrownBy(() -> LoopCsvReader.of(unknown, "loops.csv", null, LoopDefaults.NONE))
                    .isInstanceOf(InputException.class).hasMessageContaining("gain: unknown column");
            assertThat(unknown.closed).isTrue();
        }

        @Test
        void a_file_is_closed_after_reading_and_when_its_header_is_refused() throws IOException {
            assumeTrue(OpenFiles.countable(), "this system lists open descriptors in /proc/self/fd");
            Path good = Files.writeString(dir.resolve("good.csv"), HEADER + ROW);
            LoopCsvReader r = LoopCsvReader.open(good, "good.csv", LoopDefaults.NONE);
            assertThat(OpenFiles.on(good)).isPositive();
            all(r);
            assertThat(OpenFiles.on(good)).isZero();
            Path unknown = Files.writeString(dir.resolve("unknown.csv"), "tag,form,gain\n");
            assertThatThrownBy(() -> LoopCsvReader.open(unknown, "unknown.csv", LoopDefaults.NONE))
                    .isInstanceOf(InputException.class);
            assertThat(OpenFiles.on(unknown)).isZero();
            Path latin1 = Files.write(dir.resolve("latin1.csv"), "tag,f\u00f6rm\n".getBytes(StandardCharsets.ISO_8859_1));
            assertThatThrownBy(() -> LoopCsvReader.open(latin1, "latin1.csv", LoopDefaults.NONE))
                    .isInstanceOf(InputException.class).hasMessageStartingWith("latin1.csv:1: not UTF-8 text");
            assertThat(OpenFiles.on(latin1)).isZero();
        }
    }
}

// source: RFC 3629 section 3 (UTF-8 sequences: 0xC3 0xA9 is U+00E9; 0xE9 followed by an ASCII byte is none) and the contract of java.io.Reader.read(char[], int, int) (Java SE 17 API: the count of characters stored from offset, or -1 at the end)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;

/** The strict UTF-8 reader under the files loopform reads: what it returns, where it places a bad byte, what it closes. */
class Utf8ReaderTest {

    private static Utf8Reader over(byte[] bytes) {
        return new Utf8Reader(new ByteArrayInputStream(bytes), "t.csv");
    }

    @Test
    void characters_read_at_an_offset_are_counted_from_it_and_the_end_is_minus_one() throws IOException {
        char[] buffer = "..........".toCharArray();
        try (Utf8Reader r = over("abcd".getBytes(StandardCharsets.US_ASCII))) {
            int n = r.read(buffer, 3, 7);
            assertThat(n).isEqualTo(4);
            assertThat(new String(buffer)).isEqualTo("...abcd...");
            assertThat(r.read(buffer, 3, 7)).isEqualTo(-1);
        }
    }

    @Test
    void an_empty_input_ends_at_once() throws IOException {
        try (Utf8Reader r = over(new byte[0])) {
            assertThat(r.read(new char[4], 0, 4)).isEqualTo(-1);
        }
    }

    @Test
    void a_two_byte_letter_is_one_character() throws IOException {
        char[] buffer = new char[4];
        try (Utf8Reader r = over(new byte[] {'a', (byte) 0xC3, (byte) 0xA9, 'b'})) {
            StringBuilder text = new StringBuilder();
            for (int n; (n = r.read(buffer, 0, 4)) != -1; ) {
                text.append(buffer, 0, n);
            }
            assertThat(text).hasToString("a\u00e9b");
            assertThat(r.bytesRead()).isEqualTo(4);
        }
    }

    // The bad byte 0xE9 is the seventh byte (offset 6 from 0) of "ab\ncd\n" + E9 + "x", on line 3; reads of two
    // characters each meet it, so its offset adds up over reads that start part-way in the bytes
    @Test
    void a_bad_byte_met_after_several_short_reads_is_placed_at_its_line_and_byte() throws IOException {
        byte[] bytes = {'a', 'b', '\n', 'c', 'd', '\n', (byte) 0xE9, 'x'};
        char[] buffer = new char[2];
        try (Utf8Reader r = over(bytes)) {
            assertThat(r.read(buffer, 0, 2)).isEqualTo(2);
            assertThat(r.read(buffer, 0, 2)).isEqualTo(2);
            assertThatThrownBy(() -> {
                while (r.read(buffer, 0, 2) != -1) {
                    // read on to the bad byte
                }
            }).isInstanceOf(NotUtf8Exception.class)
                    .hasMessageStartingWith("t.csv:3: not UTF-8 text (byte 0xE9 at byte 6)");
        }
    }

    @Test
    void closing_the_reader_closes_the_stream() throws IOException {
        boolean[] closed = {false};
        Utf8Reader r = new Utf8Reader(new ByteArrayInputStream(new byte[0]) {
            @Override
            public void close() {
                closed[0] = true;
            }
        }, "t.csv");
        r.close();
        assertThat(closed[0]).isTrue();
    }
}

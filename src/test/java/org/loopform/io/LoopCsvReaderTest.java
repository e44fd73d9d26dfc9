// plumbing: no published source needed (source: none)
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.StringReader;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;
import org.loopform.process.FirstOrderPlusDeadTime;

class LoopCsvReaderTest {

    private static List<LoopRow> read(String csv) {
        List<LoopRow> rows = new ArrayList<>();
        try (LoopCsvReader r = LoopCsvReader.of(new StringReader(csv), "loops.csv", null, LoopDefaults.NONE)) {
            r.forEachRemaining(rows::add);
        }
        return rows;
    }

    @Test
    void reads_rows_with_units_ranges_and_a_process_model() {
        List<LoopRow> rows = read("tag,form,pb,ti,td,scan,pv_range,output_range,model,process_gain,time_constant,"
                + "dead_time,target_form,target_scan\n"
                + "TIC-1,series-pb-min,80,2.5,0.5,1 s,0..150,0..100,fopdt,1.5,5 min,30s,ideal,0.5 s\n");
        assertThat(rows).hasSize(1);
        LoopRow r = rows.get(0);
        assertThat(r.ok()).isTrue();
        assertThat(r.loop().tuning()).containsEntry("pb", "80").containsEntry("ti", "2.5").containsEntry("td", "0.5");
        assertThat(r.loop().sourceScanSeconds()).isEqualTo(1.0);
        assertThat(r.loop().targetScanSeconds()).isEqualTo(0.5);
        assertThat(r.loop().pvRange().width()).isEqualTo(150.0);
        assertThat(r.loop().process()).isInstanceOfSatisfying(FirstOrderPlusDeadTime.class, p -> {
            assertThat(p.timeConstantSeconds()).isEqualTo(300.0);
            assertThat(p.deadTimeSeconds()).isEqualTo(30.0);
        });
        assertThat(r.where()).isEqualTo("loops.csv:2");
    }

    @Test
    void skips_a_byte_order_mark_reads_semicolons_and_quoted_cells() {
        List<LoopRow> rows = read("\uFEFFtag;form;kc;ti;td;target_form;target_scan\n"
                + "\"FIC-1;A\";ideal;1.2;60;0;ideal-min;1 s\n");
        assertThat(rows).singleElement().satisfies(r -> {
            assertThat(r.ok()).isTrue();
            assertThat(r.tag()).isEqualTo("FIC-1;A");
        });
    }

    @Test
    void a_target_scan_defaults_to_the_old_scan_and_empty_cells_are_absent() {
        List<LoopRow> rows = read("tag,form,kc,ti,td,n,scan,target_form\nFIC-1,ideal,1.2,60,0,,2 s,ideal-min\n");
        assertThat(rows.get(0).loop().targetScanSeconds()).isEqualTo(2.0);
        assertThat(rows.get(0).loop().tuning()).doesNotContainKey("n");
    }

    @Test
    void a_bad_row_names_file_line_and_field_and_the_next_row_is_still_read() {
        List<LoopRow> rows = read("tag,form,kc,ti,td,target_form,target_scan\n"
                + "FIC-1,ideal,1.2,60,0,no-such-form,1 s\n"
                + "FIC-2,ideal,1.2,60,0,ideal-min,1 z\n"
                + "FIC-3,ideal,1.2,60,0,ideal-min,1 s\n");
        assertThat(rows).hasSize(3);
        assertThat(rows.get(0).ok()).isFalse();
        assertThat(rows.get(0).problems()).singleElement().asString()
                .startsWith("loops.csv:2: ").contains("target_form").contains("unknown form 'no-such-form'");
        assertThat(rows.get(1).problems()).singleElement().asString()
                .startsWith("loops.csv:3: target_scan: ").contains("unknown time unit");
        assertThat(rows.get(2).ok()).isTrue();
    }

    @Test
    void a_repeated_tag_is_an_error_of_the_later_row() {
        List<LoopRow> rows = read("tag,form,kc,ti,td,target_form,target_scan\n"
                + "FIC-1,ideal,1.2,60,0,ideal-min,1 s\n"
                + "FIC-1,ideal,1.5,60,0,ideal-min,1 s\n");
        assertThat(rows.get(0).ok()).isTrue();
        assertThat(rows.get(1).problems()).singleElement().asString()
                .contains("duplicate tag FIC-1").contains("first at loops.csv:2");
    }

    @Test
    void an_unknown_column_or_a_missing_tag_column_stops_the_file_at_once() {
        assertThatThrownBy(() -> read("tag,form,kc,ti,td,colour\nA,ideal,1,1,0,red\n"))
                .isInstanceOf(InputException.class).hasMessageContaining("loops.csv:1: colour: unknown column");
        assertThatThrownBy(() -> read("form,kc,ti,td\nideal,1,1,0\n"))
                .isInstanceOf(InputException.class).hasMessageContaining("tag: required column");
    }

    @Test
    void without_a_target_form_the_row_asks_for_one_or_for_to() {
        List<LoopRow> rows = read("tag,form,kc,ti,td\nFIC-1,ideal,1.2,60,0\n");
        assertThat(rows.get(0).problems()).singleElement().asString().contains("target_form: required")
                .contains("--to");
    }

    /** A stream that cannot be re-read or rewound and hands out one byte a call, as a slow pipe does. */
    private static final class TricklingStream extends java.io.InputStream {
        private final byte[] bytes;
        private int next;

        TricklingStream(String text) {
            this.bytes = text.getBytes(java.nio.charset.StandardCharsets.UTF_8);
        }

        @Override
        public int read() {
            return next < bytes.length ? bytes[next++] & 0xff : -1;
        }

        @Override
        public int read(byte[] b, int off, int len) {
            if (len == 0) {
                return 0;
            }
            int c = read();
            if (c < 0) {
                return -1;
            }
            b[off] = (byte) c;
            return 1;
        }

        @Override
        public boolean markSupported() {
            return false;
        }
    }

    private static String bigList(int loops) {
        StringBuilder sb = new StringBuilder("tag,form,pb,ti,td,scan,target_form\n");
        for (int k = 0; k < loops - 1; k++) {
            sb.append("TIC-").append(k).append(",series-pb-min,").append(50 + k % 200).append(",2.5,0,1 s,ideal\n");
        }
        return sb.append("TIC-LAST,series-pb-min,180,2.5,0,1 s,ideal\n").toString();
    }

    @Test
    void a_stream_read_a_byte_at_a_time_gives_every_row_and_the_last_value_whole() {
        List<LoopRow> rows = new ArrayList<>();
        String text = bigList(2000);
        try (LoopCsvReader r = LoopCsvReader.of(new TricklingStream(text), "pipe", null, LoopDefaults.NONE)) {
            r.forEachRemaining(rows::add);
            assertThat(r.bytesRead()).isEqualTo(text.getBytes(java.nio.charset.StandardCharsets.UTF_8).length);
        }
        assertThat(rows).hasSize(2000).allMatch(LoopRow::ok);
        assertThat(rows.get(1999).loop().tuning()).containsEntry("pb", "180");
        assertThat(rows.get(1999).where()).isEqualTo("pipe:2001");
    }

    @Test
    void a_fifo_is_read_once_to_its_end() throws Exception {
        java.nio.file.Path dir = java.nio.file.Files.createTempDirectory("loopform-fifo");
        java.nio.file.Path fifo = dir.resolve("loops.csv");
        org.junit.jupiter.api.Assumptions.assumeTrue(new ProcessBuilder("mkfifo", fifo.toString()).start().waitFor() == 0,
                "mkfifo is available");
        String text = bigList(2000);
        Thread writer = new Thread(() -> {
            try {
                java.nio.file.Files.writeString(fifo, text);
            } catch (java.io.IOException e) {
                throw new java.io.UncheckedIOException(e);
            }
        });
        writer.start();
        List<LoopRow> rows = new ArrayList<>();
        try (LoopCsvReader r = LoopCsvReader.open(fifo, "loops.csv", LoopDefaults.NONE)) {
            r.forEachRemaining(rows::add);
        } finally {
            writer.join(10_000);
            java.nio.file.Files.deleteIfExists(fifo);
            java.nio.file.Files.deleteIfExists(dir);
        }
        assertThat(rows).hasSize(2000);
        assertThat(rows.get(1999).tag()).isEqualTo("TIC-LAST");
        assertThat(rows.get(1999).loop().tuning()).containsEntry("pb", "180");
    }

    @Test
    void multi_byte_characters_split_across_reads_are_kept_and_lines_are_counted_past_quoted_line_breaks() {
        List<LoopRow> rows = new ArrayList<>();
        String text = "tag,form,kc,ti,td,target_form\n\"TIC-\u00b5\u00b0\nsecond line\",ideal,1,60,0,ideal\n\n"
                + "TIC-2,ideal,1,60,0,ideal";
        try (LoopCsvReader r = LoopCsvReader.of(new TricklingStream(text), "loops.csv", null, LoopDefaults.NONE)) {
            r.forEachRemaining(rows::add);
        }
        assertThat(rows).hasSize(2);
        assertThat(rows.get(0).tag()).isEqualTo("TIC-\u00b5\u00b0\nsecond line");
        assertThat(rows.get(0).where()).isEqualTo("loops.csv:2");
        // line 4 is blank and skipped; the last row has no line break after it
        assertThat(rows.get(1).where()).isEqualTo("loops.csv:5");
    }

    @Test
    void bytes_that_are_not_utf8_stop_the_file_at_their_line() {
        byte[] latin1 = "tag,form,kc,ti,td\nTIC-1,ideal,1,60,0\nTIC-\u00e9,ideal,1,60,0\n"
                .getBytes(java.nio.charset.StandardCharsets.ISO_8859_1);
        assertThatThrownBy(() -> {
            try (LoopCsvReader r = LoopCsvReader.of(new java.io.ByteArrayInputStream(latin1), "loops.csv", null,
                    LoopDefaults.NONE)) {
                r.forEachRemaining(x -> { });
            }
        }).isInstanceOf(InputException.class).hasMessageStartingWith("loops.csv:3: not UTF-8 text (byte 0xE9")
                .hasMessageContaining("save the file as UTF-8");
    }

    @Test
    void a_row_with_more_or_fewer_cells_than_the_header_is_a_bad_row_that_says_so() {
        List<LoopRow> rows = read("tag,form,kc,ti,td,target_form\n"
                + "TIC-1,ideal,1,5,60,0,ideal\n"
                + "TIC-2,ideal,1\n"
                + "TIC-3;ideal;1;60;0;ideal\n"
                + "TIC-4,ideal,1.5,60,0,ideal\n");
        assertThat(rows).hasSize(4);
        assertThat(rows.get(0).problems()).singleElement().asString()
                .startsWith("loops.csv:2: 7 cells, the header has 6; a decimal comma");
        assertThat(rows.get(1).problems()).singleElement().asString()
                .startsWith("loops.csv:3: 3 cells, the header has 6; a missing cell?");
        assertThat(rows.get(2).problems()).singleElement().asString()
                .startsWith("loops.csv:4: 1 cell, the header has 6; the row seems separated by ';'");
        assertThat(rows.get(3).ok()).isTrue();
    }

    @Test
    void a_decimal_comma_in_a_semicolon_file_is_a_bad_row_not_a_guess() {
        List<LoopRow> rows = read("tag;form;kc;ti;td;target_form\nTIC-1;ideal;1,5;60;0;ideal\n");
        assertThat(rows.get(0).problems()).singleElement().asString()
                .startsWith("loops.csv:2: kc: '1,5' has a comma in a number; write decimals with a point");
    }

    @Test
    void a_tab_separated_file_is_read() {
        List<LoopRow> rows = read("tag\tform\tkc\tti\ttd\ttarget_form\nTIC-1\tideal\t1.5\t60\t0\tideal\n");
        assertThat(rows.get(0).ok()).isTrue();
        assertThat(rows.get(0).loop().tuning()).containsEntry("kc", "1.5");
    }

    @Test
    void a_column_named_twice_stops_the_file_naming_both_columns() {
        assertThatThrownBy(() -> read("tag,form,kc,ti,td,TI\nA,ideal,1,60,0,30\n"))
                .isInstanceOf(InputException.class)
                .hasMessageContaining("loops.csv:1: ti: columns 4 and 6 are both named 'TI'");
    }

    @Test
    void an_unnamed_column_is_allowed_while_empty_and_a_bad_row_when_it_holds_a_value() {
        List<LoopRow> rows = read("tag,form,kc,ti,td,target_form,\nA,ideal,1,60,0,ideal,\nB,ideal,1,60,0,ideal,7\n");
        assertThat(rows.get(0).ok()).isTrue();
        assertThat(rows.get(1).problems()).singleElement().asString()
                .startsWith("loops.csv:3: column 7 has no name in the header, but this row has a value there ('7')");
    }

    @Test
    void an_unclosed_quote_stops_the_file_at_the_line_it_opens() {
        assertThatThrownBy(() -> read("tag,form,kc,ti,td,target_form\nA,ideal,1,60,0,ideal\n\"B,ideal,1,60,0,ideal\n"
                + "C,ideal,1,60,0,ideal\n"))
                .isInstanceOf(InputException.class)
                .hasMessageStartingWith("loops.csv:3: a quote (\") opens a cell on this line and is never closed")
                .hasMessageNotContaining("org.apache");
    }
}

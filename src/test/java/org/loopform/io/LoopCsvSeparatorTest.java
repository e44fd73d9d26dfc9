// plumbing: no published source needed (source: none); RFC 4180 for the quoting
package org.loopform.io;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.StringReader;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;

/** The separator a loop list's header uses, and what a row with the wrong cell count is told. */
class LoopCsvSeparatorTest {

    private static List<LoopRow> read(String csv) {
        List<LoopRow> rows = new ArrayList<>();
        try (LoopCsvReader r = LoopCsvReader.of(new StringReader(csv), "loops.csv", null, LoopDefaults.NONE)) {
            r.forEachRemaining(rows::add);
        }
        return rows;
    }

    @Test
    void the_most_frequent_separator_wins() {
        assertThat(LoopCsvReader.separator("tag,form,kc")).isEqualTo(',');
        assertThat(LoopCsvReader.separator("tag;form;kc,ti")).isEqualTo(';');
        assertThat(LoopCsvReader.separator("tag\tform\tkc;ti,td")).isEqualTo('\t');
        assertThat(LoopCsvReader.separator("tag\tform;kc;ti\ttd\tscan")).isEqualTo('\t');
        // no separator at all: a one-column header is read with the comma
        assertThat(LoopCsvReader.separator("tag")).isEqualTo(',');
    }

    @Test
    void a_tie_keeps_the_earlier_of_comma_semicolon_tab() {
        assertThat(LoopCsvReader.separator("tag;form,kc")).isEqualTo(',');
        assertThat(LoopCsvReader.separator("tag\tform;kc")).isEqualTo(';');
        assertThat(LoopCsvReader.separator("tag\tform,kc")).isEqualTo(',');
    }

    @Test
    void separators_inside_quotes_are_not_counted() {
        assertThat(LoopCsvReader.separator("\"a,b,c,d\";form;kc")).isEqualTo(';');
        assertThat(LoopCsvReader.separator("tag,\"x;y;z\",kc")).isEqualTo(',');
        // a quote closed again: the separators after it count
        assertThat(LoopCsvReader.separator("\"t,a,g\";form;kc;ti")).isEqualTo(';');
        assertThat(LoopCsvReader.separator("\"t;a\";g,form,kc")).isEqualTo(',');
    }

    @Test
    void a_row_with_too_many_cells_in_a_semicolon_file_names_the_separator_inside_a_cell() {
        List<LoopRow> rows = read("tag;form;kc;ti;td;target_form\nTIC-1;ideal;1;60;0;ideal;extra\n");
        assertThat(rows.get(0).problems()).singleElement().asString()
                .startsWith("loops.csv:2: 7 cells, the header has 6; a separator (';') inside a cell?");
    }

    @Test
    void a_tab_separator_is_named_tab() {
        List<LoopRow> rows = read("tag\tform\tkc\tti\ttd\ttarget_form\nTIC-1\tideal\t1\t60\t0\tideal\tx\n"
                + "TIC-2,ideal,1,60,0,ideal\n");
        assertThat(rows.get(0).problems()).singleElement().asString()
                .startsWith("loops.csv:2: 7 cells, the header has 6; a separator ('tab') inside a cell?");
        assertThat(rows.get(1).problems()).singleElement().asString()
                .startsWith("loops.csv:3: 1 cell, the header has 6; the row seems separated by ','"
                        + " but the header by 'tab'");
    }

    @Test
    void a_short_row_in_a_semicolon_file_with_tabs_is_told_of_the_tabs() {
        List<LoopRow> rows = read("tag;form;kc;ti;td;target_form\nTIC-1\tideal\t1\t60;0;ideal\n"
                + "TIC-2;ideal;1;60\n");
        assertThat(rows.get(0).problems()).singleElement().asString()
                .startsWith("loops.csv:2: 3 cells, the header has 6; the row seems separated by 'tab'"
                        + " but the header by ';'");
        assertThat(rows.get(1).problems()).singleElement().asString()
                .startsWith("loops.csv:3: 4 cells, the header has 6; a missing cell?");
    }

    @Test
    void blank_lines_between_rows_are_skipped_and_lines_still_counted() {
        List<LoopRow> rows = read("tag,form,kc,ti,td,target_form\n\nTIC-1,ideal,1\n");
        assertThat(rows).hasSize(1);
        assertThat(rows.get(0).problems()).singleElement().asString().startsWith("loops.csv:3: 3 cells");
    }
}

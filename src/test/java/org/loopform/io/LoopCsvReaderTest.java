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
}

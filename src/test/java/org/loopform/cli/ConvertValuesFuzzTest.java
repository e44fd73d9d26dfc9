// plumbing: convert's value parsing under arbitrary text; no published source needed (source: none)
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.code_intelligence.jazzer.junit.FuzzTest;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Timeout;
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.PidSetting;
import org.loopform.form.WritingContext;
import org.loopform.io.CatalogLoader;
import org.loopform.units.BadInput;
import org.loopform.units.Measure;
import org.loopform.units.Span;

/**
 * Fuzz target for {@code convert}'s value parsing: the {@code NAME=VALUE} pairs
 * ({@link ConvertCommand#parse}), the ranges and scan time of the context, and the form's units
 * layer ({@link FormCodec#decode}). Either a setting or {@link BadInput}; never another exception,
 * never a hang.
 *
 * <p>The input is text, one item a line: the source form's catalog id (an unknown id picks a
 * bundled form by its length), the PV range, the output range, the scan time (each empty for
 * "not given"), then the pairs. Regression inputs: {@code ConvertValuesFuzzTestInputs/convertValues/}.
 */
class ConvertValuesFuzzTest {

    private static final List<FormDefinition> FORMS = CatalogLoader.bundled().all();

    @FuzzTest
    @Timeout(10)
    void convertValues(byte[] bytes) {
        List<String> lines = Arrays.asList(new String(bytes, StandardCharsets.UTF_8).split("\n", -1));
        String id = line(lines, 0);
        FormDefinition form = CatalogLoader.bundled().find(id.trim())
                .orElse(FORMS.get(id.length() % FORMS.size()));
        try {
            Span pv = line(lines, 1).isEmpty() ? null : Span.parse(line(lines, 1));
            Span out = line(lines, 2).isEmpty() ? null : Span.parse(line(lines, 2));
            Double scan = line(lines, 3).isEmpty() ? null : Measure.parsePositiveSeconds(line(lines, 3));
            List<String> pairs = lines.size() > 4 ? lines.subList(4, lines.size()) : List.of();
            Map<String, String> raw = ConvertCommand.parse(pairs);
            PidSetting s = FormCodec.decode(form, raw, new WritingContext(pv, out, scan), "source");
            assertThat(s).isNotNull();
        } catch (BadInput e) {
            assertThat(e.getMessage()).isNotBlank();
        }
    }

    private static String line(List<String> lines, int i) {
        return i < lines.size() ? lines.get(i) : "";
    }
}

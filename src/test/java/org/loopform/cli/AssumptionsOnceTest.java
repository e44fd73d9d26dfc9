// plumbing: how often an assumption is printed; the counts come from the example list itself
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;

/**
 * An assumption shared by many loops (reverse action where the list gives none) is stated once in
 * the audit's summary, with the number of loops it applies to, not once per loop. The expected
 * numbers are counted here from examples/plant-k7-loops.csv: the rows of a form that keeps the
 * action apart (series-pb-min, ideal-pb-repeats) with an empty action cell.
 */
class AssumptionsOnceTest {

    private static long rowsWithoutAction(List<String> lines, String form) {
        List<String> header = List.of(lines.get(0).split(",", -1));
        int formAt = header.indexOf("form");
        int actionAt = header.indexOf("action");
        return lines.stream().skip(1).map(l -> l.split(",", -1))
                .filter(c -> c[formAt].equals(form) && c[actionAt].isBlank()).count();
    }

    @Test
    void reverse_action_is_stated_once_per_form_with_its_count() throws Exception {
        List<String> lines = Files.readAllLines(Path.of("examples/plant-k7-loops.csv"));
        long series = rowsWithoutAction(lines, "series-pb-min");
        long band = rowsWithoutAction(lines, "ideal-pb-repeats");
        assertThat(series).isGreaterThan(1);
        CliRun r = CliRun.of("audit", "examples/plant-k7-loops.csv", "--to", "examples/plant-k7-target.yaml");
        assertThat(r.exitCode()).as(r.err()).isIn(0, 1);
        assertThat(Pattern.compile("reverse action \\(output falls as the PV rises\\) was assumed").matcher(r.out())
                .results().count()).isEqualTo(2);
        assertThat(r.out()).contains(series + " loops: No action was given for series-pb-min")
                .contains(band + " loops: No action was given for ideal-pb-repeats");
    }
}

// plumbing: no published source needed (source: none)
package org.loopform.audit;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.List;
import org.loopform.findings.CheckPolicy;
import org.loopform.form.FormException;
import org.loopform.io.LoopFileReader;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/** Only bad input becomes a bad row; a bug stops the run with exit 3: pure plumbing, no figure of the main job. */
@DisplayName("an audit turns only bad input into a bad row")
class AuditBugIsNotABadRowTest {

    private static final String LOOP = """
            loops:
              - tag: TIC-1
                tuning: {form: ideal, kc: 1.2, ti: 60, td: 0}
                target: {form: ideal, scan: 1 s}
            """;

    private static LoopRow row() {
        return LoopRow.of(0, LoopFileReader.parseAll(LOOP, "list.yaml").get(0));
    }

    @Test
    void bad_input_raised_by_the_check_becomes_the_rows_problem_with_its_place() {
        LoopOutcome o = Audit.check(row(), CheckPolicy.DEFAULT, (loop, policy) -> {
            throw new FormException("ti: must be > 0 s (got -2 s)");
        });

        assertThat(o.ok()).isFalse();
        assertThat(o.problems()).singleElement().asString().startsWith("list.yaml:").contains("ti: must be > 0 s");
    }

    @Test
    void an_illegal_argument_from_the_check_is_a_bug_and_is_not_caught() {
        assertThatThrownBy(() -> Audit.check(row(), CheckPolicy.DEFAULT, (loop, policy) -> {
            throw new IllegalArgumentException("a bug");
        })).isInstanceOf(IllegalArgumentException.class).hasMessage("a bug");
    }

    @Test
    void an_illegal_state_from_a_worker_ends_the_whole_audit() {
        assertThatThrownBy(() -> Audit.run(List.of(row()).iterator(), CheckPolicy.DEFAULT, 2, o -> {
            throw new IllegalStateException("a bug while rendering");
        }, (o, r) -> { })).isInstanceOf(IllegalStateException.class).hasMessage("a bug while rendering");
    }
}

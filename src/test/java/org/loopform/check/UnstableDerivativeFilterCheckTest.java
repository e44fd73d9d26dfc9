// source: Wittenmark, Astrom and Arzen, Computer Control: An Overview, IFAC Professional Brief, 2002, Table 3
package org.loopform.check;

import static org.assertj.core.api.Assertions.assertThat;

import java.net.URISyntaxException;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.io.LoopFileReader;

/**
 * A target whose own derivative filter is unstable: the forward difference puts the filter pole at
 * 1 - h/Tf (Wittenmark, Astrom and Arzen 2002, Table 3), here 1 - 1.75092 / 0.134637 = -12.0. The
 * loop HUNT-001 (invented; src/test/python/hunt_false_pass.py, whose numpy eigenvalues find the sampled
 * loop unstable) once stopped the check with an internal error: the filter state grew twelvefold each
 * scan to infinity and the output became NaN. The check must finish and fail the loop.
 */
@DisplayName("A target with an unstable derivative filter")
class UnstableDerivativeFilterCheckTest {

    @Test
    void is_checked_to_the_end_and_fails() throws URISyntaxException {
        Path file = Path.of(UnstableDerivativeFilterCheckTest.class.getResource("hunt/hunt-001.yaml").toURI());
        CheckResult result = LoopCheck.run(LoopFileReader.readOne(file, file.toString()), CheckPolicy.DEFAULT);
        assertThat(result.targetStability().isStable()).isFalse();
        assertThat(result.verdict()).isEqualTo(Verdict.FAIL);
        assertThat(result.findings()).anySatisfy(f -> {
            assertThat(f.topic()).isEqualTo(Topic.DISCRETIZATION);
            assertThat(f.severity()).isEqualTo(Severity.FAIL);
        });
    }
}

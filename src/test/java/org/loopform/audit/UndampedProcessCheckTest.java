package org.loopform.audit;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.loopform.analysis.Stability;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import org.loopform.check.Verdict;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.LoopFileReader;

/**
 * A process with an undamped mode, {@code P(s) = 1/(s^2 + 1)} (invented), has open-loop poles on the
 * imaginary axis at +-i, exactly at a point of any decade grid (1 rad/s). Hand derivations:
 *
 * <ul>
 *   <li>design loop, proportional only, kc = 0.5: the characteristic polynomial is
 *       {@code s^2 + 1 + 0.5 = s^2 + 1.5}, roots {@code +-i sqrt(1.5)}: on the axis, marginal
 *       (Astrom and Murray, Feedback Systems, 2008, ch. 9: a closed-loop pole on the axis neither
 *       settles nor runs away);</li>
 *   <li>target loop at h = 0.1 s: the zero-order-hold equivalent of {@code 1/(s^2 + 1)} is
 *       {@code (1 - cos h)(z + 1) / (z^2 - 2 cos h z + 1)} (Astrom and Wittenmark, Computer-Controlled
 *       Systems, 3rd ed., 1997, ch. 2, table of zero-order-hold equivalents - from memory; it follows
 *       from {@code (1 - z^-1) Z{(1 - cos t)}}), so the closed loop is
 *       {@code z^2 + (k (1 - cos h) - 2 cos h) z + 1 + k (1 - cos h)}. Its roots are a complex pair
 *       (discriminant negative for k = 0.5, h = 0.1) whose product is {@code 1 + k (1 - cos h)} &gt; 1:
 *       both outside the unit circle, |z| = sqrt(1 + 0.5 (1 - cos 0.1)) = 1.0012482.</li>
 * </ul>
 * Such a loop must fail and must not stop the check with an internal error.
 */
@DisplayName("A loop check of a process with an undamped mode")
class UndampedProcessCheckTest {

    @TempDir
    Path dir;

    @Test
    void a_proportional_loop_on_an_undamped_mode_is_marginal_as_designed_and_unstable_as_sampled() throws IOException {
        Path file = Files.writeString(dir.resolve("loop.yaml"), "tag: XIC-901\n"
                + "process: {model: tf, num: [1], den: [1, 0, 1]}\n"
                + "tuning: {form: ideal, kc: 0.5, ti: 0, td: 0}\n"
                + "target: {form: ideal, scan: 0.1 s}\nranges: {pv: 0..100, output: 0..100}\n");
        CheckResult r = LoopCheck.run(LoopFileReader.readOne(file, file.toString()), CheckPolicy.DEFAULT);

        assertThat(r.designStability().verdict()).isEqualTo(Stability.MARGINAL);
        assertThat(r.targetStability().verdict()).isEqualTo(Stability.UNSTABLE);
        double expected = Math.sqrt(1 + 0.5 * (1 - Math.cos(0.1)));
        assertThat(r.targetStability().largestPoleMagnitude().getAsDouble()).isCloseTo(expected, within(1e-6));
        assertThat(r.verdict()).isEqualTo(Verdict.FAIL);
    }
}

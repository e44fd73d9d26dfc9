// plumbing: the stability walk's seed points merged from ascending runs, against the JDK's sort (an implementation outside the project)
package org.loopform.analysis;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Arrays;
import java.util.Random;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

@DisplayName("The stability walk's seed points")
class SeedMergeTest {

    /**
     * Ascending runs of random lengths (some empty, some with repeated values) merged into one array
     * are the array {@link Arrays#sort(double[])} makes of the same values, element for element.
     */
    @Test
    void merged_runs_are_what_the_library_sort_makes_of_them() {
        Random random = new Random(20261203);
        for (int trial = 0; trial < 500; trial++) {
            int runs = 1 + random.nextInt(6);
            int[] starts = new int[runs];
            double[] values = new double[200];
            int size = 0;
            for (int r = 0; r < runs; r++) {
                starts[r] = size;
                int length = random.nextInt(trial % 7 == 0 ? 3 : 30);
                double t = random.nextDouble() * Math.PI;
                for (int k = 0; k < length; k++) {
                    values[size++] = t;
                    t += random.nextInt(4) == 0 ? 0.0 : random.nextDouble() * 0.3;
                }
            }
            double[] expected = Arrays.copyOf(values, size);
            Arrays.sort(expected);

            assertThat(SampledStability.mergeRuns(values, size, starts, runs)).containsExactly(expected);
        }
    }

    /** The walk sorts only points that are not in order already: either way it walks the sorted points. */
    @Test
    void a_walk_finds_points_in_order_or_not() {
        assertThat(ArgumentWalk.ascending(new double[] {0.0, 0.5, 0.5, 3.0})).isTrue();
        assertThat(ArgumentWalk.ascending(new double[] {0.0, 0.5, 0.4})).isFalse();
        // the order Arrays.sort gives signed zeros and NaN: -0.0 before 0.0, NaN last
        assertThat(ArgumentWalk.ascending(new double[] {0.0, -0.0})).isFalse();
        assertThat(ArgumentWalk.ascending(new double[] {Double.NaN, 1.0})).isFalse();
        assertThat(ArgumentWalk.ascending(new double[] {1.0, Double.NaN})).isTrue();
    }
}

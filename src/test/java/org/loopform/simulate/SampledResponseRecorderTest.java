// plumbing: no published source needed (source: none); it checks how responses are stored
package org.loopform.simulate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

@DisplayName("A recorded response")
class SampledResponseRecorderTest {

    private static SampledResponse threeSamples() {
        SampledResponse.Recorder r = SampledResponse.recorder(3, 0.1);
        r.add(50, 40);
        r.add(51, 41);
        r.add(52.5, 42);
        return r.toResponse();
    }

    @Test
    void gives_sample_k_the_time_k_times_the_step() {
        SampledResponse response = threeSamples();

        assertThat(response.size()).isEqualTo(3);
        assertThat(response.timeSeconds(2)).isEqualTo(2 * 0.1);
        assertThat(response.timesSeconds()).containsExactly(0.0, 0.1, 2 * 0.1);
        assertThat(response.processValuesPercent()).containsExactly(50.0, 51.0, 52.5);
        assertThat(response.controllerOutputsPercent()).containsExactly(40.0, 41.0, 42.0);
    }

    @Test
    void equals_the_same_samples_given_one_by_one() {
        SampledResponse given = SampledResponse.of(new double[] {0.0, 0.1, 2 * 0.1}, new double[] {50, 51, 52.5},
                new double[] {40, 41, 42});

        assertThat(threeSamples()).isEqualTo(given).hasSameHashCodeAs(given);
        assertThat(threeSamples().toString()).isEqualTo(given.toString());
    }

    @Test
    void rejects_a_value_that_is_not_finite() {
        SampledResponse.Recorder r = SampledResponse.recorder(2, 1.0);
        r.add(50, 40);
        r.add(Double.NaN, 40);

        assertThatThrownBy(r::toResponse)
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("process value at sample 1");
    }

    @Test
    void hands_its_samples_over_once_and_only_when_complete() {
        SampledResponse.Recorder partial = SampledResponse.recorder(3, 1.0);
        partial.add(50, 40);
        assertThatThrownBy(partial::toResponse).hasMessageContaining("recorded 1 of 3");

        SampledResponse.Recorder r = SampledResponse.recorder(2, 1.0);
        r.add(50, 40);
        r.add(51, 40);
        r.toResponse();
        assertThatThrownBy(r::toResponse).hasMessageContaining("already");
    }

    @Test
    void needs_two_samples_and_a_positive_step() {
        assertThatThrownBy(() -> SampledResponse.recorder(1, 1.0)).hasMessageContaining("(got 1)");
        assertThatThrownBy(() -> SampledResponse.recorder(2, 0.0)).hasMessageContaining("(got 0.0 s)");
    }

    @Test
    void between_scans_gives_each_scan_the_same_sub_instants_and_ends_at_a_scan_instant() {
        SampledResponse.Recorder r = SampledResponse.recorder(2, 5.0, new double[] {0.0, 1.0, 3.0});
        for (int i = 0; i < 7; i++) {
            r.add(50 + i, 40 + i / 3);
        }
        SampledResponse response = r.toResponse();

        assertThat(response.timesSeconds()).containsExactly(0.0, 1.0, 3.0, 5.0, 6.0, 8.0, 10.0);
        assertThat(response.controllerOutputsPercent()).containsExactly(40, 40, 40, 41, 41, 41, 42);
    }

    @Test
    void between_scans_refuses_sub_instants_that_do_not_start_at_0_or_leave_the_scan() {
        assertThatThrownBy(() -> SampledResponse.recorder(2, 5.0, new double[] {0.5, 1.0}))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("start at 0 s");
        assertThatThrownBy(() -> SampledResponse.recorder(2, 5.0, new double[] {0.0, 5.0}))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("below the scan time");
    }

    /** Three samples on 1 s recorded, then held to ten: the last seven repeat the third. */
    static SampledResponse heldTail() {
        SampledResponse.Recorder r = SampledResponse.recorder(10, 1.0);
        r.add(50, 40);
        r.add(55, 45);
        r.add(58, 47);
        r.holdRemaining();
        return r.toResponse();
    }

    @Test
    void a_held_tail_repeats_the_last_sample_recorded_to_the_end() {
        SampledResponse held = heldTail();

        assertThat(held.size()).isEqualTo(10);
        assertThat(held.heldFrom()).isEqualTo(3);
        assertThat(held.processValuePercent(9)).isEqualTo(58.0);
        assertThat(held.controllerOutputPercent(7)).isEqualTo(47.0);
        assertThat(held.processValuesPercent()).containsExactly(50, 55, 58, 58, 58, 58, 58, 58, 58, 58);
        assertThat(held.controllerOutputsPercent()).containsExactly(40, 45, 47, 47, 47, 47, 47, 47, 47, 47);
        assertThatThrownBy(() -> held.processValuePercent(10)).isInstanceOf(IndexOutOfBoundsException.class);
    }

    @Test
    void a_held_tail_equals_the_same_samples_given_one_by_one() {
        double[] t = new double[10];
        for (int k = 0; k < 10; k++) {
            t[k] = k;
        }
        SampledResponse given = SampledResponse.of(t, new double[] {50, 55, 58, 58, 58, 58, 58, 58, 58, 58},
                new double[] {40, 45, 47, 47, 47, 47, 47, 47, 47, 47});

        assertThat(heldTail()).isEqualTo(given).hasSameHashCodeAs(given);
        assertThat(given.heldFrom()).isEqualTo(10);
    }

    @Test
    void a_tail_is_held_only_after_a_sample() {
        SampledResponse.Recorder r = SampledResponse.recorder(4, 1.0);
        assertThatThrownBy(r::holdRemaining).isInstanceOf(IllegalStateException.class).hasMessageContaining("record one");
    }
}

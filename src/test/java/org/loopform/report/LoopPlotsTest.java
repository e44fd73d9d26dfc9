// plumbing: no published source needed (source: none); it checks how a held output is drawn
package org.loopform.report;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;
import org.loopform.simulate.SampledResponse;

class LoopPlotsTest {

    @Test
    void a_held_output_is_drawn_as_steps_at_the_scan_instants() {
        // two scans of 5 s sampled at 0, 2.5 s: the output changes only at the scan instants
        SampledResponse.Recorder r = SampledResponse.recorder(2, 5.0, new double[] {0.0, 2.5});
        double[] outputs = {60, 60, 55, 55, 52};
        for (double u : outputs) {
            r.add(50, u);
        }
        SvgPlot.Series s = LoopPlots.held("target", r.toResponse(), LoopPlots.TARGET, false);

        assertThat(s.x()).containsExactly(0, 5, 5, 10, 10);
        assertThat(s.y()).containsExactly(60, 60, 55, 55, 52);
    }
}

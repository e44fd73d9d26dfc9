package org.loopform.identify;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.loopform.identify.Records.Move;

/**
 * The fitted response drawn by {@code fit --plot} and used for its residuals, against analytic step responses
 * (inverse Laplace transforms of the first- and second-order models and the integrator: common practice).
 */
class FittedResponseTest {

    @Test
    void fopdt_response_to_two_steps_matches_the_analytic_one() {
        // noise-free record of FOPDT K = 2, T = 20 s, L = 5 s (Records: analytic superposed step responses,
        // Seborg, Edgar & Mellichamp 2004, ch. 5); the response of the same model must follow it to the grid's error
        PlantRecord r = Records.make(s -> Records.fopdtStep(2, 20, 5, s), new Move[] {new Move(20, 10),
                new Move(120, -6)}, 1, 240, 0, 0, 0, 1);
        ModelFit f = new ModelFit(ModelKind.FOPDT, 2, 1.9, 2.1, 20, 19, 21, Double.NaN, Double.NaN, Double.NaN, 5, 4, 6,
                0, 1, 0);
        double[] y = FittedResponse.of(r, f);
        for (int k = 0; k < r.size(); k++) {
            assertThat(y[k]).as("t = %s s", r.time(k)).isCloseTo(r.pv(k), within(0.05));
        }
    }

    @Test
    void the_baseline_follows_the_record() {
        // the same record shifted by 7 % of span: the response shifts with it (the baseline is the mean residual)
        PlantRecord r = Records.make(s -> Records.fopdtStep(2, 20, 5, s), new Move[] {new Move(20, 10)}, 1, 200, 0, 0, 0,
                1);
        double[] t = new double[r.size()];
        double[] u = new double[r.size()];
        double[] pv = new double[r.size()];
        for (int k = 0; k < r.size(); k++) {
            t[k] = r.time(k);
            u[k] = r.output(k);
            pv[k] = r.pv(k) + 7;
        }
        ModelFit f = new ModelFit(ModelKind.FOPDT, 2, 1.9, 2.1, 20, 19, 21, Double.NaN, Double.NaN, Double.NaN, 5, 4, 6,
                0, 1, 0);
        double[] a = FittedResponse.of(r, f);
        double[] b = FittedResponse.of(new PlantRecord(t, u, pv), f);
        assertThat(b[0] - a[0]).isCloseTo(7, within(1e-9));
        assertThat(b[b.length - 1] - a[a.length - 1]).isCloseTo(7, within(1e-9));
    }
}

package org.roseate.digital;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class StationaryStateTest {
    private static SosDesign sos(JsonNode rows) {
        List<Biquad> list = new ArrayList<>();
        for (JsonNode r : rows) {
            list.add(new Biquad(r.get(0).asDouble(), r.get(1).asDouble(), r.get(2).asDouble(),
                    r.get(4).asDouble(), r.get(5).asDouble()));
        }
        return new SosDesign(list, 1000);
    }

    /**
     * The covariance against scipy.linalg.solve_discrete_lyapunov on state-space matrices that scipy's
     * own sosfilt produced (src/test/python/gen_stationary_state.py). Tolerance 1e-9 of the largest
     * variance: scipy solves through a bilinear map to the continuous equation, which loses about
     * cond ≈ 1/(1 − |pole|) = 1e4 times machine precision on the slow case.
     */
    @Test
    void covarianceMatchesScipy() {
        JsonNode ref = Reference.load("stationary_state.json");
        for (JsonNode c : ref.get("cases")) {
            StationaryState st = StationaryState.of(sos(c.get("sos")));
            JsonNode p = c.get("covariance");
            assertEquals(p.size(), st.dimension(), c.get("name").asText());
            double scale = 0;
            for (int i = 0; i < p.size(); i++) {
                scale = Math.max(scale, Math.abs(p.get(i).get(i).asDouble()));
            }
            for (int i = 0; i < p.size(); i++) {
                for (int j = 0; j < p.size(); j++) {
                    assertEquals(p.get(i).get(j).asDouble(), st.covariance(i, j), 1e-9 * scale,
                            c.get("name").asText() + " P[" + i + "][" + j + "]");
                }
            }
        }
    }

    /**
     * Draws have the covariance they should: 20000 seeded draws, each variance within 5 standard
     * errors (the sample variance of a normal value has relative standard error √(2/n) = 1 %).
     */
    @Test
    void drawsHaveTheStationaryVariance() {
        JsonNode ref = Reference.load("stationary_state.json");
        JsonNode c = ref.get("cases").get(1);
        StationaryState st = StationaryState.of(sos(c.get("sos")));
        SplittableRandom rnd = new SplittableRandom(5);
        int n = 20000;
        double[] sum = new double[st.dimension()];
        double[] x = new double[st.dimension()];
        for (int k = 0; k < n; k++) {
            st.draw(rnd::nextGaussian, 2.0, x);
            for (int i = 0; i < x.length; i++) {
                sum[i] += x[i] * x[i];
            }
        }
        for (int i = 0; i < x.length; i++) {
            double expected = 4.0 * st.covariance(i, i);
            assertEquals(expected, sum[i] / n, 5 * Math.sqrt(2.0 / n) * expected, "state " + i);
        }
    }

    @Test
    void unstableCascadeIsRefused() {
        SosDesign unstable = new SosDesign(List.of(new Biquad(1, 0, 0, -1.0, 0)), 1000);
        assertThrows(IllegalArgumentException.class, () -> StationaryState.of(unstable));
    }
}

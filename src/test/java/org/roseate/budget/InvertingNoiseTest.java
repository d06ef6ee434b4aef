package org.roseate.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.roseate.circuit.Design;

/**
 * The inverting amplifier's output noise in closed form (common practice, e.g. any op-amp noise
 * application note): e_o² = en²(1 + Rf/Rin)² + in²·Rf² + 4kTRf + 4kTRin·(Rf/Rin)², with the current
 * noise of the + input (on gnd) giving nothing, and the source d²(1 + fc/f)·(Rf/Rin)².
 */
class InvertingNoiseTest {
    private static final double K = 1.380649e-23;

    @Test
    void eachTermMatchesTheClosedForm() {
        double rin = 10e3;
        double rf = 100e3;
        double en = 10e-9;
        double in = 1e-12;
        double fce = 100;
        double fci = 200;
        Design d = BudgetFixtures.inverting("10k", "100k",
                "\"enVPerRtHz\": 10e-9, \"inAPerRtHz\": 1e-12, \"enCornerHz\": 100, \"inCornerHz\": 200",
                "\"source\": {\"densityVPerRtHz\": 1e-6, \"flickerCornerHz\": 50}, \"temperatureC\": 25,");
        NoiseBudget b = NoiseBudget.of(d, "t");
        assertEquals(List.of("source", "R1", "R2", "U1 en", "U1 in"), b.contributorNames());
        double t = 298.15;
        double g = rf / rin;
        for (double hz : new double[] {3, 47, 100, 1000, 20000}) {
            double[] per = new double[5];
            double total = b.evaluate(hz, per, null);
            double[] want = {
                1e-12 * (1 + 50 / hz) * g * g,
                4 * K * t * rin * g * g,
                4 * K * t * rf,
                en * en * (1 + fce / hz) * (1 + g) * (1 + g),
                in * in * (1 + fci / hz) * rf * rf,
            };
            double sum = 0;
            for (int i = 0; i < 5; i++) {
                // rounding only: the nodal solve of a 2-unknown system
                assertEquals(want[i], per[i], want[i] * 1e-12, b.contributorNames().get(i) + " at " + hz + " Hz");
                sum += want[i];
            }
            assertEquals(sum, total, sum * 1e-12);
        }
    }

    @Test
    void resistorsInsideBranchesAreEachCounted() {
        // Rf = R2 + R3 in series (each its own generator, powers adding to 4kT(R2+R3)), Rin = R1 || R4
        // (each seen through the divider Z_P/Z_i = R4/(R1+R4) and R1/(R1+R4) respectively).
        Design d = BudgetFixtures.parse("{\"name\": \"n\", \"stages\": [{\"kind\": \"inverting\", "
                + "\"input\": \"R1(10k) || R4(40k)\", \"feedback\": \"R2(60k) + R3(40k)\"}]}");
        NoiseBudget b = NoiseBudget.of(d, "t");
        double[] per = new double[b.contributorNames().size()];
        b.evaluate(1000, per, null);
        double kt4 = 4 * K * 298.15;
        double rin = 8e3;
        double g = 100e3 / rin;
        List<String> n = b.contributorNames();
        assertEquals(kt4 * 60e3, per[n.indexOf("R2")], kt4 * 60e3 * 1e-12);
        assertEquals(kt4 * 40e3, per[n.indexOf("R3")], kt4 * 40e3 * 1e-12);
        double r1 = kt4 * 10e3 * Math.pow(40.0 / 50, 2) * g * g;
        double r4 = kt4 * 40e3 * Math.pow(10.0 / 50, 2) * g * g;
        assertEquals(r1, per[n.indexOf("R1")], r1 * 1e-12);
        assertEquals(r4, per[n.indexOf("R4")], r4 * 1e-12);
        // together: 4kT·(R1||R4)·g², the Thévenin resistance's noise (Nyquist)
        assertEquals(kt4 * rin * g * g, r1 + r4, kt4 * rin * g * g * 1e-12);
    }
}

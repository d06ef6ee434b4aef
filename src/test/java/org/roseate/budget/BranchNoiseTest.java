package org.roseate.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.roseate.circuit.NetworkParser;

/**
 * The impedance-tree transfer of each resistor's noise to its branch's terminals, checked with
 * Nyquist's theorem for a passive two-terminal network (Nyquist, Phys. Rev. 32, 110, 1928): the
 * open-circuit noise of the whole network is 4kT·Re Z, so Σ_k R_k·|G_k|² = Re Z_b.
 */
class BranchNoiseTest {

    @ParameterizedTest
    @ValueSource(strings = {
        "R1(10k)",
        "R1(10k) + C1(10n)",
        "R1(100k) || (R2(10k) + C1(22n))",
        "(R1(4k7) || C1(100n)) + (R2(22k) || (R3(1k) + L1(10m)) || C2(1n))",
        "((R1(1k) + R2(2k2)) || (R3(3k3) + C1(47n) + (R4(10k) || C2(4n7)))) || R5(100k)",
    })
    void resistorNoisePowersAddUpToTheRealPartOfTheBranchImpedance(String expression) {
        BranchNoise bn = BranchNoise.compile(NetworkParser.parse(expression));
        int n = bn.size();
        double[] zr = new double[n];
        double[] zi = new double[n];
        double[] gr = new double[n];
        double[] gi = new double[n];
        for (double hz : new double[] {0.7, 20, 333, 1590, 7000, 48000}) {
            bn.evaluate(2 * Math.PI * hz, zr, zi, gr, gi);
            double sum = 0;
            for (int k = 0; k < bn.resistorCount(); k++) {
                int t = bn.resistorNode(k);
                sum += bn.resistorOhms(k) * (gr[t] * gr[t] + gi[t] * gi[t]);
            }
            // rounding in a few complex divisions
            assertEquals(zr[n - 1], sum, Math.abs(zr[n - 1]) * 1e-12, expression + " at " + hz + " Hz");
        }
    }
}

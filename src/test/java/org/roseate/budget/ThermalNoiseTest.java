package org.roseate.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.roseate.bands.BandFraction;
import org.roseate.circuit.Design;

/** Resistor thermal noise: the handbook figure, and kT/C for a passive RC low-pass. */
class ThermalNoiseTest {

    @Test
    void oneKiloohmAt25CIs4Point06NanovoltsPerRootHertz() {
        // Handbook value 4.06 nV/√Hz for 1 kΩ at 25 °C (the figure issue 13 names; from memory it is
        // also the usual op-amp application-note figure); quoted to 3 digits, so ±0.005 nV/√Hz.
        assertEquals(4.06e-9, Thermal.resistorDensityVPerRtHz(1000, 25), 0.005e-9);
    }

    @Test
    void aLoneResistorToGroundGivesItsOwnDensityAtAnyTemperature() {
        // A divider whose series part is R1 and shunt a large capacitor: at low frequency the output
        // is R1's open-circuit noise √(4kTR) (Nyquist 1928), T = 273.15 + 60 K, k exact (SI 2019).
        Design d = BudgetFixtures.rcLowPass("1k", "1n", "\"temperatureC\": 60,");
        double hz = 1; // RC corner 159 kHz: |H|² = 1 − 4e-11 at 1 Hz
        double want = 4 * 1.380649e-23 * 333.15 * 1000;
        assertEquals(want, NoiseBudget.of(d, "t").outputDensitySquared(hz), want * 1e-9);
    }

    @Test
    void rcLowPassIntegratesToKtOverC() {
        // Nyquist: the thermal noise on C through R is kT/C over all frequencies, independent of R.
        // Over [lo, hi] exactly (kT/C)·(2/π)·(atan(hi/fc) − atan(lo/fc)), fc = 1/(2πRC).
        double r = 10e3;
        double c = 10e-9;
        Design d = BudgetFixtures.rcLowPass("10k", "10n", "");
        double fc = 1 / (2 * Math.PI * r * c);
        double lo = fc * 1e-5;
        double hi = fc * 1e6;
        BudgetResult res = NoiseBudget.of(d, "t").compute(lo, hi, new double[0], BandFraction.OCTAVE);
        double kTc = 1.380649e-23 * 298.15 / c;
        double exact = kTc * 2 / Math.PI * (Math.atan(hi / fc) - Math.atan(lo / fc));
        // quadrature accuracy claimed in Quadrature's Javadoc: 1e-9 relative
        assertEquals(exact, res.outputRmsV() * res.outputRmsV(), exact * 1e-9);
        // the truncated tails are below 2e-5 of kT/C (1 − (2/π)(atan 1e6 − atan 1e-5))
        assertEquals(kTc, res.outputRmsV() * res.outputRmsV(), kTc * 2e-5);
        assertEquals(List.of("R1"), res.contributors().stream().map(BudgetResult.Contributor::name).toList());
        assertEquals(0, res.sourceRmsV());
    }
}

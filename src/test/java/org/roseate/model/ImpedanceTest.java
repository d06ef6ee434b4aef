package org.roseate.model;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.roseate.circuit.NetworkParser;

/** Impedances of single parts and simple combinations. */
class ImpedanceTest {

    private static double[] z(String expr, double hz) {
        ImpedanceProgram p = ImpedanceProgram.compile(NetworkParser.parse(expr));
        double[] re = new double[p.stackDepth()];
        double[] im = new double[p.stackDepth()];
        double[] out = new double[2];
        p.evaluate(2 * Math.PI * hz, re, im, out);
        return out;
    }

    /**
     * Capacitive reactance Xc = 1/(2πfC) at handbook points (e.g. the ARRL Handbook's reactance
     * tables; values here are the formula evaluated): 1 µF at 1 kHz = 159.155 Ω, 100 nF at 1 kHz
     * = 1591.55 Ω, 10 nF at 10 kHz = 1591.55 Ω, 1 nF at 100 kHz = 1591.55 Ω, 4.7 µF at 50 Hz =
     * 677.255 Ω.
     */
    @ParameterizedTest
    @CsvSource({"C1(1u), 1000, 159.155", "C1(100n), 1000, 1591.55", "C1(10n), 10000, 1591.55",
        "C1(1n), 100000, 1591.55", "C1(4u7), 50, 677.255"})
    void capacitorReactance(String expr, double hz, double ohms) {
        double[] z = z(expr, hz);
        assertEquals(0, z[0], 0);
        // Handbook values are quoted to 6 significant figures: tolerance 5e-6 relative.
        assertEquals(-ohms, z[1], 5e-6 * ohms);
    }

    /** Inductive reactance XL = 2πfL (handbook formula): 10 mH at 1 kHz = 62.832 Ω. */
    @Test
    void inductorReactance() {
        assertEquals(62.8319, z("L1(10m)", 1000)[1], 1e-4);
    }

    /** Series and parallel rules, common practice: resistances add in series, conductances in parallel. */
    @Test
    void seriesAndParallelRules() {
        assertEquals(15000, z("R1(10k) + R2(4k7) + R3(300)", 1)[0], 1e-9);
        assertEquals(10e3 * 4.7e3 / 14.7e3, z("R1(10k) || R2(4k7)", 1)[0], 1e-9);
        // Capacitors in parallel add: 10n || 22n reacts like 32n.
        assertEquals(z("C3(32n)", 1234)[1], z("C1(10n) || C2(22n)", 1234)[1], 1e-9);
        // Capacitors in series: 1/(1/C1 + 1/C2); 10n + 10n reacts like 5n.
        assertEquals(z("C3(5n)", 777)[1], z("C1(10n) + C2(10n)", 777)[1], 1e-9);
        // R in series with C at f = 1/(2πRC): |Z| = R·√2 at 45° (common practice).
        double[] rc = z("R1(1k) + C1(1u)", 1 / (2 * Math.PI * 1e-3));
        assertEquals(1000, rc[0], 1e-9);
        assertEquals(-1000, rc[1], 1e-9);
        // R parallel C at its corner: Z = R/2 − jR/2.
        double[] rpc = z("R1(1k) || C1(1u)", 1 / (2 * Math.PI * 1e-3));
        assertEquals(500, rpc[0], 1e-9);
        assertEquals(-500, rpc[1], 1e-9);
    }
}

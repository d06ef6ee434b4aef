package org.roseate.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.roseate.circuit.DesignReader;

/**
 * Circuit stages against an independent nodal solver: src/test/python/gen_circuit_mna.py
 * (textbook modified nodal analysis on elementary parts with internal nodes, numpy.linalg.solve),
 * whose output is src/test/resources/reference/model/circuits.json.
 */
class CircuitAgainstNumpyTest {

    static Stream<Arguments> cases() throws IOException {
        JsonNode root;
        try (InputStream in = CircuitAgainstNumpyTest.class.getResourceAsStream("/reference/model/circuits.json")) {
            root = new ObjectMapper().readTree(in);
        }
        List<Arguments> list = new ArrayList<>();
        for (JsonNode c : root.get("cases")) {
            list.add(Arguments.of(c.get("name").asText(), c));
        }
        return list.stream();
    }

    static CircuitModel model(String stageJson) {
        return CircuitModel.of(DesignReader.parse("{\"name\": \"t\", \"stages\": [" + stageJson + "]}", "t"), "t");
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("cases")
    void responseMatchesTheIndependentSolver(String name, JsonNode c) {
        CircuitModel m = model(c.get("stage").toString());
        JsonNode hz = c.get("hz");
        for (int i = 0; i < hz.size(); i++) {
            Complex h = m.response(hz.get(i).asDouble());
            double db = 20 * Math.log10(h.abs());
            double deg = Math.toDegrees(h.arg());
            double refDeg = c.get("deg").get(i).asDouble();
            double dDeg = Math.IEEEremainder(deg - refDeg, 360);
            // The bounds: 0.001 dB and 0.01°, far above the double-precision agreement of
            // two exact solvers (~1e-10 dB), so a wrong stamp cannot hide.
            assertEquals(c.get("db").get(i).asDouble(), db, 1e-3, name + " dB at " + hz.get(i) + " Hz");
            assertEquals(0, dDeg, 1e-2, name + " phase at " + hz.get(i) + " Hz");
        }
    }

    private static double[] logGrid(int n, double lo, double hi) {
        double[] hz = new double[n];
        for (int i = 0; i < n; i++) {
            hz[i] = lo * Math.pow(hi / lo, i / (n - 1.0));
        }
        return hz;
    }

    private static void assertZpkEqualsNodal(String name, CircuitModel m) {
        Zpk zpk = m.zpk();
        double worst = 0;
        double worstHz = 0;
        for (double hz : logGrid(1000, 0.1, 1e5)) {
            Complex h = m.response(hz);
            double err = zpk.evaluateAtHz(hz).minus(h).abs() / h.abs();
            if (err > worst) {
                worst = err;
                worstHz = hz;
            }
        }
        // The bound: 1e-9 relative at 1000 log-spaced points (0.1 Hz to 100 kHz here).
        assertTrue(worst <= 1e-9, name + ": zpk differs from the nodal response by " + worst + " at " + worstHz + " Hz");
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("cases")
    void zpkFormEqualsTheNodalResponse(String name, JsonNode c) {
        assertZpkEqualsNodal(name, model(c.get("stage").toString()));
    }

    static Stream<Path> presets() throws IOException {
        try (Stream<Path> s = Files.list(Path.of("presets"))) {
            return s.filter(p -> p.toString().endsWith(".json")).sorted().toList().stream();
        }
    }

    /** Every preset, each stage in its circuit form: the zpk of the interpolated N/D equals the nodal response. */
    @ParameterizedTest(name = "{0}")
    @MethodSource("presets")
    void presetsInCircuitFormKeepTheirZpk(Path preset) {
        var d = DesignReader.read(preset);
        for (int s = 0; s < d.stages().size(); s++) {
            var one = new org.roseate.circuit.Design("t", "", List.of(d.stages().get(s).asCircuit()), java.util.Map.of());
            assertZpkEqualsNodal(preset + " stage " + (s + 1), CircuitModel.of(one, "t"));
        }
    }

    /**
     * Multiple-feedback low-pass: R1 from the input to node a, R2 from a to the output, R3 from a
     * to the inverting input m, C1 from a to ground, C2 from m to the output. Closed form (from
     * the circuit's two node equations, as in TI's "Op Amps for Everyone", chapter on active
     * filters; recalled from memory and re-derived by hand): H(0) = −R2/R1,
     * ω0² = 1/(R2·R3·C1·C2), ω0/Q = (1/R1 + 1/R2 + 1/R3)/C1.
     */
    @Test
    void multipleFeedbackLowPassMatchesClosedForm() {
        double r1 = 22e3;
        double r2 = 47e3;
        double r3 = 15e3;
        double c1 = 1e-6;
        double c2 = 47e-9;
        CircuitModel m = model("{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\","
                + "\"branches\": {\"in a\": \"R1(22k)\", \"a out\": \"R2(47k)\", \"a m\": \"R3(15k)\", \"a gnd\": \"C1(1u)\","
                + " \"m out\": \"C2(47n)\"}, \"opamps\": {\"U1\": {\"plus\": \"gnd\", \"minus\": \"m\", \"output\": \"out\"}}}");
        double w0 = 1 / Math.sqrt(r2 * r3 * c1 * c2);
        double q = w0 * c1 / (1 / r1 + 1 / r2 + 1 / r3);
        List<Root> poles = m.poles();
        assertEquals(1, poles.size(), poles.toString());
        // 1e-6 relative: the bound.
        assertEquals(w0 / (2 * Math.PI), poles.get(0).hz(), 1e-6 * w0 / (2 * Math.PI));
        assertEquals(q, poles.get(0).q(), 1e-6 * q);
        assertEquals(-r2 / r1, m.zpk().evaluate(Complex.ZERO).re(), 1e-9 * r2 / r1);
    }

    /**
     * DC and high-frequency limits of a passive circuit (common practice: capacitors open at DC,
     * short far above every corner). Bridged-T with load: at DC the capacitors are open, so
     * H(0) = R3/(R1 + R3); far above, C1 and C2 short the input to the output, H → 1.
     */
    @Test
    void passiveLimitsAtDcAndHighFrequency() {
        CircuitModel m = model("{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\", \"branches\": {\"in out\": \"R1(10k)\","
                + " \"in t\": \"C1(22n)\", \"t out\": \"C2(22n)\", \"t gnd\": \"R2(1k)\", \"out gnd\": \"R3(100k)\"}}");
        double dc = 100e3 / 110e3;
        // At 1 mHz the capacitors' 7 GΩ reactance leaves H within 1e-6 of its DC limit.
        assertEquals(dc, m.response(1e-3).abs(), 1e-6);
        assertEquals(dc, m.zpk().evaluate(Complex.ZERO).re(), 1e-9);
        // At 1 GHz their reactance is 7 mΩ against 1 kΩ to ground: H within 1e-4 of 1.
        assertEquals(1.0, m.response(1e9).abs(), 1e-4);
        // Series R1, shunt C2 ‖ R2 ladder: the pink-ladder case at Nyquist of 48 kHz stays finite and below DC.
        CircuitModel lad = model("{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\", \"branches\": {\"in a\": \"R1(10k)\","
                + " \"a gnd\": \"R2(91k) || (R3(27k) + C1(47n))\", \"a out\": \"R6(22k)\", \"out gnd\": \"C5(10n) || R7(100k)\"}}");
        // DC: R1, R2, R6, R7 only: v_a = (R2 ‖ (R6 + R7))/(R1 + R2 ‖ (R6 + R7)), v_out = v_a·R7/(R6 + R7).
        double r2 = 91e3;
        double r67 = 122e3;
        double par = r2 * r67 / (r2 + r67);
        double dcLad = par / (10e3 + par) * 100e3 / 122e3;
        assertEquals(dcLad, lad.zpk().evaluate(Complex.ZERO).re(), 1e-9 * dcLad);
        assertTrue(lad.response(24000).abs() < dcLad);
    }
}

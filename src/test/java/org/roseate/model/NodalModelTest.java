package org.roseate.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.roseate.circuit.CircuitStage;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.circuit.Stage;

/** The nodal model against closed forms and against the older kinds' own formulas. */
class NodalModelTest {

    static Stream<Path> presets() throws Exception {
        try (Stream<Path> s = Files.list(Path.of("presets"))) {
            return s.filter(p -> p.toString().endsWith(".json")).sorted().toList().stream();
        }
    }

    private static double[] denseGrid() {
        double[] hz = new double[2001];
        for (int i = 0; i < hz.length; i++) {
            hz[i] = 0.1 * Math.pow(10, 6.0 * i / (hz.length - 1));
        }
        return hz;
    }

    /**
     * Each older stage kind equals its circuit form: two evaluations of the same equations by
     * different arithmetic (the closed form H = −Zf/Zin … on the impedance tree, and LU on the
     * nodal matrix), so they agree to rounding; 1e-12 relative is the bound, about 5000
     * ulps, room for the LU's few dozen operations on entries near 1.
     */
    @ParameterizedTest(name = "{0}")
    @MethodSource("presets")
    void olderKindsEqualTheirCircuitForms(Path preset) {
        Design d = DesignReader.read(preset);
        double[] hz = denseGrid();
        for (int s = 0; s < d.stages().size(); s++) {
            Stage st = d.stages().get(s);
            if (st instanceof CircuitStage) {
                continue;
            }
            StageModel fast = new StageModel(st, s + 1, CircuitModel.OMEGA_SCALE_RAD_PER_S, "t");
            NodalModel nodal = NodalModel.of(st.asCircuit(), s + 1, "t");
            double[] re = new double[hz.length];
            double[] im = new double[hz.length];
            nodal.response(hz, re, im, nodal.workspace());
            double[][] scratch = {new double[fast.scratchDepth()], new double[fast.scratchDepth()], new double[2], new double[2]};
            double[] h = new double[2];
            double worst = 0;
            for (int i = 0; i < hz.length; i++) {
                fast.evaluate(2 * Math.PI * hz[i], scratch, null, h);
                worst = Math.max(worst, Math.hypot(re[i] - h[0], im[i] - h[1]) / Math.hypot(h[0], h[1]));
            }
            assertTrue(worst <= 1e-12, preset + " stage " + (s + 1) + ": worst relative difference " + worst);
        }
    }

    private static CircuitModel circuit(String stageJson) {
        return CircuitModel.of(DesignReader.parse("{\"name\": \"t\", \"stages\": [" + stageJson + "]}", "t"), "t");
    }

    /**
     * Unity-gain follower-type low-pass (Sallen and Key). Closed form, any active-filter text
     * (e.g. Van Valkenburg, Analog Filter Design, or TI's application report SLOA024):
     * ω0² = 1/(R1·R2·C1·C2), Q = √(R1·R2·C1·C2)/(C2·(R1 + R2)), C2 the capacitor to ground,
     * C1 the one from the middle node to the output.
     */
    @Test
    void sallenKeyPolePairMatchesClosedForm() {
        double r1 = 68e3;
        double r2 = 33e3;
        double c1 = 470e-9;
        double c2 = 220e-9;
        CircuitModel m = circuit("{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\","
                + "\"branches\": {\"in a\": \"R1(68k)\", \"a b\": \"R2(33k)\", \"a out\": \"C1(470n)\", \"b gnd\": \"C2(220n)\"},"
                + "\"opamps\": {\"U1\": {\"plus\": \"b\", \"minus\": \"out\", \"output\": \"out\"}}}");
        double f0 = 1 / (2 * Math.PI * Math.sqrt(r1 * r2 * c1 * c2));
        double q = Math.sqrt(r1 * r2 * c1 * c2) / (c2 * (r1 + r2));
        List<Root> poles = m.poles();
        assertEquals(1, poles.size(), poles.toString());
        // 1e-6 relative: the bound; the roots come from interpolated coefficients.
        assertEquals(f0, poles.get(0).hz(), 1e-6 * f0);
        assertEquals(q, poles.get(0).q(), 1e-6 * q);
        assertEquals(1.0, m.response(0.01).abs(), 1e-6);
    }

    /**
     * The README's table of second-order sections states f0 and Q for each example; each row is
     * read from README.md, solved, and its stated figures must be the model's pole pair rounded as
     * printed (so the table cannot drift from the program).
     */
    @Test
    void readmeSectionTableIsTrue() throws Exception {
        java.util.regex.Pattern row = java.util.regex.Pattern.compile(
                "^\\| [^|]+ \\| `(\\{.*\\})`, `(\\{.*\\})` \\| ([0-9.]+) (k?)Hz, ([0-9.]+) \\|$");
        int rows = 0;
        for (String line : Files.readAllLines(Path.of("README.md"))) {
            java.util.regex.Matcher m = row.matcher(line);
            if (!m.matches()) {
                continue;
            }
            rows++;
            CircuitModel c = circuit("{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\", \"branches\": "
                    + m.group(1) + ", \"opamps\": " + m.group(2) + "}");
            List<Root> pair = c.poles().stream().filter(r -> !r.isReal()).toList();
            assertEquals(1, pair.size(), line);
            String f0 = m.group(3);
            double scale = m.group(4).isEmpty() ? 1 : 1000;
            int decimals = f0.contains(".") ? f0.length() - f0.indexOf('.') - 1 : 0;
            assertEquals(Double.parseDouble(f0), pair.get(0).hz() / scale, 0.5 * Math.pow(10, -decimals) + 1e-12, line);
            String q = m.group(5);
            int qDecimals = q.length() - q.indexOf('.') - 1;
            assertEquals(Double.parseDouble(q), pair.get(0).q(), 0.5 * Math.pow(10, -qDecimals) + 1e-12, line);
        }
        assertEquals(4, rows, "the README's four second-order sections");
    }

    /**
     * The adjoint API for noise budgets, against circuit-theory results (common practice, any
     * circuits text): a current into the middle of a divider R1 (from the driven input) and R2 sees
     * R1 ‖ R2; a voltage in series with the plus input of an inverting or non-inverting stage sees
     * the noise gain 1 + Rf/Rg; a branch's impedance is its network's.
     */
    @Test
    void adjointTransfersMatchCircuitTheory() {
        CircuitModel div = circuit("{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\","
                + " \"branches\": {\"in out\": \"R1(10k)\", \"out gnd\": \"R2(30k)\"}}");
        NodalModel m = div.stages().get(0).nodal().orElseThrow();
        NodalModel.Solution s = m.solve(1000);
        // 1e-12 relative: one small LU in double precision.
        assertEquals(7500, s.currentToOutputOhms("out", "gnd").re(), 7500 * 1e-12);
        assertEquals(0, s.currentToOutputOhms("out", "gnd").im(), 1e-9);
        assertEquals(0, s.currentToOutputOhms("in", "gnd").abs(), 1e-12, "the source holds the input node");
        assertEquals(0.75, s.output().re(), 1e-12);
        CircuitModel inv = circuit("{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\","
                + " \"branches\": {\"in m\": \"R1(10k)\", \"m out\": \"R2(47k)\"},"
                + " \"opamps\": {\"U1\": {\"plus\": \"gnd\", \"minus\": \"m\", \"output\": \"out\"}}}");
        NodalModel.Solution si = inv.stages().get(0).nodal().orElseThrow().solve(1000);
        assertEquals(1 + 47.0 / 10, si.opampPlusVoltageToOutput("U1").re(), 1e-12 * 5.7);
        assertEquals(-4.7, si.output().re(), 1e-12 * 4.7);
        // A current into the inverting node flows through R2 only: v_out = −R2·J.
        assertEquals(-47e3, si.currentToOutputOhms("m", "gnd").re(), 47e3 * 1e-12);
        NodalModel lad = circuit("{\"kind\": \"circuit\", \"input\": \"in\", \"output\": \"out\","
                + " \"branches\": {\"in out\": \"R1(10k)\", \"out gnd\": \"R2(1k) + C1(1u)\"}}").stages().get(0).nodal().orElseThrow();
        Complex z = lad.branchImpedance("out gnd", 100);
        assertEquals(1000, z.re(), 1e-9);
        assertEquals(-1 / (2 * Math.PI * 100 * 1e-6), z.im(), 1e-9);
    }
}

package org.roseate.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Path;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.roseate.bands.BandFraction;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;

/**
 * Two multi-stage designs (three older-kind stages with a nested branch network; a two-op-amp
 * circuit stage and an inverting stage) against an independent nodal noise computation:
 * src/test/python/gen_budget_reference.py (numpy) expands every series–parallel network into
 * single parts with explicit nodes, joins the stages by ideal followers, and solves one flat
 * netlist per frequency, with each resistor's noise as a Norton current across it.
 */
class NodalNoiseReferenceTest {
    private static final Path DIR = Path.of("src/test/resources/reference/budget");
    /**
     * Per-contributor densities: two double-precision LU solves of the same equations; seen
     * differences are near 1e-12, and 1e-8 allows for condition numbers up to about 1e7.
     */
    private static final double DENSITY_REL = 1e-8;
    /**
     * Range integrals: Java's Gauss–Legendre quadrature against the script's trapezoid rule on
     * 400 001 points in ln f (its error is below 1e-9 for these responses), plus the above.
     */
    private static final double INTEGRAL_REL = 1e-7;

    private static JsonNode reference(String file) throws Exception {
        JsonNode root = new ObjectMapper().readTree(DIR.resolve("nodal_noise.json").toFile());
        for (JsonNode d : root.get("designs")) {
            if (d.get("file").asText().equals(file)) {
                return d;
            }
        }
        throw new AssertionError("no reference for " + file);
    }

    @ParameterizedTest
    @ValueSource(strings = {"reference-a.json", "reference-b.json"})
    void densitiesPerContributorMatchTheFlatNetlist(String file) throws Exception {
        JsonNode ref = reference(file);
        NoiseBudget b = NoiseBudget.of(DesignReader.read(DIR.resolve(file)), file);
        List<String> names = b.contributorNames();
        double[] per = new double[names.size()];
        for (JsonNode p : ref.get("points")) {
            double hz = p.get("hz").asDouble();
            b.evaluate(hz, per, null);
            JsonNode c = p.get("contributors");
            assertEquals(c.size(), names.size(), "contributor count: " + names);
            Iterator<Map.Entry<String, JsonNode>> it = c.fields();
            while (it.hasNext()) {
                Map.Entry<String, JsonNode> e = it.next();
                int i = names.indexOf(e.getKey());
                assertTrue(i >= 0, "contributor " + e.getKey() + " missing from " + names);
                double want = e.getValue().asDouble();
                assertEquals(want, per[i], want * DENSITY_REL, file + " " + e.getKey() + " at " + hz + " Hz");
            }
        }
    }

    @ParameterizedTest
    @ValueSource(strings = {"reference-a.json", "reference-b.json"})
    void rangeFiguresMatchTheFlatNetlist(String file) throws Exception {
        JsonNode ref = reference(file);
        Design d = DesignReader.read(DIR.resolve(file));
        BudgetResult r = NoiseBudget.of(d, file).compute(ref.get("loHz").asDouble(), ref.get("hiHz").asDouble(),
                new double[] {1000}, BandFraction.OCTAVE);
        for (String key : List.of("outputRmsV", "sourceRmsV", "selfNoiseRmsV", "rateRmsVPerS")) {
            double got = switch (key) {
                case "outputRmsV" -> r.outputRmsV();
                case "sourceRmsV" -> r.sourceRmsV();
                case "selfNoiseRmsV" -> r.selfNoiseRmsV();
                default -> r.rateRmsVPerS();
            };
            double want = ref.get(key).asDouble();
            assertEquals(want, got, want * INTEGRAL_REL, file + " " + key);
        }
        JsonNode cs = ref.get("contributors");
        assertEquals(cs.size(), r.contributors().size());
        for (BudgetResult.Contributor c : r.contributors()) {
            double want = cs.get(c.name()).asDouble();
            assertEquals(want, c.rmsV(), want * INTEGRAL_REL, file + " contributor " + c.name());
        }
        for (int i = 1; i < r.contributors().size(); i++) {
            assertTrue(r.contributors().get(i - 1).rmsV() >= r.contributors().get(i).rmsV(), "ranked, largest first");
        }
        JsonNode ws = ref.get("watched");
        assertEquals(ws.size(), r.stages().size());
        for (int i = 0; i < ws.size(); i++) {
            JsonNode w = ws.get(i);
            BudgetResult.StageReading s = r.stages().get(i);
            assertEquals(w.get("stage").asInt(), s.stage());
            assertEquals(w.get("node").asText(), s.node());
            assertEquals(w.get("rmsV").asDouble(), s.rmsV(), w.get("rmsV").asDouble() * INTEGRAL_REL, file + " stage rms " + i);
            assertEquals(w.get("slewRmsVPerUs").asDouble(), s.slewRmsVPerUs(), w.get("slewRmsVPerUs").asDouble() * INTEGRAL_REL,
                    file + " stage slew " + i);
        }
    }
}

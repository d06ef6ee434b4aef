package org.roseate.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;

/**
 * The exact model against scipy.signal.freqs and tf2zpk on circuits built independently in
 * numpy by the series/parallel rules. Reference: src/test/python/gen_model_freqs.py (its output,
 * with scipy's version, is src/test/resources/reference/model/freqs.json).
 */
class ModelAgainstScipyTest {

    static Stream<Arguments> cases() throws IOException {
        JsonNode root;
        try (InputStream in = ModelAgainstScipyTest.class.getResourceAsStream("/reference/model/freqs.json")) {
            root = new ObjectMapper().readTree(in);
        }
        List<Arguments> list = new ArrayList<>();
        for (JsonNode c : root.get("cases")) {
            list.add(Arguments.of(c.get("name").asText(), c));
        }
        return list.stream();
    }

    private static CircuitModel model(JsonNode c) {
        String json = "{\"name\": \"case\", \"stages\": " + c.get("stages").toString() + "}";
        Design d = DesignReader.parse(json, "case");
        return CircuitModel.of(d, "case");
    }

    private static double[] doubles(JsonNode arr) {
        double[] d = new double[arr.size()];
        for (int i = 0; i < d.length; i++) {
            d[i] = arr.get(i).asDouble();
        }
        return d;
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("cases")
    void treeResponseMatchesScipyFreqs(String name, JsonNode c) {
        double[] hz = doubles(c.get("hz"));
        double[] re = doubles(c.get("re"));
        double[] im = doubles(c.get("im"));
        double[] gotRe = new double[hz.length];
        double[] gotIm = new double[hz.length];
        model(c).response(hz, gotRe, gotIm);
        for (int i = 0; i < hz.length; i++) {
            double err = Math.hypot(gotRe[i] - re[i], gotIm[i] - im[i]) / Math.hypot(re[i], im[i]);
            // Both sides are double-precision evaluations of the same function; 1e-9 relative
            // leaves room for the polynomial (scipy) versus tree (Roseate) rounding paths.
            assertTrue(err < 1e-9, name + " at " + hz[i] + " Hz: relative error " + err);
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("cases")
    void zpkAndRationalFormsAgreeWithTheTree(String name, JsonNode c) {
        CircuitModel m = model(c);
        Zpk zpk = m.zpk();
        RationalFunction r = m.rational();
        for (double hz : doubles(c.get("hz"))) {
            Complex tree = m.response(hz);
            Complex fromZpk = zpk.evaluateAtHz(hz);
            Complex fromRational = r.evaluateAtHz(hz);
            // Roots are found to ~1e-12 relative; 1e-8 covers error growth through the products.
            assertTrue(fromZpk.minus(tree).abs() <= 1e-8 * tree.abs(), name + " zpk at " + hz + " Hz");
            assertTrue(fromRational.minus(tree).abs() <= 1e-9 * tree.abs(), name + " rational at " + hz + " Hz");
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("cases")
    void polesAndZerosMatchScipyTf2zpk(String name, JsonNode c) {
        CircuitModel m = model(c);
        assertRootsHz(name + " poles", doubles(c.get("polesHz")), m.zpk().poles());
        assertRootsHz(name + " zeros", doubles(c.get("zerosHz")), m.zpk().zeros());
    }

    private static void assertRootsHz(String what, double[] expectedSorted, List<Complex> roots) {
        double[] got = roots.stream().mapToDouble(z -> z.abs() / (2 * Math.PI)).sorted().toArray();
        assertEquals(expectedSorted.length, got.length, what + " count");
        for (int i = 0; i < got.length; i++) {
            // numpy.roots (companion-matrix eigenvalues) and Aberth iteration agree to ~1e-10
            // relative on these well-separated roots; 1e-7 allows for the op-amp's wide spread.
            assertEquals(expectedSorted[i], got[i], 1e-7 * Math.max(1, expectedSorted[i]), what + " #" + i);
        }
    }
}

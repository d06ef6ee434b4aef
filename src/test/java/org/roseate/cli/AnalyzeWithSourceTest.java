package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code analyze --with-source}: levels of source × circuit. */
class AnalyzeWithSourceTest {

    @Test
    void flatDividerReadsTheSourceShapeInClosedForm(@TempDir Path dir) throws Exception {
        // A resistive divider (H = 1/2) driven by S ∝ 1 + fc/f: each band's level is
        // 10·log10(¼·((hi − lo) + fc·ln(hi/lo))) (elementary integral).
        Path f = dir.resolve("flat.json");
        Files.writeString(f, "{\"name\": \"flat\", \"source\": {\"densityVPerRtHz\": 1e-4, \"flickerCornerHz\": 300}, "
                + "\"stages\": [{\"kind\": \"divider\", \"series\": \"R1(10k)\", \"shunt\": \"R2(10k)\"}]}");
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("analyze", f.toString(), "--with-source", "--format", "json",
                "--freqs", "30,3000");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        assertTrue(j.get("withSource").asBoolean());
        for (JsonNode b : j.get("bands")) {
            double lo = b.get("lowHz").asDouble();
            double hi = b.get("highHz").asDouble();
            double want = 10 * Math.log10(0.25 * ((hi - lo) + 300 * Math.log(hi / lo)));
            // BandPower's quadrature: exact to far below 1e-6 dB for smooth shapes (its Javadoc)
            assertEquals(want, b.get("db").asDouble(), 1e-6, "band " + b.get("nominalHz"));
        }
        // response magnitude |H|·√(1 + fc/f) at 30 Hz: ½·√11
        assertEquals(20 * Math.log10(0.5 * Math.sqrt(11)), j.get("response").get(0).get("db").asDouble(), 1e-9);
        AnalyzeCommandTest.Run plain = AnalyzeCommandTest.run("analyze", f.toString(), "--format", "json", "--freqs", "30");
        assertEquals(20 * Math.log10(0.5), new ObjectMapper().readTree(plain.out()).get("response").get(0).get("db").asDouble(), 1e-9);
    }

    @Test
    void withSourceNeedsASource() {
        AnalyzeCommandTest.Run r = AnalyzeCommandTest.run("analyze", "presets/bench-pink.json", "--with-source");
        assertEquals(2, r.status());
        assertTrue(r.err().startsWith("roseate: bench-pink.json: --with-source needs a \"source\""), r.err());
    }
}

package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import javax.imageio.ImageIO;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.value.ESeries;

/** fit, tolerance, compare and parts through the command line. */
class DesignToolsCommandsTest {
    static AnalyzeCommandTest.Run run(String... args) {
        return AnalyzeCommandTest.run(args);
    }

    @Test
    void compareAgreesWithSeparateAnalyzeRuns() throws Exception {
        String a = "presets/bench-pink.json";
        String b = "presets/passive-pink.json";
        ObjectMapper m = new ObjectMapper();
        for (String bands : new String[] {"octave", "third"}) {
            var c = run("compare", a, b, "--format", "json", "--bands", bands);
            assertEquals(0, c.status(), c.err());
            JsonNode cols = m.readTree(c.out()).get("columns");
            assertEquals(2, cols.size());
            String[] files = {a, b};
            for (int k = 0; k < 2; k++) {
                var an = run("analyze", files[k], "--format", "json", "--bands", bands);
                JsonNode aj = m.readTree(an.out());
                JsonNode col = cols.get(k);
                // reference: the analyze command's own output for the same file
                assertEquals(aj.get("slopeDbPerOctave").asDouble(), col.get("slopeDbPerOctave").asDouble(), 1e-12);
                assertEquals(aj.get("maxDeviationDb").asDouble(), col.get("maxDeviationDb").asDouble(), 1e-12);
                assertEquals(aj.get("maxBandDeviationDb").asDouble(), col.get("maxBandDeviationDb").asDouble(), 1e-12);
                JsonNode ab = aj.get("bands");
                JsonNode cb = col.get("bands");
                assertEquals(ab.size(), cb.size());
                int ref = -1;
                for (int i = 0; i < ab.size(); i++) {
                    assertEquals(ab.get(i).get("db").asDouble(), cb.get(i).get("db").asDouble(), 1e-12);
                    assertEquals(ab.get(i).get("deviationDb").asDouble(), cb.get(i).get("deviationDb").asDouble(), 1e-12);
                    if (ab.get(i).get("nominalHz").asDouble() == 1000) {
                        ref = i;
                    }
                }
                double ref1k = ab.get(ref).get("db").asDouble();
                for (int i = 0; i < ab.size(); i++) {
                    assertEquals(ab.get(i).get("db").asDouble() - ref1k, cb.get(i).get("levelRe1kHzDb").asDouble(), 1e-12);
                }
                // ripple = max − min deviation = twice the centred peak (by the centring's definition)
                assertEquals(2 * col.get("maxBandDeviationDb").asDouble(), col.get("rippleDb").asDouble(), 1e-12);
            }
        }
        var t = run("compare", a, b);
        assertEquals(0, t.status(), t.err());
        assertTrue(t.out().contains("ripple"));
        var csv = run("compare", a, b, "--format", "csv", "--bands", "octave");
        assertEquals(1 + 2 * 10, csv.out().split("\n").length);
    }

    @Test
    void plotsFromAnalyzeCompareAndTolerance(@TempDir Path dir) throws Exception {
        Path png = dir.resolve("a.png");
        var r = run("analyze", "presets/bench-pink.json", "--plot", png.toString());
        assertEquals(0, r.status(), r.err());
        BufferedImage img = ImageIO.read(png.toFile());
        assertEquals(1000, img.getWidth());
        assertEquals(700, img.getHeight());
        Path svg = dir.resolve("c.svg");
        r = run("compare", "presets/bench-pink.json", "presets/wide-pink.json", "--plot", svg.toString());
        assertEquals(0, r.status(), r.err());
        assertEquals("svg", parseXml(svg.toFile()).getDocumentElement().getNodeName());
        Path tol = dir.resolve("t.png");
        r = run("tolerance", "presets/bench-pink.json", "--trials", "50", "--plot", tol.toString());
        assertEquals(0, r.status(), r.err());
        assertEquals(1000, ImageIO.read(tol.toFile()).getWidth());
        r = run("analyze", "presets/bench-pink.json", "--plot", png.toString());
        assertEquals(2, r.status(), "an existing plot is not replaced without --force");
        r = run("analyze", "presets/bench-pink.json", "--plot", dir.resolve("x.gif").toString());
        assertEquals(2, r.status());
        assertTrue(r.err().contains(".png or .svg"), r.err());
    }

    @Test
    void toleranceJsonAndTable() throws Exception {
        var r = run("tolerance", "presets/bench-pink.json", "--trials", "200", "--format", "json", "--distribution", "gaussian", "--seed", "3");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        assertEquals(31, j.get("bands").size());
        assertEquals(10, j.get("sensitivities").size(), "9 parts and the op-amp U1");
        double y = j.get("yield").asDouble();
        // reference: binomial standard error √(y(1−y)/N)
        assertEquals(Math.sqrt(y * (1 - y) / 200), j.get("yieldStandardError").asDouble(), 1e-12);
        var again = run("tolerance", "presets/bench-pink.json", "--trials", "200", "--format", "json", "--distribution", "gaussian", "--seed", "3", "--threads", "1");
        assertEquals(r.out(), again.out(), "same seed, same output, whatever the thread count");
        var t = run("tolerance", "presets/bench-pink.json", "--trials", "100");
        assertTrue(t.out().contains("Held exact (no tolerance given): U1"), t.out());
        assertTrue(t.out().contains("Sensitivity"));
        assertEquals("", t.err(), "no progress bar when stderr is not a terminal");
        assertEquals(2, run("tolerance", "presets/bench-pink.json", "--distribution", "cauchy").status());
        assertEquals(2, run("tolerance", "presets/bench-pink.json", "--limit", "-1dB").status());
    }

    @Test
    void fitWritesAStandardValueDesign(@TempDir Path dir) throws Exception {
        Path out = dir.resolve("fit.json");
        var r = run("fit", "--branches", "1", "--starts", "2", "--series-c", "E12", "-o", out.toString());
        assertEquals(0, r.status(), r.err());
        assertEquals("", r.err());
        assertTrue(r.out().contains("peak band deviation"), r.out());
        Design d = DesignReader.read(out);
        d.components().forEach(c -> assertTrue(
                (c.kind() == org.roseate.value.ComponentKind.RESISTOR ? ESeries.E24 : ESeries.E12).contains(c.value()), c.toString()));
        assertEquals(2, run("fit", "--branches", "1", "--starts", "1", "-o", out.toString()).status(), "exists without --force");
        assertEquals(0, run("fit", "--from", "presets/passive-pink.json", "--starts", "1", "--bands", "octave", "-o", out.toString(), "--force").status());
        assertEquals(DesignReader.read(Path.of("presets/passive-pink.json")).stages().get(0).networks().get("shunt").toExpression()
                .replaceAll("\\([^()]*\\)", "()"),
                DesignReader.read(out).stages().get(0).networks().get("shunt").toExpression().replaceAll("\\([^()]*\\)", "()"),
                "--from keeps the topology (values aside)");
        assertEquals(2, run("fit", "--series", "E25").status());
        assertEquals(2, run("fit", "--limits", "R=2M-1k").status());
        assertEquals(2, run("fit", "--branches", "0").status());
    }

    @Test
    void partsList() {
        var r = run("parts", "presets/wide-pink.json");
        assertEquals(0, r.status(), r.err());
        assertTrue(r.out().contains("C0G/NP0"));
        assertTrue(r.out().contains("metal film"));
        assertTrue(r.out().contains("R1"));
        assertEquals(2, run("parts", "nope.json").status());
    }

    /** Parses XML without fetching the SVG DTD from the network (the tests run offline). */
    static org.w3c.dom.Document parseXml(java.io.File f) throws Exception {
        DocumentBuilderFactory dbf = DocumentBuilderFactory.newInstance();
        dbf.setFeature("http://apache.org/xml/features/nonvalidating/load-external-dtd", false);
        return dbf.newDocumentBuilder().parse(f);
    }
}

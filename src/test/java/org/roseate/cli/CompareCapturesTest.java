package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code compare} with captures: a capture's column equals a separate {@code measure} run. */
class CompareCapturesTest {
    @TempDir
    Path dir;

    @Test
    void captureColumnAgreesWithMeasure() throws Exception {
        Path cap = dir.resolve("white.wav");
        assertEquals(0, AnalyzeCommandTest.run("render", "--source", "white", "-o", cap.toString(), "--seconds", "12",
                "--bits", "32f").status());
        var c = AnalyzeCommandTest.run("compare", "presets/bench-pink.json", cap.toString(), "--format", "json");
        assertEquals(0, c.status(), c.err());
        JsonNode cols = new ObjectMapper().readTree(c.out()).get("columns");
        assertEquals(2, cols.size());
        JsonNode capCol = cols.get(1);
        assertEquals("white.wav", capCol.get("name").asText());
        assertTrue(capCol.get("maxDeviationDb").isNull(), "a capture has no pointwise deviation");
        // The slope is the density's, as for designs: white noise is flat (its band levels rise 3.01 dB/octave).
        assertEquals(0, capCol.get("slopeDbPerOctave").asDouble(), 0.1);
        var m = AnalyzeCommandTest.run("measure", cap.toString(), "--format", "json");
        assertEquals(0, m.status(), m.err());
        JsonNode mj = new ObjectMapper().readTree(m.out());
        assertEquals(mj.get("slopeDbPerOctave").asDouble(), capCol.get("slopeDbPerOctave").asDouble(), 1e-12);
        for (int i = 0; i < 31; i++) {
            assertEquals(mj.get("bands").get(i).get("db").asDouble(), capCol.get("bands").get(i).get("db").asDouble(), 1e-12);
            assertEquals(mj.get("bands").get(i).get("deviationDb").asDouble(),
                    capCol.get("bands").get(i).get("deviationDb").asDouble(), 1e-12);
            // the capture column carries the measurement's ± per band (the same pipeline); designs have none
            assertEquals(mj.get("bands").get(i).get("uncertaintyDb").asDouble(),
                    capCol.get("bands").get(i).get("uncertaintyDb").asDouble(), 0.0);
            assertTrue(capCol.get("bands").get(i).get("uncertaintyDb").asDouble() > 0);
            assertTrue(cols.get(0).get("bands").get(i).get("uncertaintyDb") == null);
        }
        assertEquals(mj.get("slopeUncertaintyDbPerOctave").asDouble(), capCol.get("slopeUncertaintyDbPerOctave").asDouble(), 0.0);
        assertEquals(mj.get("maxBandDeviationUncertaintyDb").asDouble(), capCol.get("maxBandDeviationUncertaintyDb").asDouble(), 0.0);
        var t = AnalyzeCommandTest.run("compare", "presets/bench-pink.json", cap.toString());
        assertTrue(t.out().contains("±dB") && t.out().contains("± slope"), t.out());
        assertEquals(2, AnalyzeCommandTest.run("compare", "presets/bench-pink.json", dir.resolve("none.wav").toString()).status());
    }

    /** measure --plot writes a chart that decodes as PNG (javax.imageio, outside the project). */
    @Test
    void measurePlotIsWrittenAndDecodes() throws Exception {
        Path cap = dir.resolve("pink.wav");
        assertEquals(0, AnalyzeCommandTest.run("render", "presets/bench-pink.json", "-o", cap.toString(), "--seconds", "12").status());
        Path png = dir.resolve("bands.png");
        var m = AnalyzeCommandTest.run("measure", cap.toString(), "--against", "presets/bench-pink.json", "--plot", png.toString());
        assertEquals(0, m.status(), m.err());
        java.awt.image.BufferedImage img = javax.imageio.ImageIO.read(png.toFile());
        assertTrue(img != null && img.getWidth() > 100 && img.getHeight() > 100);
        java.nio.file.Files.copy(png, Path.of("target", "measure-plot-sample.png"), java.nio.file.StandardCopyOption.REPLACE_EXISTING);
        assertEquals(2, AnalyzeCommandTest.run("measure", cap.toString(), "--plot", dir.resolve("x.gif").toString()).status());
    }
}

package org.roseate.plot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import javax.imageio.ImageIO;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.io.OutputExistsException;
import org.roseate.plot.FrequencyChart.BandBars;
import org.roseate.plot.FrequencyChart.Curve;
import org.roseate.plot.FrequencyChart.Envelope;
import org.roseate.plot.FrequencyChart.Panel;

class ChartFilesTest {
    static FrequencyChart sample() {
        double[] hz = {20, 200, 2000, 20000};
        double[] db = {10, 0, -10, -20};
        double[] lo = {18, 180, 1800, 18000};
        double[] hi = {22, 220, 2200, 22000};
        double[] dev = {0.1, -0.2, 0.05, -0.1};
        double[] wl = {0.0, -0.3, 0.0, -0.2};
        double[] wh = {0.2, -0.1, 0.1, 0.0};
        Panel top = new Panel("Level (dB)", List.of(new Curve("a", hz, db, false), new Curve("target", hz, db, true)), List.of(), List.of());
        Panel bottom = new Panel("Deviation (dB)", List.of(), List.of(new BandBars("bands", lo, hi, dev, wl, wh)),
                List.of(new Envelope("5–95 %", hz, wl, dev, wh)));
        return new FrequencyChart("test", List.of(top, bottom));
    }

    @Test
    void pngDecodesAtTheRequestedSize(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("c.png");
        ChartFiles.write(sample(), f, 640, 480, false);
        assertTrue(Files.size(f) > 1000);
        BufferedImage img = ImageIO.read(f.toFile());
        assertEquals(640, img.getWidth());
        assertEquals(480, img.getHeight());
        assertThrows(OutputExistsException.class, () -> ChartFiles.write(sample(), f, 640, 480, false));
        ChartFiles.write(sample(), f, 300, 200, true);
        assertEquals(300, ImageIO.read(f.toFile()).getWidth());
    }

    @Test
    void svgParsesAsXml(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("c.SVG");
        ChartFiles.write(sample(), f, 800, 600, false);
        var doc = parseXml(f.toFile());
        assertEquals("svg", doc.getDocumentElement().getNodeName());
        assertTrue(Files.readString(f).contains("kHz"), "tick labels in kHz");
    }

    @Test
    void badNamesAndSizes(@TempDir Path dir) {
        assertThrows(IllegalArgumentException.class, () -> ChartFiles.write(sample(), dir.resolve("c.jpg"), 640, 480, false));
        assertThrows(IllegalArgumentException.class, () -> ChartFiles.write(sample(), dir.resolve("c.png"), 10, 480, false));
        assertThrows(IllegalArgumentException.class, () -> new Curve("x", new double[] {1, 2}, new double[] {1}, false));
        assertThrows(IllegalArgumentException.class, () -> new Curve("x", new double[] {0}, new double[] {1}, false));
    }

    @Test
    void aSeriesDrawnInTwoPanelsHasOneLegendEntry() {
        // compare draws each column twice (levels above, deviations below) under the same name
        double[] hz = {20, 200, 2000};
        double[] db = {1, 0, -1};
        Panel top = new Panel("Level", List.of(new Curve("A.json", hz, db, false), new Curve("B.json", hz, db, false)), List.of(), List.of());
        Panel bottom = new Panel("Deviation", List.of(new Curve("A.json", hz, db, false), new Curve("B.json", hz, db, false)), List.of(), List.of());
        var legend = ChartFiles.render(new FrequencyChart("two", List.of(top, bottom))).getPlot().getLegendItems();
        assertEquals(2, legend.getItemCount());
        assertEquals("A.json", legend.get(0).getLabel());
        assertEquals("B.json", legend.get(1).getLabel());
    }

    @Test
    void tickLabels() {
        assertEquals("20 Hz", FrequencyAxis.label(20));
        assertEquals("500 Hz", FrequencyAxis.label(500));
        assertEquals("1 kHz", FrequencyAxis.label(1000));
        assertEquals("20 kHz", FrequencyAxis.label(20000));
        assertEquals("0.5 Hz", FrequencyAxis.label(0.5));
    }

    /** Parses XML without fetching the SVG DTD from the network (the tests run offline). */
    static org.w3c.dom.Document parseXml(java.io.File f) throws Exception {
        DocumentBuilderFactory dbf = DocumentBuilderFactory.newInstance();
        dbf.setFeature("http://apache.org/xml/features/nonvalidating/load-external-dtd", false);
        return dbf.newDocumentBuilder().parse(f);
    }
}

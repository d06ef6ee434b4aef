package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import javafx.scene.Scene;
import javafx.scene.control.MenuItem;
import javafx.scene.layout.BackgroundFill;
import javafx.scene.paint.Color;
import javafx.stage.Stage;
import javafx.stage.Window;
import javax.imageio.ImageIO;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.io.TempDir;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;
import org.testfx.util.WaitForAsyncUtils;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

/**
 * The menu bar and chart export: SVG that an XML parser accepts and that holds one bar per band at
 * the band's value, PNG, never replacing a file unasked, recent files kept across sessions, the help
 * texts, and a focus ring that is not the error colour.
 */
@ExtendWith({HeadlessFx.class, ApplicationExtension.class})
class WindowMenusTest {
    @TempDir
    Path dir;
    final ScriptedPrompts prompts = new ScriptedPrompts();
    MainWindow window;
    Scene scene;
    Path preset;
    Path config;

    @Start
    void start(Stage stage) throws Exception {
        Files.createDirectories(dir.resolve("presets"));
        preset = dir.resolve("presets").resolve("bench-pink.json");
        Files.copy(RoseateWindowTest.PROJECT_PRESETS.resolve("bench-pink.json"), preset);
        config = dir.resolve("config");
        System.setProperty("roseate.configDir", config.toString());
        window = new MainWindow(prompts, dir);
        scene = window.show(stage);
    }

    @AfterEach
    void close() throws Exception {
        System.setProperty("roseate.configDir", "target/test-config");
        prompts.unsaved = Prompts.Unsaved.DISCARD;
        RoseateWindowTest.fxRun(() -> {
            window.design().flushIo();
            window.close();
        });
    }

    private void awaitDesignOk() throws Exception {
        RoseateWindowTest.await(() -> window.design().outcomeProperty().get() != null
                && window.design().outcomeProperty().get().ok() && window.design().bandChart().values().length > 0);
    }

    private static Document parse(Path svg) throws Exception {
        DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
        f.setNamespaceAware(true);
        return f.newDocumentBuilder().parse(svg.toFile()); // throws on XML that is not well-formed
    }

    private static List<Element> byClass(Document d, String tag, String cssClass) {
        List<Element> out = new ArrayList<>();
        NodeList nl = d.getElementsByTagNameNS("http://www.w3.org/2000/svg", tag);
        for (int i = 0; i < nl.getLength(); i++) {
            Element e = (Element) nl.item(i);
            if (List.of(e.getAttribute("class").split(" ")).contains(cssClass)) {
                out.add(e);
            }
        }
        return out;
    }

    private static double num(Element e, String attr) {
        return Double.parseDouble(e.getAttribute(attr));
    }

    @Test
    void bandChartSvgParsesAndHoldsEachBarAtItsValue() throws Exception {
        awaitDesignOk();
        BandChart chart = window.design().bandChart();
        double[] values = RoseateWindowTest.fx(chart::values);
        Path svg = dir.resolve("bands.svg");
        assertTrue(RoseateWindowTest.fx(() -> window.menus().chartExport().export(chart, svg)));
        Document d = parse(svg);
        assertEquals("svg", d.getDocumentElement().getLocalName());
        List<Element> bars = byClass(d, "rect", "bar");
        assertEquals(values.length, bars.size(), "one bar per band");
        // Each bar's height is |value| × (pixels per dB), the same factor for every bar; coordinates are
        // written to 0.01 px, so the factor agrees within 0.02 px / |value| (both edges rounded).
        double scale = 0;
        int best = 0;
        for (int i = 0; i < values.length; i++) {
            if (Math.abs(values[i]) > Math.abs(values[best])) {
                best = i;
            }
        }
        scale = num(bars.get(best), "height") / Math.abs(values[best]);
        assertTrue(scale > 0);
        double baseline = values[best] > 0 ? num(bars.get(best), "y") + num(bars.get(best), "height") : num(bars.get(best), "y");
        for (int i = 0; i < values.length; i++) {
            Element b = bars.get(i);
            assertEquals(Math.abs(values[i]) * scale, num(b, "height"), 0.03, "band " + i);
            double top = num(b, "y");
            if (values[i] > 0.01) {
                assertEquals(baseline, top + num(b, "height"), 0.02, "a positive bar stands on the zero line");
            } else if (values[i] < -0.01) {
                assertEquals(baseline, top, 0.02, "a negative bar hangs from the zero line");
            }
        }
        assertFalse(byClass(d, "text", "title").isEmpty());
        assertEquals(RoseateWindowTest.fx(chart::getTitle), byClass(d, "text", "title").get(0).getTextContent());
    }

    @Test
    void whiskersAndMarkersAreDrawnAndTheLineChartToo() throws Exception {
        awaitDesignOk();
        BandChart chart = RoseateWindowTest.fx(() -> {
            BandChart c = new BandChart("Measured & design <test>", "Level (dB)", "bands");
            c.show(List.of("100", "125", "160"), new double[] {-1.5, 0.5, 2}, new double[] {0.2, 0.3, Double.NaN},
                    new double[] {-1, 0.25, 1.75});
            return c;
        });
        Path svg = dir.resolve("whiskers.svg");
        assertTrue(RoseateWindowTest.fx(() -> window.menus().chartExport().export(chart, svg)));
        Document d = parse(svg);
        assertEquals(3, byClass(d, "rect", "bar").size());
        assertEquals(2, byClass(d, "line", "whisker").size(), "no whisker where the ± is unknown");
        assertEquals(4, byClass(d, "line", "whisker-cap").size());
        assertEquals(3, byClass(d, "line", "design-marker").size());
        assertEquals("Measured & design <test>", byClass(d, "text", "title").get(0).getTextContent(), "escaped and read back");

        Path line = dir.resolve("response.svg");
        assertTrue(RoseateWindowTest.fx(() -> window.menus().chartExport().export(window.design().responseChart(), line)));
        Document l = parse(line);
        List<Element> series = byClass(l, "polyline", "series");
        assertEquals(2, series.size(), "response and target line");
        assertEquals(RoseateWindowTest.DesignLimits.RESPONSE_POINTS, series.get(0).getAttribute("points").trim().split(" ").length);
    }

    @Test
    void pngExportAndNoSilentOverwrite() throws Exception {
        awaitDesignOk();
        BandChart chart = window.design().bandChart();
        Path png = dir.resolve("bands.png");
        assertTrue(RoseateWindowTest.fx(() -> window.menus().chartExport().export(chart, png)));
        BufferedImage img = ImageIO.read(png.toFile());
        assertTrue(img.getWidth() > 100 && img.getHeight() > 100);

        Path svg = dir.resolve("mine.svg");
        Files.writeString(svg, "the user's own file");
        prompts.replace = false;
        assertFalse(RoseateWindowTest.fx(() -> window.menus().chartExport().export(chart, svg)));
        assertEquals(1, prompts.replaceAsked);
        assertEquals("the user's own file", Files.readString(svg));
        assertFalse(RoseateWindowTest.fx(() -> window.menus().chartExport().export(chart, png)));
        assertEquals(2, prompts.replaceAsked, "PNG asks too");
        prompts.replace = true;
        assertTrue(RoseateWindowTest.fx(() -> window.menus().chartExport().export(chart, svg)));
        parse(svg);

        // File ▸ Export chart: the prompt's file, the view's first chart
        Path viaMenu = dir.resolve("menu.svg");
        prompts.files.add(viaMenu);
        RoseateWindowTest.fxRun(() -> window.menus().exportChart());
        assertTrue(Files.exists(viaMenu));
        parse(viaMenu);
    }

    @Test
    void recentFilesPersistAcrossSessions() throws Exception {
        awaitDesignOk();
        Path other = dir.resolve("passive-pink.json");
        Files.copy(RoseateWindowTest.PROJECT_PRESETS.resolve("passive-pink.json"), other);
        prompts.files.add(other);
        RoseateWindowTest.fxRun(() -> window.menus().open());
        RoseateWindowTest.await(() -> window.design().document().file().map(other::equals).orElse(false));
        prompts.files.add(preset);
        RoseateWindowTest.fxRun(() -> window.menus().open());
        RoseateWindowTest.await(() -> window.design().document().file().map(preset::equals).orElse(false));

        Path store = config.resolve(RecentFiles.FILE_NAME);
        assertTrue(Files.exists(store));
        RecentFiles next = new RecentFiles(store); // a later session reads the same list
        assertEquals(List.of(preset.toAbsolutePath(), other.toAbsolutePath()), next.list(), "newest first");
        List<String> items = RoseateWindowTest.fx(() -> window.menus().recentMenu().getItems().stream()
                .map(MenuItem::getText).filter(t -> t != null && t.contains("—")).toList());
        assertEquals(2, items.size());
        assertTrue(items.get(0).startsWith("bench-pink.json"));

        // opening from the list brings the file back and moves it first
        RoseateWindowTest.fxRun(() -> window.menus().openRecent(other.toAbsolutePath()));
        RoseateWindowTest.await(() -> window.design().document().file().map(f -> f.equals(other.toAbsolutePath())).orElse(false));
        assertEquals(other.toAbsolutePath(), new RecentFiles(store).list().get(0));
    }

    @Test
    void helpShowsTheSafetyNoteAndTheFocusRingIsNotTheErrorColour() throws Exception {
        awaitDesignOk();
        RoseateWindowTest.fxRun(() -> window.menus().show("Safety", HelpText.SAFETY));
        WaitForAsyncUtils.waitForFxEvents();
        assertTrue(RoseateWindowTest.fx(() -> Window.getWindows().stream().anyMatch(w -> w instanceof Stage s
                && s.getTitle().equals("Safety — Roseate"))));
        assertTrue(HelpText.SAFETY.contains(ListenView.CAUTION));
        List<String> help = RoseateWindowTest.fx(() -> window.menus().bar().getMenus().get(2).getItems().stream()
                .map(MenuItem::getText).toList());
        assertEquals(List.of("Keyboard shortcuts", "Safety: loud noise, tweeters and hearing", "What each reading means"), help);

        // A focused text field's background fills: the focus ring's colour is there, the error rose is not.
        // The tab is selected first, as a user does: a tab's content joins the scene when first selected.
        RoseateWindowTest.fxRun(() -> {
            window.tabs().getSelectionModel().select(4);
            window.tools().select("ABX test");
        });
        WaitForAsyncUtils.waitForFxEvents();
        List<Color> fills = RoseateWindowTest.fx(() -> {
            javafx.scene.control.TextField f = window.tools().abx().trials();
            f.requestFocus();
            f.applyCss();
            List<Color> c = new ArrayList<>();
            if (f.getBackground() != null) {
                for (BackgroundFill bf : f.getBackground().getFills()) {
                    if (bf.getFill() instanceof Color col) {
                        c.add(col);
                    }
                }
            }
            return c;
        });
        Color focus = Color.web("#2f6fd6");
        Color error = Color.web("#b0475a");
        assertTrue(fills.stream().anyMatch(c -> close(c, focus)), "focus ring drawn: " + fills);
        assertFalse(fills.stream().anyMatch(c -> close(c, error)), "no rose in the focus ring: " + fills);
    }

    private static boolean close(Color a, Color b) {
        return Math.abs(a.getRed() - b.getRed()) < 0.02 && Math.abs(a.getGreen() - b.getGreen()) < 0.02
                && Math.abs(a.getBlue() - b.getBlue()) < 0.02;
    }
}

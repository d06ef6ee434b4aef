package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import javafx.geometry.Bounds;
import javafx.scene.Node;
import javafx.scene.Scene;
import javafx.scene.chart.XYChart;
import javafx.stage.Stage;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.condition.EnabledIfEnvironmentVariable;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.io.TempDir;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;

/**
 * The live bench on the virtual sound card of {@code .ci/virtual-soundcard.sh}: the window plays the
 * design to the default output and measures the default input (the null sink's monitor) at the same
 * time, and the bars drawn on screen must follow the running average without the window being
 * resized. Runs only with ROSEATE_VIRTUAL_SOUNDCARD=1, as the other loopback tests.
 */
@ExtendWith({HeadlessFx.class, ApplicationExtension.class})
@EnabledIfEnvironmentVariable(named = "ROSEATE_VIRTUAL_SOUNDCARD", matches = "1")
class LiveBenchTest {
    /** How long the drawn bars are watched, ms (the ten seconds). */
    static final long WATCH_MS = 10_000;
    /** How often they are looked at, ms: faster than the analyzer's new segments (about 3 per second). */
    static final long SAMPLE_MS = 100;

    @TempDir
    Path dir;
    final ScriptedPrompts prompts = new ScriptedPrompts();
    MainWindow window;
    Scene scene;

    @Start
    void start(Stage stage) throws Exception {
        Path preset = dir.resolve("bench-pink.json");
        Files.copy(RoseateWindowTest.PROJECT_PRESETS.resolve("bench-pink.json"), preset);
        window = new MainWindow(prompts, dir);
        scene = window.show(stage);
    }

    @AfterEach
    void stopAudio() throws Exception {
        RoseateWindowTest.fxRun(() -> {
            window.measure().stop();
            window.listen().stop();
        });
    }

    /** Where each bar of the band chart is drawn, in scene coordinates (top and height per bar). */
    static double[] drawnBars(BandChart chart) {
        List<XYChart.Data<String, Number>> data = chart.bars().getData();
        double[] geometry = new double[2 * data.size()];
        for (int i = 0; i < data.size(); i++) {
            Node n = data.get(i).getNode();
            Bounds b = n == null ? null : n.localToScene(n.getBoundsInLocal());
            geometry[2 * i] = b == null ? Double.NaN : b.getMinY();
            geometry[2 * i + 1] = b == null ? Double.NaN : b.getHeight();
        }
        return geometry;
    }

    @Test
    void liveBarsKeepMovingWithoutAResize() throws Exception {
        RoseateWindowTest.await(() -> window.model() != null);
        prompts.caution = true;
        RoseateWindowTest.fxRun(() -> window.listen().start());
        RoseateWindowTest.await(() -> window.listen().playing());
        double width = RoseateWindowTest.fx(() -> window.stage().getWidth());
        double height = RoseateWindowTest.fx(() -> window.stage().getHeight());
        RoseateWindowTest.fxRun(() -> {
            window.tabs().getSelectionModel().select(2);
            window.measure().useInput();
            window.measure().start();
        });
        RoseateWindowTest.await(() -> window.measure().shown() != null);
        List<double[]> seen = new ArrayList<>();
        seen.add(RoseateWindowTest.fx(() -> drawnBars(window.measure().bandChart())));
        int changes = 0;
        long end = System.currentTimeMillis() + WATCH_MS;
        while (System.currentTimeMillis() < end) {
            Thread.sleep(SAMPLE_MS);
            double[] now = RoseateWindowTest.fx(() -> drawnBars(window.measure().bandChart()));
            if (!Arrays.equals(now, seen.get(seen.size() - 1))) {
                seen.add(now);
                changes++;
            }
        }
        assertNotNull(RoseateWindowTest.fx(() -> window.measure().shown()));
        assertTrue(RoseateWindowTest.fx(() -> window.stage().getWidth()) == width
                && RoseateWindowTest.fx(() -> window.stage().getHeight()) == height, "the window was not resized");
        assertTrue(changes >= 5, "the drawn bars changed " + changes + " times in " + WATCH_MS / 1000 + " s");
        RoseateWindowTest.snapshot(scene, "measure-live");
    }
}

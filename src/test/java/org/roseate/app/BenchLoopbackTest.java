package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import javafx.scene.Scene;
import javafx.stage.Stage;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.condition.EnabledIfEnvironmentVariable;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.measure.BandResult;
import org.roseate.measure.MeasureResult;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;

/**
 * The bench on the virtual sound card of {@code .ci/virtual-soundcard.sh}: its generator plays the
 * design to the default output, its analyzer reads the default input (the null sink's monitor), on
 * one screen. The drawn bars must follow the running average without a resize, and the reading's
 * difference from the design must lie within its ±. Runs only with ROSEATE_VIRTUAL_SOUNDCARD=1.
 */
@ExtendWith({HeadlessFx.class, ApplicationExtension.class})
@EnabledIfEnvironmentVariable(named = "ROSEATE_VIRTUAL_SOUNDCARD", matches = "1")
class BenchLoopbackTest {
    /** The level played, dBFS RMS: well above the card's 16-bit dither, well below clipping. */
    static final double LEVEL_DBFS = -20;

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
            window.bench().stop();
            window.design().flushIo();
            window.design().shutdown();
        });
    }

    @Test
    void playAndMeasureOnOneScreen() throws Exception {
        RoseateWindowTest.await(() -> window.model() != null);
        prompts.caution = true;
        BenchView bench = RoseateWindowTest.fx(() -> window.bench());
        RoseateWindowTest.fxRun(() -> {
            window.tabs().getSelectionModel().select(window.tabs().getTabs().size() - 1);
            bench.sourceBox().setValue(BenchView.Source.DESIGN_A);
            bench.levelSlider().setValue(LEVEL_DBFS);
            bench.play();
        });
        RoseateWindowTest.await(bench::playing);
        assertEquals(1, prompts.cautionAsked, "the caution is shown before the first playback");
        // the playback rises from silence over 1 s; the analysis starts once it is at its level
        Thread.sleep(1500);
        double width = RoseateWindowTest.fx(() -> window.stage().getWidth());
        double height = RoseateWindowTest.fx(() -> window.stage().getHeight());
        RoseateWindowTest.fxRun(bench::startCapture);
        RoseateWindowTest.await(() -> bench.shown() != null);
        List<double[]> seen = new ArrayList<>();
        seen.add(RoseateWindowTest.fx(() -> bench.levelsChart().drawnBarTops()));
        int changes = 0;
        long end = System.currentTimeMillis() + LiveBenchTest.WATCH_MS;
        while (System.currentTimeMillis() < end) {
            Thread.sleep(LiveBenchTest.SAMPLE_MS);
            double[] now = RoseateWindowTest.fx(() -> bench.levelsChart().drawnBarTops());
            if (!Arrays.equals(now, seen.get(seen.size() - 1))) {
                seen.add(now);
                changes++;
            }
        }
        assertTrue(RoseateWindowTest.fx(() -> window.stage().getWidth()) == width
                && RoseateWindowTest.fx(() -> window.stage().getHeight()) == height, "the window was not resized");
        assertTrue(changes >= 5, "the drawn bars changed " + changes + " times in " + LiveBenchTest.WATCH_MS / 1000 + " s");
        assertTrue(RoseateWindowTest.fx(bench::playing), "still playing");

        // hold freezes the drawing while the analysis goes on
        RoseateWindowTest.fxRun(() -> bench.holdButton().setSelected(true));
        MeasureResult held = RoseateWindowTest.fx(bench::shown);
        Thread.sleep(1500);
        assertTrue(RoseateWindowTest.fx(bench::shown) == held, "a held reading stays on show");

        MeasureResult r = held;
        double[] diff = RoseateWindowTest.fx(() -> bench.minusDesignChart().values());
        double[] sigma = RoseateWindowTest.fx(() -> bench.minusDesignChart().sigmas());
        int checked = 0;
        for (int i = 0; i < diff.length; i++) {
            BandResult b = r.bands().get(i);
            if (b.counted()) {
                // the same bound as the offline reading in BenchViewTest, with its reasons
                assertTrue(Math.abs(diff[i]) <= BenchViewTest.SIGMAS * sigma[i] + BenchViewTest.MODEL_DB,
                        String.format(Locale.ROOT, "%s Hz: %+.3f dB against ± %.3f after %d averages", b.band().label(),
                                diff[i], sigma[i], r.averages()));
                checked++;
            }
        }
        assertTrue(checked >= 25, checked + " counted bands");
        RoseateWindowTest.fxRun(() -> bench.holdButton().setSelected(false));

        RoseateWindowTest.fxRun(() -> bench.keepReading());
        assertEquals(1, RoseateWindowTest.fx(() -> bench.levelsChart().referenceCount()));
        // reset: the averaging starts again and the charts wait for the new reading
        RoseateWindowTest.fxRun(() -> bench.restartAnalysis("test"));
        assertEquals(0, RoseateWindowTest.fx(() -> bench.levelsChart().values().length));
        RoseateWindowTest.await(() -> bench.shown() != null);
        assertTrue(RoseateWindowTest.fx(bench::shown).secondsAnalysed() < r.secondsAnalysed(), "a fresh average after the reset");
        RoseateWindowTest.fxRun(() -> bench.levelsChart().hoverBand(17));
        RoseateWindowTest.snapshot(scene, "bench-live");
    }
}

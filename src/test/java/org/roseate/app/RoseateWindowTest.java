package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import javafx.scene.Scene;
import javafx.scene.input.KeyCode;
import javafx.stage.Stage;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.io.WavWriter;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;
import org.roseate.spectrum.BandLevel;
import org.testfx.api.FxRobot;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;
import org.testfx.util.WaitForAsyncUtils;

/**
 * The window end to end on the headless platform: open, edit, validate, save, measure, compare,
 * and a PNG of each view under target/ui-snapshots/.
 */
@ExtendWith({HeadlessFx.class, ApplicationExtension.class})
class RoseateWindowTest {
    static final Path PROJECT_PRESETS = Path.of("presets");
    static final Path SNAPSHOTS = Path.of("target", "ui-snapshots");

    @TempDir
    Path dir;
    final ScriptedPrompts prompts = new ScriptedPrompts();
    MainWindow window;
    Scene scene;
    Path preset;

    /** No autosave write may land in the temporary folder while JUnit removes it. */
    @AfterEach
    void stopAutosave() throws Exception {
        RoseateWindowTest.fxRun(() -> {
            window.design().flushIo();
            window.design().shutdown();
        });
    }

    @Start
    void start(Stage stage) throws Exception {
        Files.createDirectories(dir.resolve("presets"));
        preset = dir.resolve("presets").resolve("bench-pink.json");
        Files.copy(PROJECT_PRESETS.resolve("bench-pink.json"), preset);
        window = new MainWindow(prompts, dir);
        scene = window.show(stage);
    }

    static <T> T fx(Callable<T> c) throws Exception {
        return WaitForAsyncUtils.asyncFx(c).get(10, TimeUnit.SECONDS);
    }

    static void fxRun(Runnable r) throws Exception {
        WaitForAsyncUtils.asyncFx(r).get(10, TimeUnit.SECONDS);
    }

    static void await(Callable<Boolean> condition) throws Exception {
        WaitForAsyncUtils.waitFor(15, TimeUnit.SECONDS, () -> fx(condition));
    }

    private DesignView design() {
        return window.design();
    }

    private void awaitDesignOk() throws Exception {
        await(() -> design().outcomeProperty().get() != null && design().outcomeProperty().get().ok()
                && design().outcomeProperty().get().text().equals(design().editor().getText()));
    }

    @Test
    void opensThePresetAndDrawsItsCurves() throws Exception {
        awaitDesignOk();
        assertEquals(Files.readString(preset), fx(() -> design().editor().getText()));
        assertEquals(DesignLimits.RESPONSE_POINTS, fx(() -> design().responseSeries().getData().size()));
        // 31 third-octave bands from 20 Hz to 20 kHz (IEC 61260-1 base-ten nominal frequencies)
        assertEquals(31, fx(() -> design().bandChart().values().length));
        assertEquals(9, fx(() -> design().table().getItems().size())); // R1…R5, C1…C4 in bench-pink.json
        assertTrue(fx(() -> window.stage().getTitle()).startsWith("bench-pink.json"));
        snapshot("design");
    }

    @Test
    void steppingAValueRewritesTheTextAndMovesTheCurve() throws Exception {
        awaitDesignOk();
        double[] before = fx(() -> ObservableData.yValues(design().responseSeries()));
        double[] bandsBefore = fx(() -> design().bandChart().values());
        fxRun(() -> design().step("R1", true));
        await(() -> design().editor().getText().contains("R1(51k)")); // IEC 60063 E24: 47 → 51
        awaitDesignOk();
        double[] after = fx(() -> ObservableData.yValues(design().responseSeries()));
        assertEquals(before.length, after.length);
        // −Zf/Zin: raising Rin from 47k to 51k lowers the gain by 20·log10(51/47) = 0.709 dB at every frequency
        for (int i = 0; i < after.length; i += 20) {
            assertEquals(before[i] - 20 * Math.log10(51.0 / 47), after[i], 0.01, "point " + i
                    + " (0.01 dB: the op-amp's finite gain shifts with the noise gain 1 + Zf/Zin)");
        }
        assertNotEquals(bandsBefore[0], fx(() -> design().bandChart().values())[0] + 1e-300, "band bars are redrawn");
        String text = fx(() -> design().editor().getText());
        assertEquals(Files.readString(preset).replace("R1(47k)", "R1(51k)"), text, "only the value's characters change");

        // Ctrl+Z takes the step back, Ctrl+Shift+Z redoes it
        FxRobot robot = new FxRobot();
        robot.clickOn(design().editor());
        robot.press(KeyCode.CONTROL, KeyCode.Z).release(KeyCode.Z, KeyCode.CONTROL);
        await(() -> design().editor().getText().contains("R1(47k)"));
        robot.press(KeyCode.CONTROL, KeyCode.SHIFT, KeyCode.Z).release(KeyCode.Z, KeyCode.SHIFT, KeyCode.CONTROL);
        await(() -> design().editor().getText().contains("R1(51k)"));
    }

    @Test
    void aBadValueShowsTheMessageAndMarksItsPlace() throws Exception {
        awaitDesignOk();
        String bad = Files.readString(preset).replace("R4(16k)", "R4(1kk6)");
        fxRun(() -> design().editor().setText(bad));
        await(() -> design().errorSpanProperty().get() != null);
        String status = fx(() -> design().status().getText());
        TextSpan span = fx(() -> design().errorSpanProperty().get());
        assertEquals(bad.indexOf("1kk6"), span.start());
        // one place per message: the marked span's line and column, not also the network's own column
        assertEquals("bench-pink.json, line " + span.line() + ", column " + span.column()
                + ": expected a value such as 4k7 or 22n, found '1kk6'", status);
        fxRun(() -> design().selectError());
        assertEquals("1kk6", fx(() -> design().editor().getSelectedText()));
        assertTrue(fx(() -> design().editor().getStyleClass().contains("has-error")));
        snapshot("design-error");
    }

    @Test
    void saveIsAtomicAndReloadsTheSameText() throws Exception {
        awaitDesignOk();
        fxRun(() -> design().step("C2", false)); // E24 below 39n is 36n (IEC 60063)
        await(() -> design().editor().getText().contains("C2(36n)"));
        awaitDesignOk();
        fxRun(() -> design().autosaveNow());
        fxRun(() -> design().flushIo());
        Path autosave = DesignDocument.autosaveOf(preset);
        assertTrue(Files.exists(autosave), "unsaved edits are autosaved beside the file");
        new FxRobot().press(KeyCode.CONTROL, KeyCode.S).release(KeyCode.S, KeyCode.CONTROL);
        await(() -> !design().document().dirty());
        fxRun(() -> design().flushIo());
        String saved = Files.readString(preset);
        assertEquals(Files.readString(PROJECT_PRESETS.resolve("bench-pink.json")).replace("C2(39n)", "C2(36n)"), saved,
                "the file is the original with one value changed");
        assertFalse(Files.exists(autosave), "saving removes the autosave");
        try (Stream<Path> s = Files.list(preset.getParent())) {
            assertEquals(List.of(preset), s.toList(), "no temporary file is left");
        }
        fxRun(() -> design().load(preset));
        awaitDesignOk();
        assertEquals(saved, fx(() -> design().editor().getText()));
        assertFalse(fx(() -> design().document().dirty()));
        assertEquals(0, prompts.restoreAsked);
    }

    @Test
    void anAutosaveNewerThanTheFileIsOfferedBack() throws Exception {
        awaitDesignOk();
        String edited = Files.readString(preset).replace("R5(6k2)", "R5(6k8)");
        Path autosave = DesignDocument.autosaveOf(preset);
        Files.writeString(autosave, edited);
        Files.setLastModifiedTime(autosave, java.nio.file.attribute.FileTime.fromMillis(
                Files.getLastModifiedTime(preset).toMillis() + 5000));
        prompts.restore = true;
        fxRun(() -> design().load(preset));
        awaitDesignOk();
        assertEquals(1, prompts.restoreAsked);
        assertEquals(edited, fx(() -> design().editor().getText()));
        assertTrue(fx(() -> design().document().dirty()), "restored edits are unsaved until saved");
        // closing with unsaved edits asks; Cancel keeps the window open
        prompts.unsaved = Prompts.Unsaved.CANCEL;
        assertFalse(fx(() -> window.design().confirmDiscard()));
    }

    @Test
    void measuresAWavFileAndShowsBars() throws Exception {
        awaitDesignOk();
        Path wav = dir.resolve("bench.wav");
        var model = fx(() -> window.model());
        writeNoise(wav, NoiseChain.design(model.zpk(), new ChainSettings(48000, 1, false, 42L, -20)), 48000, 1, 10);
        fxRun(() -> {
            window.tabs().getSelectionModel().select(2);
            window.measure().setFile(wav);
            window.measure().start();
        });
        await(() -> window.measure().shown() != null && window.measure().shown().complete());
        org.roseate.measure.MeasureResult o = fx(() -> window.measure().shown());
        assertEquals(org.roseate.measure.MeasureMode.NOISE_SOURCE, o.mode());
        double[] bars = fx(() -> window.measure().bandChart().values());
        double[] whiskers = fx(() -> window.measure().bandChart().whiskers());
        assertEquals(31, bars.length);
        List<org.roseate.measure.BandResult> levels = o.bands();
        int ref = CompareEntry.referenceIndex(window.settings().table());
        double[] marks = fx(() -> window.measure().bandChart().markers());
        assertNotNull(marks, "the design's deviation is marked");
        for (int i = 0; i < bars.length; i++) {
            assertEquals(levels.get(i).uncertaintyDb(), whiskers[i], 1e-12);
            // bars and marks are both centred deviations from the target, so bar − mark is the same in
            // every band up to random error: within 4 standard deviations of the difference of two
            // independent bands, plus twice NoiseChain's ±0.1 dB per-band fidelity to the analog model
            double sigma = Math.hypot(whiskers[i], whiskers[ref]);
            assertEquals(bars[ref] - marks[ref], bars[i] - marks[i], 4 * sigma + 0.2, levels.get(i).band().label());
        }
        assertNotNull(fx(() -> window.measure().bandChart().markers()), "the design's deviation is marked");
        String csv = MeasureView.csv(o);
        assertEquals(32, csv.lines().count()); // header + 31 bands
        assertTrue(csv.startsWith("nominalHz,lowHz,highHz,db,uncertaintyDb,deviationDb,normalizedDb,designDifferenceDb"), csv);
        snapshot("measure");
    }

    @Test
    void aTransferOfIdenticalChannelsIsUnityWithFullCoherence() throws Exception {
        Path wav = dir.resolve("loop.wav");
        NoiseChain white = NoiseChain.white(new ChainSettings(48000, 2, true, 3L, -12));
        writeNoise(wav, white, 48000, 2, 6);
        fxRun(() -> {
            window.tabs().getSelectionModel().select(2);
            window.measure().setFile(wav);
            window.measure().setMode(org.roseate.measure.MeasureMode.TRANSFER);
            window.measure().start();
        });
        await(() -> window.measure().shown() != null && window.measure().shown().complete());
        org.roseate.measure.MeasureResult o = fx(() -> window.measure().shown());
        assertEquals(org.roseate.measure.MeasureMode.TRANSFER, o.mode());
        for (var p : o.points()) {
            // y = x exactly (a wire): H1 = Gxy/Gxx = 1 and γ² = 1 to rounding (24-bit dither is per channel)
            assertEquals(0, p.db(), 0.05, p.hz() + " Hz");
            assertTrue(p.coherence() > 0.99, p.hz() + " Hz: γ² " + p.coherence());
        }
        assertTrue(fx(() -> window.measure().coherenceSeries().getData().size()) > 50);
        // the transfer bars carry the ± of each trusted band (a wire: γ² = 1, so σ = 0 by the formula)
        double[] whiskers = fx(() -> window.measure().bandChart().whiskers());
        assertNotNull(whiskers, "transfer bars have whiskers");
        for (int i = 0; i < whiskers.length; i++) {
            var b = o.bands().get(i);
            assertEquals(b.trusted() ? b.uncertaintyDb() : Double.NaN, whiskers[i], 0, b.band().label());
        }
        snapshot("measure-transfer");
    }

    @Test
    void comparesDesignsSideBySide() throws Exception {
        awaitDesignOk();
        fxRun(() -> {
            window.tabs().getSelectionModel().select(3);
            window.compare().addCurrent();
            window.compare().addDesign(PROJECT_PRESETS.resolve("wide-pink.json"));
        });
        assertEquals(2, fx(() -> window.compare().entries().size()));
        assertEquals(3, fx(() -> window.compare().table().getColumns().size())); // band + one group per entry
        assertEquals(31, fx(() -> window.compare().table().getItems().size()));
        assertEquals(3, fx(() -> window.compare().chart().getData().size())); // target + two entries
        CompareEntry e = fx(() -> window.compare().entries().get(0));
        assertEquals(0, e.normalizedDb()[CompareEntry.referenceIndex(window.settings().table())], 0,
                "normalised at the 1 kHz band");
        snapshot("compare");
    }

    @Test
    void listenGuardsTheLevelAndAsksBeforeTheFirstPlayback() throws Exception {
        awaitDesignOk();
        fxRun(() -> window.tabs().getSelectionModel().select(1));
        assertEquals(ListenView.DEFAULT_LEVEL_DBFS, fx(() -> window.listen().levelDbfs()));
        fxRun(() -> window.listen().levelSlider().setValue(-2));
        assertEquals(ListenView.SAFE_MAX_DBFS, fx(() -> window.listen().levelDbfs()), "hard stop at −10 dBFS");
        fxRun(() -> window.listen().allowLoud().setSelected(true));
        fxRun(() -> window.listen().levelSlider().setValue(-2));
        assertEquals(-2, fx(() -> window.listen().levelDbfs()));
        fxRun(() -> window.listen().allowLoud().setSelected(false));
        assertEquals(ListenView.SAFE_MAX_DBFS, fx(() -> window.listen().levelDbfs()), "unticking pulls the level back");
        prompts.caution = false;
        new FxRobot().press(KeyCode.SPACE).release(KeyCode.SPACE);
        WaitForAsyncUtils.waitForFxEvents();
        assertEquals(1, prompts.cautionAsked, "Space asks for the caution first");
        assertFalse(fx(() -> window.listen().playing()));
        // the two sources of an A/B comparison play at the same RMS level (NoiseChain's level gain)
        NoiseChain a = fx(() -> window.listen().chainFor(ListenView.SourceKind.DESIGN, -30));
        NoiseChain b = fx(() -> window.listen().chainFor(ListenView.SourceKind.IDEAL_PINK, -30));
        assertEquals(-30, a.settings().levelDbfs());
        assertEquals(-30, b.settings().levelDbfs());
        assertTrue(fx(() -> window.listen().meter().markers()).length == 31);
        snapshot("listen");
    }

    @Test
    void shortcutsSwitchViews() throws Exception {
        FxRobot robot = new FxRobot();
        for (int i = 4; i >= 1; i--) {
            KeyCode k = KeyCode.getKeyCode(String.valueOf(i));
            robot.press(KeyCode.CONTROL, k).release(k, KeyCode.CONTROL);
            WaitForAsyncUtils.waitForFxEvents();
            assertEquals(i - 1, fx(() -> window.tabs().getSelectionModel().getSelectedIndex()));
        }
    }

    private void snapshot(String name) throws Exception {
        snapshot(scene, name);
    }

    /** Writes a PNG of the scene under target/ui-snapshots/ and checks its size. */
    static void snapshot(Scene scene, String name) throws Exception {
        Path png = SNAPSHOTS.resolve(name + ".png");
        WaitForAsyncUtils.waitForFxEvents();
        fxRun(() -> {
            try {
                PngSnapshot.write(scene, png);
            } catch (java.io.IOException e) {
                throw new java.io.UncheckedIOException(e);
            }
        });
        BufferedImage img = ImageIO.read(png.toFile());
        assertEquals((int) MainWindow.WIDTH, img.getWidth());
        assertEquals((int) MainWindow.HEIGHT, img.getHeight());
    }

    static void writeNoise(Path wav, NoiseChain chain, int rate, int channels, double seconds) throws Exception {
        long frames = (long) (seconds * rate);
        try (OutputStream out = Files.newOutputStream(wav)) {
            WavWriter w = new WavWriter(out, new WavFormat(rate, channels, SampleEncoding.FLOAT_32), frames, 5L);
            double[] buf = new double[4096 * channels];
            for (long done = 0; done < frames; ) {
                int n = (int) Math.min(4096, frames - done);
                chain.render(buf, n);
                w.writeFrames(buf, n);
                done += n;
            }
            w.finish();
        }
    }

    /** Sizes the tests rely on. */
    static final class DesignLimits {
        // LogGrid at 48 points per decade over 20 Hz … 20 kHz: ceil(3 · 48) + 1 points
        static final int RESPONSE_POINTS = (int) Math.ceil(Math.log10(1000) * DesignCurves.POINTS_PER_DECADE) + 1;
    }
}

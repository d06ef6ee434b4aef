package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import javafx.event.Event;
import javafx.scene.Scene;
import javafx.scene.input.MouseButton;
import javafx.scene.input.MouseEvent;
import javafx.scene.input.ScrollEvent;
import javafx.stage.Stage;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.bands.Band;
import org.roseate.bands.BandTable;
import org.roseate.measure.BandReader;
import org.roseate.measure.BandResult;
import org.roseate.measure.MeasureMode;
import org.roseate.measure.MeasureResult;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;
import org.roseate.spectrum.WelchSettings;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;

/**
 * The bench screen without a sound card: its charts' scales, a reading of the design's own rendered
 * noise through the measurement pipeline (what the live analyzer shows, from a file), kept traces,
 * the pointer's read-out, zoom, pan and reset, and the Listen meter's scale. Snapshots go to
 * target/ui-snapshots/.
 */
@ExtendWith({HeadlessFx.class, ApplicationExtension.class})
class BenchViewTest {
    /**
     * How far a band's centred difference from the design may lie from 0, in its own centred σ: at
     * 4σ a true zero difference fails in one of 16 000 bands (normal tail, two-sided), so 31 bands
     * stay well below one false failure in 500 runs; the rendered noise is seeded, so a run repeats.
     */
    static final double SIGMAS = 4;
    /**
     * Plus what the digital model may differ from the analog design in a band, dB: the per-root
     * prewarped bilinear cascade matches the analog band levels of the bench preset far inside this
     * (the chain's own fidelity report, README), so 0.05 dB only keeps rounding out of the test.
     */
    static final double MODEL_DB = 0.05;

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
    void stopAll() throws Exception {
        RoseateWindowTest.fxRun(() -> {
            window.bench().stop();
            window.design().flushIo();
            window.design().shutdown();
        });
    }

    private BenchView bench() {
        return window.bench();
    }

    private void showBench() throws Exception {
        RoseateWindowTest.await(() -> window.model() != null);
        RoseateWindowTest.fxRun(() -> window.tabs().getSelectionModel().select(window.tabs().getTabs().size() - 1));
    }

    @Test
    void emptyChartsShowSensibleScales() throws Exception {
        showBench();
        // no reading yet: the difference charts show their own empty range, not a placeholder
        double[] y = RoseateWindowTest.fx(() -> bench().minusDesignChart().yBoundsDb());
        assertEquals(-1, y[0], 0);
        assertEquals(1, y[1], 0);
        // the frequency axis spans the third-octave bands' edges, 20 Hz to 20 kHz nominal (IEC 61260-1
        // base-ten: edges at the midband frequency times 10^(∓1/20): 17.8 Hz and 22.4 kHz)
        double[] x = RoseateWindowTest.fx(() -> bench().minusDesignChart().xBoundsHz());
        assertEquals(1000 * Math.pow(10, -17 / 10.0) * Math.pow(10, -1 / 20.0), x[0], 0.01);
        assertEquals(1000 * Math.pow(10, 13 / 10.0) * Math.pow(10, 1 / 20.0), x[1], 1);
        // levels: the ideal pink line (equal power in every fractional-octave band, so 0 dB re 1 kHz)
        // and the design's line; the axis holds both, at least 6 dB wide, and no 0–110 dB placeholder
        double[] ly = RoseateWindowTest.fx(() -> bench().levelsChart().yBoundsDb());
        assertTrue(ly[0] < 0 && ly[1] > 0 && ly[1] - ly[0] >= 6 && ly[1] - ly[0] <= 12, ly[0] + " … " + ly[1]);
        // values that differ from zero only by rounding get a readable span, not ±1e-14 dB
        RoseateWindowTest.fxRun(() -> {
            double[] tiny = new double[31];
            for (int i = 0; i < tiny.length; i++) {
                tiny[i] = (i % 2 == 0 ? 1 : -1) * 1e-14;
            }
            bench().minusTargetChart().setReading("rounding", tiny, null);
        });
        double[] ty = RoseateWindowTest.fx(() -> bench().minusTargetChart().yBoundsDb());
        assertTrue(ty[1] - ty[0] >= 1 && ty[1] - ty[0] <= 2, ty[0] + " … " + ty[1]);
        assertEquals(0.2, ReadingsChart.niceStep((ty[1] - ty[0]) / 6), 1e-12);
        RoseateWindowTest.snapshot(scene, "bench-idle");
    }

    /** Renders the design's noise, measures it with the pipeline and shows it on the bench. */
    private MeasureResult readDesignNoise(WelchSettings.Averaging averaging) throws Exception {
        showBench();
        Path wav = dir.resolve("design-noise.wav");
        var model = RoseateWindowTest.fx(() -> window.model());
        NoiseChain chain = NoiseChain.design(model.zpk(), new ChainSettings(48000, 1, false, 7L, -20), "bench");
        RoseateWindowTest.writeNoise(wav, chain, 48000, 1, 12);
        MeasureSetup setup = new MeasureSetup(MeasureMode.NOISE_SOURCE, averaging, AnalysisSettings.DEFAULT, 0, 0,
                model, null, BandReader.WELCH);
        MeasureResult r = FileMeasurement.run(wav, setup, p -> { }, () -> false, x -> { });
        RoseateWindowTest.fxRun(() -> bench().showResult(r));
        return r;
    }

    @Test
    void theDesignsOwnNoiseReadsWithinItsUncertaintyOfTheDesign() throws Exception {
        MeasureResult r = readDesignNoise(WelchSettings.Averaging.LINEAR);
        double[] diff = RoseateWindowTest.fx(() -> bench().minusDesignChart().values());
        double[] sigma = RoseateWindowTest.fx(() -> bench().minusDesignChart().sigmas());
        assertEquals(31, diff.length);
        int checked = 0;
        for (int i = 0; i < diff.length; i++) {
            BandResult b = r.bands().get(i);
            assertEquals(b.designDifferenceDb(), diff[i], 0, "the chart shows the core's centred difference");
            if (b.counted()) {
                assertTrue(sigma[i] > 0 && sigma[i] <= b.uncertaintyDb(), b.band().label() + ": σ " + sigma[i]);
                assertTrue(Math.abs(diff[i]) <= SIGMAS * sigma[i] + MODEL_DB,
                        String.format(Locale.ROOT, "%s Hz: %+.3f dB against ± %.3f", b.band().label(), diff[i], sigma[i]));
                checked++;
            }
        }
        assertTrue(checked >= 25, checked + " counted bands");
        RoseateWindowTest.snapshot(scene, "bench-reading");
    }

    @Test
    void keptReadingsAreNamedTimedAndOverlaid() throws Exception {
        readDesignNoise(WelchSettings.Averaging.LINEAR);
        RoseateWindowTest.fxRun(() -> {
            bench().keepNameField().setText("before the swap");
            assertTrue(bench().keepReading());
            assertTrue(bench().keepReading());
        });
        List<BenchView.KeptTrace> kept = RoseateWindowTest.fx(() -> bench().keptTraces());
        assertEquals(2, kept.size());
        assertEquals("before the swap", kept.get(0).name());
        assertEquals("Reading 2", kept.get(1).name());
        assertNotNull(kept.get(0).time());
        assertTrue(kept.get(0).settings().contains("averages (linear), third-octave"), kept.get(0).settings());
        assertEquals(2, RoseateWindowTest.fx(() -> bench().levelsChart().referenceCount()));
        assertEquals(2, RoseateWindowTest.fx(() -> bench().minusDesignChart().referenceCount()));
        RoseateWindowTest.fxRun(() -> bench().setOverlaid(kept.get(1), false));
        assertEquals(1, RoseateWindowTest.fx(() -> bench().minusTargetChart().referenceCount()));
        RoseateWindowTest.snapshot(scene, "bench-kept");
        // saved and opened again: the same names, times, settings and values (NaN kept as null)
        Path file = dir.resolve("kept.json");
        RoseateWindowTest.fxRun(() -> bench().saveKept(file));
        RoseateWindowTest.fxRun(() -> bench().openKept(file));
        List<BenchView.KeptTrace> all = RoseateWindowTest.fx(() -> bench().keptTraces());
        assertEquals(4, all.size());
        for (int i = 0; i < 2; i++) {
            BenchView.KeptTrace a = all.get(i);
            BenchView.KeptTrace b = all.get(i + 2);
            assertEquals(a.name(), b.name());
            assertEquals(a.time(), b.time());
            assertEquals(a.settings(), b.settings());
            assertEquals(a.bands(), b.bands());
            org.junit.jupiter.api.Assertions.assertArrayEquals(a.levelsDb(), b.levelsDb(), 0);
            org.junit.jupiter.api.Assertions.assertArrayEquals(a.minusDesignDb(), b.minusDesignDb(), 0);
            org.junit.jupiter.api.Assertions.assertArrayEquals(a.minusTargetDb(), b.minusTargetDb(), 0);
        }
        // a file that is not one is refused with one line naming it
        Path other = dir.resolve("bench-pink.json");
        RoseateWindowTest.fxRun(() -> bench().openKept(other));
        assertEquals(List.of(other + ": not a kept-readings file (\"keptReadings\": 1 and \"readings\" expected)"),
                prompts.errors);
        assertEquals(4, RoseateWindowTest.fx(() -> bench().keptTraces().size()));
    }

    @Test
    void thePointerReadsOutTheBandUnderIt() throws Exception {
        MeasureResult r = readDesignNoise(WelchSettings.Averaging.LINEAR);
        int k = 17; // the 1 kHz band of 20 Hz … 20 kHz third-octaves
        BandResult b = r.bands().get(k);
        assertEquals("1k", b.band().label());
        ReadingsChart chart = RoseateWindowTest.fx(() -> bench().levelsChart());
        double cx = RoseateWindowTest.fx(() -> chart.bandCentreX(k));
        RoseateWindowTest.fxRun(() -> Event.fireEvent(chart.canvas(), mouse(chart.canvas(), MouseEvent.MOUSE_MOVED, cx, 100, 0)));
        String expected = String.format(Locale.ROOT, "1k Hz band: Line in %+.2f ± %.2f dB · Ideal pink %+.2f dB · Design %+.2f dB",
                b.normalizedDb(), b.uncertaintyDb(), b.normalizedDb() - b.deviationDb(),
                b.normalizedDb() - b.designDifferenceDb());
        assertEquals(expected, RoseateWindowTest.fx(() -> chart.readoutProperty().get()));
        assertEquals(expected, RoseateWindowTest.fx(() -> bench().pointerReadout().getText()));
        RoseateWindowTest.fxRun(() -> Event.fireEvent(chart.canvas(), mouse(chart.canvas(), MouseEvent.MOUSE_EXITED, -1, -1, 0)));
        assertEquals("", RoseateWindowTest.fx(() -> chart.readoutProperty().get()));
    }

    @Test
    void wheelZoomsDragPansAndDoubleClickResets() throws Exception {
        readDesignNoise(WelchSettings.Averaging.LINEAR);
        ReadingsChart chart = RoseateWindowTest.fx(() -> bench().levelsChart());
        double[] x0 = RoseateWindowTest.fx(chart::xBoundsHz);
        double[] y0 = RoseateWindowTest.fx(chart::yBoundsDb);
        double cx = RoseateWindowTest.fx(() -> chart.bandCentreX(17));
        double cy = RoseateWindowTest.fx(() -> chart.canvas().getHeight() / 2);
        // one notch in (40 px of wheel): both spans shrink by 1.25, about the pointer
        RoseateWindowTest.fxRun(() -> Event.fireEvent(chart.canvas(), scroll(chart.canvas(), cx, cy, 40, false, false)));
        double[] x1 = RoseateWindowTest.fx(chart::xBoundsHz);
        double[] y1 = RoseateWindowTest.fx(chart::yBoundsDb);
        assertEquals(Math.log10(x0[1] / x0[0]) / 1.25, Math.log10(x1[1] / x1[0]), 1e-9);
        assertEquals((y0[1] - y0[0]) / 1.25, y1[1] - y1[0], 1e-9);
        // 0.01 px: the event's point goes to scene coordinates and back, which costs ~1e-6 px of rounding
        assertEquals(cx, RoseateWindowTest.fx(() -> chart.bandCentreX(17)), 0.01, "the band under the pointer stays put");
        // Shift: frequency only
        RoseateWindowTest.fxRun(() -> Event.fireEvent(chart.canvas(), scroll(chart.canvas(), cx, cy, 40, true, false)));
        assertEquals(y1[1] - y1[0], RoseateWindowTest.fx(chart::yBoundsDb)[1] - RoseateWindowTest.fx(chart::yBoundsDb)[0], 1e-9);
        double[] x2 = RoseateWindowTest.fx(chart::xBoundsHz);
        double[] y2 = RoseateWindowTest.fx(chart::yBoundsDb);
        // a drag of (+50, +30) px moves the content with the pointer: the bounds move the other way
        double plotW = RoseateWindowTest.fx(() -> chart.canvas().getWidth() - ReadingsChart.LEFT - ReadingsChart.RIGHT);
        double plotH = RoseateWindowTest.fx(() -> chart.canvas().getHeight() - ReadingsChart.TOP - ReadingsChart.BOTTOM);
        RoseateWindowTest.fxRun(() -> {
            Event.fireEvent(chart.canvas(), mouse(chart.canvas(), MouseEvent.MOUSE_PRESSED, 200, 100, 1));
            Event.fireEvent(chart.canvas(), mouse(chart.canvas(), MouseEvent.MOUSE_DRAGGED, 250, 130, 1));
        });
        double[] x3 = RoseateWindowTest.fx(chart::xBoundsHz);
        double[] y3 = RoseateWindowTest.fx(chart::yBoundsDb);
        // 1e-6: the same scene round trip, ~1e-6 px, times the span per pixel
        assertEquals(-50 * Math.log10(x2[1] / x2[0]) / plotW, Math.log10(x3[0] / x2[0]), 1e-6);
        assertEquals(30 * (y2[1] - y2[0]) / plotH, y3[0] - y2[0], 1e-6);
        assertTrue(!RoseateWindowTest.fx(chart::autoScaled));
        RoseateWindowTest.fxRun(() -> Event.fireEvent(chart.canvas(), mouse(chart.canvas(), MouseEvent.MOUSE_CLICKED, 200, 100, 2)));
        assertTrue(RoseateWindowTest.fx(chart::autoScaled));
        double[] x4 = RoseateWindowTest.fx(chart::xBoundsHz);
        double[] y4 = RoseateWindowTest.fx(chart::yBoundsDb);
        assertEquals(x0[0], x4[0], 1e-9);
        assertEquals(x0[1], x4[1], 1e-6);
        assertEquals(y0[0], y4[0], 0);
        assertEquals(y0[1], y4[1], 0);
    }

    @Test
    void theListenMeterScaleFollowsWhatItShows() throws Exception {
        RoseateWindowTest.await(() -> window.model() != null);
        javafx.scene.chart.NumberAxis axis = RoseateWindowTest.fx(() ->
                (javafx.scene.chart.NumberAxis) window.listen().meter().getYAxis());
        // idle: the ideal pink marks, 0 dB re 1 kHz in every band (equal power per fractional-octave
        // band), with 1 dB to spare on 5 dB steps
        assertEquals(-5, RoseateWindowTest.fx(axis::getLowerBound), 0);
        assertEquals(5, RoseateWindowTest.fx(axis::getUpperBound), 0);
        // white noise: band power ∝ bandwidth, so 10·log10(B/B(1 kHz)): −17 dB at 20 Hz, +13 dB at 20 kHz
        BandTable table = AnalysisSettings.DEFAULT.table();
        List<Band> bands = table.bands();
        double[] white = new double[bands.size()];
        for (int i = 0; i < white.length; i++) {
            white[i] = 10 * Math.log10(bands.get(i).widthHz() / bands.get(17).widthHz());
        }
        assertEquals(-17, white[0], 0.01);
        RoseateWindowTest.fxRun(() -> window.listen().fitMeterScale(white, null, new double[white.length]));
        assertEquals(-20, RoseateWindowTest.fx(axis::getLowerBound), 0);
        assertEquals(15, RoseateWindowTest.fx(axis::getUpperBound), 0);
        // back to a pink-like reading: the axis narrows again
        RoseateWindowTest.fxRun(() -> window.listen().fitMeterScale(new double[white.length], null, new double[white.length]));
        assertEquals(-5, RoseateWindowTest.fx(axis::getLowerBound), 0);
        assertEquals(5, RoseateWindowTest.fx(axis::getUpperBound), 0);
    }

    @Test
    void theWindowsLineChartsScaleToTheirData() throws Exception {
        RoseateWindowTest.await(() -> window.model() != null);
        // Compare before any entry: only the target line, 0 dB re 1 kHz in every band (ideal pink has
        // equal power per fractional-octave band): a 1 dB-wide axis about 0, not 0–100 nor ±1e-14 dB
        RoseateWindowTest.fxRun(() -> window.tabs().getSelectionModel().select(3));
        javafx.scene.chart.NumberAxis y = RoseateWindowTest.fx(() ->
                (javafx.scene.chart.NumberAxis) window.compare().chart().getYAxis());
        assertEquals(-0.5, RoseateWindowTest.fx(y::getLowerBound), 1e-12);
        assertEquals(0.5, RoseateWindowTest.fx(y::getUpperBound), 1e-12);
        assertEquals("0", RoseateWindowTest.fx(() -> y.getTickLabelFormatter().toString(-1e-17)));
        // with the design added the axis holds its band levels, 6 % to spare on a 1-2-5 step
        RoseateWindowTest.fxRun(() -> window.compare().addCurrent());
        double[] levels = RoseateWindowTest.fx(() -> window.compare().chart().getData().stream()
                .flatMap(s -> s.getData().stream()).mapToDouble(d -> d.getYValue().doubleValue()).toArray());
        double lo = java.util.Arrays.stream(levels).min().orElseThrow();
        double hi = java.util.Arrays.stream(levels).max().orElseThrow();
        double[] expected = ReadingsChart.levelRange(lo, hi, 1, LevelScale.DIVISIONS);
        assertEquals(expected[0], RoseateWindowTest.fx(y::getLowerBound), 0);
        assertEquals(expected[1], RoseateWindowTest.fx(y::getUpperBound), 0);
        assertTrue(expected[0] <= lo && expected[1] >= hi);
    }

    /** A mouse event at canvas point (x, y); events carry scene coordinates, from which the target's are made. */
    static MouseEvent mouse(javafx.scene.Node on, javafx.event.EventType<MouseEvent> type, double x, double y, int clicks) {
        javafx.geometry.Point2D p = on.localToScene(x, y);
        javafx.geometry.Point2D q = on.localToScreen(x, y);
        return new MouseEvent(type, p.getX(), p.getY(), q == null ? p.getX() : q.getX(), q == null ? p.getY() : q.getY(),
                clicks > 0 ? MouseButton.PRIMARY : MouseButton.NONE, clicks,
                false, false, false, false, clicks > 0, false, false, true, false, false, null);
    }

    static ScrollEvent scroll(javafx.scene.Node on, double x, double y, double deltaY, boolean shift, boolean ctrl) {
        javafx.geometry.Point2D p = on.localToScene(x, y);
        return new ScrollEvent(ScrollEvent.SCROLL, p.getX(), p.getY(), p.getX(), p.getY(), shift, ctrl, false, false, false, false, 0, deltaY, 0,
                deltaY, ScrollEvent.HorizontalTextScrollUnits.NONE, 0, ScrollEvent.VerticalTextScrollUnits.NONE, 0, 0, null);
    }
}

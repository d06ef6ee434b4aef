package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.InputStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import javafx.scene.Scene;
import javafx.stage.Stage;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.budget.BudgetResult;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.cli.RoseateCommand;
import org.roseate.diagnose.PartEstimate;
import org.roseate.diagnose.SyntheticCapture;
import org.roseate.listen.AbxLog;
import org.roseate.listen.AbxOutcome;
import org.roseate.listen.Side;
import org.roseate.model.Root;
import org.roseate.noise.FrameSource;
import org.roseate.noise.NoiseChain;
import org.roseate.tools.MonteCarlo;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;
import org.testfx.util.WaitForAsyncUtils;

/**
 * The design tools in the window against the CLI on the same design: each view's numbers must be
 * the ones the command prints (one core, so equal to the last bit where the CLI's JSON carries full
 * precision, and equal as printed where the CLI prints text). Also: cancel stops the core's worker
 * threads, one view's job never cancels another's, the budget follows an edit, the ABX test plays
 * the hidden side and logs every trial, and a PNG of each tool goes to target/ui-snapshots/.
 */
@ExtendWith({HeadlessFx.class, ApplicationExtension.class})
class ToolViewsTest {
    /** An invented two-stage design with a hot source, so the first stage has little headroom. */
    static final String BUDGET_DEMO = """
            {
              "name": "budget demo",
              "description": "invented values for the window's budget test",
              "source": {"densityVPerRtHz": 0.06, "flickerCornerHz": 250},
              "stages": [
                {
                  "kind": "inverting",
                  "input": "R1(47k)",
                  "feedback": "R2(100k) || (R3(10k) + C1(22n))",
                  "opamp": {"gbwHz": 1e6, "openLoopGain": 1e5, "enVPerRtHz": 10e-9, "inAPerRtHz": 1e-12, "swingV": 13, "slewVPerUs": 13}
                },
                {
                  "kind": "divider",
                  "series": "R4(4k7)",
                  "shunt": "C2(100n) || (R5(22k) + C3(10n))",
                  "load": "R6(100k)"
                }
              ],
              "tolerance": {"R": "1%", "C": "5%"}
            }
            """;

    @TempDir
    Path dir;
    final ScriptedPrompts prompts = new ScriptedPrompts();
    MainWindow window;
    Scene scene;
    Path preset;

    @AfterEach
    void stopAutosave() throws Exception {
        prompts.unsaved = Prompts.Unsaved.DISCARD;
        RoseateWindowTest.fxRun(() -> {
            window.design().flushIo();
            window.close();
        });
    }

    @Start
    void start(Stage stage) throws Exception {
        Files.createDirectories(dir.resolve("presets"));
        preset = dir.resolve("presets").resolve("bench-pink.json");
        Files.copy(RoseateWindowTest.PROJECT_PRESETS.resolve("bench-pink.json"), preset);
        window = new MainWindow(prompts, dir);
        scene = window.show(stage);
    }

    private static <T> T fx(java.util.concurrent.Callable<T> c) throws Exception {
        return RoseateWindowTest.fx(c);
    }

    private static void fxRun(Runnable r) throws Exception {
        RoseateWindowTest.fxRun(r);
    }

    private static void await(java.util.concurrent.Callable<Boolean> c, int seconds) throws Exception {
        WaitForAsyncUtils.waitFor(seconds, TimeUnit.SECONDS, () -> fx(c));
    }

    private void awaitDesign(String fileName) throws Exception {
        try {
            awaitDesignOnce(fileName);
        } catch (java.util.concurrent.TimeoutException e) {
            throw new AssertionError("the design did not open: " + fx(() -> window.design().status().getText() + " / "
                    + window.design().document().file() + " / " + prompts.errors), e);
        }
    }

    private void awaitDesignOnce(String fileName) throws Exception {
        await(() -> window.model() != null && window.design().document().file().map(f -> f.getFileName().toString()
                .equals(fileName)).orElse(false) && window.design().outcomeProperty().get().ok()
                && window.design().outcomeProperty().get().text().equals(window.design().editor().getText()), 30);
    }

    static JsonNode cliJson(String... args) throws Exception {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = RoseateCommand.run(new PrintWriter(out), new PrintWriter(err), args);
        assertEquals(0, status, err.toString());
        return new ObjectMapper().readTree(out.toString());
    }

    static String cliText(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = RoseateCommand.run(new PrintWriter(out), new PrintWriter(err), args);
        assertEquals(0, status, err.toString());
        return out.toString();
    }

    private void snapshot(String tool) throws Exception {
        fxRun(() -> {
            window.tabs().getSelectionModel().select(4);
            window.tools().select(tool);
        });
        WaitForAsyncUtils.waitForFxEvents();
        Path png = RoseateWindowTest.SNAPSHOTS.resolve("tools-" + tool.toLowerCase(java.util.Locale.ROOT).replace(' ', '-') + ".png");
        fxRun(() -> {
            try {
                PngSnapshot.write(scene, png);
            } catch (java.io.IOException e) {
                throw new java.io.UncheckedIOException(e);
            }
        });
        assertTrue(Files.size(png) > 1000, png + " was written");
    }

    /** No thread of this name prefix is alive (the core's pools end once cancelled). */
    private static boolean noThread(String name) {
        return Thread.getAllStackTraces().keySet().stream().noneMatch(t -> t.isAlive() && t.getName().startsWith(name));
    }

    @Test
    void budgetShowsTheCoresVoltsAndFollowsAnEdit() throws Exception {
        Path design = dir.resolve("budget-demo.json");
        Files.writeString(design, BUDGET_DEMO);
        fxRun(() -> window.design().load(design));
        awaitDesign("budget-demo.json");
        await(() -> window.budget().resultProperty().get() != null
                && window.budget().resultProperty().get().stages().size() == 2, 30);
        compareBudget(window.budget().resultProperty().get(), cliJson("budget", design.toString(), "--format", "json"));
        List<String> rows = fx(() -> window.budget().stageTexts());
        assertEquals(2, rows.size());
        assertTrue(rows.get(0).contains("dB, P(clip)"), rows.get(0));
        assertTrue(rows.get(1).contains("no swingV given"), "the divider has no op-amp: " + rows.get(1));
        snapshotDesign();

        // Step R2 (100k → 110k, E24): the first stage's gain and so every RMS after it change.
        BudgetResult before = fx(() -> window.budget().resultProperty().get());
        fxRun(() -> window.design().step("R2", true));
        await(() -> window.design().editor().getText().contains("R2(110k)"), 15);
        await(() -> window.budget().resultProperty().get() != before, 30);
        BudgetResult after = fx(() -> window.budget().resultProperty().get());
        assertNotEquals(before.stages().get(0).rmsV(), after.stages().get(0).rmsV());
        Path edited = dir.resolve("budget-demo-edited.json");
        Files.writeString(edited, fx(() -> window.design().editor().getText()));
        compareBudget(after, cliJson("budget", edited.toString(), "--format", "json"));
    }

    private void snapshotDesign() throws Exception {
        Path png = RoseateWindowTest.SNAPSHOTS.resolve("design-with-budget.png");
        fxRun(() -> {
            window.tabs().getSelectionModel().select(0);
            try {
                PngSnapshot.write(scene, png);
            } catch (java.io.IOException e) {
                throw new java.io.UncheckedIOException(e);
            }
        });
    }

    /** One core: the window's figures are the CLI's JSON figures, to the last bit (same inputs, same code). */
    private static void compareBudget(BudgetResult r, JsonNode j) {
        assertEquals(j.get("outputRmsV").asDouble(), r.outputRmsV(), 0);
        assertEquals(j.get("stages").size(), r.stages().size());
        for (int i = 0; i < r.stages().size(); i++) {
            JsonNode s = j.get("stages").get(i);
            BudgetResult.StageReading w = r.stages().get(i);
            assertEquals(s.get("rmsV").asDouble(), w.rmsV(), 0, "stage " + i);
            if (s.get("headroomDb").isNull()) {
                assertTrue(w.headroomDb().isEmpty());
            } else {
                assertEquals(s.get("headroomDb").asDouble(), w.headroomDb().orElseThrow(), 0);
                assertEquals(s.get("clipProbability").asDouble(), w.clipProbability().orElseThrow(), 0);
            }
        }
        for (int i = 0; i < r.contributors().size(); i++) {
            assertEquals(j.get("contributors").get(i).get("name").asText(), r.contributors().get(i).name());
            assertEquals(j.get("contributors").get(i).get("rmsV").asDouble(), r.contributors().get(i).rmsV(), 0);
        }
    }

    @Test
    void partsAndPolesAreTheCliFigures() throws Exception {
        awaitDesign("bench-pink.json");
        await(() -> !window.tools().parts().table().getItems().isEmpty(), 15);
        JsonNode parts = cliJson("parts", preset.toString(), "--format", "json");
        List<PartsView.Row> rows = fx(() -> List.copyOf(window.tools().parts().table().getItems()));
        assertEquals(parts.get("parts").size() + parts.get("opamps").size(), rows.size());
        for (int i = 0; i < parts.get("parts").size(); i++) {
            JsonNode p = parts.get("parts").get(i);
            List<String> ds = new ArrayList<>();
            p.get("designators").forEach(d -> ds.add(d.asText()));
            assertEquals(String.join(" ", ds), rows.get(i).parts());
            assertEquals(p.get("quantity").asText(), rows.get(i).quantity());
            assertEquals(p.get("letterCode").asText(), rows.get(i).value());
            assertEquals(p.get("tolerance").asText(), rows.get(i).tolerance());
        }
        snapshot("Parts");

        JsonNode a = cliJson("analyze", preset.toString(), "--format", "json");
        List<PolesView.Row> roots = fx(() -> List.copyOf(window.tools().poles().table().getItems()));
        List<JsonNode> expected = new ArrayList<>();
        a.get("poles").forEach(expected::add);
        a.get("zeros").forEach(expected::add);
        assertEquals(expected.size(), roots.size());
        assertTrue(roots.size() >= 4, "bench-pink has four RC branches: " + roots.size());
        for (int i = 0; i < roots.size(); i++) {
            Root r = roots.get(i).root();
            assertEquals(expected.get(i).get("hz").asDouble(), r.hz(), 0);
            if (expected.get(i).get("q").isNull()) {
                assertTrue(r.isReal());
            } else {
                assertEquals(expected.get(i).get("q").asDouble(), r.q(), 0);
            }
        }
        snapshot("Poles and zeros");
    }

    @Test
    void toleranceIsTheCliRunAndCancelStopsItsThreads() throws Exception {
        awaitDesign("bench-pink.json");
        ToleranceView tv = window.tools().tolerance();
        fxRun(() -> tv.trials().setText("400"));
        fxRun(tv::start);
        await(() -> tv.resultProperty().get() != null, 60);
        MonteCarlo.Result r = fx(() -> tv.resultProperty().get());
        JsonNode j = cliJson("tolerance", preset.toString(), "--trials", "400", "--seed", "1", "--format", "json");
        assertEquals(j.get("yield").asDouble(), r.yield(), 0);
        assertEquals(j.get("maxBandDeviationDb").get("p50").asDouble(), r.peakDb().p50(), 0);
        assertEquals(j.get("maxBandDeviationDb").get("p95").asDouble(), r.peakDb().p95(), 0);
        assertEquals(j.get("bands").size(), r.bands().size());
        for (int i = 0; i < r.bands().size(); i++) {
            assertEquals(j.get("bands").get(i).get("deviationDb").get("p95").asDouble(), r.bands().get(i).deviationDb().p95(), 0);
        }
        for (int i = 0; i < r.sensitivities().size(); i++) {
            JsonNode s = j.get("sensitivities").get(i);
            assertEquals(s.get("designator").asText(), r.sensitivities().get(i).designator());
            assertEquals(s.get("designator").asText(), fx(() -> tv.table().getItems()).get(i).part());
            assertEquals(s.get("contributionDb").asDouble(), r.sensitivities().get(i).contributionDb(), 0);
        }
        assertEquals(r.bands().size(), fx(() -> tv.envelope().getData().get(2).getData().size()), "the 95 % envelope");
        snapshot("Tolerance");

        // A long run, then a fit in another view: the fit must not cancel it. Then cancel the run.
        fxRun(() -> tv.trials().setText(String.valueOf(MonteCarlo.MAX_TRIALS)));
        fxRun(tv::start);
        await(() -> tv.slot().busy() && !noThread("roseate-montecarlo"), 15);
        FitView fit = window.tools().fit();
        fxRun(() -> fit.starts().getValueFactory().setValue(200));
        fxRun(fit::start);
        await(() -> fit.slot().busy(), 15);
        assertTrue(fx(() -> tv.slot().busy()), "starting a fit left the tolerance run alone");
        fxRun(() -> fit.slot().cancel());
        await(() -> !fit.slot().busy(), 15);
        assertTrue(fx(() -> tv.slot().busy()), "cancelling the fit left the tolerance run alone");
        fxRun(() -> tv.slot().cancel());
        await(() -> !tv.slot().busy(), 15);
        assertEquals("Tolerance run cancelled.", fx(() -> tv.status().getText()));
        assertEquals("Fit cancelled; nothing changed.", fx(() -> fit.status().getText()));
        assertTrue(fx(() -> tv.resultProperty().get()) == r, "a cancelled run leaves the last result");
        // The core's workers stop at their next progress report (every block of trials, every 1024
        // evaluations), not at the end of the whole job: 10 s is far below the runs' length.
        await(() -> noThread("roseate-montecarlo") && noThread("roseate-fit"), 10);
    }

    @Test
    void fitIsTheCliFit() throws Exception {
        awaitDesign("bench-pink.json");
        FitView fit = window.tools().fit();
        // two free parts (R5, C4) keep the run short; R1, the input part, is held by default
        fxRun(() -> {
            fit.starts().getValueFactory().setValue(2);
            fit.hold().setText("R2, C1,R3,C2,R4,C3");
        });
        fxRun(fit::start);
        await(() -> fit.resultProperty().get() != null, 120);
        String cli = cliText("fit", "--from", preset.toString(), "--starts", "2", "--seed", "1", "--hold", "R2,C1,R3,C2,R4,C3");
        var res = fx(() -> fit.resultProperty().get());
        String bandLine = cli.lines().filter(l -> l.startsWith("peak band deviation")).findFirst().orElseThrow();
        assertTrue(bandLine.endsWith(ToolText.f("%14.4f %14.4f", res.continuousAnalysis().bands().maxBandDeviationDb(),
                res.snappedAnalysis().bands().maxBandDeviationDb())), bandLine);
        for (FitView.Row row : fx(() -> List.copyOf(fit.table().getItems()))) {
            String line = cli.lines().filter(l -> l.startsWith(ToolText.f("%-6s ", row.part()))).findFirst().orElseThrow();
            assertEquals(line, ToolText.f("%-6s %10s %14s %10s %10s", row.part(), row.start(), row.continuous(), row.standard(),
                    row.change()));
        }
        snapshot("Fit");
    }

    @Test
    void diagnoseIsTheCliDiagnosis() throws Exception {
        awaitDesign("bench-pink.json");
        Design d = DesignReader.read(preset);
        Map<String, Double> values = new HashMap<>();
        values.put("R4", d.component("R4").orElseThrow().value() * 0.8);
        Path wav = dir.resolve("built.wav");
        // the test's own capture generator (SyntheticCapture, independent of the diagnose code)
        SyntheticCapture.write(wav, d.withValues(values), 48000, 20, true, 0.01, 21);
        DiagnoseView dv = window.tools().diagnose();
        fxRun(() -> {
            dv.setCapture(wav);
            dv.setTransfer(true, 1, 2);
            dv.start();
        });
        await(() -> dv.resultProperty().get() != null, 120);
        JsonNode j = cliJson("diagnose", preset.toString(), wav.toString(), "--reference-channel", "1", "--format", "json");
        var dx = fx(() -> dv.resultProperty().get()).diagnosis();
        assertEquals(j.get("parts").size(), dx.parts().size());
        for (int i = 0; i < dx.parts().size(); i++) {
            PartEstimate p = dx.parts().get(i);
            JsonNode q = j.get("parts").get(i);
            assertEquals(q.get("designator").asText(), p.designator());
            assertEquals(q.get("estimate").asDouble(), p.estimate(), 0);
            assertEquals(q.get("low").asDouble(), p.low(), 0);
            assertEquals(q.get("high").asDouble(), p.high(), 0);
            assertEquals(q.get("outOfTolerance").asBoolean(), p.outOfTolerance());
            assertEquals(q.get("outOfTolerance").asBoolean(), fx(() -> dv.table().getItems()).get(i).out());
        }
        assertEquals(j.get("residualDb").asDouble(), dx.residualDb(), 0);
        assertEquals(j.get("ambiguityGroups").size(), dx.ambiguityGroups().size());
        assertTrue(fx(() -> dv.summary().getText()).contains("Change R4"), "R4 moved by −20 % is named");
        snapshot("Diagnose");
    }

    /** A listener that hears what plays: ideal pink or white, told apart by the chain's description. */
    static final class RecordingPlayer implements AbxView.Player {
        final List<String> played = new ArrayList<>();
        boolean open;

        @Override
        public void open() {
            open = true;
        }

        @Override
        public void play(FrameSource source) {
            played.add(((NoiseChain) source).describe());
        }

        @Override
        public void silence() {
            played.add("silence");
        }

        @Override
        public void close() {
            open = false;
        }
    }

    @Test
    void abxRunsTheFixedTrialsAndLogsThem() throws Exception {
        awaitDesign("bench-pink.json");
        AbxView abx = window.tools().abx();
        RecordingPlayer player = new RecordingPlayer();
        Path log = dir.resolve("abx.json");
        prompts.files.add(log);
        prompts.caution = true;
        fxRun(() -> {
            abx.usePlayers(() -> player);
            abx.setFile(true, preset);
            abx.seed().setText("7");
            abx.startTest();
        });
        await(() -> abx.session() != null, 15);
        assertEquals(1, prompts.cautionAsked, "the safety caution comes before the first sound");
        NoiseChain a = NoiseChain.design(org.roseate.model.CircuitModel.of(DesignReader.read(preset), "x").zpk(),
                new org.roseate.noise.ChainSettings(48000, 2, false, 1L, -30), "bench-pink.json");
        String aText = a.describe();
        int trials = AbxView.DEFAULT_TRIALS;
        int rightAnswers = 12;
        for (int t = 0; t < trials; t++) {
            int trial = t;
            fxRun(() -> abx.select(org.roseate.listen.AbxSession.Choice.X));
            String heard = player.played.get(player.played.size() - 1);
            Side x = heard.equals(aText) ? Side.A : Side.B;
            assertNull(fx(() -> abx.outcomeProperty().get()), "no result before the last answer");
            fxRun(() -> abx.answer(trial < rightAnswers ? x : (x == Side.A ? Side.B : Side.A)));
        }
        AbxOutcome o = fx(() -> abx.outcomeProperty().get());
        assertNotNull(o);
        assertEquals(rightAnswers, o.correct());
        assertEquals(trials, o.trials());
        // One-sided binomial p-value of 12 of 16: scipy.stats.binomtest (reference/listen/binomial.json,
        // src/test/python/gen_binomial_reference.py); exact rational arithmetic against scipy's
        // incomplete beta function, good to about 1e-14 relative, so 1e-12 relative.
        double scipy = scipyPValue(trials, rightAnswers);
        assertEquals(scipy, o.pValue(), 1e-12 * scipy);
        assertTrue(fx(() -> abx.resultText().getText()).contains("12 of 16 correct"));
        AbxLog saved = AbxLog.fromJson(Files.readString(log));
        assertEquals(trials, saved.log().size());
        assertTrue(saved.complete());
        assertEquals(7, saved.seed());
        assertEquals(-30, saved.levelDbfs(), 0);
        await(() -> !player.open, 10);
        snapshot("ABX test");
    }

    static double scipyPValue(int trials, int correct) throws Exception {
        try (InputStream in = ToolViewsTest.class.getResourceAsStream("/reference/listen/binomial.json")) {
            for (JsonNode c : new ObjectMapper().readTree(in).get("cases")) {
                if (c.get("trials").asInt() == trials) {
                    return c.get("pValue").get(correct).asDouble();
                }
            }
        }
        throw new AssertionError("no reference for " + trials + " trials");
    }

    @Test
    void abxRefusesToOverwriteALogUnasked() throws Exception {
        awaitDesign("bench-pink.json");
        AbxView abx = window.tools().abx();
        Path log = dir.resolve("old.json");
        Files.writeString(log, "keep me");
        prompts.files.add(log);
        prompts.caution = true;
        prompts.replace = false;
        fxRun(() -> {
            abx.usePlayers(RecordingPlayer::new);
            abx.startTest();
        });
        assertEquals(1, prompts.replaceAsked);
        assertNull(fx(abx::session));
        assertEquals("keep me", Files.readString(log));
        assertFalse(fx(() -> abx.resultText().getText()).isEmpty());
    }
}

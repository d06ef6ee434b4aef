package org.roseate.app;

import java.nio.file.Path;
import java.time.LocalTime;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import javafx.animation.AnimationTimer;
import javafx.application.Platform;
import javafx.collections.FXCollections;
import javafx.geometry.Insets;
import javafx.scene.Node;
import javafx.scene.control.Button;
import javafx.scene.control.CheckBox;
import javafx.scene.control.ComboBox;
import javafx.scene.control.Label;
import javafx.scene.control.ListView;
import javafx.scene.control.ScrollPane;
import javafx.scene.control.Slider;
import javafx.scene.control.TextField;
import javafx.scene.control.ToggleButton;
import javafx.scene.control.cell.CheckBoxListCell;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.GridPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Priority;
import javafx.scene.layout.VBox;
import javafx.scene.paint.Color;
import org.roseate.audio.Devices;
import org.roseate.audio.InputLine;
import org.roseate.audio.PlaybackEngine;
import org.roseate.bands.Band;
import org.roseate.bands.BandTable;
import org.roseate.circuit.DesignException;
import org.roseate.circuit.DesignReader;
import org.roseate.compare.Centering;
import org.roseate.compare.TargetSlope;
import org.roseate.digital.UnrenderableModelException;
import org.roseate.measure.BandReader;
import org.roseate.measure.BandResult;
import org.roseate.measure.MeasureMode;
import org.roseate.measure.MeasureRequest;
import org.roseate.measure.MeasureResult;
import org.roseate.model.BandPower;
import org.roseate.model.CircuitModel;
import org.roseate.noise.NoiseChain;
import org.roseate.spectrum.WelchSettings;

/**
 * The bench: a noise generator and a live band analyzer on one screen, so a user plays a source out
 * of the sound card and watches the line-in's reading settle onto the ideal pink line and the design.
 *
 * <p>A thin adapter: the generator is the core's {@link NoiseChain} played by {@link PlaybackEngine}
 * (the same play path as the Listen view, with its level limits and caution); the analyzer is
 * {@link LiveMeasurement}, the one measurement pipeline ({@code org.roseate.measure}) in noise-source
 * mode. Every number drawn comes from the core's {@link MeasureResult}: the differences from the
 * design and from the target are its {@code designDifferenceDb} and {@code deviationDb}, centred by
 * the inverse-variance weighted mean over the counted bands ({@link Centering#weighted}); their ±
 * are the centred standard deviations of that rule ({@link Centering#centredSigmaDb}).
 */
final class BenchView {
    static final int RATE_HZ = 48000;
    private static final String DEFAULT_OUTPUT = "Default output";
    private static final String DEFAULT_INPUT = "Default input";
    private static final DateTimeFormatter CLOCK = DateTimeFormatter.ofPattern("HH:mm:ss", Locale.ROOT);
    /** Colours of kept traces, in turn (none is the bar, pink-line or design colour). */
    private static final Color[] KEPT_COLOURS = {Color.web("#6b5b95"), Color.web("#b7791f"), Color.web("#3f7f4f"),
        Color.web("#8a5a44"), Color.web("#4a6fa5")};
    static final Color PINK_LINE = Color.web("#b0475a");
    static final Color DESIGN_LINE = Color.web("#2a2c30");

    /** What the generator plays. */
    enum Source {
        DESIGN_A("Design A (the editor's)"), DESIGN_B("Design B (from a file)"), WHITE("White noise"),
        IDEAL_PINK("Ideal pink");

        private final String label;

        Source(String label) {
            this.label = label;
        }

        @Override
        public String toString() {
            return label;
        }
    }

    /** A stored reading: its name, when it was kept, what produced it, and its three views. */
    record KeptTrace(String name, LocalTime time, String settings, List<Band> bands, double[] levelsDb,
            double[] minusDesignDb, double[] minusTargetDb, Color colour) {
        String label() {
            return name + " · " + time.format(CLOCK) + " · " + settings;
        }

        @Override
        public String toString() {
            return label();
        }
    }

    private final MainWindow window;
    private final BorderPane root = new BorderPane();
    /** True when the idle lines were skipped while the bench was hidden; redrawn when it shows. */
    private boolean idleStale;
    // signal out
    private final ComboBox<Source> source = new ComboBox<>(FXCollections.observableArrayList(Source.values()));
    private final Label fileB = new Label("no design B loaded");
    private final ComboBox<String> output = new ComboBox<>();
    private final Slider level = new Slider(ListenView.MIN_LEVEL_DBFS, ListenView.SAFE_MAX_DBFS, ListenView.DEFAULT_LEVEL_DBFS);
    private final Label levelText = new Label();
    private final CheckBox allowLoud = new CheckBox("Allow loud (above −10 dBFS)");
    private final Button play = new Button("Play");
    private final Label outInfo = new Label("Not playing.");
    // line in
    private final ComboBox<String> input = new ComboBox<>();
    private final ComboBox<String> averaging = new ComboBox<>(FXCollections.observableArrayList(
            "Linear (all segments alike)", "Exponential (" + MeasureRequest.DEFAULT_EXPONENTIAL_SEGMENTS + "-segment memory)"));
    private final Button capture = new Button("Capture");
    private final Button reset = new Button("Reset averaging");
    private final ToggleButton hold = new ToggleButton("Hold");
    private final Label inInfo = new Label("Not capturing.");
    // kept traces
    private final TextField keepName = new TextField();
    private final Button keep = new Button("Keep reading");
    private final Button removeKept = new Button("Remove");
    private final Button saveKept = new Button("Save…");
    private final Button openKept = new Button("Open…");
    private final ListView<KeptTrace> kept = new ListView<>();
    private final Map<KeptTrace, javafx.beans.property.BooleanProperty> overlaid = new java.util.IdentityHashMap<>();
    // readings
    private final ReadingsChart levels = new ReadingsChart("Line-in bands re the 1 kHz band", "Level (dB)", -20, 20, 6);
    private final ReadingsChart minusDesign = new ReadingsChart("Reading − design (weighted centring)", "Difference (dB)",
            -1, 1, 1);
    private final ReadingsChart minusTarget = new ReadingsChart("Reading − ideal pink (weighted centring)", "Difference (dB)",
            -1, 1, 1);
    private final Label pointer = new Label("Point at a band for its reading; wheel zooms, drag pans, double click resets.");
    private final AnimationTimer poll;
    private final ChainPrototypes<Source> prototypes;
    private CircuitModel modelB;
    private PlaybackEngine engine;
    private boolean starting;
    private LiveMeasurement live;
    private boolean opening;
    private MeasureResult shown;
    private int keptCount;

    BenchView(MainWindow window) {
        this.window = window;
        prototypes = new ChainPrototypes<>(Source.class, k -> switch (k) {
            case WHITE -> NoiseChain::white;
            case IDEAL_PINK -> NoiseChain::idealPink;
            case DESIGN_A -> ChainPrototypes.design(window.model());
            case DESIGN_B -> ChainPrototypes.design(modelB);
        });
        source.setValue(Source.DESIGN_A);
        source.valueProperty().addListener((o, a, b) -> switchSource());
        level.setBlockIncrement(1);
        level.setMajorTickUnit(10);
        level.setShowTickMarks(true);
        level.setShowTickLabels(true);
        level.valueProperty().addListener((o, a, b) -> {
            updateLevelText();
            switchSource();
        });
        allowLoud.selectedProperty().addListener((o, a, loud) -> {
            level.setMax(loud ? ListenView.LOUD_MAX_DBFS : ListenView.SAFE_MAX_DBFS);
            if (!loud && level.getValue() > ListenView.SAFE_MAX_DBFS) {
                level.setValue(ListenView.SAFE_MAX_DBFS);
            }
        });
        averaging.setValue(averaging.getItems().get(0));
        averaging.valueProperty().addListener((o, a, b) -> restartAnalysis("averaging changed"));
        output.getItems().add(DEFAULT_OUTPUT);
        output.setValue(DEFAULT_OUTPUT);
        input.getItems().add(DEFAULT_INPUT);
        input.setValue(DEFAULT_INPUT);
        refreshDevices();
        window.modelProperty().addListener((o, a, b) -> {
            prototypes.forget(Source.DESIGN_A);
            if (source.getValue() == Source.DESIGN_A) {
                switchSource();
            }
            restartAnalysis("the design changed");
            showIdle();
        });
        window.settingsProperty().addListener((o, a, b) -> {
            restartAnalysis("the bands changed");
            showIdle();
        });
        for (ReadingsChart c : List.of(levels, minusDesign, minusTarget)) {
            c.readoutProperty().addListener((o, a, b) -> {
                if (!b.isEmpty()) {
                    pointer.setText(b);
                }
            });
        }
        buildLayout();
        updateLevelText();
        root.visibleProperty().addListener((o, a, b) -> {
            if (b && idleStale) {
                showIdle();
            }
        });
        root.sceneProperty().addListener((o, a, b) -> {
            if (b != null && idleStale) {
                showIdle();
            }
        });
        showIdle();
        poll = new AnimationTimer() {
            @Override
            public void handle(long now) {
                showLatest();
            }
        };
        poll.start();
    }

    private void buildLayout() {
        Button loadB = new Button("Load design B…");
        loadB.setOnAction(e -> loadB());
        play.getStyleClass().add("primary");
        play.setOnAction(e -> togglePlay());
        capture.getStyleClass().add("primary");
        capture.setOnAction(e -> toggleCapture());
        reset.setOnAction(e -> restartAnalysis("reset"));
        // while held, newer readings are not drawn; on release the next frame draws the newest
        keep.setOnAction(e -> keepReading());
        removeKept.setOnAction(e -> {
            KeptTrace t = kept.getSelectionModel().getSelectedItem();
            if (t != null) {
                kept.getItems().remove(t);
                overlaid.remove(t);
                showReferences();
            }
        });
        saveKept.setOnAction(e -> window.prompts().saveFile(window.stage(), "Save the kept readings", "kept-readings.json",
                "Kept readings (*.json)", "*.json").ifPresent(this::saveKept));
        openKept.setOnAction(e -> window.prompts().openFile(window.stage(), "Open kept readings",
                "Kept readings (*.json)", "*.json").ifPresent(this::openKept));
        keepName.setPromptText("name (optional)");
        kept.setCellFactory(CheckBoxListCell.forListView(this::overlaidProperty));
        kept.setPrefHeight(120);
        DesignView.keepWidth(loadB, play, capture, reset, hold, keep, removeKept, saveKept, openKept);

        GridPane g = new GridPane();
        g.setHgap(10);
        g.setVgap(8);
        int r = 0;
        g.add(ListenView.title("Signal out"), 0, r++, 2, 1);
        g.addRow(r++, new Label("Source"), source);
        g.add(new VBox(4, loadB, fileB), 1, r++);
        g.addRow(r++, new Label("Output"), output);
        g.addRow(r++, new Label("Level"), level);
        g.addRow(r++, new Label(""), levelText);
        g.add(allowLoud, 1, r++);
        g.add(play, 1, r++);
        outInfo.setWrapText(true);
        outInfo.getStyleClass().add("readout");
        g.add(outInfo, 0, r++, 2, 1);
        g.add(ListenView.title("Line in"), 0, r++, 2, 1);
        g.addRow(r++, new Label("Input"), input);
        g.addRow(r++, new Label("Averaging"), averaging);
        g.add(new HBox(6, capture, hold), 1, r++);
        g.add(reset, 1, r++);
        inInfo.setWrapText(true);
        inInfo.getStyleClass().add("readout");
        g.add(inInfo, 0, r++, 2, 1);
        g.add(ListenView.title("Kept readings"), 0, r++, 2, 1);
        g.add(new HBox(6, keepName, keep), 0, r++, 2, 1);
        g.add(kept, 0, r++, 2, 1);
        g.add(new HBox(6, removeKept, saveKept, openKept), 0, r++, 2, 1);
        Label caution = new Label(ListenView.CAUTION);
        caution.setWrapText(true);
        caution.getStyleClass().add("hint");
        g.add(caution, 0, r, 2, 1);
        source.setPrefWidth(210);
        output.setPrefWidth(210);
        input.setPrefWidth(210);
        averaging.setPrefWidth(210);
        level.setPrefWidth(210);
        keepName.setPrefWidth(150);
        g.setPadding(new Insets(4, 16, 4, 4));
        g.setPrefWidth(330);
        g.getStyleClass().add("side-panel");
        ScrollPane side = new ScrollPane(g);
        side.setFitToWidth(true);
        side.setHbarPolicy(ScrollPane.ScrollBarPolicy.NEVER);
        side.setPrefWidth(345);
        side.setMinWidth(300);

        HBox differences = new HBox(8, minusDesign, minusTarget);
        HBox.setHgrow(minusDesign, Priority.ALWAYS);
        HBox.setHgrow(minusTarget, Priority.ALWAYS);
        pointer.getStyleClass().add("readout");
        VBox charts = new VBox(6, levels, differences, pointer);
        VBox.setVgrow(levels, Priority.ALWAYS);
        VBox.setVgrow(differences, Priority.ALWAYS);
        charts.setPadding(new Insets(0, 0, 0, 12));
        root.setLeft(side);
        root.setCenter(charts);
        root.setPadding(new Insets(12));
    }

    Node root() {
        return root;
    }

    private javafx.beans.property.BooleanProperty overlaidProperty(KeptTrace t) {
        return overlaid.computeIfAbsent(t, k -> {
            javafx.beans.property.BooleanProperty p = new javafx.beans.property.SimpleBooleanProperty(true);
            p.addListener((o, a, b) -> showReferences());
            return p;
        });
    }

    private void refreshDevices() {
        CompletableFuture.supplyAsync(() -> {
            List<String> outs = new ArrayList<>();
            List<String> ins = new ArrayList<>();
            try {
                for (Devices.Device d : Devices.list()) {
                    if (d.hasOutput()) {
                        outs.add(d.name());
                    }
                    if (d.hasInput()) {
                        ins.add(d.name());
                    }
                }
            } catch (RuntimeException e) {
                // No sound system: only the default entries.
            }
            return List.of(outs, ins);
        }, window.tasks().devices()).thenAccept(lists -> Platform.runLater(() -> {
            List<String> outs = new ArrayList<>(List.of(DEFAULT_OUTPUT));
            outs.addAll(lists.get(0));
            List<String> ins = new ArrayList<>(List.of(DEFAULT_INPUT));
            ins.addAll(lists.get(1));
            String o = output.getValue();
            String i = input.getValue();
            output.getItems().setAll(outs);
            input.getItems().setAll(ins);
            output.setValue(outs.contains(o) ? o : DEFAULT_OUTPUT);
            input.setValue(ins.contains(i) ? i : DEFAULT_INPUT);
        }));
    }

    private void loadB() {
        window.prompts().openFile(window.stage(), "Design B for the bench", "Design files (*.json)", "*.json")
                .ifPresent(p -> {
                    try {
                        setModelB(p);
                        source.setValue(Source.DESIGN_B);
                    } catch (DesignException e) {
                        window.prompts().error(window.stage(), e.getMessage());
                    }
                });
    }

    /** Loads design B from a file without asking. */
    void setModelB(Path p) {
        modelB = CircuitModel.of(DesignReader.read(p), p.getFileName().toString());
        prototypes.forget(Source.DESIGN_B);
        fileB.setText(p.getFileName() + ": " + modelB.design().name());
        if (source.getValue() == Source.DESIGN_B) {
            switchSource();
        }
        showIdle();
    }

    // ---- signal out ----

    private void updateLevelText() {
        levelText.setText(String.format(Locale.ROOT, "%.1f dBFS RMS%s", level.getValue(),
                level.getValue() > ListenView.SAFE_MAX_DBFS ? "  (loud)" : ""));
    }

    /** The model the reading is compared with: design B when B plays, else the editor's design. */
    private CircuitModel comparedModel() {
        return source.getValue() == Source.DESIGN_B && modelB != null ? modelB : window.model();
    }

    /** The chain for a source at a level (each source designed once, then re-levelled); null if none. */
    private NoiseChain chainFor(Source kind, double levelDbfs) {
        try {
            return prototypes.at(kind, levelDbfs);
        } catch (UnrenderableModelException e) {
            outInfo.setText("Cannot play " + kind + ": " + e.getMessage());
            return null;
        }
    }

    void togglePlay() {
        if (engine != null) {
            stopPlaying();
        } else {
            play();
        }
    }

    /** Starts the generator after the session's caution; the device opens off the FX thread. */
    void play() {
        if (engine != null || starting) {
            return;
        }
        NoiseChain chain = chainFor(source.getValue(), level.getValue());
        if (chain == null) {
            outInfo.setText(source.getValue() == Source.DESIGN_B ? "Load design B first."
                    : "The design has an error; fix it in the Design view, or play white noise or ideal pink.");
            return;
        }
        if (!window.cautionAccepted()) {
            outInfo.setText("Not playing: the caution was not accepted.");
            return;
        }
        String dev = DEFAULT_OUTPUT.equals(output.getValue()) ? null : output.getValue();
        starting = true;
        outInfo.setText("Opening the output…");
        CompletableFuture.supplyAsync(() -> Players.start(dev, chain), window.tasks().devices())
                .whenComplete((e, ex) -> Platform.runLater(() -> {
            starting = false;
            if (ex != null) {
                outInfo.setText(Players.failure(ex, "choose another output"));
                return;
            }
            engine = e;
            play.setText("Stop");
            outInfo.setText(String.format(Locale.ROOT, "Playing %s at %.1f dBFS RMS on %s (latency %.0f ms).",
                    chain.describe(), level.getValue(), dev == null ? "the default output" : dev, e.latencyMs()));
            restartAnalysis("the generator started");
        }));
    }

    /** Replaces what plays (source or level change) with the engine's crossfade. */
    private void switchSource() {
        showIdle();
        if (engine == null) {
            return;
        }
        NoiseChain chain = chainFor(source.getValue(), level.getValue());
        if (chain == null) {
            outInfo.setText("Nothing to play for " + source.getValue() + ".");
            return;
        }
        engine.switchTo(chain);
        outInfo.setText(String.format(Locale.ROOT, "Playing %s at %.1f dBFS RMS.", chain.describe(), level.getValue()));
        restartAnalysis("the generator changed");
    }

    void stopPlaying() {
        if (engine != null) {
            PlaybackEngine e = engine;
            engine = null;
            window.tasks().devices().submit(() -> {
                e.stop();
                return null;
            });
            outInfo.setText(String.format(Locale.ROOT, "Stopped after %.1f s; %d underruns.",
                    e.framesWritten() / (double) ListenView.RATE_HZ, e.underruns()));
        }
        play.setText("Play");
    }

    boolean playing() {
        return engine != null;
    }

    // ---- line in ----

    private MeasureSetup setup() {
        WelchSettings.Averaging avg = averaging.getSelectionModel().getSelectedIndex() == 1
                ? WelchSettings.Averaging.EXPONENTIAL : WelchSettings.Averaging.LINEAR;
        return new MeasureSetup(MeasureMode.NOISE_SOURCE, avg, window.settings(), 0, 0, comparedModel(), null,
                BandReader.WELCH);
    }

    void toggleCapture() {
        if (live != null) {
            stopCapture();
        } else {
            startCapture();
        }
    }

    /** Opens the chosen input (off the FX thread) and starts the live analysis. */
    void startCapture() {
        if (live != null || opening) {
            return;
        }
        String dev = DEFAULT_INPUT.equals(input.getValue()) ? null : input.getValue();
        MeasureSetup s = setup();
        opening = true;
        inInfo.setText("Opening the input…");
        CompletableFuture.supplyAsync(() -> {
            InputLine line = Devices.openInput(dev, RATE_HZ, 1, RATE_HZ / 10);
            try {
                return new LiveMeasurement(line, s);
            } catch (RuntimeException e) {
                line.close();
                throw e;
            }
        }, window.tasks().devices()).whenComplete((c, ex) -> Platform.runLater(() -> {
            opening = false;
            if (ex != null) {
                Throwable cause = ex.getCause() != null ? ex.getCause() : ex;
                inInfo.setText("Cannot capture: " + cause.getMessage());
                return;
            }
            live = c;
            shown = null;
            capture.setText("Stop capture");
            inInfo.setText("Capturing from " + (dev == null ? "the default input" : dev) + "…");
        }));
    }

    void stopCapture() {
        if (live != null) {
            LiveMeasurement c = live;
            live = null;
            c.close(); // as the Measure view does: the capture thread ends within its block time
            inInfo.setText(shown == null ? "Stopped." : describe(shown) + " Stopped.");
        }
        capture.setText("Capture");
    }

    boolean capturing() {
        return live != null;
    }

    /** Starts the averaging again (a new pipeline on the same input); the charts clear until it reads. */
    void restartAnalysis(String why) {
        if (live == null) {
            return;
        }
        try {
            live.restartAnalysis(setup());
        } catch (RuntimeException e) {
            inInfo.setText(e.getMessage());
            return;
        }
        shown = null;
        showIdle();
        inInfo.setText("Averaging restarted (" + why + ").");
    }

    /** Stops both sides (window closing). */
    void stop() {
        stopPlaying();
        stopCapture();
    }

    /** Draws the newest reading if it is new and not held (display rate). */
    void showLatest() {
        LiveMeasurement c = live;
        if (c == null) {
            return;
        }
        String problem = c.problem();
        if (problem != null) {
            stopCapture();
            inInfo.setText(problem); // after the stop, so its status does not replace the failure
            window.showStatus(problem);
            return;
        }
        if (engine != null && engine.failure() != null) {
            String failure = "Playback ended: " + engine.failure().getMessage();
            stopPlaying();
            outInfo.setText(failure);
            window.showStatus(failure);
        }
        MeasureResult r = c.latest();
        if (r == null || r == shown || hold.isSelected()) {
            return;
        }
        shown = r;
        showReading(r);
        inInfo.setText(describe(r));
    }

    private static String describe(MeasureResult r) {
        return String.format(Locale.ROOT, "%.1f s, %d averages (%s), %.3g Hz bins; RMS %.1f dBFS; %d of %d bands "
                + "counted.%s", r.secondsAnalysed(), r.averages(),
                r.request().averaging() == WelchSettings.Averaging.EXPONENTIAL ? "exponential" : "linear",
                r.resolutionHz(), r.measuredChannel().rmsDbfs(), r.countedBands(), r.bands().size(),
                r.clippedSamples() > 0 ? " " + r.clippedSamples() + " clipped samples." : "");
    }

    /** The three charts from one result; lines are the target and design aligned by the same centring. */
    void showReading(MeasureResult r) {
        List<BandResult> b = r.bands();
        int n = b.size();
        List<Band> bandList = b.stream().map(BandResult::band).toList();
        double[] level = new double[n];
        double[] sigma = new double[n];
        double[] pink = new double[n];
        double[] design = new double[n];
        double[] dDesign = new double[n];
        double[] dTarget = new double[n];
        boolean[] counted = new boolean[n];
        for (int i = 0; i < n; i++) {
            BandResult x = b.get(i);
            level[i] = x.normalizedDb();
            sigma[i] = x.uncertaintyDb();
            dDesign[i] = x.designDifferenceDb();
            dTarget[i] = x.deviationDb();
            // the target and the design, moved by the offsets that centre the differences
            pink[i] = level[i] - dTarget[i];
            design[i] = level[i] - dDesign[i];
            counted[i] = x.counted();
        }
        double[] sDesign = centredSigma(dDesign, sigma, counted);
        double[] sTarget = centredSigma(dTarget, sigma, counted);
        levels.setBands(bandList);
        minusDesign.setBands(bandList);
        minusTarget.setBands(bandList);
        levels.setReading("Line in", level, sigma);
        levels.setLines(List.of(new ReadingsChart.Trace(targetName(r.request().target()), pink, PINK_LINE, false),
                new ReadingsChart.Trace("Design", design, DESIGN_LINE, true)));
        minusDesign.setReading("Line in − design", dDesign, sDesign);
        minusDesign.setNotes(List.of(new ReadingsChart.Trace("line in", level, DESIGN_LINE, false),
                new ReadingsChart.Trace("design", design, DESIGN_LINE, true)));
        minusTarget.setReading("Line in − target", dTarget, sTarget);
        minusTarget.setNotes(List.of(new ReadingsChart.Trace("line in", level, DESIGN_LINE, false),
                new ReadingsChart.Trace(targetName(r.request().target()).toLowerCase(Locale.ROOT), pink, PINK_LINE, false),
                new ReadingsChart.Trace("design", design, DESIGN_LINE, true)));
        showReferences();
    }

    private static String targetName(TargetSlope t) {
        return t == TargetSlope.PINK ? "Ideal pink" : "Target " + t.describe();
    }

    /**
     * One standard deviation of each centred difference under the weighted rule (the centring is
     * shift-invariant, so centring the already centred values again gives the same weights).
     */
    static double[] centredSigma(double[] centred, double[] sigma, boolean[] counted) {
        double[] out = new double[centred.length];
        java.util.Arrays.fill(out, Double.NaN);
        boolean any = false;
        for (int i = 0; i < centred.length; i++) {
            any |= counted[i] && Double.isFinite(centred[i]);
        }
        if (!any) {
            return out;
        }
        double[] finite = centred.clone();
        boolean[] in = counted.clone();
        for (int i = 0; i < finite.length; i++) {
            if (!Double.isFinite(finite[i])) {
                finite[i] = 0;
                in[i] = false;
            }
        }
        Centering c = Centering.weighted(finite, sigma, in);
        for (int i = 0; i < out.length; i++) {
            out[i] = Double.isFinite(centred[i]) ? c.centredSigmaDb(sigma[i], in[i]) : Double.NaN;
        }
        return out;
    }

    /** Before a reading: the bands, the target line and the compared design's line, re the 1 kHz band. */
    private void showIdle() {
        if (shown != null && live != null) {
            return;
        }
        if (root.getScene() == null || !root.isVisible()) {
            // The bench is not on show (not yet in the scene, or another tab is): the design's band
            // integrals are worth computing only when the bench is looked at, not at every edit.
            idleStale = true;
            return;
        }
        idleStale = false;
        BandTable table = window.settings().table();
        List<Band> bandList = table.bands();
        int ref = 0;
        for (int i = 0; i < bandList.size(); i++) {
            if (Math.abs(Math.log(bandList.get(i).midHz() / 1000)) < Math.abs(Math.log(bandList.get(ref).midHz() / 1000))) {
                ref = i;
            }
        }
        TargetSlope target = window.settings().target();
        double[] pink = new double[bandList.size()];
        for (int i = 0; i < pink.length; i++) {
            pink[i] = 10 * Math.log10(target.bandPower(bandList.get(i).lowHz(), bandList.get(i).highHz()))
                    - 10 * Math.log10(target.bandPower(bandList.get(ref).lowHz(), bandList.get(ref).highHz()));
        }
        List<ReadingsChart.Trace> lines = new ArrayList<>();
        lines.add(new ReadingsChart.Trace(targetName(target), pink, PINK_LINE, false));
        CircuitModel m = comparedModel();
        if (m != null) {
            double[] design = new double[pink.length];
            double r = BandPower.levelDb(m::magnitudeSquared, bandList.get(ref).lowHz(), bandList.get(ref).highHz());
            for (int i = 0; i < design.length; i++) {
                design[i] = BandPower.levelDb(m::magnitudeSquared, bandList.get(i).lowHz(), bandList.get(i).highHz()) - r;
            }
            lines.add(new ReadingsChart.Trace("Design", design, DESIGN_LINE, true));
        }
        for (ReadingsChart c : List.of(levels, minusDesign, minusTarget)) {
            c.setBands(bandList);
            c.clearReading();
            c.setLines(List.of());
            c.setNotes(List.of());
        }
        levels.setLines(lines);
        showReferences();
    }

    // ---- kept readings ----

    /** Stores the reading on show as a named trace (overlaid at once); false when there is none. */
    boolean keepReading() {
        MeasureResult r = shown;
        if (r == null) {
            inInfo.setText("Nothing to keep yet: capture a reading first.");
            return false;
        }
        keptCount++;
        String name = keepName.getText() == null || keepName.getText().isBlank() ? "Reading " + keptCount
                : keepName.getText().strip();
        String settings = String.format(Locale.ROOT, "%s at %.1f dBFS%s, %d averages (%s), %s", source.getValue(),
                level.getValue(), engine == null ? " (not playing)" : "", r.averages(),
                r.request().averaging() == WelchSettings.Averaging.EXPONENTIAL ? "exponential" : "linear",
                r.bands().get(0).band().fraction().b() == 3 ? "third-octave" : "octave");
        int n = r.bands().size();
        double[] lv = new double[n];
        double[] dd = new double[n];
        double[] dt = new double[n];
        for (int i = 0; i < n; i++) {
            lv[i] = r.bands().get(i).normalizedDb();
            dd[i] = r.bands().get(i).designDifferenceDb();
            dt[i] = r.bands().get(i).deviationDb();
        }
        KeptTrace t = new KeptTrace(name, LocalTime.now().withNano(0), settings,
                r.bands().stream().map(BandResult::band).toList(), lv, dd, dt, KEPT_COLOURS[(keptCount - 1) % KEPT_COLOURS.length]);
        kept.getItems().add(t);
        overlaidProperty(t);
        keepName.clear();
        showReferences();
        return true;
    }

    private void showReferences() {
        List<ReadingsChart.Trace> lv = new ArrayList<>();
        List<ReadingsChart.Trace> dd = new ArrayList<>();
        List<ReadingsChart.Trace> dt = new ArrayList<>();
        List<Band> current = window.settings().table().bands();
        for (KeptTrace t : kept.getItems()) {
            javafx.beans.property.BooleanProperty on = overlaid.get(t);
            if (on == null || !on.get() || !t.bands().equals(current)) {
                continue;
            }
            lv.add(new ReadingsChart.Trace(t.name(), t.levelsDb(), t.colour(), true));
            dd.add(new ReadingsChart.Trace(t.name(), t.minusDesignDb(), t.colour(), true));
            dt.add(new ReadingsChart.Trace(t.name(), t.minusTargetDb(), t.colour(), true));
        }
        levels.setReferences(lv);
        minusDesign.setReferences(dd);
        minusTarget.setReferences(dt);
    }

    /** Writes every kept reading to a file (atomically); the status line says how it went. */
    void saveKept(Path file) {
        try {
            KeptReadingsFile.write(file, kept.getItems());
            window.showStatus("Saved " + kept.getItems().size() + " kept readings to " + file);
        } catch (java.io.IOException e) {
            window.prompts().error(window.stage(), file + ": cannot save (" + e.getMessage() + ")");
        }
    }

    /** Adds the readings of a file to the kept ones (those of other bands are refused, by name). */
    void openKept(Path file) {
        List<KeptReadingsFile.Stored> stored;
        try {
            stored = KeptReadingsFile.read(file);
        } catch (java.io.IOException e) {
            window.prompts().error(window.stage(), e.getMessage());
            return;
        }
        List<String> refused = new ArrayList<>();
        for (KeptReadingsFile.Stored st : stored) {
            List<Band> b = KeptReadingsFile.matching(st, window.settings().table().bands());
            if (b == null) {
                refused.add(st.name());
                continue;
            }
            keptCount++;
            KeptTrace t = new KeptTrace(st.name(), st.time(), st.settings(), b, st.levelsDb(), st.minusDesignDb(),
                    st.minusTargetDb(), KEPT_COLOURS[(keptCount - 1) % KEPT_COLOURS.length]);
            kept.getItems().add(t);
            overlaidProperty(t);
        }
        showReferences();
        window.showStatus("Opened " + (stored.size() - refused.size()) + " kept readings from " + file.getFileName()
                + (refused.isEmpty() ? "" : "; not on the bands in use: " + String.join(", ", refused)));
    }

    /** Shows or hides a kept trace on the charts. */
    void setOverlaid(KeptTrace t, boolean on) {
        overlaidProperty(t).set(on);
    }

    // ---- for tests ----

    /** Shows a result as if the live analysis had produced it (a file's reading, in tests). */
    void showResult(MeasureResult r) {
        shown = r;
        showReading(r);
        inInfo.setText(describe(r));
    }

    ReadingsChart levelsChart() {
        return levels;
    }

    ReadingsChart minusDesignChart() {
        return minusDesign;
    }

    ReadingsChart minusTargetChart() {
        return minusTarget;
    }

    List<KeptTrace> keptTraces() {
        return List.copyOf(kept.getItems());
    }

    MeasureResult shown() {
        return shown;
    }

    ComboBox<Source> sourceBox() {
        return source;
    }

    Slider levelSlider() {
        return level;
    }

    CheckBox allowLoud() {
        return allowLoud;
    }

    ToggleButton holdButton() {
        return hold;
    }

    TextField keepNameField() {
        return keepName;
    }

    Label pointerReadout() {
        return pointer;
    }
}

package org.roseate.app;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.CompletableFuture;
import javafx.animation.AnimationTimer;
import javafx.application.Platform;
import javafx.collections.FXCollections;
import javafx.geometry.Insets;
import javafx.geometry.Pos;
import javafx.scene.Node;
import javafx.scene.control.Button;
import javafx.scene.control.CheckBox;
import javafx.scene.control.ComboBox;
import javafx.scene.control.Label;
import javafx.scene.control.Slider;
import javafx.scene.control.ToggleButton;
import javafx.scene.control.ToggleGroup;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.GridPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Priority;
import javafx.scene.layout.VBox;
import org.roseate.audio.Devices;
import org.roseate.audio.PlaybackEngine;
import org.roseate.bands.Band;
import org.roseate.bands.BandTable;
import org.roseate.circuit.DesignException;
import org.roseate.circuit.DesignReader;
import org.roseate.digital.UnrenderableModelException;
import org.roseate.model.CircuitModel;
import org.roseate.noise.NoiseChain;
import org.roseate.spectrum.BandLevel;

/**
 * The listen view: plays the design (or white noise, or the ideal pink reference) through a sound
 * device with the core's {@link PlaybackEngine}, switches A/B between two sources at the same RMS
 * level, and shows a live band meter of what is playing ({@link TapSource} → {@link MeterRing} →
 * {@link BandMeter}), read at display rate.
 */
final class ListenView {
    /** The caution shown before the first playback of a session. */
    static final String CAUTION = "Noise at full scale can damage hearing and loudspeaker tweeters: start low and "
            + "turn up slowly, protect ears and tweeters, mind the noise-exposure rules of your workplace.";
    static final double DEFAULT_LEVEL_DBFS = -30;
    /** Highest level without "allow loud", dBFS RMS. */
    static final double SAFE_MAX_DBFS = -10;
    static final double LOUD_MAX_DBFS = 0;
    static final double MIN_LEVEL_DBFS = -80;
    static final int RATE_HZ = 48000;
    static final int CHANNELS = 2;
    static final double BUFFER_SECONDS = 0.1;
    static final long SEED = 20240601L;
    /** The meter's level-axis step, dB: one gridline per 5 dB keeps 30–40 dB spans readable. */
    static final double METER_STEP_DB = 5;
    /** Room kept above and below what the meter shows, dB. */
    static final double METER_MARGIN_DB = 1;

    /** What a slot plays. */
    enum SourceKind {
        DESIGN("Design in the editor"), WHITE("White noise"), IDEAL_PINK("Ideal pink reference"), FILE("Design file B");

        private final String label;

        SourceKind(String label) {
            this.label = label;
        }

        @Override
        public String toString() {
            return label;
        }
    }

    private final MainWindow window;
    private final BorderPane root = new BorderPane();
    private final ComboBox<SourceKind> sourceA = new ComboBox<>(FXCollections.observableArrayList(
            SourceKind.DESIGN, SourceKind.WHITE, SourceKind.IDEAL_PINK));
    private final ComboBox<SourceKind> sourceB = new ComboBox<>(FXCollections.observableArrayList(SourceKind.values()));
    private final Label fileB = new Label("no design file B loaded");
    private final ToggleButton playA = new ToggleButton("A");
    private final ToggleButton playB = new ToggleButton("B");
    private final ComboBox<String> device = new ComboBox<>();
    private final Slider level = new Slider(MIN_LEVEL_DBFS, SAFE_MAX_DBFS, DEFAULT_LEVEL_DBFS);
    private final Label levelText = new Label();
    private final CheckBox allowLoud = new CheckBox("Allow loud (above −10 dBFS)");
    private final Button play = new Button("Play");
    private final Label info = new Label("Stopped.");
    private final Label meterInfo = new Label("Press Play: the bars show each band's level re the 1 kHz band, the rose marks the target.");
    private final BandChart meter = new BandChart("Live band meter: what is playing", "Level re the 1 kHz band (dB)", "Playing");
    private final MeterRing ring = new MeterRing(1 << 17);
    private final AnimationTimer poll;
    private final ChainPrototypes<SourceKind> prototypes;
    private CircuitModel modelB;
    private PlaybackEngine engine;
    private BandMeter bandMeter;
    private int tapId;
    private long shownSequence = -1;
    private boolean starting;

    ListenView(MainWindow window) {
        this.window = window;
        prototypes = new ChainPrototypes<>(SourceKind.class, k -> switch (k) {
            case WHITE -> NoiseChain::white;
            case IDEAL_PINK -> NoiseChain::idealPink;
            case DESIGN -> ChainPrototypes.design(window.model());
            case FILE -> ChainPrototypes.design(modelB);
        });
        sourceA.setValue(SourceKind.DESIGN);
        sourceB.setValue(SourceKind.IDEAL_PINK);
        ToggleGroup ab = new ToggleGroup();
        playA.setToggleGroup(ab);
        playB.setToggleGroup(ab);
        playA.setSelected(true);
        ab.selectedToggleProperty().addListener((o, a, b) -> {
            if (b == null) {
                a.setSelected(true);
            } else {
                switchSource();
            }
        });
        sourceA.valueProperty().addListener((o, a, b) -> switchSource());
        sourceB.valueProperty().addListener((o, a, b) -> switchSource());
        level.setBlockIncrement(1);
        level.setMajorTickUnit(10);
        level.setShowTickMarks(true);
        level.setShowTickLabels(true);
        level.valueProperty().addListener((o, a, b) -> levelChanged());
        allowLoud.selectedProperty().addListener((o, a, loud) -> {
            level.setMax(loud ? LOUD_MAX_DBFS : SAFE_MAX_DBFS);
            if (!loud && level.getValue() > SAFE_MAX_DBFS) {
                level.setValue(SAFE_MAX_DBFS);
            }
        });
        play.setOnAction(e -> togglePlay());
        play.getStyleClass().add("primary");
        play.setDefaultButton(false);
        device.getItems().add(Devices_DEFAULT);
        device.setValue(Devices_DEFAULT);
        refreshDevices();
        window.modelProperty().addListener((o, a, b) -> {
            prototypes.forget(SourceKind.DESIGN);
            if (currentKind() == SourceKind.DESIGN) {
                switchSource();
            }
        });
        window.settingsProperty().addListener((o, a, b) -> {
            if (engine != null) {
                restartMeter();
            }
        });
        meter.fixedScale(); // fitMeterScale chooses it
        buildLayout();
        updateLevelText();
        poll = new AnimationTimer() {
            @Override
            public void handle(long now) {
                showMeter();
            }
        };
    }

    private static final String Devices_DEFAULT = "Default output";

    private void buildLayout() {
        Button loadB = new Button("Load design B…");
        loadB.setOnAction(e -> loadB());
        Button refresh = new Button("Refresh");
        refresh.getStyleClass().add("small");
        refresh.setOnAction(e -> refreshDevices());
        DesignView.keepWidth(refresh, loadB, play);
        GridPane g = new GridPane();
        g.setHgap(10);
        g.setVgap(10);
        javafx.scene.layout.ColumnConstraints labels = new javafx.scene.layout.ColumnConstraints();
        labels.setMinWidth(javafx.scene.layout.Region.USE_PREF_SIZE);
        g.getColumnConstraints().addAll(labels, new javafx.scene.layout.ColumnConstraints());
        int r = 0;
        g.add(title("Sources"), 0, r++, 2, 1);
        g.addRow(r++, new Label("A"), sourceA);
        g.addRow(r++, new Label("B"), sourceB);
        g.add(new VBox(4, loadB, fileB), 1, r++);
        HBox abBox = new HBox(0, playA, playB);
        playA.getStyleClass().add("ab-left");
        playB.getStyleClass().add("ab-right");
        g.addRow(r++, new Label("Playing"), abBox);
        Label abNote = new Label("A and B play at the same RMS level, so only the spectrum differs.");
        abNote.setWrapText(true);
        abNote.getStyleClass().add("hint");
        g.add(abNote, 0, r++, 2, 1);
        g.add(title("Output"), 0, r++, 2, 1);
        g.addRow(r++, new Label("Device"), new HBox(6, device, refresh));
        g.addRow(r++, new Label("Level"), level);
        g.addRow(r++, new Label(""), levelText);
        g.add(allowLoud, 1, r++);
        HBox playRow = new HBox(10, play);
        playRow.setAlignment(Pos.CENTER_LEFT);
        g.add(playRow, 1, r++);
        info.setWrapText(true);
        info.getStyleClass().add("readout");
        g.add(info, 0, r++, 2, 1);
        Label keys = new Label("Space plays and stops. The level is the RMS of the noise in dBFS (a full-scale sine "
                + "reads 0 dBFS); playback rises from silence over 1 s.");
        keys.setWrapText(true);
        keys.getStyleClass().add("hint");
        g.add(keys, 0, r, 2, 1);
        level.setPrefWidth(260);
        device.setPrefWidth(220);
        sourceA.setPrefWidth(220);
        sourceB.setPrefWidth(220);
        g.setPadding(new Insets(4, 16, 4, 4));
        g.setPrefWidth(360);
        g.setMinWidth(340);
        g.setMaxWidth(380);
        g.getStyleClass().add("side-panel");

        meterInfo.getStyleClass().add("readout");
        VBox right = new VBox(6, meter, meterInfo);
        VBox.setVgrow(meter, Priority.ALWAYS);
        right.setPadding(new Insets(0, 0, 0, 12));
        root.setLeft(g);
        root.setCenter(right);
        root.setPadding(new Insets(12));
        showIdleMeter();
    }

    static Label title(String s) {
        Label l = new Label(s);
        l.getStyleClass().add("section-title");
        return l;
    }

    Node root() {
        return root;
    }

    private void refreshDevices() {
        String keep = device.getValue();
        CompletableFuture.supplyAsync(() -> {
            List<String> names = new ArrayList<>();
            try {
                for (Devices.Device d : Devices.list()) {
                    if (d.hasOutput()) {
                        names.add(d.name());
                    }
                }
            } catch (RuntimeException e) {
                // No sound system: only the default entry remains.
            }
            return names;
        }, window.tasks().devices()).thenAccept(names -> Platform.runLater(() -> {
            List<String> all = new ArrayList<>();
            all.add(Devices_DEFAULT);
            all.addAll(names);
            device.getItems().setAll(all);
            device.setValue(all.contains(keep) ? keep : Devices_DEFAULT);
        }));
    }

    private void loadB() {
        window.prompts().openFile(window.stage(), "Design file for B", "Design files (*.json)", "*.json").ifPresent(p -> {
            try {
                modelB = CircuitModel.of(DesignReader.read(p), p.getFileName().toString());
                prototypes.forget(SourceKind.FILE);
                fileB.setText(p.getFileName() + ": " + modelB.design().name());
                sourceB.setValue(SourceKind.FILE);
                switchSource();
            } catch (DesignException e) {
                window.prompts().error(window.stage(), e.getMessage());
            }
        });
    }

    /** Loads B from a file without asking (for tests and the compare view). */
    void setModelB(Path p) {
        modelB = CircuitModel.of(DesignReader.read(p), p.getFileName().toString());
        prototypes.forget(SourceKind.FILE);
        fileB.setText(p.getFileName() + ": " + modelB.design().name());
    }

    private SourceKind currentKind() {
        return playB.isSelected() ? sourceB.getValue() : sourceA.getValue();
    }

    /**
     * The chain for a slot at a level; null when the slot has nothing to play. The digital design of
     * each source is made once ({@link NoiseChain#design}) and re-levelled with {@link NoiseChain#withLevel},
     * so A and B always play at the same RMS level.
     */
    NoiseChain chainFor(SourceKind kind, double levelDbfs) {
        try {
            return prototypes.at(kind, levelDbfs);
        } catch (UnrenderableModelException e) {
            info.setText("Cannot play " + kind + ": " + e.getMessage());
            return null;
        }
    }

    double levelDbfs() {
        return level.getValue();
    }

    Slider levelSlider() {
        return level;
    }

    CheckBox allowLoud() {
        return allowLoud;
    }

    BandChart meter() {
        return meter;
    }

    boolean playing() {
        return engine != null;
    }

    private void levelChanged() {
        updateLevelText();
        if (engine != null) {
            switchSource();
        }
    }

    private void updateLevelText() {
        levelText.setText(String.format(Locale.ROOT, "%.1f dBFS RMS%s", level.getValue(),
                level.getValue() > SAFE_MAX_DBFS ? "  (loud)" : ""));
    }

    void togglePlay() {
        if (engine != null) {
            stop();
        } else {
            start();
        }
    }

    /** Starts playback after the caution (once per session); opening the device runs off the FX thread. */
    void start() {
        if (engine != null || starting) {
            return;
        }
        NoiseChain chain = chainFor(currentKind(), levelDbfs());
        if (chain == null) {
            info.setText(currentKind() == SourceKind.FILE ? "Load a design file for B first."
                    : "The design has an error; fix it in the Design view, or play white or ideal pink.");
            return;
        }
        if (!window.cautionAccepted()) {
            info.setText("Not playing: the caution was not accepted.");
            return;
        }
        String dev = Devices_DEFAULT.equals(device.getValue()) ? null : device.getValue();
        int id = ++tapId;
        ring.setActiveTap(id);
        TapSource tap = new TapSource(chain, ring, id);
        starting = true;
        info.setText("Opening the device…");
        CompletableFuture.supplyAsync(() -> Players.start(dev, tap), window.tasks().devices())
                .whenComplete((e, ex) -> Platform.runLater(() -> {
            starting = false;
            if (ex != null) {
                info.setText(Players.failure(ex, "choose another device, or render a WAV file from the command line"));
                return;
            }
            engine = e;
            play.setText("Stop");
            info.setText(String.format(Locale.ROOT, "Playing %s on %s, %d Hz, latency %.0f ms.", describe(chain),
                    dev == null ? "the default output" : dev, RATE_HZ, e.latencyMs()));
            restartMeter();
            poll.start();
        }));
    }

    private static String describe(NoiseChain c) {
        return c.describe();
    }

    private void restartMeter() {
        if (bandMeter != null) {
            bandMeter.close();
        }
        BandTable table = window.settings().table();
        bandMeter = new BandMeter(ring, RATE_HZ, table).start();
        shownSequence = -1;
    }

    /** Replaces what is playing (A/B, level or design change) with a crossfade; the meter follows. */
    private void switchSource() {
        if (engine == null) {
            return;
        }
        NoiseChain chain = chainFor(currentKind(), levelDbfs());
        if (chain == null) {
            info.setText("Nothing to play for " + currentKind() + ".");
            return;
        }
        int id = ++tapId;
        engine.switchTo(new TapSource(chain, ring, id));
        ring.setActiveTap(id);
        if (bandMeter != null) {
            bandMeter.reset();
        }
        info.setText(String.format(Locale.ROOT, "Playing %s: %s at %.1f dBFS RMS.", playB.isSelected() ? "B" : "A",
                describe(chain), levelDbfs()));
    }

    void stop() {
        poll.stop();
        if (engine != null) {
            PlaybackEngine e = engine;
            engine = null;
            window.tasks().devices().submit(() -> {
                e.stop();
                return null;
            });
            info.setText(String.format(Locale.ROOT, "Stopped after %.1f s; %d underruns.", e.framesWritten() / (double) RATE_HZ,
                    e.underruns()));
        }
        if (bandMeter != null) {
            bandMeter.close();
            bandMeter = null;
        }
        play.setText("Play");
    }

    /** Shows the newest meter snapshot if it is new (called at display rate). */
    void showMeter() {
        BandMeter m = bandMeter;
        BandMeter.Snapshot s = m == null ? null : m.latest();
        if (engine != null && engine.failure() != null) {
            String failure = "Playback ended: " + engine.failure().getMessage();
            stop();
            info.setText(failure); // after the stop, so its "Stopped after …" does not replace the failure
            window.showStatus(failure);
            return;
        }
        if (s == null || s.sequence() == shownSequence) {
            return;
        }
        shownSequence = s.sequence();
        showLevels(s.levels());
        meterInfo.setText(String.format(Locale.ROOT, "%d segments averaged (exponential, %d-segment time constant); "
                + "bars: level re the 1 kHz band, whiskers ±1 standard deviation, marks: target%s.", s.averages(),
                BandMeter.TIME_CONSTANT_SEGMENTS, s.dropped() > 0 ? "; " + s.dropped() + " samples missed" : ""));
    }

    /** Bars of level re the band nearest 1 kHz, whiskers, and the target's band levels as marks. */
    void showLevels(List<BandLevel> levels) {
        int ref = 0;
        for (int i = 0; i < levels.size(); i++) {
            if (Math.abs(Math.log(levels.get(i).band().midHz() / 1000)) < Math.abs(Math.log(levels.get(ref).band().midHz() / 1000))) {
                ref = i;
            }
        }
        double[] v = new double[levels.size()];
        double[] w = new double[levels.size()];
        double[] t = targetRe(levels.stream().map(BandLevel::band).toList(), ref);
        List<String> labels = new ArrayList<>();
        for (int i = 0; i < v.length; i++) {
            v[i] = levels.get(i).levelDb() - levels.get(ref).levelDb();
            w[i] = levels.get(i).uncertaintyDb();
            labels.add(levels.get(i).band().label());
        }
        fitMeterScale(v, w, t);
        meter.show(labels, v, w, t);
    }

    /**
     * Chooses the meter's level axis for what it shows: the bars with their whiskers and the target's
     * marks, with {@link #METER_MARGIN_DB} to spare, on whole {@link #METER_STEP_DB} steps. The axis
     * only widens while the reading stays inside it (no jumping at display rate); it narrows when it
     * is more than two steps wider than needed on a side (a quieter source, a narrower band range).
     */
    void fitMeterScale(double[] values, double[] whiskers, double[] marks) {
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < values.length; i++) {
            double w = whiskers != null && Double.isFinite(whiskers[i]) ? whiskers[i] : 0;
            if (Double.isFinite(values[i])) {
                lo = Math.min(lo, values[i] - w);
                hi = Math.max(hi, values[i] + w);
            }
            if (marks != null && Double.isFinite(marks[i])) {
                lo = Math.min(lo, marks[i]);
                hi = Math.max(hi, marks[i]);
            }
        }
        if (lo > hi) {
            lo = -METER_STEP_DB;
            hi = METER_STEP_DB;
        }
        double wantLo = Math.floor((Math.min(lo, 0) - METER_MARGIN_DB) / METER_STEP_DB) * METER_STEP_DB;
        double wantHi = Math.ceil((Math.max(hi, 0) + METER_MARGIN_DB) / METER_STEP_DB) * METER_STEP_DB;
        javafx.scene.chart.NumberAxis y = (javafx.scene.chart.NumberAxis) meter.getYAxis();
        double curLo = y.getLowerBound();
        double curHi = y.getUpperBound();
        boolean inside = wantLo >= curLo && wantHi <= curHi;
        boolean tooWide = wantLo - curLo > 2 * METER_STEP_DB || curHi - wantHi > 2 * METER_STEP_DB;
        if (!inside || tooWide) {
            y.setLowerBound(wantLo);
            y.setUpperBound(wantHi);
            y.setTickUnit(METER_STEP_DB);
        }
    }

    private double[] targetRe(List<Band> bands, int ref) {
        var target = window.settings().target();
        double[] t = new double[bands.size()];
        double r = 10 * Math.log10(target.bandPower(bands.get(ref).lowHz(), bands.get(ref).highHz()));
        for (int i = 0; i < t.length; i++) {
            t[i] = 10 * Math.log10(target.bandPower(bands.get(i).lowHz(), bands.get(i).highHz())) - r;
        }
        return t;
    }

    private void showIdleMeter() {
        BandTable table = window.settings().table();
        List<String> labels = table.bands().stream().map(Band::label).toList();
        int ref = 0;
        for (int i = 0; i < table.size(); i++) {
            if (Math.abs(Math.log(table.band(i).midHz() / 1000)) < Math.abs(Math.log(table.band(ref).midHz() / 1000))) {
                ref = i;
            }
        }
        double[] marks = targetRe(table.bands(), ref);
        double[] zeros = new double[labels.size()];
        fitMeterScale(zeros, null, marks);
        meter.show(labels, zeros, null, marks);
    }
}

package org.roseate.app;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.atomic.AtomicReference;
import javafx.animation.AnimationTimer;
import javafx.application.Platform;
import javafx.collections.FXCollections;
import javafx.concurrent.Task;
import javafx.geometry.Insets;
import javafx.scene.Node;
import javafx.scene.chart.LineChart;
import javafx.scene.chart.NumberAxis;
import javafx.scene.chart.XYChart;
import javafx.scene.control.Button;
import javafx.scene.control.ComboBox;
import javafx.scene.control.Label;
import javafx.scene.control.RadioButton;
import javafx.scene.control.Spinner;
import javafx.scene.control.ToggleGroup;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.GridPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Priority;
import javafx.scene.layout.StackPane;
import javafx.scene.layout.VBox;
import org.roseate.audio.Devices;
import org.roseate.audio.InputLine;
import org.roseate.compare.BandReading;
import org.roseate.measure.BandReader;
import org.roseate.measure.BandResult;
import org.roseate.measure.MeasureCsv;
import org.roseate.measure.MeasureMode;
import org.roseate.measure.MeasureResult;
import org.roseate.measure.ResponsePoint;
import org.roseate.compare.DesignAnalysis;
import org.roseate.io.AtomicOutput;
import org.roseate.spectrum.Calibration;
import org.roseate.spectrum.CalibrationException;
import org.roseate.spectrum.WelchSettings;

/**
 * The measure view: a WAV file (analysed on a worker with progress and cancel) or a sound-card
 * input (the core's capture engine), in noise-source or transfer mode, with linear or exponential
 * averaging. Third-octave bars of the deviation from the target, with ±1σ whiskers and the design's
 * own deviation as marks; in transfer mode also |H| against the design and the coherence.
 * Results arrive as the core's immutable {@link MeasureResult}s and are drawn at display rate.
 */
final class MeasureView {
    static final int RATE_HZ = 48000;
    private static final String DEFAULT_INPUT = "Default input";

    private final MainWindow window;
    private final BorderPane root = new BorderPane();
    private final RadioButton fromFile = new RadioButton("WAV file");
    private final RadioButton fromInput = new RadioButton("Input device");
    private final Label fileLabel = new Label("no file chosen");
    private final ComboBox<String> input = new ComboBox<>();
    private final ComboBox<MeasureMode> mode = new ComboBox<>(FXCollections.observableArrayList(MeasureMode.values()));
    private final ComboBox<BandReader> reader = new ComboBox<>(FXCollections.observableArrayList(BandReader.values()));
    private final ComboBox<String> averaging = new ComboBox<>(FXCollections.observableArrayList(
            "Linear (plain mean)", "Exponential (" + org.roseate.measure.MeasureRequest.DEFAULT_EXPONENTIAL_SEGMENTS + " segments)"));
    private final Spinner<Integer> responseChannel = new Spinner<>(1, 8, 1);
    private final Spinner<Integer> referenceChannel = new Spinner<>(1, 8, 1);
    private final Button start = new Button("Start");
    private final Button stopButton = new Button("Stop");
    private final Label calibrationLabel = new Label("no calibration");
    private final Label readout = new Label("Choose a WAV file or an input, then Start.");
    private final BandChart bands = new BandChart("Third-octave bands: deviation from the target",
            "Deviation (dB)", "Measured");
    private final XYChart.Series<Number, Number> measured = new XYChart.Series<>();
    private final XYChart.Series<Number, Number> designCurve = new XYChart.Series<>();
    private final XYChart.Series<Number, Number> targetCurve = new XYChart.Series<>();
    private final XYChart.Series<Number, Number> coherence = new XYChart.Series<>();
    private final LineChart<Number, Number> magnitudeChart;
    private final LineChart<Number, Number> coherenceChart;
    private final VBox transferBox;
    private final AtomicReference<MeasureResult> live = new AtomicReference<>();
    private final AnimationTimer poll;
    private final TaskRunner.Slot work;
    private Path file;
    private Calibration calibration;
    private LiveMeasurement capture;
    private MeasureResult shown;

    MeasureView(MainWindow window) {
        this.window = window;
        this.work = window.tasks().slot("Measure");
        ToggleGroup g = new ToggleGroup();
        fromFile.setToggleGroup(g);
        fromInput.setToggleGroup(g);
        fromFile.setSelected(true);
        mode.setValue(MeasureMode.NOISE_SOURCE);
        reader.setValue(BandReader.WELCH);
        averaging.setValue(averaging.getItems().get(0));
        referenceChannel.getValueFactory().setValue(1);
        responseChannel.getValueFactory().setValue(1);
        mode.valueProperty().addListener((o, a, b) -> {
            responseChannel.getValueFactory().setValue(b == MeasureMode.TRANSFER ? 2 : 1);
            updateModeVisibility();
        });
        input.getItems().add(DEFAULT_INPUT);
        input.setValue(DEFAULT_INPUT);
        refreshInputs();
        measured.setName("Measured |H| (dB)");
        designCurve.setName("Design (dB)");
        targetCurve.setName("Target line");
        coherence.setName("Coherence γ²");
        magnitudeChart = DesignView.lineChart("Transfer magnitude", new LogAxis("Frequency (Hz)", 20, 20000),
                "Level re 1 kHz (dB)", List.of(measured, designCurve, targetCurve));
        LevelScale.install(magnitudeChart, 6);
        coherenceChart = DesignView.lineChart("Coherence", new LogAxis("Frequency (Hz)", 20, 20000), "γ² (0 … 1)",
                List.of(coherence));
        NumberAxis cy = (NumberAxis) coherenceChart.getYAxis();
        cy.setAutoRanging(false);
        cy.setLowerBound(0);
        cy.setUpperBound(1.05);
        cy.setTickUnit(0.25);
        coherenceChart.setLegendVisible(false);
        transferBox = new VBox(4, magnitudeChart, coherenceChart);
        VBox.setVgrow(magnitudeChart, Priority.ALWAYS);
        coherenceChart.setPrefHeight(200);
        poll = new AnimationTimer() {
            @Override
            public void handle(long now) {
                showLatest();
            }
        };
        poll.start();
        buildLayout();
        updateModeVisibility();
        stopButton.setDisable(true);
    }

    private void buildLayout() {
        Button choose = new Button("Choose…");
        choose.setOnAction(e -> chooseFile());
        Button loadCal = new Button("Load…");
        loadCal.setOnAction(e -> loadCalibration());
        Button saveCal = new Button("Save from this loopback…");
        saveCal.setOnAction(e -> saveCalibration());
        Button clearCal = new Button("Clear");
        clearCal.getStyleClass().add("small");
        clearCal.setOnAction(e -> {
            calibration = null;
            calibrationLabel.setText("no calibration");
        });
        Button saveCapture = new Button("Save capture…");
        saveCapture.setOnAction(e -> saveCapture());
        Button exportCsv = new Button("Export CSV…");
        exportCsv.setOnAction(e -> exportCsv());
        start.getStyleClass().add("primary");
        DesignView.keepWidth(choose, loadCal, clearCal, saveCal, saveCapture, exportCsv, start, stopButton);
        start.setOnAction(e -> start());
        stopButton.setOnAction(e -> stop());

        GridPane p = new GridPane();
        p.setHgap(10);
        p.setVgap(9);
        int r = 0;
        p.add(ListenView.title("Source"), 0, r++, 2, 1);
        p.add(fromFile, 0, r);
        p.add(new HBox(6, choose, fileLabel), 1, r++);
        p.add(fromInput, 0, r);
        p.add(input, 1, r++);
        p.add(ListenView.title("Analysis"), 0, r++, 2, 1);
        p.addRow(r++, new Label("Mode"), mode);
        p.addRow(r++, new Label("Averaging"), averaging);
        p.addRow(r++, new Label("Band reader"), reader);
        p.addRow(r++, new Label("Response channel"), responseChannel);
        p.addRow(r++, new Label("Reference channel"), referenceChannel);
        p.add(new HBox(8, start, stopButton), 1, r++);
        p.add(ListenView.title("Calibration (transfer mode)"), 0, r++, 2, 1);
        p.add(new HBox(6, loadCal, clearCal), 1, r++);
        p.add(saveCal, 1, r++);
        calibrationLabel.setWrapText(true);
        calibrationLabel.getStyleClass().add("hint");
        p.add(calibrationLabel, 0, r++, 2, 1);
        p.add(ListenView.title("Results"), 0, r++, 2, 1);
        p.add(new HBox(6, saveCapture, exportCsv), 0, r++, 2, 1);
        readout.setWrapText(true);
        readout.getStyleClass().add("readout");
        p.add(readout, 0, r, 2, 1);
        fileLabel.setMaxWidth(170);
        input.setPrefWidth(220);
        mode.setPrefWidth(220);
        averaging.setPrefWidth(220);
        reader.setPrefWidth(220);
        responseChannel.setPrefWidth(80);
        referenceChannel.setPrefWidth(80);
        p.setPrefWidth(380);
        p.setMinWidth(360);
        p.setMaxWidth(400);
        p.setPadding(new Insets(4, 16, 4, 4));
        p.getStyleClass().add("side-panel");

        VBox charts = new VBox(6, bands, transferBox);
        VBox.setVgrow(bands, Priority.ALWAYS);
        VBox.setVgrow(transferBox, Priority.ALWAYS);
        StackPane right = new StackPane(charts);
        right.setPadding(new Insets(0, 0, 0, 12));
        root.setLeft(p);
        root.setCenter(right);
        root.setPadding(new Insets(12));
    }

    private void updateModeVisibility() {
        boolean transfer = mode.getValue() == MeasureMode.TRANSFER;
        referenceChannel.setDisable(!transfer);
        reader.setDisable(transfer);
        transferBox.setVisible(transfer);
        transferBox.setManaged(transfer);
    }

    Node root() {
        return root;
    }

    private void refreshInputs() {
        CompletableFuture.supplyAsync(() -> {
            List<String> names = new ArrayList<>();
            try {
                for (Devices.Device d : Devices.list()) {
                    if (d.hasInput()) {
                        names.add(d.name());
                    }
                }
            } catch (RuntimeException e) {
                // No sound system: only the default entry.
            }
            return names;
        }, window.tasks().devices()).thenAccept(names -> Platform.runLater(() -> {
            List<String> all = new ArrayList<>();
            all.add(DEFAULT_INPUT);
            all.addAll(names);
            input.getItems().setAll(all);
            input.setValue(DEFAULT_INPUT);
        }));
    }

    private void chooseFile() {
        window.prompts().openFile(window.stage(), "Measure a WAV capture", "WAV files (*.wav)", "*.wav", "*.WAV")
                .ifPresent(this::setFile);
    }

    /** The WAV file chosen for measuring, or null (for the Diagnose tool). */
    Path file() {
        return file;
    }

    /** Sets the WAV file to measure (and selects the file source). */
    void setFile(Path p) {
        file = p;
        fileLabel.setText(p.getFileName().toString());
        fromFile.setSelected(true);
    }

    /** Selects the sound-card input (the default one) as the source. */
    void useInput() {
        fromInput.setSelected(true);
    }

    void setMode(MeasureMode m) {
        mode.setValue(m);
    }

    private MeasureSetup setup() {
        WelchSettings.Averaging avg = averaging.getSelectionModel().getSelectedIndex() == 1
                ? WelchSettings.Averaging.EXPONENTIAL : WelchSettings.Averaging.LINEAR;
        return new MeasureSetup(mode.getValue(), avg, window.settings(), responseChannel.getValue() - 1,
                referenceChannel.getValue() - 1, window.model(), calibration,
                mode.getValue() == MeasureMode.TRANSFER ? BandReader.WELCH : reader.getValue());
    }

    /** Starts measuring the chosen file or input. */
    void start() {
        stop();
        MeasureSetup s = setup();
        live.set(null);
        shown = null;
        if (fromFile.isSelected()) {
            if (file == null) {
                readout.setText("Choose a WAV file first.");
                return;
            }
            Path f = file;
            Task<MeasureResult> task = new Task<>() {
                @Override
                protected MeasureResult call() {
                    return FileMeasurement.run(f, s, p -> updateProgress(p, 1), this::isCancelled, live::set);
                }
            };
            start.setDisable(true);
            stopButton.setDisable(false);
            readout.setText("Measuring " + f.getFileName() + "…");
            work.run("Measuring " + f.getFileName(), task, out -> {
                live.set(out);
                start.setDisable(false);
                stopButton.setDisable(true);
                window.showStatus("Measured " + f.getFileName());
            }, msg -> {
                start.setDisable(false);
                stopButton.setDisable(true);
                readout.setText(msg);
                window.showStatus(msg);
            });
            return;
        }
        String dev = DEFAULT_INPUT.equals(input.getValue()) ? null : input.getValue();
        int channels = s.mode() == MeasureMode.TRANSFER
                ? Math.max(2, Math.max(s.referenceChannel(), s.responseChannel()) + 1) : s.responseChannel() + 1;
        readout.setText("Opening the input…");
        start.setDisable(true);
        CompletableFuture.supplyAsync(() -> {
            InputLine line = Devices.openInput(dev, RATE_HZ, channels, RATE_HZ / 10);
            try {
                return new LiveMeasurement(line, s);
            } catch (RuntimeException e) {
                line.close();
                throw e;
            }
        }, window.tasks().devices()).whenComplete((c, ex) -> Platform.runLater(() -> {
            if (ex != null) {
                start.setDisable(false);
                Throwable cause = ex.getCause() != null ? ex.getCause() : ex;
                readout.setText("Cannot capture: " + cause.getMessage());
                return;
            }
            capture = c;
            stopButton.setDisable(false);
            readout.setText("Capturing from " + (dev == null ? "the default input" : dev) + "…");
        }));
    }

    /** Stops a capture or cancels a file measurement. */
    void stop() {
        if (capture != null) {
            LiveMeasurement c = capture;
            capture = null;
            c.close();
            lastCapture = c;
            if (shown != null) {
                readout.setText(describe(shown)); // "(stopped)", no longer "(running)"
            }
        }
        if (work.busy()) {
            work.cancel();
        }
        start.setDisable(false);
        stopButton.setDisable(true);
    }

    private LiveMeasurement lastCapture;

    /** Draws the newest outcome if it is new (display rate). */
    void showLatest() {
        LiveMeasurement c = capture;
        if (c != null) {
            MeasureResult o = c.latest();
            if (o != null) {
                live.set(o);
            }
            String problem = c.problem();
            if (problem != null) {
                stop();
                readout.setText(problem); // after the stop, so its own status line does not replace the failure
                window.showStatus(problem);
                return;
            }
        }
        MeasureResult o = live.get();
        if (o == null || o == shown) {
            return;
        }
        shown = o;
        if (o.mode() == MeasureMode.NOISE_SOURCE) {
            showNoise(o);
        } else {
            showTransfer(o);
        }
        readout.setText(describe(o));
    }

    /** "" for a finished file, " (running)" while capturing or measuring, " (stopped)" after Stop. */
    private String state(MeasureResult o) {
        if (o.complete()) {
            return "";
        }
        return capture != null || work.busy() ? " (running)" : " (stopped)";
    }

    private String describe(MeasureResult o) {
        String clip = o.clippedSamples() > 0 ? String.format(Locale.ROOT, " %d clipped or flat-topped samples.", o.clippedSamples()) : "";
        String warn = o.warnings().isEmpty() ? "" : " " + o.warnings().size() + " warning" + (o.warnings().size() == 1 ? "" : "s")
                + ": see the marks.";
        if (o.mode() == MeasureMode.NOISE_SOURCE) {
            return String.format(Locale.ROOT, "%s%s: %.1f s, %d averages, T_eff %.1f s, %.3g Hz bins, %s. Slope %s "
                    + "dB/octave (target %+.2f); peak band deviation %s dB; levels in %s; RMS %.1f dBFS, DC %+.2g FS.%s%s",
                    org.roseate.measure.MeasureTable.displayName(o.source()), state(o),
                    o.secondsAnalysed(), o.averages(), o.effectiveSeconds(), o.resolutionHz(), o.request().reader(),
                    estimate(o.slopeDbPerOctave(), "%+.2f"), o.request().target().dbPerOctave(),
                    estimate(o.maxBandDeviationDb(), "%.2f"), o.levelUnit(),
                    o.measuredChannel().rmsDbfs(), o.measuredChannel().dcOffsetFs(), clip, warn);
        }
        long trusted = o.points().stream().filter(ResponsePoint::trusted).count();
        long bandsTrusted = o.bands().stream().filter(BandResult::trusted).count();
        return String.format(Locale.ROOT, "%s%s: %.1f s, %d averages%s. Slope %s dB/octave; peak band deviation "
                + "%s dB; %d of %d bands and %d of %d points with γ² ≥ %.2f; levels are gain in dB re 1.%s%s",
                org.roseate.measure.MeasureTable.displayName(o.source()), state(o),
                o.secondsAnalysed(), o.averages(), calibration != null ? ", calibrated" : "",
                estimate(o.slopeDbPerOctave(), "%+.2f"), estimate(o.maxBandDeviationDb(), "%.2f"),
                bandsTrusted, o.bands().size(), trusted, o.points().size(), o.request().coherenceThreshold(), clip, warn);
    }

    /** "value ± u", or "—" when the figure does not exist (too few counted bands). */
    private static String estimate(org.roseate.measure.Estimate e, String fmt) {
        if (Double.isNaN(e.value())) {
            return "—";
        }
        return String.format(Locale.ROOT, fmt, e.value())
                + (Double.isNaN(e.uncertainty()) ? "" : String.format(Locale.ROOT, " ± %.2f", e.uncertainty()));
    }

    private void showNoise(MeasureResult n) {
        List<BandResult> levels = n.bands();
        double[] v = levels.stream().mapToDouble(BandResult::deviationDb).toArray();
        double[] w = levels.stream().mapToDouble(BandResult::uncertaintyDb).toArray();
        bands.setTitle(titleFor(levels) + ": deviation from the target " + n.request().target().describe()
                + " (weighted centring)");
        bands.show(levels.stream().map(l -> l.band().label()).toList(), v, w, designMarks());
    }

    private String titleFor(List<BandResult> levels) {
        return levels.isEmpty() || levels.get(0).band().fraction().b() == 3 ? "Third-octave bands" : "Octave bands";
    }

    /** The design's own centred band deviation, for the marks; null without a design. */
    private double[] designMarks() {
        if (window.model() == null) {
            return null;
        }
        AnalysisSettings s = window.settings();
        return DesignAnalysis.bandLevels(window.model(), s.table(), s.target()).readings().stream()
                .mapToDouble(BandReading::deviationDb).toArray();
    }

    private void showTransfer(MeasureResult t) {
        bands.setTitle(titleFor(t.bands()) + ": transfer deviation from the target " + t.request().target().describe()
                + "");
        bands.show(t.bands().stream().map(l -> l.band().label()).toList(),
                t.bands().stream().mapToDouble(BandResult::deviationDb).toArray(),
                t.bands().stream().mapToDouble(b -> b.trusted() ? b.uncertaintyDb() : Double.NaN).toArray(), designMarks());
        List<ResponsePoint> pts = t.points();
        int ref = 0;
        for (int i = 0; i < pts.size(); i++) {
            if (Math.abs(Math.log(pts.get(i).hz() / 1000)) < Math.abs(Math.log(pts.get(ref).hz() / 1000))) {
                ref = i;
            }
        }
        double[] hz = new double[pts.size()];
        double[] db = new double[hz.length];
        double[] model = new double[hz.length];
        double[] target = new double[hz.length];
        double[] coh = new double[hz.length];
        for (int i = 0; i < hz.length; i++) {
            ResponsePoint p = pts.get(i);
            hz[i] = p.hz();
            db[i] = p.db() - pts.get(ref).db();
            model[i] = p.modelDb() - pts.get(ref).modelDb();
            target[i] = p.targetDb() - pts.get(ref).db();
            coh[i] = p.coherence();
        }
        AnalysisSettings s = window.settings();
        ((LogAxis) magnitudeChart.getXAxis()).setBounds(Math.min(hz[0], s.range().loHz()), Math.max(hz[hz.length - 1], s.range().hiHz()));
        ((LogAxis) coherenceChart.getXAxis()).setBounds(Math.min(hz[0], s.range().loHz()), Math.max(hz[hz.length - 1], s.range().hiHz()));
        ObservableData.setLine(measured, hz, db);
        ObservableData.setLine(designCurve, hz, model);
        ObservableData.setLine(targetCurve, hz, target);
        ObservableData.setLine(coherence, hz, coh);
    }

    // ---- calibration, capture, CSV ----

    private void loadCalibration() {
        window.prompts().openFile(window.stage(), "Load a calibration", "Calibration files (*.json)", "*.json").ifPresent(p -> {
            try {
                calibration = Calibration.read(p);
                calibrationLabel.setText(String.format(Locale.ROOT, "%s: made at %.0f Hz%s", p.getFileName(),
                        calibration.sampleRateHz(), Double.isNaN(calibration.voltsPerFullScale()) ? ""
                                : String.format(Locale.ROOT, ", %.3g V at full scale", calibration.voltsPerFullScale())));
            } catch (CalibrationException e) {
                window.prompts().error(window.stage(), e.getMessage());
            }
        });
    }

    private void saveCalibration() {
        MeasureResult o = live.get();
        if (o == null || o.rawTransfer() == null) {
            readout.setText("Measure a loopback (output straight to input) in transfer mode first.");
            return;
        }
        window.prompts().saveFile(window.stage(), "Save the calibration", "calibration.json", "Calibration files (*.json)",
                "*.json").ifPresent(p -> {
                    try {
                        Calibration.fromLoopback(p.toString(), o.rawTransfer(), Double.NaN).write(p);
                        window.showStatus("Saved calibration " + p);
                    } catch (IOException | CalibrationException e) {
                        window.prompts().error(window.stage(), p + ": cannot save the calibration (" + e.getMessage() + ")");
                    }
                });
    }

    private void saveCapture() {
        LiveMeasurement c = capture != null ? capture : lastCapture;
        if (c == null) {
            readout.setText("Only an input capture can be saved; a WAV file is already on disk.");
            return;
        }
        window.prompts().saveFile(window.stage(), "Save the capture", "capture.wav", "WAV files (*.wav)", "*.wav")
                .ifPresent(p -> window.tasks().executor().submit(() -> {
                    try {
                        c.saveCapture(p);
                        Platform.runLater(() -> window.showStatus(String.format(Locale.ROOT, "Saved %.1f s of capture to %s",
                                c.keptSeconds(), p)));
                    } catch (IOException e) {
                        Platform.runLater(() -> window.prompts().error(window.stage(), p + ": cannot save (" + e.getMessage() + ")"));
                    }
                }));
    }

    private void exportCsv() {
        MeasureResult o = live.get();
        if (o == null) {
            readout.setText("Nothing measured yet.");
            return;
        }
        window.prompts().saveFile(window.stage(), "Export the bands as CSV", "bands.csv", "CSV files (*.csv)", "*.csv")
                .ifPresent(p -> {
                    try {
                        AtomicOutput.writeString(p, csv(o), true);
                        window.showStatus("Exported " + p);
                    } catch (IOException e) {
                        window.prompts().error(window.stage(), p + ": cannot write (" + e.getMessage() + ")");
                    }
                });
    }

    /** The CSV export: the core's writer, so it is byte for byte what {@code measure --format csv} prints. */
    static String csv(MeasureResult o) {
        return MeasureCsv.of(o);
    }

    // ---- for tests ----

    BandChart bandChart() {
        return bands;
    }

    MeasureResult latest() {
        return live.get();
    }

    MeasureResult shown() {
        return shown;
    }

    Label readout() {
        return readout;
    }

    XYChart.Series<Number, Number> coherenceSeries() {
        return coherence;
    }
}

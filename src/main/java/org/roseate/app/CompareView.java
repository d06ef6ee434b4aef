package org.roseate.app;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import javafx.beans.property.SimpleStringProperty;
import javafx.collections.FXCollections;
import javafx.collections.ObservableList;
import javafx.concurrent.Task;
import javafx.geometry.Insets;
import javafx.scene.Node;
import javafx.scene.chart.LineChart;
import javafx.scene.chart.XYChart;
import javafx.scene.control.Button;
import javafx.scene.control.Label;
import javafx.scene.control.ListView;
import javafx.scene.control.SplitPane;
import javafx.scene.control.TableColumn;
import javafx.scene.control.TableView;
import javafx.geometry.Orientation;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Priority;
import javafx.scene.layout.VBox;
import org.roseate.bands.BandTable;
import org.roseate.circuit.DesignException;
import org.roseate.circuit.DesignReader;
import org.roseate.model.CircuitModel;

/**
 * The compare view: designs and captures side by side over the current band table. A table of band
 * levels normalised at 1 kHz and deviations from the target, one pair of columns per entry, and
 * the normalised levels overlaid on a log-frequency chart with the target. Captures are analysed
 * on a worker with progress and cancel.
 */
final class CompareView {
    private final MainWindow window;
    private final BorderPane root = new BorderPane();
    private final ObservableList<CompareEntry> entries = FXCollections.observableArrayList();
    private final ListView<CompareEntry> list = new ListView<>(entries);
    private final TableView<Integer> table = new TableView<>();
    private final LogAxis axis = new LogAxis("Band midband frequency (Hz)", 20, 20000);
    private final LineChart<Number, Number> chart;
    private final XYChart.Series<Number, Number> target = new XYChart.Series<>();
    private final Label info = new Label("Add the design in the editor, design files or WAV captures.");

    CompareView(MainWindow window) {
        this.window = window;
        target.setName("Target");
        chart = DesignView.lineChart("Band levels re the 1 kHz band", axis, "Level re 1 kHz (dB)", new ArrayList<>());
        LevelScale.install(chart, 1);
        chart.setCreateSymbols(true);
        chart.getStyleClass().add("compare-chart");
        list.setCellFactory(v -> new javafx.scene.control.ListCell<>() {
            @Override
            protected void updateItem(CompareEntry e, boolean empty) {
                super.updateItem(e, empty);
                setText(empty || e == null ? null : String.format(Locale.ROOT, "%s  (%s, peak ±%.2f dB)", e.name(), e.kind(), e.peakDb()));
            }
        });
        list.setPlaceholder(new Label("Nothing to compare yet."));
        table.setPlaceholder(new Label("Band levels appear here."));
        entries.addListener((javafx.collections.ListChangeListener<CompareEntry>) c -> rebuild());
        window.settingsProperty().addListener((o, a, b) -> {
            if (!entries.isEmpty()) {
                info.setText("The band settings changed; add the entries again to compare them over the new bands.");
            }
        });
        buildLayout();
        rebuild();
    }

    private void buildLayout() {
        Button addCurrent = new Button("Add the design in the editor");
        addCurrent.setOnAction(e -> addCurrent());
        Button addDesign = new Button("Add design file…");
        addDesign.setOnAction(e -> window.prompts().openFile(window.stage(), "Add a design", "Design files (*.json)", "*.json")
                .ifPresent(this::addDesign));
        Button addCapture = new Button("Add WAV capture…");
        addCapture.setOnAction(e -> window.prompts().openFile(window.stage(), "Add a capture", "WAV files (*.wav)", "*.wav", "*.WAV")
                .ifPresent(this::addCapture));
        Button remove = new Button("Remove");
        remove.setOnAction(e -> {
            CompareEntry sel = list.getSelectionModel().getSelectedItem();
            if (sel != null) {
                entries.remove(sel);
            }
        });
        Button clear = new Button("Clear");
        clear.setOnAction(e -> entries.clear());
        for (Button b : List.of(addCurrent, addDesign, addCapture)) {
            b.setMaxWidth(Double.MAX_VALUE);
        }
        info.setWrapText(true);
        info.getStyleClass().add("hint");
        VBox left = new VBox(8, ListenView.title("Entries"), addCurrent, addDesign, addCapture, list, new HBox(6, remove, clear), info);
        VBox.setVgrow(list, Priority.ALWAYS);
        left.setPrefWidth(300);
        left.setMinWidth(280);
        left.setPadding(new Insets(4, 12, 4, 4));
        SplitPane right = new SplitPane(chart, table);
        right.setOrientation(Orientation.VERTICAL);
        right.setDividerPositions(0.55);
        root.setLeft(left);
        root.setCenter(right);
        root.setPadding(new Insets(12));
    }

    Node root() {
        return root;
    }

    void addCurrent() {
        CircuitModel m = window.model();
        if (m == null) {
            info.setText("The editor's design has an error; fix it first.");
            return;
        }
        AnalysisSettings s = window.settings();
        entries.add(CompareEntry.ofDesign(m.design().name() + " (editor)", m, s.table(), s.target()));
    }

    void addDesign(Path p) {
        try {
            CircuitModel m = CircuitModel.of(DesignReader.read(p), p.getFileName().toString());
            AnalysisSettings s = window.settings();
            entries.add(CompareEntry.ofDesign(p.getFileName().toString(), m, s.table(), s.target()));
        } catch (DesignException e) {
            window.prompts().error(window.stage(), e.getMessage());
        }
    }

    /** Analyses a capture in noise-source mode on a worker, then adds it. */
    void addCapture(Path p) {
        AnalysisSettings s = window.settings();
        MeasureSetup setup = new MeasureSetup(org.roseate.measure.MeasureMode.NOISE_SOURCE,
                org.roseate.spectrum.WelchSettings.Averaging.LINEAR, s, 0, 0, null, null, org.roseate.measure.BandReader.WELCH);
        Task<org.roseate.measure.MeasureResult> task = new Task<>() {
            @Override
            protected org.roseate.measure.MeasureResult call() throws Exception {
                return FileMeasurement.run(p, setup, f -> updateProgress(f, 1), this::isCancelled, o -> { });
            }
        };
        // one slot per capture: adding a second capture never cancels the first, nor another view's work
        window.tasks().slot("Compare " + p.getFileName()).run("Analysing " + p.getFileName(), task,
                out -> entries.add(CompareEntry.ofCapture(p.getFileName().toString(), out, s.table())),
                msg -> {
                    info.setText(msg);
                    window.showStatus(msg);
                });
    }

    private void rebuild() {
        BandTable bt = window.settings().table();
        List<XYChart.Series<Number, Number>> series = new ArrayList<>();
        int ref = CompareEntry.referenceIndex(bt);
        double[] mid = bt.midHz();
        double[] t = new double[mid.length];
        double r = 10 * Math.log10(window.settings().target().bandPower(bt.band(ref).lowHz(), bt.band(ref).highHz()));
        for (int i = 0; i < t.length; i++) {
            t[i] = 10 * Math.log10(window.settings().target().bandPower(bt.band(i).lowHz(), bt.band(i).highHz())) - r;
        }
        ObservableData.setLine(target, mid, t);
        series.add(target);
        for (CompareEntry e : entries) {
            XYChart.Series<Number, Number> s = new XYChart.Series<>();
            s.setName(e.name());
            ObservableData.setLine(s, e.midHz(), e.normalizedDb());
            series.add(s);
        }
        axis.setBounds(Math.min(window.settings().range().loHz(), mid[0]), Math.max(window.settings().range().hiHz(), mid[mid.length - 1]));
        chart.getData().setAll(series);
        ObservableData.redraw(chart);

        List<TableColumn<Integer, ?>> cols = new ArrayList<>();
        List<String> labels = bt.bands().stream().map(b -> b.label()).toList();
        TableColumn<Integer, String> band = new TableColumn<>("Band (Hz)");
        band.setCellValueFactory(c -> new SimpleStringProperty(labels.get(c.getValue())));
        band.setPrefWidth(80);
        cols.add(band);
        for (CompareEntry e : entries) {
            TableColumn<Integer, String> group = new TableColumn<>(e.name());
            TableColumn<Integer, String> lv = new TableColumn<>("re 1 kHz (dB)");
            lv.setCellValueFactory(c -> new SimpleStringProperty(cell(e.normalizedDb(), c.getValue())));
            TableColumn<Integer, String> dv = new TableColumn<>("deviation (dB)");
            dv.setCellValueFactory(c -> new SimpleStringProperty(cell(e.deviationDb(), c.getValue())));
            lv.setStyle("-fx-alignment: CENTER-RIGHT;");
            dv.setStyle("-fx-alignment: CENTER-RIGHT;");
            group.getColumns().addAll(List.of(lv, dv));
            cols.add(group);
        }
        table.getColumns().setAll(cols);
        List<Integer> rows = new ArrayList<>();
        for (int i = 0; i < labels.size(); i++) {
            rows.add(i);
        }
        table.getItems().setAll(entries.isEmpty() ? List.of() : rows);
    }

    private static String cell(double[] v, int i) {
        return i < v.length && Double.isFinite(v[i]) ? String.format(Locale.ROOT, "%+.2f", v[i]) : "";
    }

    // ---- for tests ----

    ObservableList<CompareEntry> entries() {
        return entries;
    }

    TableView<Integer> table() {
        return table;
    }

    LineChart<Number, Number> chart() {
        return chart;
    }
}

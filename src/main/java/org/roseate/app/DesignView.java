package org.roseate.app;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicLong;
import javafx.animation.KeyFrame;
import javafx.animation.PauseTransition;
import javafx.animation.Timeline;
import javafx.application.Platform;
import javafx.beans.property.ObjectProperty;
import javafx.beans.property.ReadOnlyObjectProperty;
import javafx.beans.property.SimpleObjectProperty;
import javafx.beans.property.SimpleStringProperty;
import javafx.collections.FXCollections;
import javafx.geometry.Insets;
import javafx.geometry.Orientation;
import javafx.geometry.Pos;
import javafx.scene.Node;
import javafx.scene.chart.LineChart;
import javafx.scene.chart.NumberAxis;
import javafx.scene.chart.XYChart;
import javafx.scene.control.Button;
import javafx.scene.control.ComboBox;
import javafx.scene.control.Label;
import javafx.scene.control.SplitPane;
import javafx.scene.control.TableCell;
import javafx.scene.control.TableColumn;
import javafx.scene.control.TableView;
import javafx.scene.control.TextArea;
import javafx.scene.control.TextField;
import javafx.scene.control.Tooltip;
import javafx.scene.input.KeyCode;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Priority;
import javafx.scene.layout.Region;
import javafx.scene.layout.VBox;
import javafx.util.Duration;
import org.roseate.bands.BandFraction;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.compare.BandReading;
import org.roseate.compare.FrequencyRange;
import org.roseate.compare.TargetSlope;
import org.roseate.model.CircuitModel;
import org.roseate.value.ESeries;
import org.roseate.value.EngineeringValue;

/**
 * The design view: the design file's JSON in an editor, read and analysed as you type (150 ms
 * after the last key, on a background thread), the component table with E-series steps, and the
 * response, deviation and band-deviation charts.
 */
final class DesignView {
    /** Pause after the last key before the text is read. */
    static final Duration DEBOUNCE = Duration.millis(150);
    /** How often unsaved edits are written beside the file. */
    static final Duration AUTOSAVE_EVERY = Duration.seconds(4);
    static final List<ESeries> SERIES = List.of(ESeries.E6, ESeries.E12, ESeries.E24, ESeries.E48, ESeries.E96);

    private final MainWindow window;
    private final DesignDocument doc = new DesignDocument(DefaultDesign.TEXT, null);
    private final ExecutorService analysis = Executors.newSingleThreadExecutor(daemon("roseate-design-analysis"));
    private final ExecutorService io = Executors.newSingleThreadExecutor(daemon("roseate-autosave"));
    private final AtomicLong generation = new AtomicLong();
    private final PauseTransition debounce = new PauseTransition(DEBOUNCE);
    private final Timeline autosave;
    private final ObjectProperty<DesignOutcome> outcome = new SimpleObjectProperty<>();
    private final ObjectProperty<TextSpan> errorSpan = new SimpleObjectProperty<>();

    private final TextArea editor = new TextArea();
    private final ErrorMarks errorMarks = new ErrorMarks(editor);
    private final Label status = new Label();
    private final Button showError = new Button("Show");
    private final Label fileLabel = new Label();
    private final Label summary = new Label();
    private final ComboBox<ESeries> series = new ComboBox<>(FXCollections.observableArrayList(SERIES));
    private final ComboBox<String> target = new ComboBox<>(FXCollections.observableArrayList(
            "pink (−3.01 dB/octave)", "white (0 dB/octave)", "brown (−6.02 dB/octave)", "blue (+3.01 dB/octave)"));
    private final ComboBox<BandFraction> bandsBox = new ComboBox<>(FXCollections.observableArrayList(BandFraction.values()));
    private final TextField rangeField = new TextField("20-20k");
    private final TableView<ComponentRow> table = new TableView<>();
    private final XYChart.Series<Number, Number> response = new XYChart.Series<>();
    private final XYChart.Series<Number, Number> targetLine = new XYChart.Series<>();
    private final XYChart.Series<Number, Number> deviation = new XYChart.Series<>();
    private final LineChart<Number, Number> responseChart;
    private final LineChart<Number, Number> deviationChart;
    private final BandChart bandChart = new BandChart("Band deviation from the target", "Deviation (dB)", "Band deviation");
    private final LogAxis responseAxis = new LogAxis("Frequency (Hz)", 20, 20000);
    private final LogAxis deviationAxis = new LogAxis("Frequency (Hz)", 20, 20000);
    private final BorderPane root = new BorderPane();
    private boolean settingText;

    DesignView(MainWindow window) {
        this.window = window;
        response.setName("Response |H| (dB)");
        targetLine.setName("Target line");
        deviation.setName("Deviation (dB)");
        responseChart = lineChart("Response magnitude", responseAxis, "Level (dB)", List.of(response, targetLine));
        responseChart.getStyleClass().add("response-chart");
        deviationChart = lineChart("Deviation from the target line", deviationAxis, "Deviation (dB)", List.of(deviation));
        LevelScale.install(responseChart, 6);
        LevelScale.install(deviationChart, 1);
        deviationChart.setLegendVisible(false);
        series.setValue(ESeries.E24);
        target.setValue(target.getItems().get(0));
        bandsBox.setValue(BandFraction.THIRD_OCTAVE);
        bandsBox.setConverter(new javafx.util.StringConverter<>() {
            @Override
            public String toString(BandFraction f) {
                return f == null ? "" : f == BandFraction.OCTAVE ? "octave bands" : "third-octave bands";
            }

            @Override
            public BandFraction fromString(String s) {
                return BandFraction.parse(s).orElse(BandFraction.THIRD_OCTAVE);
            }
        });
        editor.getStyleClass().add("design-editor");
        editor.setWrapText(false);
        editor.textProperty().addListener((o, a, b) -> {
            if (!settingText) {
                debounce.playFromStart();
            }
        });
        debounce.setOnFinished(e -> commitTyping());
        autosave = new Timeline(new KeyFrame(AUTOSAVE_EVERY, e -> autosaveNow()));
        autosave.setCycleCount(Timeline.INDEFINITE);
        autosave.play();
        buildTable();
        buildLayout();
        series.valueProperty().addListener((o, a, b) -> refreshTable(outcome.get()));
        target.valueProperty().addListener((o, a, b) -> settingsChanged());
        bandsBox.valueProperty().addListener((o, a, b) -> settingsChanged());
        rangeField.setOnAction(e -> settingsChanged());
        rangeField.focusedProperty().addListener((o, a, focused) -> {
            if (!focused) {
                settingsChanged();
            }
        });
        showError.setOnAction(e -> selectError());
        errorSpan.addListener((o, a, b) -> errorMarks.show(b));
        showError.setVisible(false);
        setText(doc.text());
        analyseNow(doc.text());
    }

    private static java.util.concurrent.ThreadFactory daemon(String name) {
        return r -> {
            Thread t = new Thread(r, name);
            t.setDaemon(true);
            return t;
        };
    }

    static LineChart<Number, Number> lineChart(String title, LogAxis x, String yLabel,
            List<XYChart.Series<Number, Number>> series) {
        NumberAxis y = new NumberAxis();
        y.setLabel(yLabel);
        y.setForceZeroInRange(false);
        y.setAnimated(false);
        LineChart<Number, Number> c = new LineChart<>(x, y);
        c.setTitle(title);
        c.setAnimated(false);
        c.setCreateSymbols(false);
        c.getData().addAll(series);
        return c;
    }

    private void buildLayout() {
        Button open = new Button("Open…");
        open.setOnAction(e -> open());
        open.setTooltip(new Tooltip("Open a design file (Ctrl+O)"));
        Button save = new Button("Save");
        save.setOnAction(e -> save());
        save.setTooltip(new Tooltip("Save the design (Ctrl+S)"));
        Button saveAs = new Button("Save as…");
        saveAs.setOnAction(e -> saveAs());
        Button undo = new Button("Undo");
        undo.setOnAction(e -> undo());
        undo.setTooltip(new Tooltip("Undo the last edit (Ctrl+Z)"));
        Button redo = new Button("Redo");
        redo.setOnAction(e -> redo());
        redo.setTooltip(new Tooltip("Redo (Ctrl+Shift+Z)"));
        rangeField.setPrefColumnCount(8);
        rangeField.setTooltip(new Tooltip("Frequency range in Hz, e.g. 20-20k or 0.5-50"));
        Region grow = new Region();
        HBox.setHgrow(grow, Priority.ALWAYS);
        fileLabel.getStyleClass().add("file-label");
        HBox bar = new HBox(8, open, save, saveAs, sep(), undo, redo, sep(), new Label("Target"), target,
                bandsBox, new Label("Range (Hz)"), rangeField, grow, fileLabel);
        bar.setAlignment(Pos.CENTER_LEFT);
        bar.getStyleClass().add("tool-bar-row");
        keepWidth(open, save, saveAs, undo, redo, target, bandsBox, rangeField);
        fileLabel.setMinWidth(0);
        fileLabel.setTextOverrun(javafx.scene.control.OverrunStyle.LEADING_ELLIPSIS);
        bar.getChildren().stream().filter(n -> n instanceof Label && n != fileLabel)
                .forEach(n -> ((Label) n).setMinWidth(Region.USE_PREF_SIZE));

        status.getStyleClass().add("design-status");
        status.setMaxWidth(Double.MAX_VALUE);
        status.setWrapText(true);
        HBox.setHgrow(status, Priority.ALWAYS);
        showError.getStyleClass().add("small");
        HBox statusRow = new HBox(8, status, showError);
        statusRow.setAlignment(Pos.CENTER_LEFT);
        Label editorTitle = new Label("Design file (JSON)");
        editorTitle.getStyleClass().add("section-title");
        VBox editorBox = new VBox(6, editorTitle, errorMarks.node(), statusRow);
        VBox.setVgrow(errorMarks.node(), Priority.ALWAYS);

        Label tableTitle = new Label("Components");
        tableTitle.getStyleClass().add("section-title");
        Button down = new Button("▼ Down");
        down.setOnAction(e -> stepSelected(false));
        down.setTooltip(new Tooltip("Next lower value of the series (− key in the table)"));
        Button up = new Button("▲ Up");
        up.setOnAction(e -> stepSelected(true));
        up.setTooltip(new Tooltip("Next higher value of the series (+ key in the table)"));
        Button snap = new Button("Snap");
        snap.setOnAction(e -> snapSelected());
        snap.setTooltip(new Tooltip("Set the selected part to the nearest value of the series"));
        Label seriesLabel = new Label("Series");
        keepWidth(tableTitle, seriesLabel, series, down, up, snap);
        HBox tableBar = new HBox(8, tableTitle, seriesLabel, series, down, up, snap);
        tableBar.setAlignment(Pos.CENTER_LEFT);
        VBox tableBox = new VBox(6, tableBar, table);
        VBox.setVgrow(table, Priority.ALWAYS);

        SplitPane left = new SplitPane(editorBox, tableBox);
        left.setOrientation(Orientation.VERTICAL);
        left.setDividerPositions(0.56);

        summary.getStyleClass().add("summary");
        summary.setWrapText(true);
        VBox charts = new VBox(4, summary, responseChart, deviationChart, bandChart);
        for (Node n : List.of(responseChart, deviationChart, bandChart)) {
            VBox.setVgrow(n, Priority.ALWAYS);
            ((Region) n).setMinHeight(150);
        }
        charts.setPadding(new Insets(0, 0, 0, 6));
        SplitPane split = new SplitPane(left, charts);
        split.setDividerPositions(0.40);
        root.setTop(bar);
        root.setCenter(split);
        BorderPane.setMargin(split, new Insets(8, 0, 0, 0));
        root.setPadding(new Insets(10));
    }

    /** Keeps controls at their preferred width when a row runs short of space. */
    static void keepWidth(Region... nodes) {
        for (Region n : nodes) {
            n.setMinWidth(Region.USE_PREF_SIZE);
        }
    }

    static Node sep() {
        Region r = new Region();
        r.getStyleClass().add("bar-separator");
        return r;
    }

    private void buildTable() {
        TableColumn<ComponentRow, String> part = column("Part", ComponentRow::designator, 60);
        TableColumn<ComponentRow, String> value = column("Value", ComponentRow::valueText, 80);
        value.setCellFactory(javafx.scene.control.cell.TextFieldTableCell.forTableColumn());
        value.setEditable(true);
        value.setOnEditCommit(e -> valueTyped(e.getRowValue().designator(), e.getNewValue()));
        TableColumn<ComponentRow, String> tol = column("Tolerance", ComponentRow::toleranceText, 80);
        TableColumn<ComponentRow, String> nearest = new TableColumn<>("Nearest in series");
        nearest.setCellValueFactory(c -> new SimpleStringProperty(c.getValue().nearestText()));
        nearest.setCellFactory(col -> new TableCell<>() {
            @Override
            protected void updateItem(String s, boolean empty) {
                super.updateItem(s, empty);
                ComponentRow row = empty || getTableRow() == null ? null : getTableRow().getItem();
                setText(empty || row == null ? null : row.standard() ? s + "  (standard)" : s);
                getStyleClass().remove("off-series");
                if (row != null && !row.standard()) {
                    getStyleClass().add("off-series");
                }
            }
        });
        nearest.setPrefWidth(150);
        TableColumn<ComponentRow, ComponentRow> steps = new TableColumn<>("Step");
        steps.setCellValueFactory(c -> new javafx.beans.property.SimpleObjectProperty<>(c.getValue()));
        steps.setCellFactory(col -> new TableCell<>() {
            private final Button dn = new Button("▼");
            private final Button upB = new Button("▲");
            private final HBox box = new HBox(4, dn, upB);

            {
                dn.getStyleClass().add("small");
                upB.getStyleClass().add("small");
                dn.setOnAction(e -> step(getItem().designator(), false));
                upB.setOnAction(e -> step(getItem().designator(), true));
            }

            @Override
            protected void updateItem(ComponentRow r, boolean empty) {
                super.updateItem(r, empty);
                setGraphic(empty || r == null ? null : box);
            }
        });
        steps.setPrefWidth(90);
        steps.setSortable(false);
        table.getColumns().setAll(List.of(part, value, tol, nearest, steps));
        for (TableColumn<ComponentRow, ?> c : List.of(part, tol, nearest, steps)) {
            c.setEditable(false);
        }
        table.setEditable(true);
        table.setColumnResizePolicy(TableView.CONSTRAINED_RESIZE_POLICY_FLEX_LAST_COLUMN);
        table.setPlaceholder(new Label("The components appear here once the design reads without error."));
        table.setOnKeyPressed(e -> {
            if (table.getEditingCell() != null) {
                return;
            }
            if (e.getCode() == KeyCode.PLUS || e.getCode() == KeyCode.ADD || e.getCode() == KeyCode.EQUALS) {
                stepSelected(true);
                e.consume();
            } else if (e.getCode() == KeyCode.MINUS || e.getCode() == KeyCode.SUBTRACT) {
                stepSelected(false);
                e.consume();
            }
        });
    }

    private static TableColumn<ComponentRow, String> column(String title, java.util.function.Function<ComponentRow, String> f,
            double width) {
        TableColumn<ComponentRow, String> c = new TableColumn<>(title);
        c.setCellValueFactory(cell -> new SimpleStringProperty(f.apply(cell.getValue())));
        c.setPrefWidth(width);
        return c;
    }

    Node root() {
        return root;
    }

    // ---- text, parse, analysis ----

    private void setText(String text) {
        settingText = true;
        try {
            int caret = Math.min(editor.getCaretPosition(), text.length());
            double scroll = editor.getScrollTop();
            editor.setText(text);
            editor.positionCaret(caret);
            editor.setScrollTop(scroll);
        } finally {
            settingText = false;
        }
    }

    private void commitTyping() {
        String text = editor.getText();
        doc.edit(text);
        analyseNow(text);
        updateFileLabel();
    }

    /** Reads and analyses {@code text} on the analysis thread; the newest request wins. */
    private void analyseNow(String text) {
        long gen = generation.incrementAndGet();
        String source = doc.sourceName();
        AnalysisSettings s = window.settings();
        analysis.submit(() -> {
            DesignOutcome out = DesignOutcome.of(text, source, s);
            Platform.runLater(() -> {
                if (generation.get() == gen) {
                    apply(out);
                }
            });
        });
    }

    private void apply(DesignOutcome out) {
        outcome.set(out);
        editor.getStyleClass().remove("has-error");
        if (!out.ok()) {
            editor.getStyleClass().add("has-error");
            TextSpan span = out.errorSpan().orElse(null);
            errorSpan.set(span);
            status.setText(ErrorLocator.placed(out.error().getMessage(), doc.sourceName(), span));
            status.getStyleClass().setAll("label", "design-status", "error");
            showError.setVisible(span != null);
            if (span != null && !editor.isFocused()) {
                selectError();
            }
            return;
        }
        errorSpan.set(null);
        showError.setVisible(false);
        status.getStyleClass().setAll("label", "design-status", "ok");
        status.setText(String.format(Locale.ROOT, "%s reads without error: %d stage%s, %d components (analysed in %.1f ms)",
                out.design().name(), out.design().stages().size(), out.design().stages().size() == 1 ? "" : "s",
                out.design().components().size(), out.elapsedNanos() / 1e6));
        DesignCurves c = out.curves();
        AnalysisSettings s = window.settings();
        responseAxis.setBounds(s.range().loHz(), s.range().hiHz());
        deviationAxis.setBounds(s.range().loHz(), s.range().hiHz());
        ObservableData.setLine(response, c.hz(), c.responseDb());
        ObservableData.setLine(targetLine, c.hz(), c.targetDb());
        ObservableData.setLine(deviation, c.deviationHz(), c.deviationDb());
        List<String> labels = c.bands().stream().map(r -> r.band().label()).toList();
        double[] dev = c.bands().stream().mapToDouble(BandReading::deviationDb).toArray();
        bandChart.setTitle((s.fraction() == BandFraction.OCTAVE ? "Octave" : "Third-octave") + "-band deviation from the target");
        bandChart.show(labels, dev, null, null);
        summary.setText(String.format(Locale.ROOT,
                "%s  ·  slope %+.2f dB/octave (target %+.2f)  ·  peak deviation ±%.2f dB  ·  peak band deviation ±%.2f dB",
                c.name(), c.slopeDbPerOctave(), s.target().dbPerOctave(), c.maxDeviationDb(), c.maxBandDeviationDb()));
        refreshTable(out);
        window.designChanged(out.model());
    }

    private void refreshTable(DesignOutcome out) {
        if (out == null || !out.ok()) {
            return;
        }
        String selected = table.getSelectionModel().getSelectedItem() == null ? null
                : table.getSelectionModel().getSelectedItem().designator();
        Design d = out.design();
        List<ComponentRow> rows = d.components().stream().map(c -> ComponentRow.of(d, c, series.getValue())).toList();
        table.getItems().setAll(rows);
        if (selected != null) {
            for (int i = 0; i < rows.size(); i++) {
                if (rows.get(i).designator().equals(selected)) {
                    table.getSelectionModel().select(i);
                }
            }
        }
    }

    private void settingsChanged() {
        FrequencyRange r;
        try {
            r = FrequencyRange.parse(rangeField.getText());
            rangeField.getStyleClass().remove("has-error");
        } catch (IllegalArgumentException e) {
            if (!rangeField.getStyleClass().contains("has-error")) {
                rangeField.getStyleClass().add("has-error");
            }
            window.showStatus("Range: " + e.getMessage());
            return;
        }
        TargetSlope t = switch (target.getItems().indexOf(target.getValue())) {
            case 1 -> TargetSlope.WHITE;
            case 2 -> TargetSlope.BROWN;
            case 3 -> TargetSlope.BLUE;
            default -> TargetSlope.PINK;
        };
        try {
            window.setSettings(new AnalysisSettings(r, t, bandsBox.getValue()));
        } catch (IllegalArgumentException e) {
            window.showStatus("Range: " + e.getMessage());
            return;
        }
        analyseNow(editor.getText());
    }

    // ---- component steps ----

    private void stepSelected(boolean up) {
        ComponentRow r = table.getSelectionModel().getSelectedItem();
        if (r != null) {
            step(r.designator(), up);
        }
    }

    private void snapSelected() {
        ComponentRow r = table.getSelectionModel().getSelectedItem();
        DesignOutcome out = outcome.get();
        if (r != null && out != null && out.ok()) {
            setValue(r.designator(), series.getValue().nearest(r.value()));
        }
    }

    /** Steps a component one value up or down the chosen series and rewrites the design and the text. */
    void step(String designator, boolean up) {
        DesignOutcome out = outcome.get();
        if (out == null || !out.ok()) {
            window.showStatus("Fix the design error before stepping values.");
            return;
        }
        Optional<Component> c = out.design().component(designator);
        if (c.isEmpty()) {
            return;
        }
        ESeries s = series.getValue();
        setValue(designator, up ? s.stepUp(c.get().value()) : s.stepDown(c.get().value()));
    }

    private void setValue(String designator, double value) {
        DesignOutcome out = outcome.get();
        out.design().component(designator).ifPresent(c -> setValueText(designator, EngineeringValue.format(value, c.kind())));
    }

    /**
     * Replaces the characters of one component's value in the text with {@code valueText} and
     * nothing else (see {@link ValueSpans}); refuses, with a status line, when the value is not
     * written in exactly one place.
     */
    void setValueText(String designator, String valueText) {
        commitPendingTyping();
        Optional<String> edited = ValueSpans.replace(doc.text(), designator, valueText);
        if (edited.isEmpty()) {
            window.showStatus(designator + ": its value is not written in exactly one place as " + designator
                    + "(value); edit it in the text.");
            return;
        }
        String text = edited.get();
        doc.edit(text);
        setText(text);
        analyseNow(text);
        updateFileLabel();
    }

    /** A value typed into the table: checked as a value of the part's kind, then written into the text. */
    private void valueTyped(String designator, String typed) {
        DesignOutcome out = outcome.get();
        Optional<Component> c = out == null || !out.ok() ? Optional.empty() : out.design().component(designator);
        if (c.isEmpty()) {
            table.refresh();
            return;
        }
        String text = typed == null ? "" : typed.strip();
        try {
            EngineeringValue.parse(text, c.get().kind());
        } catch (IllegalArgumentException e) {
            window.showStatus(designator + ": " + e.getMessage());
            table.refresh();
            return;
        }
        setValueText(designator, text);
    }

    // ---- undo, files, autosave ----

    void undo() {
        commitPendingTyping();
        if (doc.undo()) {
            setText(doc.text());
            analyseNow(doc.text());
            updateFileLabel();
        }
    }

    void redo() {
        commitPendingTyping();
        if (doc.redo()) {
            setText(doc.text());
            analyseNow(doc.text());
            updateFileLabel();
        }
    }

    private void commitPendingTyping() {
        if (debounce.getStatus() == javafx.animation.Animation.Status.RUNNING) {
            debounce.stop();
            commitTyping();
        }
    }

    /** Opens the bundled preset or the embedded default at start. */
    void openInitial(Path workingDir) {
        Path preset = DefaultDesign.presetIn(workingDir);
        if (preset != null) {
            load(preset);
        }
    }

    /** Asks for a file and opens it, after the unsaved-changes question. */
    void open() {
        if (!confirmDiscard()) {
            return;
        }
        window.prompts().openFile(window.stage(), "Open a design", "Design files (*.json)", "*.json")
                .ifPresent(this::load);
    }

    /** Loads a design file into the editor, offering its autosave back when it is newer. */
    void load(Path file) {
        String text;
        try {
            text = DefaultDesign.read(file);
        } catch (IOException | java.io.UncheckedIOException e) {
            window.prompts().error(window.stage(), file + ": cannot read (" + e.getMessage() + ")");
            return;
        }
        commitPendingTyping();
        doc.load(file, text);
        setText(text);
        try {
            Optional<String> pending = DesignDocument.pendingAutosave(file);
            if (pending.isPresent() && window.prompts().restoreAutosave(window.stage(), file, DesignDocument.autosaveOf(file))) {
                doc.edit(pending.get());
                setText(pending.get());
            } else if (pending.isPresent()) {
                removeAutosave();
            }
        } catch (IOException e) {
            window.showStatus("Autosave of " + file.getFileName() + " could not be read: " + e.getMessage());
        }
        analyseNow(doc.text());
        updateFileLabel();
        window.showStatus("Opened " + file);
    }

    /** Saves to the design's file (asking for one if it has none); false if not saved. */
    boolean save() {
        commitPendingTyping();
        Optional<Path> f = doc.file();
        return f.isPresent() ? saveTo(f.get()) : saveAs();
    }

    boolean saveAs() {
        commitPendingTyping();
        String name = doc.file().map(p -> p.getFileName().toString()).orElse("design.json");
        Optional<Path> target = window.prompts().saveFile(window.stage(), "Save the design", name,
                "Design files (*.json)", "*.json");
        return target.isPresent() && saveTo(target.get());
    }

    private boolean saveTo(Path target) {
        try {
            doc.saveAs(target);
        } catch (IOException e) {
            window.prompts().error(window.stage(), target + ": cannot save (" + e.getMessage() + ")");
            return false;
        }
        Path autosaveFile = DesignDocument.autosaveOf(target);
        io.submit(() -> {
            try {
                Files.deleteIfExists(autosaveFile);
            } catch (IOException e) {
                // A stale autosave equal to the file is ignored when the file is opened again.
            }
        });
        updateFileLabel();
        window.showStatus("Saved " + target);
        return true;
    }

    /** The unsaved-changes question; true when it is fine to drop the current text. */
    boolean confirmDiscard() {
        commitPendingTyping();
        if (!doc.dirty()) {
            return true;
        }
        switch (window.prompts().unsavedChanges(window.stage(), doc.sourceName())) {
            case SAVE:
                return save();
            case DISCARD:
                discardEdits();
                return true;
            default:
                return false;
        }
    }

    /**
     * Drops the unsaved edits: the text goes back to the file's (one undo step brings the edits back
     * on purpose), and the autosave is removed on the autosave thread, after any write still queued
     * there, so no later write can bring the discarded edits back.
     */
    private void discardEdits() {
        if (doc.dirty() && doc.edit(doc.savedText())) {
            setText(doc.text());
            analyseNow(doc.text());
            updateFileLabel();
        }
        removeAutosave();
    }

    private void removeAutosave() {
        Optional<Path> f = doc.file();
        if (f.isEmpty()) {
            return;
        }
        Path target = DesignDocument.autosaveOf(f.get());
        io.submit(() -> {
            try {
                Files.deleteIfExists(target);
            } catch (IOException e) {
                Platform.runLater(() -> window.showStatus("Could not remove the autosave " + target + ": " + e.getMessage()));
            }
        });
    }

    /**
     * Writes unsaved edits beside the file (on the autosave thread); with nothing unsaved (edits undone
     * or discarded) removes the autosave instead, so it never offers back text the user dropped.
     */
    void autosaveNow() {
        commitPendingTyping();
        Optional<Path> f = doc.file();
        if (f.isEmpty()) {
            return;
        }
        if (!doc.dirty()) {
            removeAutosave();
            return;
        }
        String text = doc.text();
        Path target = DesignDocument.autosaveOf(f.get());
        io.submit(() -> {
            try {
                org.roseate.io.AtomicOutput.writeString(target, text, true);
            } catch (IOException e) {
                Platform.runLater(() -> window.showStatus("Autosave failed: " + e.getMessage()));
            }
        });
    }

    /** Waits for pending autosave writes and deletes (for an orderly close and for tests). */
    void flushIo() {
        try {
            io.submit(() -> { }).get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        } catch (java.util.concurrent.ExecutionException e) {
            throw new IllegalStateException(e);
        }
    }

    private void updateFileLabel() {
        String name = doc.file().map(Path::toString).orElse("untitled (embedded bench pink source)");
        fileLabel.setText((doc.dirty() ? "● " : "") + name);
        window.titleChanged(doc.file().map(p -> p.getFileName().toString()).orElse("untitled"), doc.dirty());
    }

    void selectError() {
        TextSpan s = errorSpan.get();
        if (s != null && s.end() <= editor.getLength()) {
            editor.selectRange(s.start(), s.end());
        }
    }

    void shutdown() {
        autosave.stop();
        analysis.shutdownNow();
        io.shutdown();
    }

    // ---- for the window and tests ----

    ReadOnlyObjectProperty<DesignOutcome> outcomeProperty() {
        return outcome;
    }

    ReadOnlyObjectProperty<TextSpan> errorSpanProperty() {
        return errorSpan;
    }

    DesignDocument document() {
        return doc;
    }

    TextArea editor() {
        return editor;
    }

    Label status() {
        return status;
    }

    TableView<ComponentRow> table() {
        return table;
    }

    XYChart.Series<Number, Number> responseSeries() {
        return response;
    }

    XYChart.Series<Number, Number> deviationSeries() {
        return deviation;
    }

    BandChart bandChart() {
        return bandChart;
    }

    ErrorMarks errorMarks() {
        return errorMarks;
    }

    LineChart<Number, Number> responseChart() {
        return responseChart;
    }

    CircuitModel model() {
        DesignOutcome o = outcome.get();
        return o == null ? null : o.model();
    }
}

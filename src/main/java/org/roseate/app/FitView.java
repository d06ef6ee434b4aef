package org.roseate.app;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import javafx.beans.property.ObjectProperty;
import javafx.beans.property.ReadOnlyObjectProperty;
import javafx.beans.property.SimpleObjectProperty;
import javafx.beans.property.SimpleStringProperty;
import javafx.collections.FXCollections;
import javafx.geometry.Insets;
import javafx.geometry.Pos;
import javafx.scene.Node;
import javafx.scene.control.Button;
import javafx.scene.control.CheckBox;
import javafx.scene.control.ComboBox;
import javafx.scene.control.Label;
import javafx.scene.control.ProgressBar;
import javafx.scene.control.Spinner;
import javafx.scene.control.TableColumn;
import javafx.scene.control.TableView;
import javafx.scene.control.TextField;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.GridPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Priority;
import javafx.scene.layout.VBox;
import org.roseate.circuit.Component;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignWriter;
import org.roseate.compare.DesignAnalysis;
import org.roseate.model.CircuitModel;
import org.roseate.tools.FitPlan;
import org.roseate.tools.FitResult;
import org.roseate.tools.FitSpec;
import org.roseate.tools.Fitter;
import org.roseate.tools.PartLimits;
import org.roseate.tools.SeriesChoice;
import org.roseate.tools.Topologies;
import org.roseate.value.ESeries;
import org.roseate.value.EngineeringValue;

/**
 * Refits the values of the design in the editor to the target slope, as {@code fit --from} does
 * ({@link Fitter}, {@link FitPlan}): the input part and the design's own gain at 1 kHz are held
 * unless "free input" is ticked, inductors are held, the rest move; then the nearest standard values
 * are searched. Runs in the view's own task slot with progress and cancel; the result can be saved
 * as a new design file and opened.
 */
final class FitView {
    /** One part's row: start, continuous and standard value, change from continuous to standard. */
    record Row(String part, String start, String continuous, String standard, String change) {
    }

    private final MainWindow window;
    private final TaskRunner.Slot slot;
    private final BorderPane root = new BorderPane();
    private final ComboBox<ESeries> seriesR = new ComboBox<>(FXCollections.observableArrayList(ESeries.values()));
    private final ComboBox<ESeries> seriesC = new ComboBox<>(FXCollections.observableArrayList(ESeries.values()));
    private final TextField limits = new TextField("R=1k-2M2,C=100p-1u");
    private final Spinner<Integer> starts = new Spinner<>(1, 1000, 4);
    private final TextField seed = new TextField("1");
    private final TextField hold = new TextField();
    private final CheckBox freeInput = new CheckBox("Free the input part");
    private final Button run = new Button("Fit");
    private final Button cancel = new Button("Cancel");
    private final Button saveAs = new Button("Save result as…");
    private final ProgressBar progress = new ProgressBar(0);
    private final Label status = new Label("Refits the design in the editor; press Fit.");
    private final Label summary = new Label();
    private final TableView<Row> table = new TableView<>();
    private final ObjectProperty<FitResult> result = new SimpleObjectProperty<>();

    FitView(MainWindow window) {
        this.window = window;
        this.slot = window.tasks().slot("fit");
        seriesR.setValue(ESeries.E24);
        seriesC.setValue(ESeries.E12);
        starts.setEditable(true);
        seed.setPrefColumnCount(6);
        limits.setPrefColumnCount(16);
        hold.setPromptText("parts kept exactly, e.g. R2,C1");
        GridPane g = new GridPane();
        g.setHgap(8);
        g.setVgap(6);
        int r = 0;
        g.addRow(r++, new Label("Series R"), seriesR);
        g.addRow(r++, new Label("Series C"), seriesC);
        g.addRow(r++, new Label("Limits"), limits);
        g.addRow(r++, new Label("Starts"), starts);
        g.addRow(r++, new Label("Seed"), seed);
        g.addRow(r++, new Label("Hold"), hold);
        g.add(freeInput, 1, r++);
        Label note = new Label("Target, range and bands: those of the Design view. Held: the design's own gain at 1 kHz, "
                + "the input part (unless freed) and inductors, as fit --from holds them.");
        note.setWrapText(true);
        note.getStyleClass().add("readout");
        run.setDefaultButton(false);
        run.setOnAction(e -> start());
        cancel.setOnAction(e -> slot.cancel());
        cancel.setDisable(true);
        saveAs.setOnAction(e -> saveResult());
        saveAs.setDisable(true);
        progress.setPrefWidth(200);
        HBox buttons = new HBox(8, run, cancel, progress);
        buttons.setAlignment(Pos.CENTER_LEFT);
        VBox left = new VBox(10, ToolsView.title("Fit values to the target"), g, note, buttons, status, saveAs);
        left.setPrefWidth(340);
        left.getStyleClass().add("side-panel");
        status.setWrapText(true);
        summary.setWrapText(true);
        summary.setMinHeight(javafx.scene.layout.Region.USE_PREF_SIZE);
        summary.getStyleClass().add("summary");
        table.getColumns().setAll(List.of(col("Part", Row::part, 70), col("Start", Row::start, 100),
                col("Continuous", Row::continuous, 120), col("Standard", Row::standard, 100), col("Change", Row::change, 90)));
        table.setPlaceholder(new Label("No fit yet."));
        VBox right = new VBox(8, summary, table);
        VBox.setVgrow(table, Priority.ALWAYS);
        right.setPadding(new Insets(0, 0, 0, 12));
        root.setLeft(left);
        root.setCenter(right);
        root.setPadding(new Insets(10));
    }

    static <R> TableColumn<R, String> col(String name, java.util.function.Function<R, String> f, double width) {
        TableColumn<R, String> c = new TableColumn<>(name);
        c.setCellValueFactory(x -> new SimpleStringProperty(f.apply(x.getValue())));
        c.setPrefWidth(width);
        c.setSortable(false);
        return c;
    }

    /** The spec {@code fit --from} would build for the design in the editor; throws with a reason. */
    FitSpec spec() {
        CircuitModel m = window.model();
        if (m == null) {
            throw new IllegalArgumentException("the design has an error; fix it first");
        }
        Design start = m.design();
        List<String> held = new ArrayList<>();
        if (!freeInput.isSelected()) {
            held.addAll(Topologies.inputParts(start));
        }
        for (String h : hold.getText().split(",")) {
            String d = h.trim();
            if (d.isEmpty()) {
                continue;
            }
            if (start.component(d).isEmpty()) {
                throw new IllegalArgumentException("hold: no part '" + d + "' in the design; its parts are "
                        + String.join(" ", start.components().stream().map(Component::designator).toList()));
            }
            held.add(d);
        }
        FitPlan plan = FitPlan.of(start, held);
        if (plan.free().isEmpty()) {
            throw new IllegalArgumentException("every part is held; there is nothing left to fit");
        }
        long s;
        try {
            s = Long.parseLong(seed.getText().trim());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("seed: expected a whole number, found '" + seed.getText() + "'");
        }
        AnalysisSettings a = window.settings();
        return new FitSpec(start, plan.free(), FitPlan.ownGain(start), a.range(),
                a.target(), a.fraction(), new SeriesChoice(seriesR.getValue(), seriesC.getValue()),
                PartLimits.parse(limits.getText()), starts.getValue(), s, Runtime.getRuntime().availableProcessors(),
                FitSpec.DEFAULT_POINTWISE_WEIGHT);
    }

    /** Starts the fit in this view's slot. */
    void start() {
        FitSpec fs;
        try {
            fs = spec();
        } catch (IllegalArgumentException e) {
            status.setText("Cannot fit: " + e.getMessage());
            return;
        }
        ToolTask<FitResult> task = new ToolTask<>() {
            @Override
            protected FitResult call() {
                return Fitter.fit(fs, progress());
            }
        };
        progress.progressProperty().bind(task.progressProperty());
        run.setDisable(true);
        cancel.setDisable(false);
        status.setText("Fitting " + fs.free().size() + " parts, " + fs.starts() + " starts…");
        slot.run("Fit", task, res -> {
            finished();
            show(fs, res);
        }, msg -> {
            finished();
            status.setText(msg.endsWith("cancelled") ? "Fit cancelled; nothing changed." : "Fit failed: " + msg);
        });
    }

    private void finished() {
        progress.progressProperty().unbind();
        run.setDisable(false);
        cancel.setDisable(true);
    }

    private void show(FitSpec fs, FitResult res) {
        DesignAnalysis c = res.continuousAnalysis();
        DesignAnalysis s = res.snappedAnalysis();
        summary.setText(ToolText.f("Peak band deviation: continuous ±%.4f dB, standard ±%.4f dB. Peak deviation: ±%.4f, "
                + "±%.4f dB. Slope %+.4f, %+.4f dB/octave. Gain at 1 kHz: start %.3f, continuous %.3f, standard %.3f dB.%s",
                c.bands().maxBandDeviationDb(), s.bands().maxBandDeviationDb(), c.slope().maxDeviationDb(),
                s.slope().maxDeviationDb(), c.slope().slopeDbPerOctave(), s.slope().slopeDbPerOctave(), res.startGainDb(),
                res.continuousGainDb(), res.snappedGainDb(),
                res.atLimit().isEmpty() ? "" : " At a limit: " + String.join(" ", res.atLimit()) + "."));
        List<Row> rows = new ArrayList<>();
        List<Component> first = fs.start().components();
        List<Component> cont = res.continuous().components();
        List<Component> snap = res.snapped().components();
        for (int i = 0; i < snap.size(); i++) {
            Component a = cont.get(i);
            Component b = snap.get(i);
            boolean fixed = !fs.free().contains(b.designator());
            rows.add(new Row(b.designator(), EngineeringValue.format(first.get(i).value(), b.kind()),
                    EngineeringValue.formatSi(a.value(), a.kind()), EngineeringValue.format(b.value(), b.kind()),
                    fixed ? "held" : ToolText.f("%+.1f%%", 100 * (b.value() / a.value() - 1))));
        }
        table.getItems().setAll(rows);
        status.setText(ToolText.f("Fitted in %.1f s, %d evaluations.", res.elapsedSeconds(), res.evaluations()));
        saveAs.setDisable(false);
        result.set(res);
    }

    /** Writes the standard-value design to a new file (never over an existing one unasked) and opens it. */
    private void saveResult() {
        FitResult res = result.get();
        if (res == null) {
            return;
        }
        Design written = res.snapped().withName(res.snapped().name() + " (refitted)",
                "Values refitted in the window; held parts unchanged.");
        Optional<Path> target = window.prompts().saveFile(window.stage(), "Save the fitted design", "fitted.json",
                "Design files (*.json)", "*.json");
        if (target.isEmpty()) {
            return;
        }
        if (!SafeWrite.writeString(window, target.get(), DesignWriter.toJson(written))) {
            return;
        }
        if (window.design().confirmDiscard()) {
            window.design().load(target.get());
        }
    }

    ReadOnlyObjectProperty<FitResult> resultProperty() {
        return result;
    }

    TaskRunner.Slot slot() {
        return slot;
    }

    Label status() {
        return status;
    }

    TableView<Row> table() {
        return table;
    }

    TextField hold() {
        return hold;
    }

    Spinner<Integer> starts() {
        return starts;
    }

    Node root() {
        return root;
    }
}

package org.roseate.app;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.function.Supplier;
import javafx.beans.property.ObjectProperty;
import javafx.beans.property.ReadOnlyObjectProperty;
import javafx.beans.property.SimpleObjectProperty;
import javafx.geometry.Insets;
import javafx.geometry.Orientation;
import javafx.geometry.Pos;
import javafx.scene.Node;
import javafx.scene.chart.LineChart;
import javafx.scene.chart.XYChart;
import javafx.scene.control.Button;
import javafx.scene.control.Label;
import javafx.scene.control.RadioButton;
import javafx.scene.control.Spinner;
import javafx.scene.control.SplitPane;
import javafx.scene.control.TableRow;
import javafx.scene.control.TableView;
import javafx.scene.control.ToggleGroup;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.GridPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Priority;
import javafx.scene.layout.VBox;
import javafx.concurrent.Task;
import org.roseate.circuit.Design;
import org.roseate.diagnose.CaptureDiagnosis;
import org.roseate.diagnose.Diagnosis;
import org.roseate.diagnose.FitPoint;
import org.roseate.diagnose.MissingToleranceException;
import org.roseate.diagnose.PartEstimate;
import org.roseate.model.CircuitModel;
import org.roseate.value.ComponentKind;
import org.roseate.value.EngineeringValue;
import org.roseate.value.Tolerance;

/**
 * Diagnoses a build of the design in the editor from a capture, as {@code diagnose} does
 * ({@link CaptureDiagnosis}): a noise-source capture (one channel, level left free) or a transfer
 * capture (reference and response channels), from a chosen WAV file or the Measure view's file.
 * Shows each part's estimate with its interval, marks parts outside their tolerance, names the
 * ambiguity groups, and draws measured, fitted and design levels with the residual. Runs in the
 * view's own task slot with cancel.
 */
final class DiagnoseView {
    /** One part's row of the table. */
    record Row(String part, String nominal, String estimate, String change, String interval, String tolerance,
            String pOutside, boolean out) {
    }

    private final MainWindow window;
    private final TaskRunner.Slot slot;
    private final Supplier<Path> measuredFile;
    private final BorderPane root = new BorderPane();
    private final Label captureLabel = new Label("no capture chosen");
    private final RadioButton noise = new RadioButton("Noise-source capture");
    private final RadioButton transfer = new RadioButton("Transfer capture");
    private final Spinner<Integer> channel = new Spinner<>(1, 64, 1);
    private final Spinner<Integer> reference = new Spinner<>(1, 64, 1);
    private final Button run = new Button("Diagnose");
    private final Button cancel = new Button("Cancel");
    private final Label status = new Label("Choose a capture of the built circuit, then Diagnose.");
    private final Label summary = new Label();
    private final TableView<Row> table = new TableView<>();
    private final XYChart.Series<Number, Number> measured = new XYChart.Series<>();
    private final XYChart.Series<Number, Number> fitted = new XYChart.Series<>();
    private final XYChart.Series<Number, Number> designed = new XYChart.Series<>();
    private final XYChart.Series<Number, Number> residual = new XYChart.Series<>();
    private final LogAxis levelAxis = new LogAxis("Frequency (Hz)", 20, 20000);
    private final LogAxis residualAxis = new LogAxis("Frequency (Hz)", 20, 20000);
    private final LineChart<Number, Number> levelChart;
    private final LineChart<Number, Number> residualChart;
    private final ObjectProperty<CaptureDiagnosis.Outcome> result = new SimpleObjectProperty<>();
    private Path capture;

    /**
     * @param measuredFile the Measure view's current file, or null when it has none
     */
    DiagnoseView(MainWindow window, Supplier<Path> measuredFile) {
        this.window = window;
        this.slot = window.tasks().slot("diagnose");
        this.measuredFile = measuredFile;
        measured.setName("measured");
        fitted.setName("fitted");
        designed.setName("design");
        residual.setName("measured − fitted");
        levelChart = DesignView.lineChart("Level: measured, fitted and design", levelAxis, "Level (dB)",
                List.of(measured, fitted, designed));
        residualChart = DesignView.lineChart("Residual: measured − fitted", residualAxis, "Residual (dB)", List.of(residual));
        residualChart.setLegendVisible(false);
        ToggleGroup mode = new ToggleGroup();
        noise.setToggleGroup(mode);
        transfer.setToggleGroup(mode);
        noise.setSelected(true);
        reference.disableProperty().bind(noise.selectedProperty());
        channel.setEditable(true);
        reference.setEditable(true);
        Button choose = new Button("Choose capture…");
        choose.setOnAction(e -> window.prompts().openFile(window.stage(), "Capture of the built circuit",
                "WAV files (*.wav)", "*.wav", "*.WAV").ifPresent(this::setCapture));
        Button fromMeasure = new Button("Use the Measure view's file");
        fromMeasure.setOnAction(e -> {
            Path p = measuredFile.get();
            if (p == null) {
                status.setText("The Measure view has no file yet; measure a WAV file there first, or choose one here.");
            } else {
                setCapture(p);
            }
        });
        GridPane g = new GridPane();
        g.setHgap(8);
        g.setVgap(6);
        int r = 0;
        g.add(new VBox(6, choose, fromMeasure, captureLabel), 0, r++, 2, 1);
        g.add(noise, 0, r++, 2, 1);
        g.add(transfer, 0, r++, 2, 1);
        g.addRow(r++, new Label("Response channel"), channel);
        g.addRow(r++, new Label("Reference channel"), reference);
        Label note = new Label("Tolerances come from the design's \"tolerance\" map (they are the priors). "
                + "The design is the one in the editor.");
        note.setWrapText(true);
        note.getStyleClass().add("readout");
        run.setOnAction(e -> start());
        cancel.setOnAction(e -> slot.cancel());
        cancel.setDisable(true);
        HBox buttons = new HBox(8, run, cancel);
        buttons.setAlignment(Pos.CENTER_LEFT);
        status.setWrapText(true);
        VBox left = new VBox(10, ToolsView.title("Diagnose a build"), g, note, buttons, status);
        left.setPrefWidth(320);
        left.getStyleClass().add("side-panel");
        table.getColumns().setAll(List.of(FitView.col("Part", Row::part, 60), FitView.col("Nominal", Row::nominal, 90),
                FitView.col("Estimate", Row::estimate, 90), FitView.col("Change", Row::change, 70),
                FitView.col("Interval", Row::interval, 170), FitView.col("Tol.", Row::tolerance, 50),
                FitView.col("P(outside)", Row::pOutside, 80)));
        table.setRowFactory(t -> new TableRow<>() {
            @Override
            protected void updateItem(Row row, boolean empty) {
                super.updateItem(row, empty);
                getStyleClass().remove("out-of-tolerance");
                if (!empty && row != null && row.out()) {
                    getStyleClass().add("out-of-tolerance");
                }
            }
        });
        table.setPlaceholder(new Label("No diagnosis yet."));
        summary.setWrapText(true);
        summary.setMinHeight(javafx.scene.layout.Region.USE_PREF_SIZE);
        summary.getStyleClass().add("summary");
        VBox top = new VBox(6, summary, table);
        VBox.setVgrow(table, Priority.ALWAYS);
        SplitPane charts = new SplitPane(levelChart, residualChart);
        charts.setOrientation(Orientation.VERTICAL);
        SplitPane right = new SplitPane(top, charts);
        right.setOrientation(Orientation.VERTICAL);
        right.setDividerPositions(0.45);
        BorderPane.setMargin(right, new Insets(0, 0, 0, 12));
        root.setLeft(left);
        root.setCenter(right);
        root.setPadding(new Insets(10));
    }

    void setCapture(Path p) {
        capture = p;
        captureLabel.setText(p.getFileName().toString());
    }

    void setTransfer(boolean t, int referenceChannel, int responseChannel) {
        (t ? transfer : noise).setSelected(true);
        reference.getValueFactory().setValue(referenceChannel);
        channel.getValueFactory().setValue(responseChannel);
    }

    /** The request {@code diagnose} would make; throws with a reason. */
    CaptureDiagnosis.Request request() {
        CircuitModel m = window.model();
        if (m == null) {
            throw new IllegalArgumentException("the design has an error; fix it first");
        }
        if (capture == null) {
            throw new IllegalArgumentException("choose a capture first");
        }
        Design d = m.design();
        boolean t = transfer.isSelected();
        return new CaptureDiagnosis.Request(d, d.name(), capture, t ? reference.getValue() : null, channel.getValue(),
                Map.<String, Tolerance>of(), null, null);
    }

    void start() {
        CaptureDiagnosis.Request req;
        try {
            req = request();
        } catch (IllegalArgumentException e) {
            status.setText("Cannot diagnose: " + e.getMessage());
            return;
        }
        Task<CaptureDiagnosis.Outcome> task = new Task<>() {
            @Override
            protected CaptureDiagnosis.Outcome call() {
                try {
                    return CaptureDiagnosis.run(req);
                } catch (MissingToleranceException e) {
                    throw new IllegalArgumentException(req.source() + ": no tolerance for "
                            + String.join(", ", e.designators()) + "; add them to the design's \"tolerance\" map, "
                            + "e.g. \"tolerance\": {\"R\": \"1%\", \"C\": \"5%\"}");
                }
            }
        };
        run.setDisable(true);
        cancel.setDisable(false);
        status.setText("Diagnosing " + req.capture().getFileName() + "…");
        slot.run("Diagnose", task, out -> {
            finished();
            show(req.design(), out);
        }, msg -> {
            finished();
            status.setText(msg.endsWith("cancelled") ? "Diagnosis cancelled." : "Cannot diagnose: " + msg);
        });
    }

    private void finished() {
        run.setDisable(false);
        cancel.setDisable(true);
    }

    private static String si(double v, ComponentKind kind) {
        return EngineeringValue.formatSi(Double.parseDouble(ToolText.f("%.4g", v)), kind);
    }

    private void show(Design design, CaptureDiagnosis.Outcome o) {
        Diagnosis dx = o.diagnosis();
        List<Row> rows = new ArrayList<>();
        for (PartEstimate p : dx.parts()) {
            ComponentKind k = design.component(p.designator()).orElseThrow().kind();
            rows.add(new Row(p.designator(), si(p.nominal(), k), si(p.estimate(), k), ToolText.f("%+.2f%%", p.changePercent()),
                    si(p.low(), k) + " … " + si(p.high(), k), new Tolerance(p.tolerance()).toString(),
                    ToolText.f("%.3f", p.probabilityOutside()), p.outOfTolerance()));
        }
        table.getItems().setAll(rows);
        StringBuilder sb = new StringBuilder();
        if (dx.modelMisfit()) {
            sb.append("No part values explain this measurement: look for a missing, extra or swapped part or a wiring "
                    + "fault; the estimates are not to be trusted. ");
        } else if (dx.flagged().isEmpty()) {
            sb.append(ToolText.f("No part is outside its tolerance at %.0f %% confidence. ", 100 * dx.confidence()));
        } else {
            for (PartEstimate p : dx.flagged()) {
                ComponentKind k = design.component(p.designator()).orElseThrow().kind();
                sb.append(ToolText.f("Change %s: it measures %s, the design wants %s. ", p.designator(),
                        si(p.estimate(), k), si(p.nominal(), k)));
            }
        }
        if (dx.ambiguityGroups().isEmpty()) {
            sb.append("Ambiguity groups: none. ");
        } else {
            List<String> g = new ArrayList<>();
            dx.ambiguityGroups().forEach(x -> g.add("{" + String.join(" ", x) + "}"));
            sb.append("Ambiguity groups (the capture cannot tell these apart): ").append(String.join(", ", g)).append(". ");
        }
        sb.append(ToolText.f("Residual %.3f dB RMS over %d trusted points (%.3f dB expected from the scatter, p = %.3g). "
                + "Intervals: central %.0f %%.", dx.residualDb(), o.measured().trustedCount(), dx.expectedResidualDb(),
                dx.misfitPValue(), 100 * dx.confidence()));
        summary.setText(sb.toString());
        List<FitPoint> t = dx.points().stream().filter(FitPoint::trusted).toList();
        double[] hz = t.stream().mapToDouble(FitPoint::hz).toArray();
        levelAxis.setBounds(o.bandHz()[0], o.bandHz()[1]);
        residualAxis.setBounds(o.bandHz()[0], o.bandHz()[1]);
        ObservableData.setLine(measured, hz, t.stream().mapToDouble(FitPoint::measuredDb).toArray());
        ObservableData.setLine(fitted, hz, t.stream().mapToDouble(FitPoint::fittedDb).toArray());
        ObservableData.setLine(designed, hz, t.stream().mapToDouble(FitPoint::designDb).toArray());
        ObservableData.setLine(residual, hz, t.stream().mapToDouble(FitPoint::residualDb).toArray());
        status.setText(ToolText.f("Diagnosed %s: segment %d, %s.", o.measured().description(), o.segmentLength(),
                ToolText.hz(o.measured().sampleRateHz())));
        result.set(o);
    }

    ReadOnlyObjectProperty<CaptureDiagnosis.Outcome> resultProperty() {
        return result;
    }

    TaskRunner.Slot slot() {
        return slot;
    }

    Label status() {
        return status;
    }

    Label summary() {
        return summary;
    }

    TableView<Row> table() {
        return table;
    }

    Node root() {
        return root;
    }
}

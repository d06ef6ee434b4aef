package org.roseate.app;

import java.util.List;
import javafx.beans.property.ObjectProperty;
import javafx.beans.property.ReadOnlyObjectProperty;
import javafx.beans.property.SimpleObjectProperty;
import javafx.collections.FXCollections;
import javafx.geometry.Insets;
import javafx.geometry.Pos;
import javafx.scene.Node;
import javafx.scene.chart.LineChart;
import javafx.scene.chart.XYChart;
import javafx.scene.control.Button;
import javafx.scene.control.CheckBox;
import javafx.scene.control.ComboBox;
import javafx.scene.control.Label;
import javafx.scene.control.ProgressBar;
import javafx.scene.control.SplitPane;
import javafx.scene.control.TableView;
import javafx.scene.control.TextField;
import javafx.geometry.Orientation;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.GridPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.VBox;
import org.roseate.circuit.Design;
import org.roseate.model.CircuitModel;
import org.roseate.tools.BinnedQuantiles;
import org.roseate.tools.Distribution;
import org.roseate.tools.MonteCarlo;
import org.roseate.tools.Quantiles;

/**
 * Monte Carlo tolerance analysis of the design in the editor, as {@code tolerance} runs it
 * ({@link MonteCarlo#run}): the 5–50–95 % envelopes of each band's deviation, the yield against a
 * limit on the peak band deviation, and each part's sensitivity ranked by its contribution. Runs
 * in the view's own task slot with progress and cancel.
 */
final class ToleranceView {
    /** One ranked sensitivity. */
    record Row(String part, String tolerance, String contribution, String shape, String level) {
    }

    private final MainWindow window;
    private final TaskRunner.Slot slot;
    private final BorderPane root = new BorderPane();
    private final TextField trials = new TextField("2000");
    private final ComboBox<Distribution> distribution = new ComboBox<>(FXCollections.observableArrayList(Distribution.values()));
    private final TextField seed = new TextField("1");
    private final TextField limit = new TextField("1");
    private final CheckBox againstNominal = new CheckBox("Judge against the nominal design");
    private final Button run = new Button("Run");
    private final Button cancel = new Button("Cancel");
    private final ProgressBar progress = new ProgressBar(0);
    private final Label status = new Label("Draws every toleranced part at random; press Run.");
    private final Label summary = new Label();
    private final XYChart.Series<Number, Number> p5 = new XYChart.Series<>();
    private final XYChart.Series<Number, Number> p50 = new XYChart.Series<>();
    private final XYChart.Series<Number, Number> p95 = new XYChart.Series<>();
    private final XYChart.Series<Number, Number> nominal = new XYChart.Series<>();
    private final LogAxis axis = new LogAxis("Band, nominal midband frequency (Hz)", 20, 20000);
    private final LineChart<Number, Number> envelope;
    private final TableView<Row> table = new TableView<>();
    private final ObjectProperty<MonteCarlo.Result> result = new SimpleObjectProperty<>();

    ToleranceView(MainWindow window) {
        this.window = window;
        this.slot = window.tasks().slot("tolerance");
        distribution.setValue(Distribution.UNIFORM);
        distribution.setConverter(new javafx.util.StringConverter<>() {
            @Override
            public String toString(Distribution d) {
                return d == null ? "" : d == Distribution.UNIFORM ? "uniform" : "Gaussian";
            }

            @Override
            public Distribution fromString(String s) {
                return Distribution.parse(s).orElse(Distribution.UNIFORM);
            }
        });
        p5.setName("5 %");
        p50.setName("median");
        p95.setName("95 %");
        nominal.setName("nominal");
        envelope = DesignView.lineChart("Band deviation from the target: 5–95 % envelope", axis, "Deviation (dB)",
                List.of(p5, p50, p95, nominal));
        envelope.getStyleClass().add("envelope-chart");
        GridPane g = new GridPane();
        g.setHgap(8);
        g.setVgap(6);
        int r = 0;
        g.addRow(r++, new Label("Trials"), trials);
        g.addRow(r++, new Label("Distribution"), distribution);
        g.addRow(r++, new Label("Seed"), seed);
        g.addRow(r++, new Label("Yield limit (dB)"), limit);
        g.add(againstNominal, 1, r++);
        Label note = new Label("Tolerances: the design's \"tolerance\" map; parts without one stay exact. Uniform: "
                + "within ± tolerance; Gaussian: σ = tolerance/3, cut at ±3σ.");
        note.setWrapText(true);
        note.getStyleClass().add("readout");
        run.setOnAction(e -> start());
        cancel.setOnAction(e -> slot.cancel());
        cancel.setDisable(true);
        progress.setPrefWidth(200);
        HBox buttons = new HBox(8, run, cancel, progress);
        buttons.setAlignment(Pos.CENTER_LEFT);
        status.setWrapText(true);
        VBox left = new VBox(10, ToolsView.title("Tolerance and yield"), g, note, buttons, status);
        left.setPrefWidth(340);
        left.getStyleClass().add("side-panel");
        summary.setWrapText(true);
        summary.setMinHeight(javafx.scene.layout.Region.USE_PREF_SIZE);
        summary.getStyleClass().add("summary");
        table.getColumns().setAll(List.of(FitView.col("Part", Row::part, 70), FitView.col("Tolerance", Row::tolerance, 80),
                FitView.col("Contribution (dB)", Row::contribution, 130), FitView.col("Shape dB/%", Row::shape, 100),
                FitView.col("Level dB/%", Row::level, 100)));
        table.setPlaceholder(new Label("No run yet."));
        Label rank = new Label("Ranked by contribution: the shape change, dB, of one part moving by its whole tolerance. "
                + "Tighten the top ones first.");
        rank.setWrapText(true);
        rank.getStyleClass().add("readout");
        VBox sens = new VBox(4, rank, table);
        SplitPane right = new SplitPane(envelope, sens);
        right.setOrientation(Orientation.VERTICAL);
        right.setDividerPositions(0.6);
        VBox centre = new VBox(6, summary, right);
        VBox.setVgrow(right, javafx.scene.layout.Priority.ALWAYS);
        centre.setPadding(new Insets(0, 0, 0, 12));
        root.setLeft(left);
        root.setCenter(centre);
        root.setPadding(new Insets(10));
    }

    /** The spec {@code tolerance} would build; throws with a reason. */
    MonteCarlo.Spec spec() {
        CircuitModel m = window.model();
        if (m == null) {
            throw new IllegalArgumentException("the design has an error; fix it first");
        }
        Design d = m.design();
        int n = parseInt(trials.getText(), "trials");
        long s = parseLong(seed.getText(), "seed");
        double lim;
        try {
            lim = Double.parseDouble(limit.getText().trim().replaceAll("(?i)db$", "").trim());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("limit: expected a peak deviation in dB such as 1 or 0.5, found '"
                    + limit.getText() + "'");
        }
        AnalysisSettings a = window.settings();
        return new MonteCarlo.Spec(d, a.range(), a.target(), a.fraction(), n, distribution.getValue(), s, lim,
                Runtime.getRuntime().availableProcessors(), againstNominal.isSelected());
    }

    private static int parseInt(String text, String what) {
        try {
            return Integer.parseInt(text.trim());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException(what + ": expected a whole number, found '" + text + "'");
        }
    }

    private static long parseLong(String text, String what) {
        try {
            return Long.parseLong(text.trim());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException(what + ": expected a whole number, found '" + text + "'");
        }
    }

    void start() {
        MonteCarlo.Spec ms;
        try {
            ms = spec();
        } catch (IllegalArgumentException e) {
            status.setText("Cannot run: " + e.getMessage());
            return;
        }
        ToolTask<MonteCarlo.Result> task = new ToolTask<>() {
            @Override
            protected MonteCarlo.Result call() {
                return MonteCarlo.run(ms, progress());
            }
        };
        progress.progressProperty().bind(task.progressProperty());
        run.setDisable(true);
        cancel.setDisable(false);
        status.setText(ToolText.f("Running %d trials…", ms.trials()));
        slot.run("Tolerance", task, res -> {
            finished();
            show(res);
        }, msg -> {
            finished();
            status.setText(msg.endsWith("cancelled") ? "Tolerance run cancelled." : "Tolerance failed: " + msg);
        });
    }

    private void finished() {
        progress.progressProperty().unbind();
        run.setDisable(false);
        cancel.setDisable(true);
    }

    private void show(MonteCarlo.Result r) {
        Quantiles p = r.peakDb();
        summary.setText(ToolText.f("Yield (peak band deviation ≤ %.3g dB): %.1f %% ± %.1f %% (binomial standard error). "
                + "Peak band deviation: nominal ±%.3f dB; 5 %% %s, median %s, 95 %% %s dB. Percentiles within ±%.4f dB "
                + "(0.001 dB bins). Exact (no tolerance): %s.", r.spec().limitDb(), 100 * r.yield(),
                100 * r.yieldStandardError(), r.nominalPeakDb(), q(p.p5()), q(p.p50()), q(p.p95()),
                BinnedQuantiles.ERROR_DB, r.exact().isEmpty() ? "none" : String.join(" ", r.exact())));
        int n = r.bands().size();
        double[] hz = new double[n];
        double[] a = new double[n];
        double[] b = new double[n];
        double[] c = new double[n];
        double[] nom = new double[n];
        for (int i = 0; i < n; i++) {
            MonteCarlo.BandSpread s = r.bands().get(i);
            hz[i] = s.band().nominalHz();
            a[i] = s.deviationDb().p5();
            b[i] = s.deviationDb().p50();
            c[i] = s.deviationDb().p95();
            nom[i] = s.nominalDeviationDb();
        }
        axis.setBounds(r.spec().range().loHz(), r.spec().range().hiHz());
        setFinite(p5, hz, a);
        setFinite(p50, hz, b);
        setFinite(p95, hz, c);
        setFinite(nominal, hz, nom);
        table.getItems().setAll(r.sensitivities().stream().map(s -> new Row(s.designator(),
                s.tolerance() == null ? "exact" : s.tolerance().toString(), ToolText.f("%.4f", s.contributionDb()),
                ToolText.f("%.4f", s.maxShapeDb()), ToolText.f("%.4f", s.maxLevelDb()))).toList());
        status.setText(ToolText.f("%d trials, seed %d.", r.spec().trials(), r.spec().seed()));
        result.set(r);
    }

    /** Draws the points whose value is finite (a percentile beyond the bins is left out, not guessed). */
    private static void setFinite(XYChart.Series<Number, Number> s, double[] x, double[] y) {
        int n = 0;
        for (double v : y) {
            n += Double.isFinite(v) ? 1 : 0;
        }
        double[] xs = new double[n];
        double[] ys = new double[n];
        for (int i = 0, k = 0; i < y.length; i++) {
            if (Double.isFinite(y[i])) {
                xs[k] = x[i];
                ys[k++] = y[i];
            }
        }
        ObservableData.setLine(s, xs, ys);
    }

    /** A percentile, or "beyond" when it lies outside the ±32.8 dB the bins cover (refused, not guessed). */
    private static String q(double v) {
        return Double.isNaN(v) ? "beyond" : ToolText.f("%.3f", v);
    }

    ReadOnlyObjectProperty<MonteCarlo.Result> resultProperty() {
        return result;
    }

    TaskRunner.Slot slot() {
        return slot;
    }

    Label status() {
        return status;
    }

    TextField trials() {
        return trials;
    }

    TableView<Row> table() {
        return table;
    }

    LineChart<Number, Number> envelope() {
        return envelope;
    }

    Node root() {
        return root;
    }
}

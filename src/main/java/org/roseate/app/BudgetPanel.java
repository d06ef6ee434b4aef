package org.roseate.app;

import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicLong;
import javafx.application.Platform;
import javafx.beans.property.ObjectProperty;
import javafx.beans.property.ReadOnlyObjectProperty;
import javafx.beans.property.SimpleObjectProperty;
import javafx.geometry.Insets;
import javafx.geometry.Pos;
import javafx.scene.Node;
import javafx.scene.control.Label;
import javafx.scene.control.ProgressBar;
import javafx.scene.control.ScrollPane;
import javafx.scene.control.Tooltip;
import javafx.scene.layout.GridPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Region;
import javafx.scene.layout.VBox;
import org.roseate.budget.BudgetResult;
import org.roseate.budget.NoiseBudget;
import org.roseate.compare.LogGrid;
import org.roseate.model.CircuitModel;

/**
 * The volts-and-headroom budget beside the design, as {@code budget} computes it
 * ({@link NoiseBudget#compute}): the output RMS, each stage's RMS volts with a headroom bar and the
 * clip probability, and the noise contributors ranked. Recomputed after every edit that reads
 * without error and every change of range or band width, on its own thread (newest wins).
 *
 * <p>The headroom bar: its fill is RMS/swing on a dB scale, 1 − headroom/{@value #BAR_SPAN_DB} dB,
 * so an empty bar has 40 dB to spare and a full one sits at the rails. It turns amber below
 * {@value #CAUTION_HEADROOM_DB} dB, where the 4σ peaks (exceeded about 6e-5 of the time by Gaussian
 * noise) reach the swing, and red at 0 dB, where the RMS itself does.
 */
final class BudgetPanel {
    /** Headroom in dB that an empty bar stands for. */
    static final double BAR_SPAN_DB = 40;
    /** 20·log10(4): below this the 4σ peaks pass the swing. */
    static final double CAUTION_HEADROOM_DB = 12.04;
    /** How many contributors are listed. */
    static final int CONTRIBUTORS_SHOWN = 5;
    /** Density points for the output density, as {@code budget} takes by default: 10 per decade. */
    static final int POINTS_PER_DECADE = 10;

    private final MainWindow window;
    private final ExecutorService worker = Executors.newSingleThreadExecutor(r -> {
        Thread t = new Thread(r, "roseate-budget");
        t.setDaemon(true);
        return t;
    });
    private final AtomicLong generation = new AtomicLong();
    private final ObjectProperty<BudgetResult> result = new SimpleObjectProperty<>();
    private final Label summary = new Label("The budget appears once the design reads without error.");
    private final HBox stages = new HBox(14);
    private final GridPane contributors = new GridPane();
    private final HBox box = new HBox(18);
    private final ScrollPane root = new ScrollPane(box);

    BudgetPanel(MainWindow window) {
        this.window = window;
        Label title = new Label("Volts and headroom");
        title.getStyleClass().add("section-title");
        Label stagesTitle = new Label("Stages: RMS volts and headroom to the swing");
        stagesTitle.getStyleClass().add("subsection-title");
        Label contribTitle = new Label("Noise at the output, ranked");
        contribTitle.getStyleClass().add("subsection-title");
        summary.setWrapText(true);
        summary.getStyleClass().add("readout");
        contributors.setHgap(8);
        contributors.setVgap(2);
        Label legend = new Label("Headroom: 20·log10(swing/RMS). P(clip): erfc(swing/(√2·RMS)), the chance Gaussian noise of "
                + "that RMS passes the swing (give each op-amp its swingV).");
        legend.setWrapText(true);
        legend.getStyleClass().add("readout");
        Tooltip.install(title, new Tooltip(legend.getText()));
        Tooltip.install(stagesTitle, new Tooltip(legend.getText()));
        summary.setMinHeight(Region.USE_PREF_SIZE);
        VBox about = new VBox(4, title, summary);
        about.setPrefWidth(330);
        about.setMinWidth(280);
        VBox stagesBox = new VBox(4, stagesTitle, stages);
        VBox contribBox = new VBox(4, contribTitle, contributors);
        contribBox.setMinWidth(250);
        box.getChildren().setAll(about, stagesBox, contribBox);
        box.setPadding(new Insets(6, 8, 6, 8));
        box.getStyleClass().add("budget-panel");
        root.setFitToHeight(true);
        root.setPrefHeight(150);
        root.setMinHeight(0);
        window.modelProperty().addListener((o, a, m) -> recompute());
        window.settingsProperty().addListener((o, a, s) -> recompute());
        recompute();
    }

    Node root() {
        return root;
    }

    /** The newest budget shown (null before the first or when the design has no noise). */
    ReadOnlyObjectProperty<BudgetResult> resultProperty() {
        return result;
    }

    /** Recomputes for the current design and settings; only the newest request's answer is shown. */
    void recompute() {
        CircuitModel m = window.model();
        if (m == null || worker.isShutdown()) {
            return;
        }
        AnalysisSettings s = window.settings();
        long g = generation.incrementAndGet();
        worker.submit(() -> {
            BudgetResult r;
            String failure = null;
            try {
                NoiseBudget b = NoiseBudget.of(m.design(), m.design().name());
                r = b.compute(s.range().loHz(), s.range().hiHz(), LogGrid.points(s.range().loHz(), s.range().hiHz(),
                        POINTS_PER_DECADE), s.fraction());
            } catch (RuntimeException e) {
                r = null;
                failure = e.getMessage();
            }
            BudgetResult done = r;
            String why = failure;
            Platform.runLater(() -> {
                if (g == generation.get()) {
                    show(done, why);
                }
            });
        });
    }

    private void show(BudgetResult r, String failure) {
        stages.getChildren().clear();
        contributors.getChildren().clear();
        if (r == null || !(r.outputRmsV() > 0)) {
            result.set(null);
            summary.setText(failure != null ? "No budget: " + failure
                    : "Nothing makes noise: the design has no \"source\", and no resistors or op-amp noise keys "
                            + "(enVPerRtHz, inAPerRtHz).");
            return;
        }
        StringBuilder sb = new StringBuilder(ToolText.f("Output RMS %s V over %s – %s", ToolText.volts(r.outputRmsV()),
                ToolText.hz(r.loHz()), ToolText.hz(r.hiHz())));
        if (r.hasSource()) {
            sb.append(ToolText.f("; source's part %s V", ToolText.volts(r.sourceRmsV())));
        }
        sb.append(ToolText.f("; circuit's own %s V", ToolText.volts(r.selfNoiseRmsV())));
        r.sourceToSelfDb().ifPresent(db -> sb.append(ToolText.f(" (source %.1f dB above)", db)));
        sb.append(ToolText.f(". Zero crossings %s /s (Rice).", ToolText.volts(r.zeroCrossingsPerS())));
        summary.setText(sb.toString());
        for (BudgetResult.StageReading s : r.stages()) {
            String name = s.stage() + " " + s.node() + s.opamp().map(u -> " (" + u + ")").orElse("");
            Label n = new Label(name);
            Label v = new Label(ToolText.volts(s.rmsV()) + " V RMS");
            v.getStyleClass().add("stage-rms");
            ProgressBar bar = new ProgressBar(0);
            bar.setMaxWidth(Double.MAX_VALUE);
            bar.getStyleClass().add("headroom-bar");
            Label clip = new Label();
            if (s.headroomDb().isPresent()) {
                double h = s.headroomDb().get();
                bar.setProgress(fill(h));
                bar.getStyleClass().add(h < 0 ? "over" : h < CAUTION_HEADROOM_DB ? "tight" : "clear");
                double p = s.clipProbability().orElse(Double.NaN);
                clip.setText(ToolText.f("%.1f dB, P(clip) %s", h, p == 0 ? "< 1e-300" : ToolText.f("%.3g", p)));
            } else {
                bar.setDisable(true);
                clip.setText("no swingV given");
            }
            bar.setTooltip(new Tooltip(ToolText.f("swing %s V", s.swingV().map(String::valueOf).orElse("not given"))));
            HBox head = new HBox(8, n, v);
            VBox one = new VBox(2, head, bar, clip);
            one.setPrefWidth(190);
            one.setMinWidth(170);
            one.getStyleClass().add("budget-stage");
            stages.getChildren().add(one);
        }
        double total2 = r.outputRmsV() * r.outputRmsV();
        List<BudgetResult.Contributor> cs = r.contributors();
        for (int i = 0; i < Math.min(CONTRIBUTORS_SHOWN, cs.size()); i++) {
            BudgetResult.Contributor c = cs.get(i);
            Label share = new Label(ToolText.f("%.2f %%", 100 * c.rmsV() * c.rmsV() / total2));
            share.setAlignment(Pos.CENTER_RIGHT);
            contributors.addRow(i, new Label((i + 1) + ". " + c.name()), new Label(ToolText.volts(c.rmsV()) + " V"), share);
        }
        if (cs.size() > CONTRIBUTORS_SHOWN) {
            contributors.addRow(CONTRIBUTORS_SHOWN, new Label("… " + (cs.size() - CONTRIBUTORS_SHOWN) + " more (see budget)"));
        }
        result.set(r);
    }

    /** The bar's fill for a headroom in dB: 0 at {@value #BAR_SPAN_DB} dB or more, 1 at 0 dB or less. */
    static double fill(double headroomDb) {
        return Math.max(0, Math.min(1, 1 - headroomDb / BAR_SPAN_DB));
    }

    /** The text of each stage row (name, RMS, headroom and P(clip)), for tests. */
    List<String> stageTexts() {
        List<String> out = new java.util.ArrayList<>();
        for (Node n : stages.getChildren()) {
            VBox one = (VBox) n;
            HBox head = (HBox) one.getChildren().get(0);
            out.add(((Label) head.getChildren().get(0)).getText() + " | " + ((Label) head.getChildren().get(1)).getText()
                    + " | " + ((Label) one.getChildren().get(2)).getText());
        }
        return out;
    }

    void shutdown() {
        worker.shutdownNow();
    }
}

package org.roseate.app;

import java.nio.file.Path;
import java.util.List;
import java.util.Objects;
import javafx.beans.property.ObjectProperty;
import javafx.beans.property.ReadOnlyObjectProperty;
import javafx.beans.property.SimpleObjectProperty;
import javafx.geometry.Insets;
import javafx.geometry.Pos;
import javafx.scene.Scene;
import javafx.scene.control.Label;
import javafx.scene.control.Tab;
import javafx.scene.control.TabPane;
import javafx.scene.input.KeyCode;
import javafx.scene.input.KeyCodeCombination;
import javafx.scene.input.KeyCombination;
import javafx.scene.input.KeyEvent;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Priority;
import javafx.scene.layout.Region;
import javafx.stage.Stage;
import org.roseate.model.CircuitModel;

/**
 * The window: six views in tabs (Design, Listen, Measure, Compare, Tools, Bench), a status bar with the running
 * task's progress, the keyboard shortcuts, and the state the views share: the analysis settings
 * and the newest design that reads without error.
 */
final class MainWindow {
    static final double WIDTH = 1200;
    static final double HEIGHT = 800;

    private final Prompts prompts;
    private final Path workingDir;
    private final ObjectProperty<AnalysisSettings> settings = new SimpleObjectProperty<>(AnalysisSettings.DEFAULT);
    private final ObjectProperty<CircuitModel> model = new SimpleObjectProperty<>();
    private final TaskRunner tasks = new TaskRunner();
    private final Label statusText = new Label("Ready.");
    private final TabPane tabs = new TabPane();
    private final BorderPane root = new BorderPane();
    private Stage stage;
    private DesignView design;
    private ListenView listen;
    private MeasureView measure;
    private CompareView compare;
    private ToolsView tools;
    private BudgetPanel budget;
    private MenuBarBuilder menus;
    private BenchView bench;
    private boolean cautionAccepted;

    MainWindow(Prompts prompts, Path workingDir) {
        this.prompts = Objects.requireNonNull(prompts, "prompts");
        this.workingDir = workingDir;
        FftThreads.useDaemonPool();
    }

    /** Builds the views into {@code stage}, opens the preset and shows the window. */
    Scene show(Stage s) {
        this.stage = s;
        design = new DesignView(this);
        listen = new ListenView(this);
        measure = new MeasureView(this);
        compare = new CompareView(this);
        tools = new ToolsView(this, measure::file);
        budget = new BudgetPanel(this);
        javafx.scene.control.SplitPane designWithBudget = new javafx.scene.control.SplitPane(design.root(), budget.root());
        designWithBudget.setOrientation(javafx.geometry.Orientation.VERTICAL);
        designWithBudget.setDividerPositions(0.8);
        bench = new BenchView(this);
        tabs.getTabs().setAll(List.of(tab("Design", designWithBudget), tab("Listen", listen.root()),
                tab("Measure", measure.root()), tab("Compare", compare.root()), tab("Tools", tools.root()),
                tab("Bench", bench.root())));
        tabs.setTabClosingPolicy(TabPane.TabClosingPolicy.UNAVAILABLE);
        tabs.getStyleClass().add("views");

        Label brand = new Label("Roseate");
        brand.getStyleClass().add("brand");
        Label tagline = new Label("design, hear and measure noise-shaping filters");
        tagline.getStyleClass().add("tagline");
        HBox header = new HBox(12, brand, tagline);
        header.setAlignment(Pos.BASELINE_LEFT);
        header.getStyleClass().add("header");

        statusText.getStyleClass().add("status-text");
        statusText.setMaxWidth(Double.MAX_VALUE);
        HBox.setHgrow(statusText, Priority.ALWAYS);
        Region pad = new Region();
        HBox status = new HBox(10, statusText, pad, tasks.node());
        status.setAlignment(Pos.CENTER_LEFT);
        status.getStyleClass().add("status-bar");
        status.setPadding(new Insets(4, 10, 4, 10));

        ChartExport chartExport = new ChartExport(this);
        menus = new MenuBarBuilder(this, RecentFiles.forUser(), chartExport);
        root.setTop(new javafx.scene.layout.VBox(menus.build(), header));
        root.setCenter(tabs);
        root.setBottom(status);
        root.getStyleClass().add("roseate");

        Scene scene = new Scene(root, WIDTH, HEIGHT);
        var css = MainWindow.class.getResource("roseate.css");
        if (css != null) {
            scene.getStylesheets().add(css.toExternalForm());
        }
        var toolsCss = MainWindow.class.getResource("roseate-tools.css");
        if (toolsCss != null) {
            scene.getStylesheets().add(toolsCss.toExternalForm());
        }
        installShortcuts(scene);
        menus.installAccelerators(scene);
        chartExport.install(scene);
        s.setScene(scene);
        s.setMinWidth(900);
        s.setMinHeight(600);
        titleChanged("untitled", false);
        s.setOnCloseRequest(e -> {
            if (!close()) {
                e.consume();
            }
        });
        design.openInitial(workingDir);
        s.show();
        return scene;
    }

    /**
     * A tab whose content joins the scene when the tab is first selected: the views are all built
     * at start (their state and listeners exist from the first moment), but CSS and layout of the
     * hidden ones would otherwise be part of the first frame, about half of the time to the first
     * curve on these machines (issue 17, target 6).
     */
    private static Tab tab(String name, javafx.scene.Node content) {
        Tab t = new Tab(name);
        t.setClosable(false);
        if (t.isSelected()) {
            t.setContent(content);
        }
        t.selectedProperty().addListener((o, was, is) -> {
            if (is && t.getContent() == null) {
                t.setContent(content);
            }
        });
        return t;
    }

    private void installShortcuts(Scene scene) {
        for (int i = 0; i < tabs.getTabs().size() && i < 9; i++) {
            int index = i;
            scene.getAccelerators().put(new KeyCodeCombination(KeyCode.getKeyCode(String.valueOf(i + 1)),
                    KeyCombination.SHORTCUT_DOWN), () -> tabs.getSelectionModel().select(index));
        }
        scene.getAccelerators().put(new KeyCodeCombination(KeyCode.O, KeyCombination.SHORTCUT_DOWN), () -> {
            tabs.getSelectionModel().select(0);
            design.open();
        });
        scene.getAccelerators().put(new KeyCodeCombination(KeyCode.S, KeyCombination.SHORTCUT_DOWN), design::save);
        scene.getAccelerators().put(new KeyCodeCombination(KeyCode.S, KeyCombination.SHORTCUT_DOWN,
                KeyCombination.SHIFT_DOWN), design::saveAs);
        KeyCombination undo = new KeyCodeCombination(KeyCode.Z, KeyCombination.SHORTCUT_DOWN);
        KeyCombination redo = new KeyCodeCombination(KeyCode.Z, KeyCombination.SHORTCUT_DOWN, KeyCombination.SHIFT_DOWN);
        KeyCombination redoY = new KeyCodeCombination(KeyCode.Y, KeyCombination.SHORTCUT_DOWN);
        // A filter, so the editor's own undo (which knows nothing of value steps) never sees the keys.
        scene.addEventFilter(KeyEvent.KEY_PRESSED, e -> {
            if (tabs.getSelectionModel().getSelectedIndex() == 0) {
                if (redo.match(e) || redoY.match(e)) {
                    design.redo();
                    e.consume();
                } else if (undo.match(e)) {
                    design.undo();
                    e.consume();
                }
            } else if (tabs.getSelectionModel().getSelectedIndex() == 1 && e.getCode() == KeyCode.SPACE
                    && !(e.getTarget() instanceof javafx.scene.control.TextInputControl)) {
                listen.togglePlay();
                e.consume();
            }
        });
    }

    /** The close request: unsaved-changes question, then audio and threads stop. False to stay open. */
    boolean close() {
        if (!design.confirmDiscard()) {
            return false;
        }
        listen.stop();
        measure.stop();
        bench.stop();
        design.shutdown();
        tools.shutdown();
        budget.shutdown();
        tasks.shutdown();
        return true;
    }

    // ---- shared state ----

    Prompts prompts() {
        return prompts;
    }

    Stage stage() {
        return stage;
    }

    Path workingDir() {
        return workingDir;
    }

    AnalysisSettings settings() {
        return settings.get();
    }

    ReadOnlyObjectProperty<AnalysisSettings> settingsProperty() {
        return settings;
    }

    void setSettings(AnalysisSettings s) {
        s.table(); // throws IllegalArgumentException for a range that holds no band
        settings.set(s);
    }

    /** The newest design that reads without error (null before the first). */
    ReadOnlyObjectProperty<CircuitModel> modelProperty() {
        return model;
    }

    CircuitModel model() {
        return model.get();
    }

    void designChanged(CircuitModel m) {
        model.set(m);
    }

    TaskRunner tasks() {
        return tasks;
    }

    void showStatus(String text) {
        statusText.setText(text);
    }

    Label statusLabel() {
        return statusText;
    }

    void titleChanged(String name, boolean dirty) {
        if (stage != null) {
            stage.setTitle((dirty ? "● " : "") + name + " — Roseate");
        }
    }

    /** Shows the safety caution once per session; true when playback may start. */
    boolean cautionAccepted() {
        if (!cautionAccepted) {
            cautionAccepted = prompts.acceptCaution(stage, ListenView.CAUTION);
        }
        return cautionAccepted;
    }

    TabPane tabs() {
        return tabs;
    }

    DesignView design() {
        return design;
    }

    ListenView listen() {
        return listen;
    }

    MeasureView measure() {
        return measure;
    }

    CompareView compare() {
        return compare;
    }

    ToolsView tools() {
        return tools;
    }

    BudgetPanel budget() {
        return budget;
    }

    MenuBarBuilder menus() {
        return menus;
    }

    BenchView bench() {
        return bench;
    }
}

package org.roseate.app;

import java.nio.file.Path;
import java.util.function.Supplier;
import javafx.scene.Node;
import javafx.scene.control.Label;
import javafx.scene.control.Tab;
import javafx.scene.control.TabPane;

/**
 * The design tools in one tab of the window, each a thin face of the core the CLI calls: Fit
 * ({@code fit --from}), Tolerance ({@code tolerance}), Parts ({@code parts}), Poles and zeros
 * ({@code analyze}'s roots), Diagnose ({@code diagnose}) and the ABX test ({@code listen-test}).
 * Long jobs run in each view's own task slot, so starting one never cancels another view's.
 */
final class ToolsView {
    private final TabPane tabs = new TabPane();
    private final FitView fit;
    private final ToleranceView tolerance;
    private final PartsView parts;
    private final PolesView poles;
    private final DiagnoseView diagnose;
    private final AbxView abx;

    /**
     * @param measuredFile the Measure view's current file, for Diagnose (null when none)
     */
    ToolsView(MainWindow window, Supplier<Path> measuredFile) {
        fit = new FitView(window);
        tolerance = new ToleranceView(window);
        parts = new PartsView(window);
        poles = new PolesView(window);
        diagnose = new DiagnoseView(window, measuredFile);
        abx = new AbxView(window, AbxView::soundCard);
        tabs.getTabs().setAll(tab("Fit", fit.root()), tab("Tolerance", tolerance.root()), tab("Parts", parts.root()),
                tab("Poles and zeros", poles.root()), tab("Diagnose", diagnose.root()), tab("ABX test", abx.root()));
        tabs.setTabClosingPolicy(TabPane.TabClosingPolicy.UNAVAILABLE);
        tabs.getStyleClass().add("tool-tabs");
    }

    private static Tab tab(String name, Node content) {
        Tab t = new Tab(name, content);
        t.setClosable(false);
        return t;
    }

    static Label title(String s) {
        Label l = new Label(s);
        l.getStyleClass().add("section-title");
        return l;
    }

    Node root() {
        return tabs;
    }

    TabPane tabs() {
        return tabs;
    }

    /** Selects the tool with this tab name. */
    void select(String name) {
        tabs.getTabs().stream().filter(t -> t.getText().equals(name)).findFirst()
                .ifPresent(t -> tabs.getSelectionModel().select(t));
    }

    FitView fit() {
        return fit;
    }

    ToleranceView tolerance() {
        return tolerance;
    }

    PartsView parts() {
        return parts;
    }

    PolesView poles() {
        return poles;
    }

    DiagnoseView diagnose() {
        return diagnose;
    }

    AbxView abx() {
        return abx;
    }

    void shutdown() {
        fit.slot().cancel();
        tolerance.slot().cancel();
        diagnose.slot().cancel();
        abx.shutdown();
    }
}

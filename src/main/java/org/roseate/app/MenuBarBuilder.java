package org.roseate.app;

import java.nio.file.Path;
import java.util.Optional;
import javafx.scene.Node;
import javafx.scene.Scene;
import javafx.scene.chart.XYChart;
import javafx.scene.control.Menu;
import javafx.scene.control.MenuBar;
import javafx.scene.control.MenuItem;
import javafx.scene.control.SeparatorMenuItem;
import javafx.scene.control.TextArea;
import javafx.scene.input.KeyCode;
import javafx.scene.input.KeyCodeCombination;
import javafx.scene.input.KeyCombination;
import javafx.scene.layout.BorderPane;
import javafx.stage.Stage;

/**
 * The window's menu bar: File (open, recent files, save, save as, export chart, quit), View (the
 * views and the tools) and Help (keyboard shortcuts, the safety note, what each reading means).
 * Opening and saving go through the Design view; every file opened or saved goes to the
 * {@link RecentFiles} list.
 */
final class MenuBarBuilder {
    private final MainWindow window;
    private final RecentFiles recent;
    private final ChartExport export;
    private final Menu recentMenu = new Menu("Open recent");
    private final MenuBar bar = new MenuBar();

    MenuBarBuilder(MainWindow window, RecentFiles recent, ChartExport export) {
        this.window = window;
        this.recent = recent;
        this.export = export;
    }

    MenuBar build() {
        MenuItem open = item("Open…", this::open, new KeyCodeCombination(KeyCode.O, KeyCombination.SHORTCUT_DOWN));
        MenuItem save = item("Save", this::save, new KeyCodeCombination(KeyCode.S, KeyCombination.SHORTCUT_DOWN));
        MenuItem saveAs = item("Save as…", this::saveAs, new KeyCodeCombination(KeyCode.S, KeyCombination.SHORTCUT_DOWN,
                KeyCombination.SHIFT_DOWN));
        MenuItem exportChart = item("Export chart…", this::exportChart, new KeyCodeCombination(KeyCode.E,
                KeyCombination.SHORTCUT_DOWN));
        MenuItem quit = item("Quit", this::quit, new KeyCodeCombination(KeyCode.Q, KeyCombination.SHORTCUT_DOWN));
        refreshRecent();
        Menu file = new Menu("File", null, open, recentMenu, new SeparatorMenuItem(), save, saveAs,
                new SeparatorMenuItem(), exportChart, new SeparatorMenuItem(), quit);
        Menu view = new Menu("View");
        String[] names = {"Design", "Listen", "Measure", "Compare", "Tools", "Bench"};
        for (int i = 0; i < names.length; i++) {
            int index = i;
            view.getItems().add(item(names[i], () -> window.tabs().getSelectionModel().select(index),
                    new KeyCodeCombination(KeyCode.getKeyCode(String.valueOf(i + 1)), KeyCombination.SHORTCUT_DOWN)));
        }
        view.getItems().add(new SeparatorMenuItem());
        for (String tool : new String[] {"Fit", "Tolerance", "Parts", "Poles and zeros", "Diagnose", "ABX test"}) {
            view.getItems().add(item("Tools: " + tool, () -> {
                window.tabs().getSelectionModel().select(4);
                window.tools().select(tool);
            }, null));
        }
        Menu help = new Menu("Help", null,
                item("Keyboard shortcuts", () -> show("Keyboard shortcuts", HelpText.SHORTCUTS), new KeyCodeCombination(KeyCode.F1)),
                item("Safety: loud noise, tweeters and hearing", () -> show("Safety", HelpText.SAFETY), null),
                item("What each reading means", () -> show("What each reading means", HelpText.READINGS), null));
        bar.getMenus().setAll(file, view, help);
        bar.getStyleClass().add("roseate-menu-bar");
        return bar;
    }

    /** Puts the menu's shortcuts on the scene too (over the window's own, so both run the same action). */
    void installAccelerators(Scene scene) {
        for (Menu m : bar.getMenus()) {
            for (MenuItem i : m.getItems()) {
                if (i.getAccelerator() != null && i.getOnAction() != null) {
                    MenuItem item = i;
                    scene.getAccelerators().put(i.getAccelerator(), () -> item.getOnAction().handle(null));
                }
            }
        }
    }

    private static MenuItem item(String text, Runnable action, KeyCombination accelerator) {
        MenuItem i = new MenuItem(text);
        i.setOnAction(e -> action.run());
        if (accelerator != null) {
            i.setAccelerator(accelerator);
        }
        return i;
    }

    private Optional<Path> currentFile() {
        return window.design().document().file();
    }

    /** Runs an open or save and puts the resulting file first in the recent list. */
    private void remembering(Runnable r) {
        Optional<Path> before = currentFile();
        r.run();
        Optional<Path> after = currentFile();
        if (after.isPresent() && (!after.equals(before) || !window.design().document().dirty())) {
            remember(after.get());
        }
    }

    void remember(Path p) {
        if (!recent.add(p)) {
            window.showStatus("Could not save the recent-files list in " + recent.store());
        }
        refreshRecent();
    }

    void open() {
        window.tabs().getSelectionModel().select(0);
        remembering(window.design()::open);
    }

    void save() {
        remembering(window.design()::save);
    }

    void saveAs() {
        remembering(window.design()::saveAs);
    }

    /** Opens a recent file, after the unsaved-changes question. */
    void openRecent(Path p) {
        if (!java.nio.file.Files.isRegularFile(p)) {
            window.prompts().error(window.stage(), p + ": no longer exists");
            return;
        }
        if (!window.design().confirmDiscard()) {
            return;
        }
        window.tabs().getSelectionModel().select(0);
        window.design().load(p);
        if (window.design().document().file().filter(p::equals).isPresent()) {
            remember(p);
        }
    }

    private void refreshRecent() {
        recentMenu.getItems().clear();
        for (Path p : recent.list()) {
            MenuItem i = new MenuItem(p.getFileName() + "  —  " + p);
            i.setMnemonicParsing(false);
            i.setOnAction(e -> openRecent(p));
            recentMenu.getItems().add(i);
        }
        if (recent.list().isEmpty()) {
            MenuItem none = new MenuItem("(none yet)");
            none.setDisable(true);
            recentMenu.getItems().add(none);
        } else {
            recentMenu.getItems().addAll(new SeparatorMenuItem(), item("Clear the list", () -> {
                recent.clear();
                refreshRecent();
            }, null));
        }
    }

    void exportChart() {
        Node view = window.tabs().getSelectionModel().getSelectedItem() == null ? null
                : window.tabs().getSelectionModel().getSelectedItem().getContent();
        Optional<XYChart<?, ?>> c = export.current(view);
        if (c.isEmpty()) {
            window.showStatus("This view has no chart to export.");
            return;
        }
        export.ask(c.get(), "svg");
    }

    private void quit() {
        if (window.close()) {
            window.stage().close();
        }
    }

    /** Shows a help text in its own small window (not modal, so it can stay open beside the work). */
    void show(String title, String text) {
        TextArea area = new TextArea(text);
        area.setEditable(false);
        area.setWrapText(true);
        area.getStyleClass().add("help-text");
        Stage s = new Stage();
        s.initOwner(window.stage());
        s.setTitle(title + " — Roseate");
        Scene scene = new Scene(new BorderPane(area), 640, 420);
        scene.getStylesheets().addAll(window.stage().getScene().getStylesheets());
        s.setScene(scene);
        s.show();
    }

    ChartExport chartExport() {
        return export;
    }

    RecentFiles recent() {
        return recent;
    }

    Menu recentMenu() {
        return recentMenu;
    }

    MenuBar bar() {
        return bar;
    }
}

package org.roseate.app;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Optional;
import javafx.event.EventTarget;
import javafx.scene.Node;
import javafx.scene.Scene;
import javafx.scene.chart.XYChart;
import javafx.scene.control.ContextMenu;
import javafx.scene.control.MenuItem;
import javafx.scene.input.ContextMenuEvent;
import javafx.scene.input.MouseEvent;

/**
 * Export of any chart in the window to PNG (a snapshot, {@link PngSnapshot}) or SVG (drawn from the
 * chart's data, {@link ChartSvg}): a context menu on every chart (right click), and File ▸ Export
 * chart for the chart last pointed at (or the first chart of the view shown). Works for charts
 * added later too, since it listens on the scene. An existing file is replaced only after the user
 * agrees ({@link SafeWrite}).
 */
final class ChartExport {
    private final MainWindow window;
    private XYChart<?, ?> lastPointed;

    ChartExport(MainWindow window) {
        this.window = window;
    }

    /** Listens on the scene for context-menu requests and pointer moves over charts. */
    void install(Scene scene) {
        scene.addEventFilter(MouseEvent.MOUSE_MOVED, e -> {
            XYChart<?, ?> c = chartOf(e.getTarget());
            if (c != null) {
                lastPointed = c;
            }
        });
        scene.addEventFilter(ContextMenuEvent.CONTEXT_MENU_REQUESTED, e -> {
            XYChart<?, ?> c = chartOf(e.getTarget());
            if (c == null) {
                return;
            }
            lastPointed = c;
            MenuItem png = new MenuItem("Export chart as PNG…");
            png.setOnAction(a -> ask(c, "png"));
            MenuItem svg = new MenuItem("Export chart as SVG…");
            svg.setOnAction(a -> ask(c, "svg"));
            new ContextMenu(png, svg).show(c, e.getScreenX(), e.getScreenY());
            e.consume();
        });
    }

    /** The chart a node belongs to, or null. */
    static XYChart<?, ?> chartOf(EventTarget t) {
        Node n = t instanceof Node node ? node : null;
        while (n != null) {
            if (n instanceof XYChart<?, ?> c) {
                return c;
            }
            n = n.getParent();
        }
        return null;
    }

    /** The chart File ▸ Export chart means: the one last pointed at if it is showing, else the view's first. */
    Optional<XYChart<?, ?>> current(Node view) {
        if (lastPointed != null && lastPointed.getScene() != null && lastPointed.isVisible()
                && isInside(lastPointed, view)) {
            return Optional.of(lastPointed);
        }
        return view == null ? Optional.empty() : view.lookupAll(".chart").stream()
                .filter(n -> n instanceof XYChart<?, ?> && n.isVisible()).<XYChart<?, ?>>map(n -> (XYChart<?, ?>) n).findFirst();
    }

    private static boolean isInside(Node n, Node parent) {
        for (Node p = n; p != null; p = p.getParent()) {
            if (p == parent) {
                return true;
            }
        }
        return false;
    }

    /** Asks for a file (PNG or SVG by its extension, {@code preferred} first) and writes the chart. */
    void ask(XYChart<?, ?> chart, String preferred) {
        String base = chart.getTitle() == null || chart.getTitle().isBlank() ? "chart"
                : chart.getTitle().replaceAll("[^A-Za-z0-9]+", "-").replaceAll("(^-|-$)", "").toLowerCase(Locale.ROOT);
        Optional<Path> target = window.prompts().saveFile(window.stage(), "Export the chart", base + "." + preferred,
                preferred.equals("svg") ? "SVG drawing (*.svg)" : "PNG picture (*.png)", "*." + preferred);
        target.ifPresent(p -> export(chart, p));
    }

    /** Writes {@code chart} to {@code file}, PNG or SVG by the file's extension; false when refused or failed. */
    boolean export(XYChart<?, ?> chart, Path file) {
        String name = file.getFileName().toString().toLowerCase(Locale.ROOT);
        if (name.endsWith(".svg")) {
            return SafeWrite.writeString(window, file, ChartSvg.of(chart));
        }
        if (!name.endsWith(".png")) {
            window.prompts().error(window.stage(), file + ": expected a .png or .svg file name");
            return false;
        }
        if (!SafeWrite.mayWrite(window, file)) {
            return false;
        }
        try {
            PngSnapshot.write(chart, file);
        } catch (IOException e) {
            window.prompts().error(window.stage(), file + ": cannot write (" + e.getMessage() + ")");
            return false;
        }
        window.showStatus("Wrote " + file);
        return true;
    }
}

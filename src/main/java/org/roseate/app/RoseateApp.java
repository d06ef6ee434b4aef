package org.roseate.app;

import javafx.application.Application;
import javafx.geometry.Insets;
import javafx.scene.Scene;
import javafx.scene.control.Label;
import javafx.scene.layout.VBox;
import javafx.stage.Stage;

/**
 * The desktop window. For now it shows the product's purpose and points to the command line;
 * the design, listen, measure and compare views arrive with the desktop issue.
 */
public final class RoseateApp extends Application {

    /** Starts JavaFX and opens the window; returns when the window closes. */
    public static void launchWindow(String[] args) {
        if (System.getenv("DISPLAY") == null && System.getenv("WAYLAND_DISPLAY") == null
                && !"Monocle".equals(System.getProperty("glass.platform"))) {
            System.err.println("roseate: no display for the window; run a subcommand instead, e.g. "
                    + "'java -jar roseate.jar analyze presets/bench-pink.json' (see --help)");
            System.exit(3);
        }
        Application.launch(RoseateApp.class, args);
    }

    @Override
    public void start(Stage stage) {
        Label title = new Label("Roseate");
        title.setStyle("-fx-font-size: 22px; -fx-font-weight: bold;");
        Label body = new Label("Design, hear and measure pink-noise filters.\n"
                + "The window's views are being built; every function is available now from the command line:\n"
                + "  java -jar roseate.jar --help");
        VBox box = new VBox(12, title, body);
        box.setPadding(new Insets(24));
        stage.setTitle("Roseate");
        stage.setScene(new Scene(box, 720, 420));
        stage.show();
    }
}

package org.roseate.app;

import java.nio.file.Path;
import javafx.application.Application;
import javafx.stage.Stage;

/**
 * The desktop window's JavaFX application: design, listen, measure and compare views over the same
 * core the command line uses. Opens on {@code presets/bench-pink.json} when the working directory
 * has it, else on an embedded copy of that design.
 */
public final class RoseateApp extends Application {
    private MainWindow window;

    /** Starts JavaFX and opens the window; returns when the window closes. */
    public static void launchWindow(String[] args) {
        if (System.getenv("DISPLAY") == null && System.getenv("WAYLAND_DISPLAY") == null
                && !"Monocle".equals(System.getProperty("glass.platform"))) {
            System.err.println("roseate: no display for the window; run a subcommand instead, e.g. "
                    + "'java -jar roseate.jar analyze presets/bench-pink.json' (see --help)");
            System.exit(org.roseate.cli.RoseateCommand.EXIT_NO_DISPLAY);
        }
        Application.launch(RoseateApp.class, args);
    }

    @Override
    public void start(Stage stage) {
        window = new MainWindow(new FxPrompts(), Path.of("").toAbsolutePath());
        window.show(stage);
    }
}

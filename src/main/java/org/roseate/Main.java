package org.roseate;

import org.roseate.cli.RoseateCommand;

/**
 * Entry point of {@code roseate.jar}: with no arguments it opens the desktop window, with a
 * subcommand it runs headless and exits with the command's status (0 ok, 2 bad input, 3 device
 * trouble); without a display the window exits with 4 ({@code RoseateCommand.EXIT_NO_DISPLAY}).
 */
public final class Main {
    private Main() {
    }

    public static void main(String[] args) {
        if (args.length == 0) {
            org.roseate.app.RoseateApp.launchWindow(args);
            return;
        }
        System.exit(RoseateCommand.run(args));
    }
}

package org.roseate.app;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.roseate.io.AtomicOutput;

/**
 * Writes a file the user chose from the window: an existing file is replaced only after the user
 * says so ({@link Prompts#confirmReplace}), and the write is atomic (the old content stays whole
 * until the new is complete). Failures are shown, never thrown.
 */
final class SafeWrite {
    private SafeWrite() {
    }

    /** True when {@code target} may be written: it does not exist, or the user agreed to replace it. */
    static boolean mayWrite(MainWindow window, Path target) {
        if (Files.exists(target) && !window.prompts().confirmReplace(window.stage(), target)) {
            window.showStatus("Not written: " + target + " already exists and was kept.");
            return false;
        }
        return true;
    }

    /** Writes text; false (with a message) when refused or failed. */
    static boolean writeString(MainWindow window, Path target, String text) {
        if (!mayWrite(window, target)) {
            return false;
        }
        try {
            AtomicOutput.writeString(target, text, true);
        } catch (IOException e) {
            window.prompts().error(window.stage(), target + ": cannot write (" + e.getMessage() + ")");
            return false;
        }
        window.showStatus("Wrote " + target);
        return true;
    }
}

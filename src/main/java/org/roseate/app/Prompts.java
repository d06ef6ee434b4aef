package org.roseate.app;

import java.nio.file.Path;
import java.util.Optional;
import javafx.stage.Window;

/**
 * The questions the window asks its user: file choosers and confirmations. The window gets the
 * JavaFX dialogs ({@link FxPrompts}); tests give scripted answers, so no modal dialog blocks them.
 */
interface Prompts {
    /** What to do with unsaved changes. */
    enum Unsaved { SAVE, DISCARD, CANCEL }

    /**
     * @param extensions patterns such as "*.json"
     */
    Optional<Path> openFile(Window owner, String title, String description, String... extensions);

    Optional<Path> saveFile(Window owner, String title, String initialName, String description, String... extensions);

    Unsaved unsavedChanges(Window owner, String documentName);

    /** True to take the autosaved text back. */
    boolean restoreAutosave(Window owner, Path design, Path autosave);

    /** Shows the safety caution before the first playback; true to go on. */
    boolean acceptCaution(Window owner, String caution);

    void error(Window owner, String message);

    /**
     * Asks before an existing file is replaced; true to replace it. By default the answer is no, so a
     * file is never replaced without a question.
     */
    default boolean confirmReplace(Window owner, Path file) {
        return false;
    }
}

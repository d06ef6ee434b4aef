package org.roseate.app;

import java.nio.file.Path;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Deque;
import java.util.List;
import java.util.Optional;
import javafx.stage.Window;

/** {@link Prompts} with answers set by the test, so no modal dialog ever blocks it. */
final class ScriptedPrompts implements Prompts {
    final Deque<Path> files = new ArrayDeque<>();
    Unsaved unsaved = Unsaved.CANCEL;
    boolean restore = true;
    boolean caution;
    int cautionAsked;
    int restoreAsked;
    final List<String> errors = new ArrayList<>();
    boolean replace;
    int replaceAsked;

    @Override
    public Optional<Path> openFile(Window owner, String title, String description, String... extensions) {
        return Optional.ofNullable(files.poll());
    }

    @Override
    public Optional<Path> saveFile(Window owner, String title, String initialName, String description, String... extensions) {
        return Optional.ofNullable(files.poll());
    }

    @Override
    public Unsaved unsavedChanges(Window owner, String documentName) {
        return unsaved;
    }

    @Override
    public boolean restoreAutosave(Window owner, Path design, Path autosave) {
        restoreAsked++;
        return restore;
    }

    @Override
    public boolean acceptCaution(Window owner, String text) {
        cautionAsked++;
        return caution;
    }

    @Override
    public void error(Window owner, String message) {
        errors.add(message);
    }

    @Override
    public boolean confirmReplace(Window owner, Path file) {
        replaceAsked++;
        return replace;
    }
}

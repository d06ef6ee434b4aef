package org.roseate.app;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.util.ArrayDeque;
import java.util.Deque;
import java.util.Optional;
import org.roseate.io.AtomicOutput;

/**
 * The design text being edited: its file, the text last saved, undo and redo over committed
 * edits, and the autosave file beside it. Plain Java, used on the FX thread only.
 *
 * <p>An edit is committed when typing pauses (the view's debounce) or when a value is stepped, so
 * one undo step takes back one pause's worth of typing. Saves are atomic ({@link AtomicOutput}:
 * temporary file in the same folder, then a rename). The autosave file is
 * {@code .NAME.roseate-autosave} beside the design; a save removes it.
 */
final class DesignDocument {
    /** Most undo steps kept. */
    static final int MAX_HISTORY = 500;
    static final String AUTOSAVE_SUFFIX = ".roseate-autosave";

    private final Deque<String> undo = new ArrayDeque<>();
    private final Deque<String> redo = new ArrayDeque<>();
    private String text;
    private String savedText;
    private Path file;

    DesignDocument(String text, Path file) {
        this.text = text;
        this.savedText = text;
        this.file = file;
    }

    String text() {
        return text;
    }

    Optional<Path> file() {
        return Optional.ofNullable(file);
    }

    /** The name used in messages: the file's name, or "editor" for text not yet saved. */
    String sourceName() {
        return file == null ? "editor" : file.getFileName().toString();
    }

    /** The text as last saved or opened. */
    String savedText() {
        return savedText;
    }

    boolean dirty() {
        return !text.equals(savedText);
    }

    /** Commits an edit; returns false when the text did not change. */
    boolean edit(String newText) {
        if (newText.equals(text)) {
            return false;
        }
        undo.push(text);
        while (undo.size() > MAX_HISTORY) {
            undo.removeLast();
        }
        redo.clear();
        text = newText;
        return true;
    }

    boolean canUndo() {
        return !undo.isEmpty();
    }

    boolean canRedo() {
        return !redo.isEmpty();
    }

    /** Goes back one committed edit; returns false when there is none. */
    boolean undo() {
        if (undo.isEmpty()) {
            return false;
        }
        redo.push(text);
        text = undo.pop();
        return true;
    }

    boolean redo() {
        if (redo.isEmpty()) {
            return false;
        }
        undo.push(text);
        text = redo.pop();
        return true;
    }

    /** Replaces everything with a freshly opened file's text; history is cleared. */
    void load(Path newFile, String newText) {
        file = newFile;
        text = newText;
        savedText = newText;
        undo.clear();
        redo.clear();
    }

    /** Writes the text atomically to {@code target} (replacing it), which becomes the file; removes the autosave. */
    void saveAs(Path target) throws IOException {
        String content = text;
        AtomicOutput.writeString(target, content, true);
        Path old = file;
        file = target;
        savedText = content;
        Files.deleteIfExists(autosaveOf(target));
        if (old != null && !old.equals(target)) {
            Files.deleteIfExists(autosaveOf(old));
        }
    }

    /** The autosave file beside {@code design}: {@code .NAME.roseate-autosave}. */
    static Path autosaveOf(Path design) {
        Path name = design.getFileName();
        return design.resolveSibling("." + name + AUTOSAVE_SUFFIX);
    }

    /** Writes the current text to the autosave file, atomically; false when there is no file or nothing unsaved. */
    boolean writeAutosave() throws IOException {
        if (file == null || !dirty()) {
            return false;
        }
        AtomicOutput.writeString(autosaveOf(file), text, true);
        return true;
    }

    /** Removes the autosave file, if any. */
    void discardAutosave() throws IOException {
        if (file != null) {
            Files.deleteIfExists(autosaveOf(file));
        }
    }

    /**
     * The autosaved text of {@code design} when the autosave file is newer than the design and
     * differs from it; empty otherwise.
     */
    static Optional<String> pendingAutosave(Path design) throws IOException {
        Path a = autosaveOf(design);
        if (!Files.isRegularFile(a)) {
            return Optional.empty();
        }
        FileTime at = Files.getLastModifiedTime(a);
        if (Files.exists(design) && at.compareTo(Files.getLastModifiedTime(design)) <= 0) {
            return Optional.empty();
        }
        String saved = new String(Files.readAllBytes(a), StandardCharsets.UTF_8);
        String current = Files.exists(design) ? Files.readString(design) : "";
        return saved.equals(current) ? Optional.empty() : Optional.of(saved);
    }
}

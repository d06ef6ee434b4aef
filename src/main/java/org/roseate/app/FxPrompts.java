package org.roseate.app;

import java.io.File;
import java.nio.file.Path;
import java.util.Optional;
import javafx.scene.control.Alert;
import javafx.scene.control.ButtonBar;
import javafx.scene.control.ButtonType;
import javafx.stage.FileChooser;
import javafx.stage.Window;

/** {@link Prompts} as JavaFX file choosers and alerts. */
final class FxPrompts implements Prompts {
    private File lastFolder;

    @Override
    public Optional<Path> openFile(Window owner, String title, String description, String... extensions) {
        FileChooser fc = chooser(title, description, extensions);
        File f = fc.showOpenDialog(owner);
        return remember(f);
    }

    @Override
    public Optional<Path> saveFile(Window owner, String title, String initialName, String description,
            String... extensions) {
        FileChooser fc = chooser(title, description, extensions);
        fc.setInitialFileName(initialName);
        return remember(fc.showSaveDialog(owner));
    }

    private FileChooser chooser(String title, String description, String... extensions) {
        FileChooser fc = new FileChooser();
        fc.setTitle(title);
        fc.getExtensionFilters().add(new FileChooser.ExtensionFilter(description, extensions));
        fc.getExtensionFilters().add(new FileChooser.ExtensionFilter("All files", "*"));
        if (lastFolder != null && lastFolder.isDirectory()) {
            fc.setInitialDirectory(lastFolder);
        }
        return fc;
    }

    private Optional<Path> remember(File f) {
        if (f == null) {
            return Optional.empty();
        }
        lastFolder = f.getParentFile();
        return Optional.of(f.toPath());
    }

    @Override
    public Unsaved unsavedChanges(Window owner, String documentName) {
        ButtonType save = new ButtonType("Save", ButtonBar.ButtonData.YES);
        ButtonType discard = new ButtonType("Discard changes", ButtonBar.ButtonData.NO);
        Alert a = new Alert(Alert.AlertType.CONFIRMATION, "", save, discard, ButtonType.CANCEL);
        a.initOwner(owner);
        a.setTitle("Unsaved changes");
        a.setHeaderText(documentName + " has changes that are not saved.");
        a.setContentText("Save them before going on?");
        ButtonType r = a.showAndWait().orElse(ButtonType.CANCEL);
        return r == save ? Unsaved.SAVE : r == discard ? Unsaved.DISCARD : Unsaved.CANCEL;
    }

    @Override
    public boolean restoreAutosave(Window owner, Path design, Path autosave) {
        ButtonType restore = new ButtonType("Restore", ButtonBar.ButtonData.YES);
        ButtonType discard = new ButtonType("Discard", ButtonBar.ButtonData.NO);
        Alert a = new Alert(Alert.AlertType.CONFIRMATION, "", restore, discard);
        a.initOwner(owner);
        a.setTitle("Autosaved changes");
        a.setHeaderText("Unsaved edits of " + design.getFileName() + " were kept from an earlier session.");
        a.setContentText("They are newer than the file. Restore them into the editor (the file is left as it is until you save)?");
        return a.showAndWait().orElse(discard) == restore;
    }

    @Override
    public boolean acceptCaution(Window owner, String caution) {
        ButtonType play = new ButtonType("I understand, play", ButtonBar.ButtonData.OK_DONE);
        Alert a = new Alert(Alert.AlertType.WARNING, caution, play, ButtonType.CANCEL);
        a.initOwner(owner);
        a.setTitle("Before playing noise");
        a.setHeaderText("Hearing and loudspeaker safety");
        return a.showAndWait().orElse(ButtonType.CANCEL) == play;
    }

    @Override
    public void error(Window owner, String message) {
        Alert a = new Alert(Alert.AlertType.ERROR, message, ButtonType.OK);
        a.initOwner(owner);
        a.setTitle("Roseate");
        a.setHeaderText(null);
        a.showAndWait();
    }

    @Override
    public boolean confirmReplace(Window owner, Path file) {
        ButtonType replace = new ButtonType("Replace", ButtonBar.ButtonData.YES);
        Alert a = new Alert(Alert.AlertType.CONFIRMATION, "", replace, ButtonType.CANCEL);
        a.initOwner(owner);
        a.setTitle("Replace the file?");
        a.setHeaderText(file.getFileName() + " already exists.");
        a.setContentText("Replace " + file + "? Its current content will be lost.");
        return a.showAndWait().orElse(ButtonType.CANCEL) == replace;
    }
}

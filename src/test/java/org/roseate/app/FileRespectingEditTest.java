package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import javafx.scene.Scene;
import javafx.scene.control.TableColumn;
import javafx.scene.input.KeyCode;
import javafx.stage.Stage;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.io.TempDir;
import org.testfx.api.FxRobot;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;
import org.testfx.util.WaitForAsyncUtils;

/**
 * Edits from the component table change only the characters of the value edited: the saved file is
 * compared byte for byte with the original in which exactly that value was replaced by hand. The
 * file is written the way a person might write it (its own indentation and key order, {@code 3e6}
 * spelled as such, the optional tolerance and open-loop gain left out), nothing like the program's
 * own output.
 */
@ExtendWith({HeadlessFx.class, ApplicationExtension.class})
class FileRespectingEditTest {
    /** A hand-written design: tabs, keys out of the usual order, no tolerance, gbwHz as 3e6. */
    static final String HAND_WRITTEN = "{\n"
            + "\t\"stages\" : [\n"
            + "\t\t{ \"opamp\": {\"gbwHz\":3e6},\n"
            + "\t\t  \"feedback\": \"R2(75k) || C1(3n3) || (R3(51k) + C2(39n)) || (R4(16k) + C3(15n)) || (R5(6k2) + C4(4n7))\",\n"
            + "\t\t  \"input\":\"R1(47k)\", \"kind\": \"inverting\" }\n"
            + "\t],\n"
            + "\t\"name\": \"hand-written pink\"\n"
            + "}\n";

    @TempDir
    Path dir;
    final ScriptedPrompts prompts = new ScriptedPrompts();
    MainWindow window;
    Scene scene;
    Path file;

    /** No autosave write may land in the temporary folder while JUnit removes it. */
    @AfterEach
    void stopAutosave() throws Exception {
        RoseateWindowTest.fxRun(() -> {
            window.design().flushIo();
            window.design().shutdown();
        });
    }

    @Start
    void start(Stage stage) throws Exception {
        file = dir.resolve("hand.json");
        Files.writeString(file, HAND_WRITTEN);
        window = new MainWindow(prompts, dir);
        scene = window.show(stage);
        window.design().load(file);
    }

    private DesignView design() {
        return window.design();
    }

    private void awaitDesignOk() throws Exception {
        RoseateWindowTest.await(() -> design().outcomeProperty().get() != null && design().outcomeProperty().get().ok()
                && design().outcomeProperty().get().text().equals(design().editor().getText()));
    }

    private byte[] saveAndRead() throws Exception {
        RoseateWindowTest.fxRun(() -> design().save());
        RoseateWindowTest.await(() -> !design().document().dirty());
        RoseateWindowTest.fxRun(() -> design().flushIo());
        return Files.readAllBytes(file);
    }

    private static byte[] bytes(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }

    @Test
    void steppingAValueChangesOnlyItsCharacters() throws Exception {
        awaitDesignOk();
        RoseateWindowTest.fxRun(() -> design().step("R1", true)); // IEC 60063 E24: 47 → 51
        RoseateWindowTest.await(() -> design().editor().getText().contains("R1(51k)"));
        awaitDesignOk();
        assertArrayEquals(bytes(HAND_WRITTEN.replace("R1(47k)", "R1(51k)")), saveAndRead());
    }

    @Test
    void typingIntoTheValueCellChangesOnlyItsCharacters() throws Exception {
        awaitDesignOk();
        int row = RoseateWindowTest.fx(() -> {
            for (int i = 0; i < design().table().getItems().size(); i++) {
                if (design().table().getItems().get(i).designator().equals("C2")) {
                    return i;
                }
            }
            return -1;
        });
        assertTrue(row >= 0);
        RoseateWindowTest.fxRun(() -> {
            @SuppressWarnings("unchecked")
            TableColumn<ComponentRow, ?> value = design().table().getColumns().get(1);
            design().table().requestFocus();
            design().table().getSelectionModel().select(row);
            design().table().edit(row, value);
        });
        WaitForAsyncUtils.waitForFxEvents();
        assertTrue(RoseateWindowTest.fx(() -> design().table().getEditingCell() != null), "the value cell is editable");
        FxRobot robot = new FxRobot();
        robot.write("36n");
        robot.press(KeyCode.ENTER).release(KeyCode.ENTER);
        RoseateWindowTest.await(() -> design().editor().getText().contains("C2(36n)"));
        awaitDesignOk();
        assertArrayEquals(bytes(HAND_WRITTEN.replace("C2(39n)", "C2(36n)")), saveAndRead());
    }

    @Test
    void aValueSetFromTheTableIsOneUndoStep() throws Exception {
        awaitDesignOk();
        String before = RoseateWindowTest.fx(() -> design().editor().getText());
        RoseateWindowTest.fxRun(() -> design().setValueText("R1", "4k7"));
        RoseateWindowTest.await(() -> design().editor().getText().contains("R1(4k7)"));
        RoseateWindowTest.fxRun(() -> design().undo());
        assertEquals(before, RoseateWindowTest.fx(() -> design().editor().getText()));
    }

    @Test
    void anAutosaveNeverBringsBackDiscardedEdits() throws Exception {
        awaitDesignOk();
        RoseateWindowTest.fxRun(() -> design().step("R5", true)); // E24: 6k2 → 6k8
        RoseateWindowTest.await(() -> design().editor().getText().contains("R5(6k8)"));
        RoseateWindowTest.fxRun(() -> design().autosaveNow());
        RoseateWindowTest.fxRun(() -> design().flushIo());
        Path autosave = DesignDocument.autosaveOf(file);
        assertTrue(Files.exists(autosave), "the edit was autosaved");
        prompts.unsaved = Prompts.Unsaved.DISCARD;
        assertTrue(RoseateWindowTest.fx(() -> design().confirmDiscard()));
        // the periodic autosave fires again after the discard
        RoseateWindowTest.fxRun(() -> design().autosaveNow());
        RoseateWindowTest.fxRun(() -> design().flushIo());
        assertFalse(Files.exists(autosave), "no autosave after a discard");
        assertArrayEquals(bytes(HAND_WRITTEN), Files.readAllBytes(file), "the file is untouched");
        RoseateWindowTest.fxRun(() -> design().load(file));
        awaitDesignOk();
        assertEquals(0, prompts.restoreAsked, "nothing is offered back");
        assertEquals(HAND_WRITTEN, RoseateWindowTest.fx(() -> design().editor().getText()));
    }

    @Test
    void undoingEveryEditRemovesTheAutosave() throws Exception {
        awaitDesignOk();
        RoseateWindowTest.fxRun(() -> design().step("R5", true));
        RoseateWindowTest.await(() -> design().editor().getText().contains("R5(6k8)"));
        RoseateWindowTest.fxRun(() -> design().autosaveNow());
        RoseateWindowTest.fxRun(() -> design().flushIo());
        Path autosave = DesignDocument.autosaveOf(file);
        assertTrue(Files.exists(autosave));
        RoseateWindowTest.fxRun(() -> design().undo());
        RoseateWindowTest.fxRun(() -> design().autosaveNow());
        RoseateWindowTest.fxRun(() -> design().flushIo());
        assertFalse(Files.exists(autosave), "the undone edit is not kept for a later offer");
    }

    @Test
    void theErrorPlaceIsMarkedWhileTyping() throws Exception {
        awaitDesignOk();
        RoseateWindowTest.fxRun(() -> design().editor().requestFocus());
        RoseateWindowTest.await(() -> design().editor().isFocused());
        String bad = HAND_WRITTEN.replace("R4(16k)", "R4(1kk6)");
        int caret = bad.indexOf("1kk6") + 4;
        RoseateWindowTest.fxRun(() -> {
            design().editor().setText(bad);
            design().editor().positionCaret(caret);
        });
        RoseateWindowTest.await(() -> design().errorSpanProperty().get() != null);
        WaitForAsyncUtils.waitForFxEvents();
        assertTrue(RoseateWindowTest.fx(() -> design().errorMarks().shapes()) > 0, "the place is marked");
        assertEquals(caret, RoseateWindowTest.fx(() -> design().editor().getCaretPosition()), "the caret stays where the user typed");
        assertEquals("", RoseateWindowTest.fx(() -> design().editor().getSelectedText()), "nothing is selected under the user");
        RoseateWindowTest.snapshot(scene, "design-error-typing");
    }
}

package org.roseate.app;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import javafx.stage.Stage;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;

/** Background work in one view never cancels another view's: each view has its own task slot. */
@ExtendWith({HeadlessFx.class, ApplicationExtension.class})
class ViewTasksTest {
    @TempDir
    Path dir;
    final ScriptedPrompts prompts = new ScriptedPrompts();
    MainWindow window;

    @Start
    void start(Stage stage) {
        window = new MainWindow(prompts, dir);
        window.show(stage);
    }

    @Test
    void startingWorkInCompareLeavesMeasureRunning() throws Exception {
        Path longFile = dir.resolve("long.wav");
        Path shortFile = dir.resolve("short.wav");
        RoseateWindowTest.writeNoise(longFile, NoiseChain.white(new ChainSettings(48000, 1, false, 5L, -20)), 48000, 1, 30);
        RoseateWindowTest.writeNoise(shortFile, NoiseChain.white(new ChainSettings(48000, 1, false, 6L, -20)), 48000, 1, 3);
        RoseateWindowTest.fxRun(() -> {
            window.tabs().getSelectionModel().select(2);
            window.measure().setFile(longFile);
            window.measure().start();
        });
        // Compare starts its own analysis while Measure's is still running
        assertTrue(RoseateWindowTest.fx(() -> window.measure().shown() == null || !window.measure().shown().complete()),
                "the measurement is still running when Compare starts");
        RoseateWindowTest.fxRun(() -> window.compare().addCapture(shortFile));
        RoseateWindowTest.await(() -> window.compare().entries().size() == 1);
        RoseateWindowTest.await(() -> window.measure().shown() != null && window.measure().shown().complete());
        String readout = RoseateWindowTest.fx(() -> window.measure().readout().getText());
        assertFalse(readout.contains("cancelled"), readout);
        assertEquals(30.0, RoseateWindowTest.fx(() -> window.measure().shown().secondsAnalysed()), 0.01, "the whole file was measured");
    }
}

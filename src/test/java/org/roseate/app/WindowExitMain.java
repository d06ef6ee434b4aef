package org.roseate.app;

import java.nio.file.Path;
import javafx.animation.KeyFrame;
import javafx.animation.Timeline;
import javafx.application.Platform;
import javafx.stage.Stage;
import javafx.stage.WindowEvent;
import javafx.util.Duration;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;

/**
 * A child process for {@link WindowExitTest}: opens the window (on Monocle when there is no
 * display), measures a WAV file long enough for JTransforms to use its thread pool, then asks the
 * window to close as the window manager does (a close request) and prints "closing" just before.
 * The process must then end by itself.
 */
public final class WindowExitMain {
    private WindowExitMain() {
    }

    public static void main(String[] args) throws Exception {
        Path dir = Path.of(args[0]);
        Path wav = dir.resolve("white.wav");
        RoseateWindowTest.writeNoise(wav, NoiseChain.white(new ChainSettings(48000, 1, false, 11L, -20)), 48000, 1, 4);
        HeadlessFx.activate();
        Platform.startup(() -> {
            Stage stage = new Stage();
            MainWindow window = new MainWindow(new ScriptedPrompts(), dir);
            window.show(stage);
            window.tabs().getSelectionModel().select(2);
            window.measure().setFile(wav);
            window.measure().start();
            Timeline poll = new Timeline();
            poll.getKeyFrames().add(new KeyFrame(Duration.millis(100), e -> {
                org.roseate.measure.MeasureResult o = window.measure().shown();
                if (o != null && o.complete()) {
                    poll.stop();
                    System.out.println("measured " + Thread.getAllStackTraces().keySet().stream()
                            .filter(t -> t.getName().startsWith("roseate-fft")).count() + " fft threads");
                    System.out.println("closing");
                    System.out.flush();
                    stage.fireEvent(new WindowEvent(stage, WindowEvent.WINDOW_CLOSE_REQUEST));
                }
            }));
            poll.setCycleCount(Timeline.INDEFINITE);
            poll.play();
        });
    }
}

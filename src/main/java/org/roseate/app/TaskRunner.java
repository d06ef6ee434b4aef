package org.roseate.app;

import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.Consumer;
import javafx.concurrent.Task;
import javafx.concurrent.Worker;
import javafx.geometry.Pos;
import javafx.scene.control.Button;
import javafx.scene.control.Label;
import javafx.scene.control.ProgressBar;
import javafx.scene.layout.HBox;

/**
 * Runs long work (file analysis) off the FX thread, one task at a time, and shows it in the status
 * bar: its title, a progress bar and a Cancel button. Results and failures come back on the FX
 * thread.
 */
final class TaskRunner {
    private final ExecutorService executor;
    private final ExecutorService devices;
    private final HBox node;
    private final Label title = new Label();
    private final ProgressBar bar = new ProgressBar(0);
    private final Button cancel = new Button("Cancel");
    private Task<?> current;

    TaskRunner() {
        AtomicInteger n = new AtomicInteger();
        executor = Executors.newFixedThreadPool(2, r -> {
            Thread t = new Thread(r, "roseate-work-" + n.incrementAndGet());
            t.setDaemon(true);
            return t;
        });
        devices = Executors.newSingleThreadExecutor(r -> {
            Thread t = new Thread(r, "roseate-devices");
            t.setDaemon(true);
            return t;
        });
        bar.setPrefWidth(180);
        cancel.getStyleClass().add("small");
        cancel.setOnAction(e -> cancelCurrent());
        node = new HBox(8, title, bar, cancel);
        node.setAlignment(Pos.CENTER_RIGHT);
        node.setVisible(false);
        node.setManaged(false);
    }

    HBox node() {
        return node;
    }

    ExecutorService executor() {
        return executor;
    }

    /** For opening and listing sound devices, which can block for a while; never holds up file work. */
    ExecutorService devices() {
        return devices;
    }

    boolean busy() {
        return current != null && !current.isDone();
    }

    void cancelCurrent() {
        if (current != null) {
            current.cancel(true);
        }
    }

    /**
     * Starts {@code task}, cancelling one still running; {@code onDone} gets the value, {@code onFailed}
     * the one-line message (or "cancelled").
     */
    <T> void run(String what, Task<T> task, Consumer<T> onDone, Consumer<String> onFailed) {
        cancelCurrent();
        current = task;
        title.setText(what);
        bar.progressProperty().bind(task.progressProperty());
        node.setVisible(true);
        node.setManaged(true);
        task.stateProperty().addListener((obs, old, state) -> {
            if (state == Worker.State.SUCCEEDED || state == Worker.State.FAILED || state == Worker.State.CANCELLED) {
                if (current == task) {
                    bar.progressProperty().unbind();
                    node.setVisible(false);
                    node.setManaged(false);
                }
                if (state == Worker.State.SUCCEEDED) {
                    onDone.accept(task.getValue());
                } else if (state == Worker.State.CANCELLED) {
                    onFailed.accept(what + ": cancelled");
                } else {
                    Throwable ex = task.getException();
                    onFailed.accept(ex == null ? what + " failed" : String.valueOf(ex.getMessage()));
                }
            }
        });
        executor.submit(task);
    }

    void shutdown() {
        cancelCurrent();
        executor.shutdownNow();
        devices.shutdownNow();
    }
}

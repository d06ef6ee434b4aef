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
 * Runs long work (file analysis) off the FX thread and shows it in the status bar: its title, a
 * progress bar and a Cancel button. Each view has its own {@link Slot}: a new task in a slot
 * cancels only that slot's previous task, never another view's. Results and failures come back on
 * the FX thread. Every thread here is a daemon, so none keeps the process alive after the window
 * closes.
 */
final class TaskRunner {
    private final ExecutorService executor;
    private final ExecutorService devices;
    private final HBox node;
    private final Label title = new Label();
    private final ProgressBar bar = new ProgressBar(0);
    private final Button cancel = new Button("Cancel");
    /** The task the status bar shows (the one started last that is still running). */
    private Task<?> shown;

    /** One view's place for background work: at most one task at a time. */
    final class Slot {
        private final String name;
        private Task<?> current;

        private Slot(String name) {
            this.name = name;
        }

        String name() {
            return name;
        }

        boolean busy() {
            return current != null && !current.isDone();
        }

        /** Cancels this slot's task, if one is running; other slots are left alone. */
        void cancel() {
            if (current != null) {
                current.cancel(true);
            }
        }

        /**
         * Starts {@code task}, cancelling this slot's task still running; {@code onDone} gets the value,
         * {@code onFailed} the one-line message (or "WHAT: cancelled").
         */
        <T> void run(String what, Task<T> task, Consumer<T> onDone, Consumer<String> onFailed) {
            cancel();
            current = task;
            show(what, task);
            task.stateProperty().addListener((obs, old, state) -> {
                if (state == Worker.State.SUCCEEDED || state == Worker.State.FAILED || state == Worker.State.CANCELLED) {
                    if (shown == task) {
                        hide();
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
    }

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
        cancel.setOnAction(e -> {
            if (shown != null) {
                shown.cancel(true);
            }
        });
        node = new HBox(8, title, bar, cancel);
        node.setAlignment(Pos.CENTER_RIGHT);
        node.setVisible(false);
        node.setManaged(false);
    }

    /** A new slot for one view. */
    Slot slot(String name) {
        return new Slot(name);
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

    private void show(String what, Task<?> task) {
        shown = task;
        title.setText(what);
        bar.progressProperty().unbind();
        bar.progressProperty().bind(task.progressProperty());
        node.setVisible(true);
        node.setManaged(true);
    }

    private void hide() {
        shown = null;
        bar.progressProperty().unbind();
        node.setVisible(false);
        node.setManaged(false);
    }

    void shutdown() {
        if (shown != null) {
            shown.cancel(true);
        }
        executor.shutdownNow();
        devices.shutdownNow();
    }
}

package org.roseate.app;

import java.util.concurrent.CancellationException;
import java.util.function.DoubleConsumer;
import javafx.concurrent.Task;

/**
 * A background task for a core job that reports progress through a {@link DoubleConsumer} (fit,
 * tolerance). The consumer it hands the job updates the task's progress and, once the task is
 * cancelled, throws {@link CancellationException} in whichever worker thread reports next: the core
 * jobs report from their own workers every few thousand evaluations, so a cancel stops their
 * threads within a fraction of a second instead of letting them run to the end unseen.
 */
abstract class ToolTask<T> extends Task<T> {
    /** Progress 0 … 1 into the task; throws once the task is cancelled. */
    protected final DoubleConsumer progress() {
        return fraction -> {
            if (isCancelled()) {
                throw new CancellationException("cancelled");
            }
            updateProgress(Math.max(0, Math.min(1, fraction)), 1);
        };
    }
}

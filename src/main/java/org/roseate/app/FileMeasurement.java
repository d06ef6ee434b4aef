package org.roseate.app;

import java.nio.file.Path;
import java.util.concurrent.CancellationException;
import java.util.function.BooleanSupplier;
import java.util.function.Consumer;
import java.util.function.DoubleConsumer;
import org.roseate.measure.FileMeasure;
import org.roseate.measure.MeasureResult;

/** The window's file measurement: the core's {@link FileMeasure}, with the view's setup. */
final class FileMeasurement {
    private FileMeasurement() {
    }

    /**
     * @param progress  receives the fraction read, 0 … 1
     * @param cancelled polled between blocks; when true the measurement stops with {@link CancellationException}
     * @param partial   receives intermediate results (from this thread)
     * @throws org.roseate.measure.MeasureException the core's one-line message naming the file
     */
    static MeasureResult run(Path file, MeasureSetup setup, DoubleConsumer progress, BooleanSupplier cancelled,
            Consumer<MeasureResult> partial) {
        return FileMeasure.run(file, setup.request(), progress, cancelled, partial);
    }
}

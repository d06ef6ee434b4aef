package org.roseate.app;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.CancellationException;
import java.util.function.BooleanSupplier;
import java.util.function.Consumer;
import java.util.function.DoubleConsumer;
import org.roseate.io.WavFormat;
import org.roseate.io.WavReader;

/** Measures a WAV file in blocks, reporting progress and intermediate results, and honouring cancel. */
final class FileMeasurement {
    /** Frames per read. */
    static final int BLOCK_FRAMES = 8192;
    /** Least wall time between two intermediate results, ns (about display rate, no faster). */
    static final long PUBLISH_EVERY_NANOS = 50_000_000L;

    private FileMeasurement() {
    }

    /**
     * @param progress  receives the fraction read, 0 … 1
     * @param cancelled polled between blocks; when true the measurement stops with {@link CancellationException}
     * @param partial   receives intermediate outcomes (from this thread)
     * @throws IllegalArgumentException a one-line message naming the file for a capture that does not fit the setup
     */
    static MeasureOutcome run(Path file, MeasureSetup setup, DoubleConsumer progress, BooleanSupplier cancelled,
            Consumer<MeasureOutcome> partial) throws IOException {
        String name = file.getFileName().toString();
        try (WavReader reader = WavReader.open(file)) {
            WavFormat f = reader.format();
            MeasureAnalyzer a;
            try {
                a = new MeasureAnalyzer(setup, f.sampleRateHz(), f.channels());
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(name + ": " + e.getMessage(), e);
            }
            if (reader.frames() < a.segmentLength()) {
                throw new IllegalArgumentException(String.format(Locale.ROOT,
                        "%s: the capture is %.2f s, shorter than one analysis segment of %d frames (%.2f s) that the "
                                + "lowest band needs; record longer or raise the low end of the range",
                        name, reader.frames() / (double) f.sampleRateHz(), a.segmentLength(),
                        a.segmentLength() / (double) f.sampleRateHz()));
            }
            double[] buf = new double[BLOCK_FRAMES * f.channels()];
            long total = reader.frames();
            long done = 0;
            long lastAverages = 0;
            long lastPublish = 0;
            for (int got; (got = reader.readFrames(buf, BLOCK_FRAMES)) > 0; ) {
                if (cancelled.getAsBoolean()) {
                    throw new CancellationException(name + ": cancelled");
                }
                a.accept(buf, got);
                done += got;
                progress.accept(done / (double) total);
                long now = System.nanoTime();
                if (a.averages() != lastAverages && now - lastPublish > PUBLISH_EVERY_NANOS) {
                    lastAverages = a.averages();
                    lastPublish = now;
                    partial.accept(a.result(name, false));
                }
            }
            try {
                return a.result(name, true);
            } catch (IllegalArgumentException e) {
                throw new IllegalArgumentException(name + ": " + e.getMessage(), e);
            }
        }
    }
}

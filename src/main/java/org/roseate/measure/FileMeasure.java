package org.roseate.measure;

import java.io.IOException;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.concurrent.CancellationException;
import java.util.function.BooleanSupplier;
import java.util.function.Consumer;
import java.util.function.DoubleConsumer;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.io.WavFormatException;
import org.roseate.io.WavReader;

/**
 * Runs the pipeline over a WAV file in blocks, with progress, cancel and intermediate results: the one
 * way a file is measured, by the command line, the window and {@code compare}. The blocks are read
 * and decoded one or two ahead on a second thread ({@link ReadAhead}); the pipeline runs on the
 * caller's thread, on the same blocks in the same order.
 */
public final class FileMeasure {
    /** Least wall time between two intermediate results, ns (about display rate, no faster). */
    public static final long PUBLISH_EVERY_NANOS = 50_000_000L;

    private FileMeasure() {
    }

    /** Measures a file with no progress, cancel or intermediate results. */
    public static MeasureResult run(Path file, MeasureRequest request) {
        return run(file, request, p -> { }, () -> false, null);
    }

    /**
     * @param progress  receives the fraction read, 0 … 1
     * @param cancelled polled between blocks; when true the measurement stops with {@link CancellationException}
     * @param partial   receives intermediate results (on this thread); null for none (then none are computed)
     * @throws MeasureException with a one-line message naming the file for anything the file or the
     *                          request does not allow (unreadable, too short, silent, NaN, …)
     */
    public static MeasureResult run(Path file, MeasureRequest request, DoubleConsumer progress,
            BooleanSupplier cancelled, Consumer<MeasureResult> partial) {
        String name = file.toString();
        try (WavReader reader = open(file)) {
            WavFormat f = reader.format();
            MeasurePipeline p = new MeasurePipeline(request, name, f.sampleRateHz(), f.channels(), codeFs(f.encoding()));
            p.checkLength(reader.frames());
            p.transformInParallel(true);
            long total = reader.frames();
            long lastAverages = 0;
            long lastPublish = 0;
            try (ReadAhead blocks = new ReadAhead(reader, MeasurePipeline.BLOCK_FRAMES)) {
                for (double[] buf; (buf = blocks.next()) != null; ) {
                    if (cancelled.getAsBoolean()) {
                        throw new CancellationException(name + ": cancelled");
                    }
                    p.accept(buf, blocks.frames());
                    progress.accept(p.frames() / (double) total);
                    long now = System.nanoTime();
                    if (partial != null && p.averages() != lastAverages && now - lastPublish > PUBLISH_EVERY_NANOS) {
                        lastAverages = p.averages();
                        lastPublish = now;
                        MeasureResult r = p.result(false);
                        if (r != null) {
                            partial.accept(r);
                        }
                    }
                }
            }
            return p.result(true);
        } catch (WavFormatException e) {
            throw new MeasureException(e.getMessage());
        } catch (IOException e) {
            throw new MeasureException(name + ": cannot read (" + e.getMessage() + ")");
        }
    }

    /** One quantisation step of an encoding in full-scale units: 2^−(bits−1) for PCM, 0 for float. */
    public static double codeFs(SampleEncoding e) {
        return e.isFloat() ? 0 : Math.scalb(1.0, -(e.bitsPerSample() - 1));
    }

    private static WavReader open(Path file) throws IOException {
        String name = file.toString();
        if (Files.isDirectory(file)) {
            throw new MeasureException(name + ": is a folder, not a WAV file");
        }
        try {
            return WavReader.open(file);
        } catch (NoSuchFileException e) {
            throw new MeasureException(name + ": no such file");
        } catch (AccessDeniedException e) {
            throw new MeasureException(name + ": permission denied");
        }
    }
}

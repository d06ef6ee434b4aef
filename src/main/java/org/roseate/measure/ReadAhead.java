package org.roseate.measure;

import java.io.IOException;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;
import org.roseate.io.WavReader;

/**
 * Reads and decodes a WAV file's blocks on a second thread while the caller analyses the previous
 * ones, so that on two cores the file's reading and decoding overlaps the Welch transforms. The
 * caller gets the same blocks in the same order as from {@link WavReader#readFrames} on its own
 * thread, and the reader's exceptions, rethrown on the caller's thread; results are therefore
 * unchanged. Three block buffers circulate (two may wait decoded while one is being analysed).
 */
final class ReadAhead implements AutoCloseable {
    /** One decoded block: {@code frames} frames in {@code samples}, or the exception that ended reading. */
    private record Block(double[] samples, int frames, Throwable failure) {
    }

    private final BlockingQueue<Block> decoded = new ArrayBlockingQueue<>(3);
    private final BlockingQueue<double[]> spare = new ArrayBlockingQueue<>(3);
    private final Thread thread;
    private double[] lent;
    private int frames;

    /** Starts reading blocks of {@code blockFrames} frames from {@code reader} (which the caller closes). */
    ReadAhead(WavReader reader, int blockFrames) {
        int samples = blockFrames * reader.format().channels();
        for (int i = 0; i < 3; i++) {
            spare.add(new double[samples]);
        }
        thread = new Thread(() -> readAll(reader, blockFrames), "roseate-wav-read");
        thread.setDaemon(true);
        thread.start();
    }

    private void readAll(WavReader reader, int blockFrames) {
        try {
            while (true) {
                double[] buf = spare.take();
                int got;
                try {
                    got = reader.readFrames(buf, blockFrames);
                } catch (IOException | RuntimeException | Error e) {
                    decoded.put(new Block(null, 0, e));
                    return;
                }
                decoded.put(new Block(buf, got, null));
                if (got == 0) {
                    return;
                }
            }
        } catch (InterruptedException e) {
            // closed by the caller: stop quietly
        }
    }

    /**
     * The next block's samples (interleaved), valid until the next call; {@link #frames} tells how
     * many frames. Returns null at the end of the data.
     */
    double[] next() throws IOException {
        if (lent != null) {
            spare.add(lent);
            lent = null;
        }
        Block b;
        try {
            b = decoded.take();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IOException("interrupted while reading", e);
        }
        if (b.failure() != null) {
            Throwable f = b.failure();
            if (f instanceof IOException io) {
                throw io;
            }
            if (f instanceof RuntimeException r) {
                throw r;
            }
            throw (Error) f;
        }
        frames = b.frames();
        if (frames == 0) {
            return null;
        }
        lent = b.samples();
        return lent;
    }

    /** Frames in the block {@link #next} returned last. */
    int frames() {
        return frames;
    }

    /** Stops the reading thread (if still running) and waits for it. */
    @Override
    public void close() {
        thread.interrupt();
        try {
            thread.join();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}

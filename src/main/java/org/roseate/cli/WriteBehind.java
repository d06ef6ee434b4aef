package org.roseate.cli;

import java.io.IOException;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.BlockingQueue;

/**
 * Hands filled blocks to a second thread that writes them (encoding, dither, statistics, the file),
 * so that on two cores the writing overlaps the rendering of the next block. Blocks are written in
 * the order they were submitted, each by the same {@link Sink} call the caller would have made, so
 * the file and the statistics are unchanged. Three buffers circulate. A failure of the writer is
 * rethrown on the caller's thread at its next {@link #spare}, {@link #submit} or {@link #finish}.
 */
final class WriteBehind implements AutoCloseable {
    /** Writes one block: {@code frames} frames of {@code samples} (interleaved). */
    interface Sink {
        void write(double[] samples, int frames) throws IOException;
    }

    private record Block(double[] samples, int frames) {
    }

    private static final Block END = new Block(null, 0);

    private final BlockingQueue<Block> full = new ArrayBlockingQueue<>(3);
    private final BlockingQueue<double[]> spare = new ArrayBlockingQueue<>(3);
    private final Thread thread;
    private volatile Throwable failure;
    private boolean finished;

    WriteBehind(int samplesPerBlock, Sink sink) {
        for (int i = 0; i < 3; i++) {
            spare.add(new double[samplesPerBlock]);
        }
        thread = new Thread(() -> drain(sink), "roseate-wav-write");
        thread.setDaemon(true);
        thread.start();
    }

    private void drain(Sink sink) {
        try {
            while (true) {
                Block b = full.take();
                if (b == END) {
                    return;
                }
                sink.write(b.samples(), b.frames());
                spare.put(b.samples());
            }
        } catch (InterruptedException e) {
            // closed by the caller after a failure of its own: stop quietly
        } catch (IOException | RuntimeException | Error e) {
            failure = e;
            spare.offer(new double[0]); // wakes a caller waiting in spare(); it then sees the failure
        }
    }

    /** A free buffer to fill (waits while all three are queued for writing). */
    double[] spare() throws IOException {
        rethrow();
        double[] b = take(spare);
        rethrow();
        return b;
    }

    /** Queues a filled buffer for writing. */
    void submit(double[] samples, int frames) throws IOException {
        rethrow();
        put(new Block(samples, frames));
    }

    /** Waits until every submitted block is written; rethrows the writer's failure. */
    void finish() throws IOException {
        if (!finished) {
            finished = true;
            put(END);
            join();
        }
        rethrow();
    }

    /** Stops the writer without waiting for queued blocks (after a failure); idempotent. */
    @Override
    public void close() {
        if (!finished) {
            finished = true;
            thread.interrupt();
            join();
        }
    }

    private void rethrow() throws IOException {
        Throwable f = failure;
        if (f instanceof IOException io) {
            throw io;
        }
        if (f instanceof RuntimeException r) {
            throw r;
        }
        if (f instanceof Error e) {
            throw e;
        }
    }

    private void put(Block b) throws IOException {
        try {
            while (!full.offer(b, 100, java.util.concurrent.TimeUnit.MILLISECONDS)) {
                rethrow();
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IOException("interrupted while writing", e);
        }
    }

    private static double[] take(BlockingQueue<double[]> q) throws IOException {
        try {
            return q.take();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IOException("interrupted while writing", e);
        }
    }

    private void join() {
        try {
            thread.join();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}

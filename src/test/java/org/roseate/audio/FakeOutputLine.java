package org.roseate.audio;

import java.util.concurrent.CountDownLatch;
import java.util.concurrent.locks.LockSupport;

/**
 * An output line for tests. In instant mode it takes every write at once and reports everything
 * written as played; in real-time mode it plays at the sample rate by the wall clock, blocks while
 * its buffer is full, and its position stops at the frames written when starved (as a device's
 * does). After {@code stallAfterFrames} it stops taking data: {@code write} blocks until
 * {@link #close()}, and the position freezes. It records the first {@code recordFrames} frames.
 */
final class FakeOutputLine implements OutputLine {
    private final int rateHz;
    private final int channels;
    private final int bufferFrames;
    private final boolean realTime;
    private final long stallAfterFrames;
    private final byte[] record;
    private final CountDownLatch closed = new CountDownLatch(1);
    private volatile long written;
    private volatile long startNanos = -1;
    private volatile int recorded;
    volatile boolean started;

    FakeOutputLine(int rateHz, int channels, int bufferFrames, boolean realTime, long stallAfterFrames, int recordFrames) {
        this.rateHz = rateHz;
        this.channels = channels;
        this.bufferFrames = bufferFrames;
        this.realTime = realTime;
        this.stallAfterFrames = stallAfterFrames;
        this.record = new byte[recordFrames * channels * 2];
    }

    /** Recorded samples decoded to doubles (16-bit). */
    double[] recorded() {
        int n = recorded / 2;
        double[] x = new double[n];
        PcmCodec.decode(record, 0, n, 16, x, 0);
        return x;
    }

    int recordedFrames() {
        return recorded / (2 * channels);
    }

    @Override
    public String deviceName() {
        return "fake";
    }

    @Override
    public int sampleRateHz() {
        return rateHz;
    }

    @Override
    public int channels() {
        return channels;
    }

    @Override
    public int bitsPerSample() {
        return 16;
    }

    @Override
    public int bufferFrames() {
        return bufferFrames;
    }

    @Override
    public void start() {
        started = true;
        startNanos = System.nanoTime();
    }

    private boolean isClosed() {
        return closed.getCount() == 0;
    }

    @Override
    public int write(byte[] bytes, int offset, int length) {
        int frameBytes = 2 * channels;
        int frames = length / frameBytes;
        if (isClosed()) {
            return 0;
        }
        if (written + frames > stallAfterFrames) {
            try {
                closed.await();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
            return 0;
        }
        if (realTime) {
            while (!isClosed() && (!started || written + frames - framePosition() > bufferFrames)) {
                if (!started && written + frames > bufferFrames) {
                    throw new IllegalStateException("write beyond the buffer before start() would block for ever");
                }
                if (!started) {
                    break;
                }
                LockSupport.parkNanos(500_000L);
            }
        }
        int r = recorded;
        int keep = Math.max(0, Math.min(length, record.length - r));
        System.arraycopy(bytes, offset, record, r, keep);
        recorded = r + keep;
        written += frames;
        return frames * frameBytes;
    }

    @Override
    public long framePosition() {
        long w = written;
        if (!realTime) {
            return w;
        }
        if (startNanos < 0) {
            return 0;
        }
        long elapsed = (long) ((System.nanoTime() - startNanos) * 1e-9 * rateHz);
        // A starved device's clock stops at what it was given; the deficit is not made up later.
        long p = Math.min(w, elapsed - deficit);
        if (elapsed - deficit > w) {
            deficit = elapsed - w;
        }
        return p;
    }

    private volatile long deficit;

    @Override
    public void close() {
        closed.countDown();
    }
}

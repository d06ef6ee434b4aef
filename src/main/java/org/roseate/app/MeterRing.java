package org.roseate.app;

/**
 * A lock-free single-producer single-consumer ring of samples from the render thread to the band
 * meter's analysis thread. The producer never waits: when the ring lacks room, the block is
 * dropped and counted. The producer publishes a volatile write count after the samples, the
 * consumer a volatile read count after taking them.
 *
 * <p>Several {@link TapSource}s may share one ring (the sources of an A/B comparison, rendered one
 * after the other by the same render thread during a crossfade); only the tap whose id is the
 * ring's {@link #activeTap()} writes.
 */
final class MeterRing {
    private final double[] ring;
    private final int mask;
    private volatile long written;
    private volatile long read;
    private volatile long dropped;
    private volatile int activeTap;

    /**
     * @param capacityPow2 capacity in samples, a power of two ≥ 16
     */
    MeterRing(int capacityPow2) {
        if (capacityPow2 < 16 || Integer.bitCount(capacityPow2) != 1) {
            throw new IllegalArgumentException("capacity=" + capacityPow2 + " must be a power of two >= 16");
        }
        ring = new double[capacityPow2];
        mask = capacityPow2 - 1;
    }

    int activeTap() {
        return activeTap;
    }

    void setActiveTap(int id) {
        activeTap = id;
    }

    /**
     * Producer: appends channel {@code channel} of {@code frames} interleaved frames. No allocation,
     * lock or wait; drops the whole block when it does not fit.
     */
    void write(double[] interleaved, int frames, int channels, int channel) {
        long w = written;
        if (ring.length - (w - read) < frames) {
            dropped += frames;
            return;
        }
        for (int f = 0; f < frames; f++) {
            ring[(int) ((w + f) & mask)] = interleaved[f * channels + channel];
        }
        written = w + frames;
    }

    /** Consumer: copies up to {@code max} samples into {@code dst}; returns how many. */
    int read(double[] dst, int max) {
        long r = read;
        int n = (int) Math.min(Math.min(max, dst.length), written - r);
        for (int i = 0; i < n; i++) {
            dst[i] = ring[(int) ((r + i) & mask)];
        }
        read = r + n;
        return n;
    }

    /** Samples dropped because the consumer was behind. */
    long dropped() {
        return dropped;
    }

    long written() {
        return written;
    }
}

package org.roseate.noise;

/**
 * A stream of audio frames: the noise chain, the ideal-pink reference, or anything else that can
 * be rendered to a file or a sound card. Implementations are single-threaded (one consumer) and
 * allocation-free in {@link #render}.
 */
public interface FrameSource {
    /** Channels per frame, ≥ 1. */
    int channels();

    /** Output sample rate in Hz. */
    double sampleRateHz();

    /**
     * Fills {@code interleaved[0 .. frames·channels)} with the next frames, full scale ±1.0
     * (a full-scale sine reads 0 dBFS). Any {@code frames ≥ 0}; no allocation, locking or I/O.
     *
     * @param interleaved destination, length ≥ frames·channels
     */
    void render(double[] interleaved, int frames);
}

package org.roseate.audio;

/**
 * The part of an output line the playback engine uses; {@link Devices} adapts a Java Sound
 * {@code SourceDataLine} to it, and tests supply fakes (a line that stalls, one that records).
 *
 * <p>{@link #write} is called only by the render thread; {@link #framePosition} and {@link #close}
 * may be called from the watchdog thread at the same time, and {@link #close} must then make a
 * blocked {@link #write} return.
 */
public interface OutputLine {
    /** Device name for messages. */
    String deviceName();

    /** Frames per second. */
    int sampleRateHz();

    /** Channels per frame. */
    int channels();

    /** Bits per sample of the signed little-endian PCM the line takes: 16, 24 or 32. */
    int bitsPerSample();

    /** The line's buffer in frames, as opened: the output latency is this over the sample rate. */
    int bufferFrames();

    /** Starts playback. */
    void start();

    /**
     * Writes whole frames, blocking while the buffer is full; returns the bytes taken (fewer, even 0,
     * when the line was closed or has stopped taking data).
     */
    int write(byte[] bytes, int offset, int length);

    /** Frames the device has played since it was opened (its clock, not ours). */
    long framePosition();

    /** Stops and releases the device; unblocks a pending {@link #write}. Idempotent. */
    void close();
}

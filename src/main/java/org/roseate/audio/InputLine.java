package org.roseate.audio;

/**
 * The part of an input line the capture engine uses; {@link Devices} adapts a Java Sound
 * {@code TargetDataLine} to it, and tests supply fakes.
 *
 * <p>{@link #read} is called only by the capture thread; {@link #framePosition} and {@link #close}
 * may be called from the watchdog thread at the same time, and {@link #close} must then make a
 * blocked {@link #read} return.
 */
public interface InputLine {
    /** Device name for messages. */
    String deviceName();

    /** Frames per second. */
    int sampleRateHz();

    /** Channels per frame. */
    int channels();

    /** Bits per sample of the signed little-endian PCM the line gives: 16, 24 or 32. */
    int bitsPerSample();

    /** The line's buffer in frames, as opened. */
    int bufferFrames();

    /** Starts capture. */
    void start();

    /** Reads whole frames, blocking until {@code length} bytes arrived; returns the bytes read (fewer on close). */
    int read(byte[] bytes, int offset, int length);

    /** Frames the device has captured since it was opened. */
    long framePosition();

    /** Stops and releases the device; unblocks a pending {@link #read}. Idempotent. */
    void close();
}

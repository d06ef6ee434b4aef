package org.roseate.io;

import java.util.Objects;

/**
 * The layout of a WAV file's samples: rate, channel count and sample encoding. Immutable.
 *
 * <p>Bounds come from the header fields they end up in (Microsoft/IBM Multimedia Programming
 * Interface and Data Specifications 1.0, 1991, WAVE "fmt " chunk): channels and the block align
 * (bytes per frame) are 16-bit unsigned fields, the byte rate a 32-bit unsigned field.
 *
 * @param sampleRateHz frames per second, &gt; 0
 * @param channels     samples per frame, 1 to 65535, with channels × bytes per sample ≤ 65535
 * @param encoding     how each sample is stored
 */
public record WavFormat(int sampleRateHz, int channels, SampleEncoding encoding) {
    static final long MAX_UINT32 = 0xFFFF_FFFFL;

    /** Validates against the header field widths. */
    public WavFormat {
        Objects.requireNonNull(encoding, "encoding");
        if (sampleRateHz <= 0) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be > 0");
        }
        if (channels < 1 || channels > 0xFFFF) {
            throw new IllegalArgumentException("channels=" + channels + " must be in 1..65535");
        }
        long blockAlign = (long) channels * encoding.bytesPerSample();
        if (blockAlign > 0xFFFF) {
            throw new IllegalArgumentException("channels=" + channels + " with " + encoding
                    + " gives " + blockAlign + " bytes per frame; a WAV frame holds at most 65535");
        }
        if (blockAlign * sampleRateHz > MAX_UINT32) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " with "
                    + blockAlign + " bytes per frame exceeds the WAV byte-rate field (2^32 − 1)");
        }
    }

    /** Bytes per frame (the header's block align): channels × bytes per sample. */
    public int bytesPerFrame() {
        return channels * encoding.bytesPerSample();
    }

    /** Bytes per second (the header's average byte rate): sample rate × bytes per frame. */
    public long bytesPerSecond() {
        return (long) sampleRateHz * bytesPerFrame();
    }
}

package org.roseate.io;

import java.util.Locale;

/**
 * How one sample is stored in a WAV file: integer PCM of 8 (unsigned, offset 128), 16, 24 or 32
 * bits (signed two's complement, little-endian), or IEEE 754 float of 32 or 64 bits.
 *
 * <p>Source: Microsoft/IBM, Multimedia Programming Interface and Data Specifications 1.0 (1991),
 * "Data Format of the Samples" (8-bit unsigned, wider signed); IEEE float as format tag 3.
 */
public enum SampleEncoding {
    /** 8-bit unsigned PCM, code 128 is silence. */
    PCM_8(1, false, "8"),
    /** 16-bit signed PCM. */
    PCM_16(2, false, "16"),
    /** 24-bit signed PCM, three bytes per sample. */
    PCM_24(3, false, "24"),
    /** 32-bit signed PCM. */
    PCM_32(4, false, "32"),
    /** 32-bit IEEE 754 float. */
    FLOAT_32(4, true, "32f"),
    /** 64-bit IEEE 754 float. */
    FLOAT_64(8, true, "64f");

    private final int bytesPerSample;
    private final boolean isFloat;
    private final String label;

    SampleEncoding(int bytesPerSample, boolean isFloat, String label) {
        this.bytesPerSample = bytesPerSample;
        this.isFloat = isFloat;
        this.label = label;
    }

    /** Bytes one sample occupies in the file (1, 2, 3, 4 or 8). */
    public int bytesPerSample() {
        return bytesPerSample;
    }

    /** Bits one sample occupies in the file: 8 × {@link #bytesPerSample()}. */
    public int bitsPerSample() {
        return 8 * bytesPerSample;
    }

    /** True for the IEEE float encodings. */
    public boolean isFloat() {
        return isFloat;
    }

    /** The short name {@link #parse} accepts: "8", "16", "24", "32", "32f" or "64f". */
    public String label() {
        return label;
    }

    /**
     * The encoding named by a short label, case-insensitive: "8", "16", "24", "32" (integer PCM),
     * "32f" or "64f" (float).
     *
     * @throws IllegalArgumentException naming the bad label and the accepted ones
     */
    public static SampleEncoding parse(String text) {
        String key = text == null ? "" : text.trim().toLowerCase(Locale.ROOT);
        for (SampleEncoding e : values()) {
            if (e.label.equals(key)) {
                return e;
            }
        }
        throw new IllegalArgumentException(
                "sample encoding \"" + text + "\" is not known; use 8, 16, 24, 32, 32f or 64f");
    }
}

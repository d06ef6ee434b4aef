package org.roseate.audio;

import java.util.random.RandomGenerator;
import java.util.random.RandomGeneratorFactory;

/**
 * Conversion between doubles at full scale 1.0 and signed little-endian PCM of 16, 24 or 32 bits,
 * in place in caller-owned arrays. The encoder adds TPDF dither and clips; the decoder is exact.
 *
 * <p>Encoding follows {@link org.roseate.io.WavWriter}: code = round(x · F + d), F = 2<sup>n−1</sup>,
 * clipped to [−F, F − 1], with d the difference of two uniforms on [0, 1) (triangular on (−1, 1)
 * LSB, Lipshitz, Wannamaker and Vanderkooy, J. Audio Eng. Soc. 40(5), 1992, from memory) drawn from
 * a seeded {@code L64X128MixRandom}; NaN becomes 0. Decoding is code / F.
 *
 * <p>An encoder is for one thread; {@link #encode} and {@link #decode} allocate nothing.
 */
public final class PcmCodec {
    private final int bytesPerSample;
    private final double fullScale;
    private final long maxCode;
    private final long minCode;
    private final RandomGenerator dither;
    private long clipped;

    /**
     * @param bitsPerSample 16, 24 or 32
     * @param ditherSeed    seed of the dither generator
     * @param dithered      false for plain rounding (tests)
     * @throws IllegalArgumentException for another bit depth
     */
    public PcmCodec(int bitsPerSample, long ditherSeed, boolean dithered) {
        checkBits(bitsPerSample);
        this.bytesPerSample = bitsPerSample / 8;
        this.fullScale = Math.scalb(1.0, bitsPerSample - 1);
        this.maxCode = (1L << (bitsPerSample - 1)) - 1;
        this.minCode = -(1L << (bitsPerSample - 1));
        this.dither = dithered ? RandomGeneratorFactory.<RandomGenerator>of("L64X128MixRandom").create(ditherSeed) : null;
    }

    static void checkBits(int bitsPerSample) {
        if (bitsPerSample != 16 && bitsPerSample != 24 && bitsPerSample != 32) {
            throw new IllegalArgumentException("bitsPerSample=" + bitsPerSample + " must be 16, 24 or 32");
        }
    }

    /** Bytes per sample: 2, 3 or 4. */
    public int bytesPerSample() {
        return bytesPerSample;
    }

    /** Samples clipped (or NaN) so far. */
    public long clippedSamples() {
        return clipped;
    }

    /**
     * Encodes {@code samples} doubles from {@code src[0..]} into {@code dst[0..samples·bytesPerSample)}.
     * Any {@code samples ≥ 0}; the arrays must be long enough (not checked: this runs on the audio thread).
     */
    public void encode(double[] src, int samples, byte[] dst) {
        int p = 0;
        int n = bytesPerSample;
        for (int i = 0; i < samples; i++) {
            double v = src[i] * fullScale;
            if (dither != null) {
                v += dither.nextDouble() - dither.nextDouble();
            }
            double r = Math.rint(v);
            long q;
            if (r > maxCode) {
                clipped++;
                q = maxCode;
            } else if (r < minCode) {
                clipped++;
                q = minCode;
            } else if (r != r) {
                clipped++;
                q = 0;
            } else {
                q = (long) r;
            }
            for (int k = 0; k < n; k++) {
                dst[p++] = (byte) (q >>> (8 * k));
            }
        }
    }

    /**
     * Decodes {@code samples} samples of signed little-endian PCM from {@code src[offset..]} into
     * {@code dst[dstOffset..]} as code / 2<sup>n−1</sup>. Allocates nothing.
     */
    public static void decode(byte[] src, int offset, int samples, int bitsPerSample, double[] dst, int dstOffset) {
        int n = bitsPerSample / 8;
        double scale = Math.scalb(1.0, -(bitsPerSample - 1));
        int shift = 64 - bitsPerSample;
        int p = offset;
        for (int i = 0; i < samples; i++) {
            long q = 0;
            for (int k = 0; k < n; k++) {
                q |= (src[p++] & 0xFFL) << (8 * k);
            }
            q = (q << shift) >> shift;
            dst[dstOffset + i] = q * scale;
        }
    }
}

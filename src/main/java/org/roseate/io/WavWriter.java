package org.roseate.io;

import java.io.IOException;
import java.io.OutputStream;
import java.util.Objects;
import java.util.random.RandomGenerator;
import java.util.random.RandomGeneratorFactory;

/**
 * Streams samples into a RIFF/WAVE file in constant memory. The frame count is declared up front
 * (a render knows its length), so the header is complete before the first sample and the target
 * stream need not be seekable; {@link #finish()} checks that exactly that many frames arrived.
 *
 * <p><b>Header.</b> Layout per Microsoft/IBM, Multimedia Programming Interface and Data
 * Specifications 1.0 (1991), and Microsoft's WAVEFORMATEXTENSIBLE documentation. Mono and stereo
 * files get the plain header that every reader accepts: format tag 1 (PCM, 16-byte fmt chunk) or
 * tag 3 (IEEE float, 18-byte fmt chunk with cbSize 0). More than two channels get
 * WAVE_FORMAT_EXTENSIBLE (tag 0xFFFE, cbSize 22, valid bits = container bits, channel mask 0 =
 * no speaker assignment, since these are measurement channels). Microsoft also recommends the
 * extensible header above 16 bits; it is not used there for mono/stereo because with valid bits
 * equal to container bits the plain header is unambiguous and readers such as Python's
 * {@code wave} module (before 3.12) accept only tag 1. Float files carry a {@code fact} chunk
 * (frame count), as the specification asks of every non-PCM format. An odd-sized data chunk is
 * followed by one pad byte.
 *
 * <p><b>Scale.</b> Samples are at full scale 1.0. An n-bit PCM code is round(x · F + d) with
 * F = 2<sup>n−1</sup> (32768 for 16 bit), clipped to [−F, F − 1]; so −1.0 is stored exactly and
 * +1.0 becomes F − 1. A sample counts as clipped when its rounded, dithered code lies outside that
 * range (with dither off: when x · F ≥ F − 0.5 or x · F &lt; −F − 0.5); NaN is stored as 0 and
 * also counted. 8-bit codes are stored offset by 128. Float encodings store x unchanged (float 32
 * rounds to nearest) and never count clips.
 *
 * <p><b>Dither.</b> For PCM, d is TPDF dither: the difference of two independent uniforms on
 * [0, 1) LSB, i.e. triangular on (−1, 1) LSB, 2 LSB peak to peak, variance 1/6 LSB². With
 * rounding the total error then has mean 0 and variance 1/4 LSB² for any input (Lipshitz,
 * Wannamaker and Vanderkooy, "Quantization and Dither: A Theoretical Survey", J. Audio Eng. Soc.
 * 40(5), 1992, from memory). The uniforms come from a seeded {@code L64X128MixRandom}, so output is
 * reproducible.
 *
 * <p>Not thread-safe. The writer does not close the stream; see {@link AtomicOutput} for the
 * write-then-commit pattern.
 */
public final class WavWriter {
    private static final int BUFFER_BYTES = 1 << 16;
    private static final int FMT_PLAIN_PCM = 16;
    private static final int FMT_PLAIN_FLOAT = 18;
    private static final int FMT_EXTENSIBLE = 40;

    private final OutputStream out;
    private final WavFormat format;
    private final long totalFrames;
    private final RandomGenerator dither;
    private final byte[] buffer;
    private final int framesPerBuffer;
    private final double fullScale;
    private final long minCode;
    private final long maxCode;
    private long framesWritten;
    private long clippedSamples;
    private boolean finished;

    /**
     * A writer with TPDF dither for PCM encodings, seeded for reproducibility; writes the header now.
     *
     * @param out         receives the file's bytes; not closed by this writer
     * @param format      rate, channels and encoding
     * @param totalFrames exactly how many frames will be written, ≥ 0, small enough for the 32-bit
     *                    RIFF size field
     * @param ditherSeed  seed of the dither generator
     * @throws IllegalArgumentException if totalFrames is negative or too large for a WAV file
     */
    public WavWriter(OutputStream out, WavFormat format, long totalFrames, long ditherSeed)
            throws IOException {
        this(out, format, totalFrames,
                RandomGeneratorFactory.<RandomGenerator>of("L64X128MixRandom").create(ditherSeed));
    }

    /** As the dithering constructor, but PCM codes are plainly rounded (for tests and float data). */
    public static WavWriter withoutDither(OutputStream out, WavFormat format, long totalFrames)
            throws IOException {
        return new WavWriter(out, format, totalFrames, null);
    }

    private WavWriter(OutputStream out, WavFormat format, long totalFrames, RandomGenerator dither)
            throws IOException {
        this.out = Objects.requireNonNull(out, "out");
        this.format = Objects.requireNonNull(format, "format");
        if (totalFrames < 0) {
            throw new IllegalArgumentException("totalFrames=" + totalFrames + " must be >= 0");
        }
        long dataBytes = totalFrames * format.bytesPerFrame();
        long maxData = WavFormat.MAX_UINT32 - headerBytes(format) + 8 - 1;
        if (totalFrames > maxData / format.bytesPerFrame() || dataBytes > maxData) {
            throw new IllegalArgumentException("totalFrames=" + totalFrames + " at "
                    + format.bytesPerFrame() + " bytes per frame exceeds the 4 GiB WAV limit");
        }
        this.totalFrames = totalFrames;
        this.dither = format.encoding().isFloat() ? null : dither;
        this.framesPerBuffer = Math.max(1, BUFFER_BYTES / format.bytesPerFrame());
        this.buffer = new byte[framesPerBuffer * format.bytesPerFrame()];
        int bits = format.encoding().bitsPerSample();
        this.fullScale = Math.scalb(1.0, bits - 1);
        this.maxCode = (1L << (bits - 1)) - 1;
        this.minCode = -(1L << (bits - 1));
        writeHeader(dataBytes);
    }

    /** Bytes before the first sample for this format. */
    static int headerBytes(WavFormat format) {
        return 12 + 8 + fmtSize(format) + (format.encoding().isFloat() ? 12 : 0) + 8;
    }

    private static boolean extensible(WavFormat format) {
        return format.channels() > 2;
    }

    private static int fmtSize(WavFormat format) {
        if (extensible(format)) {
            return FMT_EXTENSIBLE;
        }
        return format.encoding().isFloat() ? FMT_PLAIN_FLOAT : FMT_PLAIN_PCM;
    }

    private void writeHeader(long dataBytes) throws IOException {
        int fmtSize = fmtSize(format);
        boolean isFloat = format.encoding().isFloat();
        long pad = dataBytes & 1;
        long riffSize = headerBytes(format) - 8 + dataBytes + pad;
        byte[] h = new byte[headerBytes(format)];
        int p = 0;
        p = putTag(h, p, "RIFF");
        p = putU32(h, p, riffSize);
        p = putTag(h, p, "WAVE");
        p = putTag(h, p, "fmt ");
        p = putU32(h, p, fmtSize);
        int tag = extensible(format) ? WavCodes.TAG_EXTENSIBLE
                : isFloat ? WavCodes.TAG_IEEE_FLOAT : WavCodes.TAG_PCM;
        p = putU16(h, p, tag);
        p = putU16(h, p, format.channels());
        p = putU32(h, p, format.sampleRateHz());
        p = putU32(h, p, format.bytesPerSecond());
        p = putU16(h, p, format.bytesPerFrame());
        p = putU16(h, p, format.encoding().bitsPerSample());
        if (fmtSize >= FMT_PLAIN_FLOAT) {
            p = putU16(h, p, fmtSize - FMT_PLAIN_FLOAT);
        }
        if (fmtSize == FMT_EXTENSIBLE) {
            p = putU16(h, p, format.encoding().bitsPerSample());
            p = putU32(h, p, 0);
            p = WavCodes.putSubFormatGuid(h, p,
                    isFloat ? WavCodes.TAG_IEEE_FLOAT : WavCodes.TAG_PCM);
        }
        if (isFloat) {
            p = putTag(h, p, "fact");
            p = putU32(h, p, 4);
            p = putU32(h, p, totalFrames);
        }
        p = putTag(h, p, "data");
        p = putU32(h, p, dataBytes);
        assert p == h.length;
        out.write(h);
    }

    /**
     * Encodes and writes frames. Allocates nothing.
     *
     * @param interleaved samples at full scale 1.0, frame by frame; at least frames × channels long
     * @param frames      frames to take from the start of the array, ≥ 0
     * @throws IllegalArgumentException if the array is too short or frames is negative
     * @throws IllegalStateException    after {@link #finish()}, or if this would exceed the
     *                                  declared frame count
     */
    public void writeFrames(double[] interleaved, int frames) throws IOException {
        writeFrames(interleaved, frames, null);
    }

    /**
     * As {@link #writeFrames(double[], int)}, and also gives back what the file now holds: sample i of the
     * call becomes {@code written[i]}, the stored code over full scale (after dither, rounding and
     * clipping; NaN as 0) or the stored float. Lets a caller report the level of the file itself.
     *
     * @param written null, or an array at least frames × channels long (it may be {@code interleaved})
     */
    public void writeFrames(double[] interleaved, int frames, double[] written) throws IOException {
        if (finished) {
            throw new IllegalStateException("writeFrames after finish()");
        }
        int channels = format.channels();
        if (frames < 0 || (long) frames * channels > interleaved.length) {
            throw new IllegalArgumentException("frames=" + frames + " with " + channels
                    + " channels needs " + (long) frames * channels + " samples; array has "
                    + interleaved.length);
        }
        if (frames > totalFrames - framesWritten) {
            throw new IllegalStateException("writing " + frames + " more frames would exceed the "
                    + totalFrames + " declared (" + framesWritten + " written)");
        }
        int done = 0;
        while (done < frames) {
            int n = Math.min(framesPerBuffer, frames - done);
            int samples = n * channels;
            encode(interleaved, done * channels, samples);
            if (written != null) {
                decode(written, done * channels, samples);
            }
            out.write(buffer, 0, samples * format.encoding().bytesPerSample());
            done += n;
        }
        framesWritten += frames;
    }

    private void encode(double[] src, int from, int samples) {
        byte[] b = buffer;
        int end = from + samples;
        int p = 0;
        switch (format.encoding()) {
            case FLOAT_32 -> {
                for (int i = from; i < end; i++) {
                    int bits = Float.floatToRawIntBits((float) src[i]);
                    b[p++] = (byte) bits;
                    b[p++] = (byte) (bits >>> 8);
                    b[p++] = (byte) (bits >>> 16);
                    b[p++] = (byte) (bits >>> 24);
                }
            }
            case FLOAT_64 -> {
                for (int i = from; i < end; i++) {
                    long bits = Double.doubleToRawLongBits(src[i]);
                    for (int k = 0; k < 64; k += 8) {
                        b[p++] = (byte) (bits >>> k);
                    }
                }
            }
            case PCM_8 -> {
                for (int i = from; i < end; i++) {
                    b[p++] = (byte) (quantize(src[i]) + 128);
                }
            }
            case PCM_16 -> {
                for (int i = from; i < end; i++) {
                    long q = quantize(src[i]);
                    b[p++] = (byte) q;
                    b[p++] = (byte) (q >>> 8);
                }
            }
            case PCM_24 -> {
                for (int i = from; i < end; i++) {
                    long q = quantize(src[i]);
                    b[p++] = (byte) q;
                    b[p++] = (byte) (q >>> 8);
                    b[p++] = (byte) (q >>> 16);
                }
            }
            case PCM_32 -> {
                for (int i = from; i < end; i++) {
                    long q = quantize(src[i]);
                    b[p++] = (byte) q;
                    b[p++] = (byte) (q >>> 8);
                    b[p++] = (byte) (q >>> 16);
                    b[p++] = (byte) (q >>> 24);
                }
            }
        }
    }

    /** The values just encoded into {@code buffer}, back at full scale 1.0. */
    private void decode(double[] dst, int from, int samples) {
        byte[] b = buffer;
        int p = 0;
        for (int i = from; i < from + samples; i++) {
            dst[i] = switch (format.encoding()) {
                case FLOAT_32 -> {
                    int bits = (b[p] & 0xff) | (b[p + 1] & 0xff) << 8 | (b[p + 2] & 0xff) << 16 | b[p + 3] << 24;
                    p += 4;
                    yield Float.intBitsToFloat(bits);
                }
                case FLOAT_64 -> {
                    long bits = 0;
                    for (int k = 0; k < 8; k++) {
                        bits |= (b[p + k] & 0xffL) << (8 * k);
                    }
                    p += 8;
                    yield Double.longBitsToDouble(bits);
                }
                case PCM_8 -> ((b[p++] & 0xff) - 128) / fullScale;
                case PCM_16 -> {
                    int q = (b[p] & 0xff) | b[p + 1] << 8;
                    p += 2;
                    yield q / fullScale;
                }
                case PCM_24 -> {
                    int q = (b[p] & 0xff) | (b[p + 1] & 0xff) << 8 | b[p + 2] << 16;
                    p += 3;
                    yield q / fullScale;
                }
                case PCM_32 -> {
                    int q = (b[p] & 0xff) | (b[p + 1] & 0xff) << 8 | (b[p + 2] & 0xff) << 16 | b[p + 3] << 24;
                    p += 4;
                    yield q / fullScale;
                }
            };
        }
    }

    private long quantize(double x) {
        double v = x * fullScale;
        if (dither != null) {
            v += dither.nextDouble() - dither.nextDouble();
        }
        double r = Math.rint(v);
        if (r > maxCode) {
            clippedSamples++;
            return maxCode;
        }
        if (r < minCode) {
            clippedSamples++;
            return minCode;
        }
        if (r != r) {
            clippedSamples++;
            return 0;
        }
        return (long) r;
    }

    /**
     * Ends the file: writes the RIFF pad byte if the data size is odd and flushes the stream (it
     * stays open). Idempotent.
     *
     * @throws IllegalStateException if fewer frames were written than declared
     */
    public void finish() throws IOException {
        if (finished) {
            return;
        }
        if (framesWritten != totalFrames) {
            throw new IllegalStateException("WAV writer got " + framesWritten + " of the "
                    + totalFrames + " frames declared in its header");
        }
        finished = true;
        if (((totalFrames * format.bytesPerFrame()) & 1) != 0) {
            out.write(0);
        }
        out.flush();
    }

    /** The format being written. */
    public WavFormat format() {
        return format;
    }

    /** Frames declared in the header. */
    public long totalFrames() {
        return totalFrames;
    }

    /** Frames written so far. */
    public long framesWritten() {
        return framesWritten;
    }

    /** PCM samples so far that were clipped to the code range or were NaN (see class notes). */
    public long clippedSamples() {
        return clippedSamples;
    }

    /** True if PCM codes get TPDF dither (always false for float encodings). */
    public boolean dithered() {
        return dither != null;
    }

    private static int putTag(byte[] b, int p, String tag) {
        for (int i = 0; i < 4; i++) {
            b[p + i] = (byte) tag.charAt(i);
        }
        return p + 4;
    }

    private static int putU16(byte[] b, int p, int v) {
        b[p] = (byte) v;
        b[p + 1] = (byte) (v >>> 8);
        return p + 2;
    }

    private static int putU32(byte[] b, int p, long v) {
        b[p] = (byte) v;
        b[p + 1] = (byte) (v >>> 8);
        b[p + 2] = (byte) (v >>> 16);
        b[p + 3] = (byte) (v >>> 24);
        return p + 4;
    }
}

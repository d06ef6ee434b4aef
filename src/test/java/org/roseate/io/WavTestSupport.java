package org.roseate.io;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.SplittableRandom;

/** Shared helpers for the io tests: writing whole signals and reading header fields by offset. */
final class WavTestSupport {
    private WavTestSupport() {
    }

    /** The bytes of a whole WAV file, written without dither in one call. */
    static byte[] wavBytes(WavFormat format, double[] interleaved) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        int frames = interleaved.length / format.channels();
        WavWriter w = WavWriter.withoutDither(out, format, frames);
        w.writeFrames(interleaved, frames);
        w.finish();
        return out.toByteArray();
    }

    static Path writeTemp(Path dir, String name, byte[] bytes) throws IOException {
        Path p = dir.resolve(name);
        Files.write(p, bytes);
        return p;
    }

    /**
     * Seeded random samples that are exact codes of the encoding's grid (k / 2^(n−1), including
     * both extremes) for PCM, floats in [−1, 1] for float 32 and arbitrary doubles for float 64.
     */
    static double[] exactSamples(SampleEncoding e, int count, long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        double[] x = new double[count];
        for (int i = 0; i < count; i++) {
            if (e == SampleEncoding.FLOAT_32) {
                x[i] = (float) r.nextDouble(-1.0, 1.0);
            } else if (e == SampleEncoding.FLOAT_64) {
                x[i] = r.nextDouble(-1.0, 1.0);
            } else {
                long full = 1L << (e.bitsPerSample() - 1);
                x[i] = r.nextLong(-full, full) / (double) full;
            }
        }
        if (count >= 2) {
            x[0] = -1.0;
            x[1] = e.isFloat() ? 1.0 : 1.0 - Math.scalb(1.0, 1 - e.bitsPerSample());
        }
        return x;
    }

    static ByteBuffer le(byte[] b) {
        return ByteBuffer.wrap(b).order(ByteOrder.LITTLE_ENDIAN);
    }

    static String tag(byte[] b, int at) {
        return new String(b, at, 4, java.nio.charset.StandardCharsets.US_ASCII);
    }
}

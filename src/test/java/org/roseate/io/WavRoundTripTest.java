package org.roseate.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/** Write → read round trips: the reader inverts the writer's documented scale exactly. */
class WavRoundTripTest {
    private static final int FRAMES = 1001; // odd, so 8-bit and 24-bit mono need the pad byte

    @TempDir
    Path dir;

    static Stream<Arguments> layouts() {
        List<Arguments> all = new ArrayList<>();
        for (SampleEncoding e : SampleEncoding.values()) {
            for (int channels : new int[] {1, 2, 6}) {
                for (int rate : new int[] {44100, 48000, 96000, 192000}) {
                    all.add(Arguments.of(e, channels, rate));
                }
            }
        }
        return all.stream();
    }

    @ParameterizedTest(name = "{0} {1}ch {2}Hz")
    @MethodSource("layouts")
    void arbitrarySamplesComeBackWithinHalfAnLsbOrExactForFloat(SampleEncoding e, int channels,
            int rate) throws IOException {
        WavFormat format = new WavFormat(rate, channels, e);
        SplittableRandom r = new SplittableRandom(rate * 31L + channels * 7L + e.ordinal());
        double lsb = Math.scalb(1.0, 1 - e.bitsPerSample());
        double[] x = new double[FRAMES * channels];
        for (int i = 0; i < x.length; i++) {
            // up to 1 − 1 LSB so nothing clips; float also gets values beyond full scale
            x[i] = e.isFloat() ? r.nextDouble(-2.0, 2.0) : r.nextDouble(-1.0, 1.0 - lsb);
        }
        Path p = WavTestSupport.writeTemp(dir, "rt.wav", WavTestSupport.wavBytes(format, x));

        double[] y = new double[x.length];
        try (WavReader reader = WavReader.open(p)) {
            assertEquals(format, reader.format());
            assertEquals(FRAMES, reader.frames());
            assertEquals(FRAMES, reader.readFrames(y, FRAMES));
            assertEquals(0, reader.readFrames(y, FRAMES));
        }
        for (int i = 0; i < x.length; i++) {
            if (e == SampleEncoding.FLOAT_64) {
                assertEquals(x[i], y[i], 0.0, "float 64 is stored bit for bit");
            } else if (e == SampleEncoding.FLOAT_32) {
                assertEquals((float) x[i], y[i], 0.0, "float 32 is the nearest float");
            } else {
                // round to nearest: |error| ≤ 0.5 LSB, plus 1e-12 LSB for the double arithmetic
                assertTrue(Math.abs(y[i] - x[i]) <= lsb * (0.5 + 1e-12),
                        "sample " + i + ": wrote " + x[i] + " read " + y[i]);
            }
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("encodings")
    void gridValuesRoundTripExactly(SampleEncoding e) throws IOException {
        WavFormat format = new WavFormat(48000, 2, e);
        double[] x = WavTestSupport.exactSamples(e, 2 * 777, 99);
        Path p = WavTestSupport.writeTemp(dir, "grid.wav", WavTestSupport.wavBytes(format, x));
        double[] y = new double[x.length];
        try (WavReader reader = WavReader.open(p)) {
            reader.readFrames(y, 777);
        }
        assertArrayEquals(x, y, 0.0, "k / 2^(n−1) is representable in both directions");
    }

    static Stream<SampleEncoding> encodings() {
        return Stream.of(SampleEncoding.values());
    }

    @Test
    void readingInBlocksOf1And3And64GivesTheSameSamplesAsOneRead() throws IOException {
        WavFormat format = new WavFormat(44100, 3, SampleEncoding.PCM_24);
        int frames = 70_001; // more than one internal 64 KiB buffer, odd
        double[] x = WavTestSupport.exactSamples(SampleEncoding.PCM_24, 3 * frames, 5);
        Path p = WavTestSupport.writeTemp(dir, "blocks.wav", WavTestSupport.wavBytes(format, x));
        for (int block : new int[] {1, 3, 64, frames}) {
            double[] y = new double[x.length];
            double[] buf = new double[3 * block];
            int at = 0;
            try (WavReader reader = WavReader.open(p)) {
                for (int n; (n = reader.readFrames(buf, block)) > 0; ) {
                    System.arraycopy(buf, 0, y, at, 3 * n);
                    at += 3 * n;
                }
            }
            assertEquals(x.length, at);
            assertArrayEquals(x, y, 0.0, "block " + block);
        }
    }

    @Test
    void writingInBlocksOf1And3And64GivesTheSameBytesAsOneWriteWithDither() throws IOException {
        WavFormat format = new WavFormat(48000, 2, SampleEncoding.PCM_16);
        int frames = 40_003;
        double[] x = new double[2 * frames];
        SplittableRandom r = new SplittableRandom(8);
        for (int i = 0; i < x.length; i++) {
            x[i] = r.nextDouble(-0.9, 0.9);
        }
        byte[] whole = write(format, x, frames, frames);
        for (int block : new int[] {1, 3, 64}) {
            assertArrayEquals(whole, write(format, x, frames, block), "block " + block);
        }
    }

    private static byte[] write(WavFormat format, double[] x, int frames, int block)
            throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        WavWriter w = new WavWriter(out, format, frames, 1234L);
        double[] buf = new double[block * format.channels()];
        for (int at = 0; at < frames; at += block) {
            int n = Math.min(block, frames - at);
            System.arraycopy(x, at * format.channels(), buf, 0, n * format.channels());
            w.writeFrames(buf, n);
        }
        w.finish();
        return out.toByteArray();
    }

    @Test
    void readAllChannelPicksOneChannel() throws IOException {
        WavFormat format = new WavFormat(48000, 2, SampleEncoding.PCM_16);
        double[] x = WavTestSupport.exactSamples(SampleEncoding.PCM_16, 2 * 5000, 3);
        Path p = WavTestSupport.writeTemp(dir, "ch.wav", WavTestSupport.wavBytes(format, x));
        double[] right = WavReader.readAllChannel(p, 1);
        assertEquals(5000, right.length);
        for (int i = 0; i < 5000; i++) {
            assertEquals(x[2 * i + 1], right[i], 0.0);
        }
        IllegalArgumentException ex = org.junit.jupiter.api.Assertions.assertThrows(
                IllegalArgumentException.class, () -> WavReader.readAllChannel(p, 2));
        assertEquals("channel=2 is out of range for " + p + " (2 channels)", ex.getMessage());
    }
}

package org.roseate.io;

import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Seeded mutation of valid files: whatever the bytes, the reader either works or throws
 * {@link WavFormatException} / {@link IOException}, and never needs more memory than the file.
 * A light in-suite stand-in for real fuzzing (common practice).
 */
class WavReaderFuzzTest {
    private static final int CASES = 3000;

    @TempDir
    Path dir;

    private static List<byte[]> seeds() throws IOException {
        List<byte[]> s = new ArrayList<>();
        for (String name : new String[] {"wave_pcm8_mono", "wave_pcm24_stereo",
            "scipy_float64_mono", "ext_pcm24_6ch", "ext_float32_3ch", "scipy_pcm16_odd_list"}) {
            try (InputStream in = WavReaderFuzzTest.class.getResourceAsStream("/io/" + name
                    + ".wav")) {
                s.add(in.readAllBytes());
            }
        }
        s.add(WavTestSupport.wavBytes(new WavFormat(48000, 2, SampleEncoding.FLOAT_32),
                new double[40]));
        return s;
    }

    @Test
    void mutatedFilesFailOnlyWithDeclaredExceptions() throws IOException {
        List<byte[]> seeds = seeds();
        SplittableRandom r = new SplittableRandom(20240611L);
        Path p = dir.resolve("f.wav");
        double[] buf = new double[64 * 65535];
        for (int k = 0; k < CASES; k++) {
            byte[] b = seeds.get(r.nextInt(seeds.size())).clone();
            switch (r.nextInt(4)) {
                case 0 -> {
                    int flips = 1 + r.nextInt(6);
                    for (int i = 0; i < flips; i++) {
                        b[r.nextInt(b.length)] = (byte) r.nextInt(256);
                    }
                }
                case 1 -> b = Arrays.copyOf(b, r.nextInt(b.length + 1));
                case 2 -> {
                    // an absurd 32-bit value in a header field: sizes, rate, channels, bits
                    int at = r.nextInt(Math.min(b.length, 72) - 3);
                    ByteBuffer.wrap(b).order(ByteOrder.LITTLE_ENDIAN)
                            .putInt(at, r.nextBoolean() ? -1 - r.nextInt(16) : r.nextInt());
                }
                default -> {
                    for (int i = 12; i < b.length; i++) {
                        b[i] = (byte) r.nextInt(256);
                    }
                }
            }
            Files.write(p, b);
            try (WavReader reader = WavReader.open(p)) {
                int perRead = Math.max(1, buf.length / reader.format().channels() / 64);
                while (reader.readFrames(buf, Math.min(perRead, 64)) > 0) {
                    // drain
                }
            } catch (WavFormatException | IOException expected) {
                // fine: a reported, one-line failure
            } catch (RuntimeException e) {
                fail("case " + k + ": " + e, e);
            }
        }
    }
}

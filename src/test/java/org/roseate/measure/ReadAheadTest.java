package org.roseate.measure;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.io.AtomicOutput;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.io.WavFormatException;
import org.roseate.io.WavReader;
import org.roseate.io.WavWriter;

/**
 * {@link ReadAhead} against the reference, {@link WavReader#readFrames} called on the test's own
 * thread: the same blocks in the same order, and the same exception for a file cut short.
 */
class ReadAheadTest {
    @TempDir
    Path dir;

    private Path wav(int frames, int channels) throws IOException {
        double[] x = new double[frames * channels];
        SplittableRandom r = new SplittableRandom(7);
        for (int i = 0; i < x.length; i++) {
            x[i] = r.nextDouble(-0.5, 0.5);
        }
        Path file = dir.resolve("x" + frames + "-" + channels + ".wav");
        try (AtomicOutput out = AtomicOutput.open(file, true)) {
            WavWriter w = new WavWriter(out.stream(), new WavFormat(48000, channels, SampleEncoding.FLOAT_32), frames, 1);
            w.writeFrames(x, frames);
            w.finish();
            out.commit();
        }
        return file;
    }

    @Test
    void givesTheBlocksOfDirectReadsInOrder() throws Exception {
        int block = 1000;
        for (int channels = 1; channels <= 2; channels++) {
            // 10.5 blocks: a short last block
            Path file = wav(10_500, channels);
            try (WavReader direct = WavReader.open(file); WavReader ahead = WavReader.open(file);
                 ReadAhead blocks = new ReadAhead(ahead, block)) {
                double[] expected = new double[block * channels];
                for (int got; (got = direct.readFrames(expected, block)) > 0; ) {
                    double[] b = blocks.next();
                    assertEquals(got, blocks.frames());
                    assertArrayEquals(Arrays.copyOf(expected, got * channels), Arrays.copyOf(b, got * channels));
                }
                assertNull(blocks.next(), "end of data");
            }
        }
    }

    @Test
    void aFileThatShrinksUnderTheReaderGivesTheReadersOwnException() throws Exception {
        String expected;
        Path a = wav(10_000, 1);
        try (WavReader r = WavReader.open(a)) {
            shrink(a);
            double[] buf = new double[1000];
            expected = assertThrows(WavFormatException.class, () -> {
                while (r.readFrames(buf, 1000) > 0) {
                    // read to the cut
                }
            }).getMessage();
        }
        wav(10_000, 1); // the same file again, whole
        try (WavReader r = WavReader.open(a)) {
            shrink(a);
            try (ReadAhead blocks = new ReadAhead(r, 1000)) {
                WavFormatException e = assertThrows(WavFormatException.class, () -> {
                    while (blocks.next() != null) {
                        // read to the cut
                    }
                });
                assertEquals(expected, e.getMessage());
            }
        }
    }

    /** Cuts the file to about a quarter of its samples, as if it shrank while open. */
    private static void shrink(Path file) throws IOException {
        try (var ch = java.nio.channels.FileChannel.open(file, java.nio.file.StandardOpenOption.WRITE)) {
            ch.truncate(ch.size() - 30_000);
        }
    }
}

package org.roseate.hardening;

import com.code_intelligence.jazzer.api.FuzzedDataProvider;
import com.code_intelligence.jazzer.junit.FuzzTest;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.roseate.io.WavFormatException;
import org.roseate.io.WavReader;

/**
 * Fuzzing of the streaming WAV reader (Jazzer). Contract: any bytes in a file give a reader whose
 * frames can all be read, or a {@link WavFormatException} whose message is one line starting with
 * the file's path; no other exception (not even a plain IOException, since the temp file is
 * readable), no hang, memory bounded by the reader's fixed buffer.
 *
 * <p>Without {@code JAZZER_FUZZ} each method runs only its seed corpus under
 * {@code src/test/resources/org/roseate/hardening/WavReaderJazzerTestInputs/<method>/}.
 */
class WavReaderJazzerTest {
    /** The reader's committed reference files (made by src/test/python/gen_wav_reference.py). */
    private static final List<byte[]> VALID = loadValid();
    private static final Path FILE = tempFile();
    private static final double[] BUF = new double[4096 * 64];

    /** Arbitrary bytes as a whole file. */
    @FuzzTest(maxDuration = "5m")
    void arbitraryBytes(byte[] input) throws Throwable {
        Bounded.run(() -> check(input));
    }

    /** A valid file with header fields overwritten, bytes flipped, chunks inserted or the file cut. */
    @FuzzTest(maxDuration = "5m")
    void mutatedValidWav(FuzzedDataProvider data) throws Throwable {
        byte[] b = VALID.get(data.consumeInt(0, VALID.size() - 1)).clone();
        int edits = data.consumeInt(1, 8);
        for (int e = 0; e < edits && b.length > 4; e++) {
            ByteBuffer le = ByteBuffer.wrap(b).order(ByteOrder.LITTLE_ENDIAN);
            // most edits land in the first 80 bytes: RIFF header, fmt chunk, data header
            int hot = Math.min(b.length - 4, 80);
            switch (data.consumeInt(0, 5)) {
                case 0 -> le.putInt(data.consumeInt(0, hot), data.pickValue(new int[] {
                    0, 1, -1, -2, 0x7FFFFFFF, 0x80000000, 3, 8, 16, 22, 40, 0xFFFE, 65535, 48000, data.consumeInt()}));
                case 1 -> le.putShort(data.consumeInt(0, hot), data.pickValue(new short[] {
                    0, 1, 2, 3, 8, 16, 24, 32, 64, -2, -1, (short) 0xFFFE, data.consumeShort()}));
                case 2 -> b[data.consumeInt(0, b.length - 1)] = data.consumeByte();
                case 3 -> b = java.util.Arrays.copyOf(b, data.consumeInt(0, b.length));
                case 4 -> b = insertChunk(b, data);
                default -> {
                    byte[] tag = data.pickValue(new String[] {"RIFF", "RIFX", "RF64", "WAVE", "fmt ", "data", "LIST", "fact", "JUNK"})
                            .getBytes(java.nio.charset.StandardCharsets.US_ASCII);
                    System.arraycopy(tag, 0, b, data.consumeInt(0, b.length - 4), 4);
                }
            }
        }
        byte[] mutated = b;
        Bounded.run(() -> check(mutated));
    }

    private static byte[] insertChunk(byte[] b, FuzzedDataProvider data) {
        int at = Math.min(b.length, 12);
        int size = data.consumeInt(0, 70);
        byte[] body = data.consumeBytes(size);
        ByteBuffer c = ByteBuffer.allocate(8 + body.length + (body.length & 1)).order(ByteOrder.LITTLE_ENDIAN);
        c.put(data.pickValue(new String[] {"fmt ", "data", "LIST", "junk"}).getBytes(java.nio.charset.StandardCharsets.US_ASCII));
        c.putInt(data.consumeBoolean() ? body.length : data.consumeInt());
        c.put(body);
        byte[] out = new byte[b.length + c.capacity()];
        System.arraycopy(b, 0, out, 0, at);
        System.arraycopy(c.array(), 0, out, at, c.capacity());
        System.arraycopy(b, at, out, at + c.capacity(), b.length - at);
        return out;
    }

    private static void check(byte[] bytes) throws IOException {
        Files.write(FILE, bytes);
        try (WavReader r = WavReader.open(FILE)) {
            int channels = r.format().channels();
            int perRead = Math.max(1, BUF.length / channels);
            long total = 0;
            for (int n; (n = r.readFrames(BUF, perRead)) > 0; ) {
                total += n;
            }
            if (total != r.frames()) {
                throw new AssertionError("read " + total + " frames, header promised " + r.frames());
            }
            // frames can never exceed what the bytes hold: memory and time are bounded by the file
            if (total * r.format().bytesPerFrame() > bytes.length) {
                throw new AssertionError(total + " frames cannot fit in " + bytes.length + " bytes");
            }
        } catch (WavFormatException e) {
            Contract.oneLine(e.getMessage(), FILE + ": ", e);
        }
    }

    private static List<byte[]> loadValid() {
        List<byte[]> s = new ArrayList<>();
        for (String name : new String[] {"wave_pcm8_mono", "wave_pcm24_stereo", "scipy_float64_mono",
            "scipy_float32_stereo", "ext_pcm24_6ch", "ext_float32_3ch", "scipy_pcm16_odd_list"}) {
            try (InputStream in = WavReaderJazzerTest.class.getResourceAsStream("/io/" + name + ".wav")) {
                s.add(in.readAllBytes());
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        }
        return s;
    }

    private static Path tempFile() {
        try {
            Path p = Files.createTempFile("roseate-fuzz-", ".wav");
            p.toFile().deleteOnExit();
            return p;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}

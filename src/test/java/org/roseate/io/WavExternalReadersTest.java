package org.roseate.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.File;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import javax.sound.sampled.AudioFileFormat;
import javax.sound.sampled.AudioFormat;
import javax.sound.sampled.AudioInputStream;
import javax.sound.sampled.AudioSystem;
import javax.sound.sampled.UnsupportedAudioFileException;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Files from {@link WavWriter} read by two independent readers: the JDK's Java Sound WAVE readers
 * (test code only; the io package itself uses no Java Sound) and scipy.io.wavfile.read (scipy
 * 1.17.1), run through python3.
 */
class WavExternalReadersTest {
    private static final int FRAMES = 9;

    @TempDir
    Path dir;

    private record Case(SampleEncoding encoding, int channels, int rateHz) {
        String fileName() {
            return encoding.label() + "_" + channels + "ch_" + rateHz + ".wav";
        }
    }

    private static List<Case> cases() {
        List<Case> all = new ArrayList<>();
        int rate = 44100;
        for (SampleEncoding e : SampleEncoding.values()) {
            for (int ch : new int[] {1, 2, 6}) {
                all.add(new Case(e, ch, rate));
                rate = rate == 44100 ? 48000 : rate == 48000 ? 96000 : 44100;
            }
        }
        return all;
    }

    private double[] write(Case c) throws IOException {
        WavFormat f = new WavFormat(c.rateHz(), c.channels(), c.encoding());
        double[] x = WavTestSupport.exactSamples(c.encoding(), FRAMES * c.channels(),
                c.fileName().hashCode());
        WavTestSupport.writeTemp(dir, c.fileName(), WavTestSupport.wavBytes(f, x));
        return x;
    }

    @Test
    void javaSoundReadsEveryLayoutWithTheSamples()
            throws IOException, UnsupportedAudioFileException {
        for (Case c : cases()) {
            double[] x = write(c);
            File file = dir.resolve(c.fileName()).toFile();
            AudioFileFormat aff = AudioSystem.getAudioFileFormat(file);
            AudioFormat af = aff.getFormat();
            String what = c.fileName();
            assertEquals(AudioFileFormat.Type.WAVE, aff.getType(), what);
            assertEquals(c.rateHz(), af.getSampleRate(), 0.0, what);
            assertEquals(c.channels(), af.getChannels(), what);
            assertEquals(c.encoding().bitsPerSample(), af.getSampleSizeInBits(), what);
            assertEquals(FRAMES, aff.getFrameLength(), what);
            AudioFormat.Encoding expected = c.encoding().isFloat() ? AudioFormat.Encoding.PCM_FLOAT
                    : c.encoding() == SampleEncoding.PCM_8 ? AudioFormat.Encoding.PCM_UNSIGNED
                    : AudioFormat.Encoding.PCM_SIGNED;
            assertEquals(expected, af.getEncoding(), what);
            byte[] raw;
            try (AudioInputStream in = AudioSystem.getAudioInputStream(file)) {
                raw = in.readAllBytes();
            }
            assertEquals(FRAMES * c.channels() * c.encoding().bytesPerSample(), raw.length, what);
            for (int i = 0; i < x.length; i++) {
                assertEquals(x[i], decodeLittleEndian(raw, i, c.encoding()), 0.0, what + " #" + i);
            }
        }
    }

    /** Independent decode of Java Sound's raw little-endian bytes, by the WAV sample rules. */
    private static double decodeLittleEndian(byte[] raw, int index, SampleEncoding e) {
        ByteBuffer b = ByteBuffer.wrap(raw).order(ByteOrder.LITTLE_ENDIAN);
        int at = index * e.bytesPerSample();
        return switch (e) {
            case PCM_8 -> ((raw[at] & 0xFF) - 128) / 128.0;
            case PCM_16 -> b.getShort(at) / 32768.0;
            case PCM_24 -> (((raw[at + 2]) << 16) | ((raw[at + 1] & 0xFF) << 8) | (raw[at] & 0xFF))
                    / 8388608.0;
            case PCM_32 -> b.getInt(at) / 2147483648.0;
            case FLOAT_32 -> b.getFloat(at);
            case FLOAT_64 -> b.getDouble(at);
        };
    }

    @Test
    void scipyReadsEveryLayoutWithRateChannelsDtypeAndSamples()
            throws IOException, InterruptedException {
        List<Case> cases = cases();
        List<double[]> written = new ArrayList<>();
        for (Case c : cases) {
            written.add(write(c));
        }
        // Prints one line per file: rate, channels, frames, dtype, then samples normalised the
        // way WavReader documents (codes / 2^(bits−1) with scipy's left-justified 24-bit in int32,
        // 8-bit as (code − 128) / 128), as 17-digit decimals.
        String script = String.join("\n",
                "import sys, warnings, numpy as np",
                "warnings.simplefilter('error')",
                "from scipy.io import wavfile",
                "for name in sys.argv[1:]:",
                "    rate, d = wavfile.read(name)",
                "    d2 = d if d.ndim == 2 else d[:, None]",
                "    if d.dtype == np.uint8: x = (d2.astype(float) - 128) / 128",
                "    elif d.dtype.kind == 'i': x = d2.astype(float) / -np.iinfo(d.dtype).min",
                "    else: x = d2.astype(float)",
                "    print(rate, d2.shape[1], d2.shape[0], d.dtype.name,",
                "          ' '.join('%.17g' % v for v in x.ravel()))");
        List<String> cmd = new ArrayList<>(List.of("python3", "-c", script));
        for (Case c : cases) {
            cmd.add(dir.resolve(c.fileName()).toString());
        }
        List<String> lines = runPython(cmd);
        assertEquals(cases.size(), lines.size(), String.join("\n", lines));
        for (int k = 0; k < cases.size(); k++) {
            Case c = cases.get(k);
            String[] f = lines.get(k).trim().split(" ");
            String what = c.fileName() + ": " + lines.get(k);
            assertEquals(c.rateHz(), Integer.parseInt(f[0]), what);
            assertEquals(c.channels(), Integer.parseInt(f[1]), what);
            assertEquals(FRAMES, Integer.parseInt(f[2]), what);
            // scipy's dtypes: uint8, int16, int32 (24-bit left-justified), int32, float32, float64
            String dtype = switch (c.encoding()) {
                case PCM_8 -> "uint8";
                case PCM_16 -> "int16";
                case PCM_24, PCM_32 -> "int32";
                case FLOAT_32 -> "float32";
                case FLOAT_64 -> "float64";
            };
            assertEquals(dtype, f[3], what);
            double[] x = written.get(k);
            assertEquals(x.length, f.length - 4, what);
            for (int i = 0; i < x.length; i++) {
                assertEquals(x[i], Double.parseDouble(f[4 + i]), 0.0, what + " #" + i);
            }
        }
    }

    /** Runs python3; skips the test (not fails) where python3 with scipy is missing. */
    static List<String> runPython(List<String> cmd) throws IOException, InterruptedException {
        Process p;
        try {
            p = new ProcessBuilder(cmd).redirectErrorStream(true).start();
        } catch (IOException e) {
            Assumptions.assumeTrue(false, "python3 not available: " + e.getMessage());
            throw e;
        }
        String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        assertTrue(p.waitFor(60, TimeUnit.SECONDS), "python3 timed out");
        Assumptions.assumeFalse(out.contains("ModuleNotFoundError"), "scipy not available");
        assertEquals(0, p.exitValue(), out);
        return out.lines().filter(s -> !s.isBlank()).toList();
    }
}

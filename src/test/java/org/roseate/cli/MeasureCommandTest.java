package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.ByteArrayOutputStream;
import java.io.OutputStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.random.RandomGenerator;
import java.util.random.RandomGeneratorFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.io.WavWriter;

class MeasureCommandTest {
    private static final int FS = 48000;

    @TempDir
    Path dir;

    record Run(int status, String out, String err) {
    }

    static Run run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int status = RoseateCommand.run(new PrintWriter(out), new PrintWriter(err), args);
        return new Run(status, out.toString(), err.toString());
    }

    private Path wav(String name, int rate, SampleEncoding enc, double[]... channels) throws Exception {
        int frames = channels[0].length;
        double[] inter = new double[frames * channels.length];
        for (int i = 0; i < frames; i++) {
            for (int c = 0; c < channels.length; c++) {
                inter[i * channels.length + c] = channels[c][i];
            }
        }
        Path p = dir.resolve(name);
        try (OutputStream o = Files.newOutputStream(p)) {
            WavWriter w = WavWriter.withoutDither(o, new WavFormat(rate, channels.length, enc), frames);
            w.writeFrames(inter, frames);
            w.finish();
        }
        return p;
    }

    private static double[] noise(long seed, int n, double sigma) {
        RandomGenerator r = RandomGeneratorFactory.<RandomGenerator>of("L64X128MixRandom").create(seed);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = sigma * r.nextGaussian();
        }
        return x;
    }

    /** One-pole low-pass y[n] = (1 − a)·x[n] + a·y[n−1], written out. */
    private static double[] onePole(double a, double[] x) {
        double[] y = new double[x.length];
        double prev = 0;
        for (int i = 0; i < x.length; i++) {
            prev = (1 - a) * x[i] + a * prev;
            y[i] = prev;
        }
        return y;
    }

    /** 20·log10|H| of that filter at hz: H = (1 − a)/(1 − a·e^{−jω}) (closed form). */
    private static double onePoleDb(double a, double hz) {
        double w = 2 * Math.PI * hz / FS;
        double re = 1 - a * Math.cos(w);
        double im = a * Math.sin(w);
        return 20 * Math.log10((1 - a) / Math.hypot(re, im));
    }

    @Test
    void noiseModeJsonReadsWhiteNoiseLevelsWithinTheirUncertainty() throws Exception {
        double sigma = 0.05;
        Path f = wav("white.wav", FS, SampleEncoding.FLOAT_32, noise(1, 3 * FS, sigma));
        Run r = run("measure", f.toString(), "--bands", "octave", "--range", "125-8000", "--format", "json", "--slope", "white");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        assertEquals(8192, j.get("segmentLength").asInt(), "8 bins in the 125 Hz octave band: 8·48000/88.4 → 2^13");
        BandTable table = BandTable.of(BandFraction.OCTAVE, 125, 8000);
        assertEquals(table.size(), j.get("bands").size());
        for (int i = 0; i < table.size(); i++) {
            JsonNode b = j.get("bands").get(i);
            for (String key : new String[] {"nominalHz", "lowHz", "highHz", "db", "uncertaintyDb", "deviationDb"}) {
                assertTrue(b.has(key), key);
            }
            assertEquals(table.band(i).lowHz(), b.get("lowHz").asDouble(), 0.0, "IEC 61260-1 edges from BandTable");
            // white noise of variance σ² has density σ²/(fs/2), so a band of width B reads 10·log10(2σ²B/(fs/2)) dBFS
            double expected = 10 * Math.log10(2 * sigma * sigma * table.band(i).widthHz() / (FS / 2.0));
            double u = b.get("uncertaintyDb").asDouble();
            // 4 standard deviations (as stated by the command) plus float32 rounding (1e-7 relative, negligible)
            assertEquals(expected, b.get("db").asDouble(), 4 * u, table.band(i).label());
        }
        // the slope is that of the density the bands imply (level minus 10·log10 of the band width): white
        // noise is flat, 0 dB/octave, although its band levels rise 3.01 dB per octave; 0.1 dB/octave is
        // about 4σ of the least-squares slope over these band uncertainties
        assertEquals(0, j.get("slopeDbPerOctave").asDouble(), 0.1);
    }

    @Test
    void fullScaleSineReadsZeroDbfs() throws Exception {
        double[] x = new double[3 * FS];
        for (int i = 0; i < x.length; i++) {
            x[i] = Math.sin(2 * Math.PI * 997 * i / FS);
        }
        Path f = wav("sine.wav", FS, SampleEncoding.FLOAT_32, x);
        Run r = run("measure", f.toString(), "--range", "100-10000", "--format", "json");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        for (JsonNode b : j.get("bands")) {
            if (b.get("nominalHz").asDouble() == 1000) {
                // AES17: full-scale sine = 0 dBFS; ±0.01 dB as the issue asks
                assertEquals(0.0, b.get("db").asDouble(), 0.01);
            }
        }
        Run volts = run("measure", f.toString(), "--range", "100-10000", "--format", "csv", "--volts-per-fs", "2");
        assertEquals(0, volts.status(), volts.err());
        String row = Arrays.stream(volts.out().split("\n")).filter(l -> l.startsWith("1000.0,")).findFirst().orElseThrow();
        // 2 V peak is √2 V rms: 20·log10(√2) = 3.01 dBV (closed form)
        assertEquals(10 * Math.log10(2), Double.parseDouble(row.split(",")[3]), 0.01);
        Run table = run("measure", f.toString(), "--range", "100-10000");
        assertEquals(0, table.status(), table.err());
        assertTrue(table.out().contains("dBFS"));
    }

    @Test
    void transferModeRecoversAFilterAndCalibrationDividesTheChainOut() throws Exception {
        double[] x = noise(2, 4 * FS, 0.2);
        double a = 0.9; // corner near 800 Hz
        double[] chainOut = new double[x.length];
        for (int i = 0; i < x.length; i++) {
            chainOut[i] = 0.5 * x[i]; // the "cable" halves the level: −6.02 dB
        }
        Path loop = wav("loop.wav", FS, SampleEncoding.FLOAT_64, x, chainOut);
        Path cal = dir.resolve("cal.json");
        Run saved = run("measure", loop.toString(), "--transfer", "--range", "100-10000", "--save-calibration",
                cal.toString(), "--freqs", "1000", "--format", "json", "--volts-per-fs", "1.25");
        assertEquals(0, saved.status(), saved.err());
        JsonNode sj = new ObjectMapper().readTree(saved.out());
        assertEquals(20 * Math.log10(0.5), sj.get("response").get(0).get("db").asDouble(), 1e-9, "H = 0.5 exactly");
        assertTrue(Files.exists(cal));
        double[] y = onePole(a, x);
        for (int i = 0; i < y.length; i++) {
            y[i] *= 0.5;
        }
        // response on channel 1, reference on channel 2
        Path dev = wav("device.wav", FS, SampleEncoding.FLOAT_64, y, x);
        Run r = run("measure", dev.toString(), "--transfer", "--reference-channel", "2", "--range", "100-10000",
                "--calibration", cal.toString(), "--freqs", "100,1000,5000", "--format", "json");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        assertTrue(j.get("calibrated").asBoolean());
        assertEquals(3, j.get("response").size());
        for (JsonNode p : j.get("response")) {
            double hz = p.get("hz").asDouble();
            // 0.05 dB where coherence ≈ 1 (the bound); the chain's 0.5 is divided out
            assertEquals(onePoleDb(a, hz), p.get("db").asDouble(), 0.05, hz + " Hz");
            assertTrue(p.get("coherence").asDouble() > 0.999);
            assertTrue(p.get("trusted").asBoolean());
            for (String key : new String[] {"hz", "db", "deg", "coherence"}) {
                assertTrue(p.has(key));
            }
        }
        assertTrue(j.has("bands") && j.has("slopeDbPerOctave"));
        Run csv = run("measure", dev.toString(), "--transfer", "--reference-channel", "2", "--range", "100-10000",
                "--format", "csv");
        assertEquals(0, csv.status(), csv.err());
        assertTrue(csv.out().startsWith("hz,db,uncertaintyDb,deg,uncertaintyDeg,coherence,trusted,targetDb,modelDb\r\n"), csv.out());
        Run t = run("measure", dev.toString(), "--transfer", "--reference-channel", "2", "--range", "100-10000",
                "--against", "presets/bench-pink.json");
        assertEquals(0, t.status(), t.err());
        assertTrue(t.out().contains("model dB"));

        Path other = wav("other-rate.wav", 44100, SampleEncoding.FLOAT_32, Arrays.copyOf(x, 44100), Arrays.copyOf(x, 44100));
        Run mismatch = run("measure", other.toString(), "--transfer", "--calibration", cal.toString());
        assertEquals(2, mismatch.status());
        assertEquals("roseate: " + cal + ": calibration was made at 48000 Hz, the capture is 44100 Hz\n", mismatch.err());
    }

    @Test
    void noiseModeAgainstADesign() throws Exception {
        Path f = wav("n.wav", FS, SampleEncoding.PCM_24, noise(3, 2 * FS, 0.05));
        Run r = run("measure", f.toString(), "--bands", "octave", "--range", "125-8000", "--against",
                "presets/bench-pink.json", "--format", "json");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        double sum = 0;
        for (JsonNode b : j.get("bands")) {
            assertTrue(b.get("counted").asBoolean(), "white noise: every band counts");
            double u = b.get("uncertaintyDb").asDouble();
            sum += b.get("designDifferenceDb").asDouble() / (u * u);
        }
        // shape comparison: the inverse-variance weighted mean difference is removed, so the weighted
        // differences sum to zero (Σ wᵢ(dᵢ − m) = 0 by the definition of the weighted mean; rounding only)
        assertEquals(0.0, sum, 1e-6);
        assertTrue(j.get("designOffsetDb").isNumber());
    }

    private static byte[] header(int tag, int channels, int rate, int bits, int dataBytes) {
        ByteBuffer b = ByteBuffer.allocate(44 + dataBytes).order(ByteOrder.LITTLE_ENDIAN);
        b.put("RIFF".getBytes()).putInt(36 + dataBytes).put("WAVE".getBytes());
        b.put("fmt ".getBytes()).putInt(16).putShort((short) tag).putShort((short) channels).putInt(rate)
                .putInt(rate * channels * bits / 8).putShort((short) (channels * bits / 8)).putShort((short) bits);
        b.put("data".getBytes()).putInt(dataBytes);
        return b.array();
    }

    @Test
    void badFilesGiveOneLineAndStatusTwo() throws Exception {
        Path good = wav("good.wav", FS, SampleEncoding.PCM_16, noise(4, FS, 0.1), noise(5, FS, 0.1));
        byte[] bytes = Files.readAllBytes(good);
        Path truncated = Files.write(dir.resolve("truncated.wav"), Arrays.copyOf(bytes, bytes.length / 2));
        Path text = Files.writeString(dir.resolve("text.wav"), "hello, not audio\n");
        Path empty = Files.write(dir.resolve("empty.wav"), new byte[0]);
        Path adpcm = Files.write(dir.resolve("adpcm.wav"), header(2, 1, FS, 4, 100));
        Path shortFile = wav("short.wav", FS, SampleEncoding.PCM_16, noise(6, 1000, 0.1));
        Object[][] cases = {
            {new String[] {"measure", truncated.toString()}, truncated + ": truncated"},
            {new String[] {"measure", text.toString()}, text + ": not a WAV file"},
            {new String[] {"measure", empty.toString()}, empty + ": empty file"},
            {new String[] {"measure", adpcm.toString()}, adpcm + ": unsupported encoding"},
            {new String[] {"measure", good.toString(), "--channel", "3"}, good + ": channel 3 is out of range; the source has 2 channels"},
            {new String[] {"measure", good.toString(), "--transfer", "--reference-channel", "0"}, "--reference-channel 0: channels count from 1"},
            {new String[] {"measure", good.toString(), "--transfer", "--reference-channel", "3"}, good + ": reference channel 3 is out of range; the source has 2 channels"},
            {new String[] {"measure", good.toString(), "--transfer", "--bank"}, "--bank reads noise-source band levels; leave out --transfer"},
            {new String[] {"measure", dir.resolve("nope.wav").toString()}, dir.resolve("nope.wav") + ": no such file"},
            {new String[] {"measure", shortFile.toString()}, shortFile + ": the capture is 0.02 s (1000 frames), shorter than one analysis segment of 131072 frames"},
            {new String[] {"measure", good.toString(), "--save-calibration", "c.json"}, "--save-calibration needs --transfer"},
            {new String[] {"measure", good.toString(), "--segment", "1001"}, "segment length: expected an even number"},
            {new String[] {"measure", good.toString(), "--calibration", text.toString()}, text + ": invalid JSON"},
        };
        for (Object[] c : cases) {
            String[] args = (String[]) c[0];
            Run r = run(args);
            assertEquals(2, r.status(), String.join(" ", args) + " → " + r.err());
            assertTrue(r.err().startsWith("roseate: " + c[1]), r.err());
            assertEquals(1, r.err().strip().split("\n").length, "one line: " + r.err());
            assertFalse(r.err().contains("Exception"), r.err());
        }
        Run mono = run("measure", shortFile.toString(), "--transfer", "--segment", "256");
        assertEquals(2, mono.status());
        assertEquals("roseate: " + shortFile + ": a transfer measurement needs two channels (reference and response); the source has 1\n", mono.err());
    }
}

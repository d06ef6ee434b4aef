package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.random.RandomGenerator;
import java.util.random.RandomGeneratorFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.io.WavWriter;

/** Input integrity through the real command line: silence, NaN, clipping, flat tops and DC. */
class MeasureIntegrityTest {
    private static final int FS = 48000;

    @TempDir
    Path dir;

    private Path wav(String name, SampleEncoding enc, double[] x) throws Exception {
        Path p = dir.resolve(name);
        try (OutputStream o = Files.newOutputStream(p)) {
            WavWriter w = WavWriter.withoutDither(o, new WavFormat(FS, 1, enc), x.length);
            w.writeFrames(x, x.length);
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

    @Test
    void silenceIsRefusedAsNoSignal() throws Exception {
        Path zero = wav("zero.wav", SampleEncoding.PCM_16, new double[3 * FS]);
        MeasureCommandTest.Run r = MeasureCommandTest.run("measure", zero.toString());
        assertEquals(2, r.status());
        assertEquals("roseate: " + zero + ": no signal: channel 1 is all zero\n", r.err());
        assertEquals("", r.out());
        // −150 dBFS RMS in float: σ = 10^(−150/20)/√2, since a full-scale sine (RMS 1/√2) is 0 dBFS (AES17)
        Path faint = wav("faint.wav", SampleEncoding.FLOAT_32, noise(7, 3 * FS, Math.pow(10, -150 / 20.0) / Math.sqrt(2)));
        MeasureCommandTest.Run f = MeasureCommandTest.run("measure", faint.toString(), "--format", "json");
        assertEquals(2, f.status());
        assertTrue(f.err().startsWith("roseate: " + faint + ": no signal: channel 1 is at -150.0 dBFS RMS, below -140 dBFS"), f.err());
        assertEquals(1, f.err().strip().split("\n").length);
        // in transfer mode a silent reference is refused the same way
        Path two = dir.resolve("two.wav");
        double[] n = noise(8, 3 * FS, 0.1);
        double[] inter = new double[2 * n.length];
        for (int i = 0; i < n.length; i++) {
            inter[2 * i + 1] = n[i];
        }
        try (OutputStream o = Files.newOutputStream(two)) {
            WavWriter w = WavWriter.withoutDither(o, new WavFormat(FS, 2, SampleEncoding.PCM_24), n.length);
            w.writeFrames(inter, n.length);
            w.finish();
        }
        MeasureCommandTest.Run t = MeasureCommandTest.run("measure", two.toString(), "--transfer", "--range", "100-10000");
        assertEquals(2, t.status());
        assertEquals("roseate: " + two + ": no signal: channel 1 is all zero\n", t.err());
    }

    @Test
    void aNotANumberSampleIsRefusedNamingItsTime() throws Exception {
        double[] x = noise(9, 3 * FS, 0.1);
        x[24000] = Double.NaN;
        x[30000] = Double.POSITIVE_INFINITY;
        Path f = wav("nan.wav", SampleEncoding.FLOAT_32, x);
        MeasureCommandTest.Run r = MeasureCommandTest.run("measure", f.toString());
        assertEquals(2, r.status());
        // frame 24000 at 48 kHz is 24000/48000 = 0.5 s from the start (closed form); the first bad one is named
        assertEquals("roseate: " + f + ": sample 24001 of channel 1 (at 0.500000 s) is NaN; a capture must hold finite numbers\n",
                r.err());
        x[24000] = 0;
        Path g = wav("inf.wav", SampleEncoding.FLOAT_64, x);
        MeasureCommandTest.Run s = MeasureCommandTest.run("measure", g.toString());
        assertEquals(2, s.status());
        assertTrue(s.err().contains("sample 30001 of channel 1 (at 0.625000 s) is +infinity"), s.err());
    }

    @Test
    void clippingIsCountedWarnedAndMarked() throws Exception {
        // Gaussian noise with σ = 0.5 FS clipped by the 16-bit converter: P(|x| ≥ 1) = 2·Q(2) = 0.0455003
        // (scipy.stats.norm.sf(2)·2, scipy 1.17); within one code adds 2·φ(2)·(1.5 codes)/σ ≈ 1e-5, negligible
        int n = 3 * FS;
        double[] x = noise(10, n, 0.5);
        for (int i = 0; i < n; i++) {
            x[i] = Math.max(-1, Math.min(1, x[i]));
        }
        Path f = wav("clipped.wav", SampleEncoding.PCM_16, x);
        MeasureCommandTest.Run r = MeasureCommandTest.run("measure", f.toString(), "--format", "json");
        assertEquals(0, r.status(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        long clipped = j.get("clippedSamples").asLong();
        double expected = 0.0455003 * n;
        // binomial standard deviation √(n·p·(1 − p)) = 79 samples; 4σ
        assertEquals(expected, clipped, 4 * Math.sqrt(n * 0.0455003 * (1 - 0.0455003)));
        assertTrue(r.err().startsWith("roseate: warning: " + f + ": channel 1 has " + clipped + " clipped or flat-topped samples"),
                r.err());
        assertTrue(j.get("warnings").get(0).asText().contains(clipped + " clipped"));

        // a clip before the converter: flat tops at ±0.5 FS in a 24-bit file, σ = 0.25 → the same 2·Q(2) share
        double[] y = noise(11, n, 0.25);
        for (int i = 0; i < n; i++) {
            y[i] = Math.max(-0.5, Math.min(0.5, y[i]));
        }
        Path g = wav("flat.wav", SampleEncoding.PCM_24, y);
        MeasureCommandTest.Run s = MeasureCommandTest.run("measure", g.toString(), "--format", "json");
        assertEquals(0, s.status(), s.err());
        long flat = new ObjectMapper().readTree(s.out()).get("clippedSamples").asLong();
        // both rails sit at the same magnitude 0.5 (exact in 24 bits), so both count
        assertEquals(expected, flat, 4 * Math.sqrt(n * 0.0455003 * (1 - 0.0455003)));

        // the same noise unclipped at 24 bits: no sample at full scale, its peak value held once
        double[] clean = noise(12, n, 0.1);
        Path h = wav("clean.wav", SampleEncoding.PCM_24, clean);
        MeasureCommandTest.Run c = MeasureCommandTest.run("measure", h.toString(), "--format", "json");
        assertEquals(0, c.status(), c.err());
        assertEquals(0, new ObjectMapper().readTree(c.out()).get("clippedSamples").asLong());
        assertEquals("", c.err());
    }

    @Test
    void dcOffsetAndRmsAreReportedAndDoNotMoveTheBands() throws Exception {
        int n = 3 * FS;
        double[] x = noise(13, n, 0.05);
        double[] shifted = x.clone();
        for (int i = 0; i < n; i++) {
            shifted[i] += 0.1;
        }
        Path a = wav("plain.wav", SampleEncoding.FLOAT_32, x);
        Path b = wav("dc.wav", SampleEncoding.FLOAT_32, shifted);
        JsonNode ja = new ObjectMapper().readTree(MeasureCommandTest.run("measure", a.toString(), "--format", "json").out());
        MeasureCommandTest.Run rb = MeasureCommandTest.run("measure", b.toString(), "--format", "json");
        assertEquals(0, rb.status(), rb.err());
        JsonNode jb = new ObjectMapper().readTree(rb.out());
        // mean of N(0.1, 0.05²): standard error 0.05/√n = 1.3e-4; 4 of them
        assertEquals(0.1, jb.get("dcOffsetFs").asDouble(), 4 * 0.05 / Math.sqrt(n));
        // RMS with DC: √(0.1² + 0.05²), in dBFS 10·log10(2·(0.01 + 0.0025)) = −16.02 dBFS (AES17); the
        // sample variance's relative error √(2/n) = 0.4 % of 0.0025 moves it by under 0.01 dB
        assertEquals(10 * Math.log10(2 * (0.01 + 0.0025)), jb.get("rmsDbfs").asDouble(), 0.01);
        // Welch with constant detrend removes each segment's mean before the window (scipy.signal.welch,
        // detrend='constant'), so the bands read the same; float32 rounding of the shifted samples only
        for (int i = 0; i < ja.get("bands").size(); i++) {
            assertEquals(ja.get("bands").get(i).get("db").asDouble(), jb.get("bands").get(i).get("db").asDouble(), 1e-3);
        }
        MeasureCommandTest.Run t = MeasureCommandTest.run("measure", b.toString());
        assertTrue(t.out().matches("(?s).*DC offset \\+0\\.(100|0999).*"), t.out());
    }

    @Test
    void aCaptureTooShortForTheLowestBandSaysWhichBand() throws Exception {
        Path f = wav("short.wav", SampleEncoding.PCM_16, noise(14, FS, 0.1));
        MeasureCommandTest.Run r = MeasureCommandTest.run("measure", f.toString(), "--bands", "octave", "--range", "16-16000");
        assertEquals(2, r.status());
        // 8 bins in the 16 Hz octave band (11.0–22.4 Hz, 11.4 Hz wide): n ≥ 8·48000/11.4 → 2^16 (BandLevels)
        assertTrue(r.err().startsWith("roseate: " + f + ": the capture is 1.00 s (48000 frames), shorter than one analysis "
                + "segment of 65536 frames (1.37 s) that the 16 Hz band needs"), r.err());
    }
}

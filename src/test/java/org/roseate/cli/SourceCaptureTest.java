package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Random;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.io.SampleEncoding;
import org.roseate.io.WavFormat;
import org.roseate.io.WavWriter;

/**
 * {@code budget --source-capture}: d and fc of S(f) = d²(1 + fc/f) recovered from a synthetic capture of
 * a bare source made here, by code independent of the project's noise and spectrum packages: seeded
 * Gaussian spectral lines X_k = √(N·fs·S(f_k)/4)·(g₁ + i·g₂), so that E|X_k|² = N·fs·S(f_k)/2 (Parseval
 * for a one-sided density), and one inverse FFT (a radix-2 Cooley–Tukey written here) over the whole
 * record, written as 32-bit float at a known volts per full scale.
 */
class SourceCaptureTest {
    static final double D = 150e-6;
    static final double FC = 250;
    static final int RATE = 16000;
    static final int LOG2_FRAMES = 20;
    static final double VOLTS_PER_FS = 0.2;

    @TempDir
    static Path dir;
    static Path capture;

    @BeforeAll
    static void writeCapture() throws IOException {
        capture = dir.resolve("junction.wav");
        write(capture, D, FC, RATE, LOG2_FRAMES, VOLTS_PER_FS, 77);
    }

    /**
     * The fit recovers d and fc within four of its own standard deviations (a false failure under 1e-4),
     * and those are small enough to matter: a 65 s record gives the 10 Hz third-octave band a relative
     * error of 1/√(B·T) ≈ 8 % and the bands above 1 kHz under 1 %, so d (set by the many white bands) is
     * expected within about 0.5 % and fc (set by the few bands below it) within about 5 %; the test asks
     * for ± below 1 % and 10 %.
     */
    @Test
    void budgetRecoversTheSourceFromItsCapture() throws Exception {
        var r = AnalyzeCommandTest.run("budget", "presets/random-voltage.json", "--range", "0.4-45", "--source-capture",
                capture.toString(), "--volts-per-fs", Double.toString(VOLTS_PER_FS), "--format", "json");
        assertEquals(0, r.status(), r.err());
        JsonNode f = new ObjectMapper().readTree(r.out()).get("sourceFit");
        double d = f.get("densityVPerRtHz").asDouble();
        double dSigma = f.get("densitySigma").asDouble();
        double fc = f.get("flickerCornerHz").asDouble();
        double fcSigma = f.get("flickerCornerSigmaHz").asDouble();
        assertTrue(dSigma > 0 && dSigma < 0.01 * D, "± of d: " + dSigma);
        assertTrue(fcSigma > 0 && fcSigma < 0.1 * FC, "± of fc: " + fcSigma);
        assertEquals(D, d, 4 * dSigma, "d");
        assertEquals(FC, fc, 4 * fcSigma, "fc");
        System.out.printf("fit: d = %.5g ± %.2g (true %.5g), fc = %.4g ± %.2g (true %.4g), chi2/dof %.2f, %d bands%n", d,
                dSigma, D, fc, fcSigma, FC, f.get("chiSquarePerDof").asDouble(), f.get("bands").asInt());

        var t = AnalyzeCommandTest.run("budget", "presets/random-voltage.json", "--range", "0.4-45", "--source-capture",
                capture.toString(), "--volts-per-fs", Double.toString(VOLTS_PER_FS));
        assertEquals(0, t.status(), t.err());
        assertTrue(t.out().contains("Source: fitted to junction.wav: d = "), t.out());
    }

    /** render takes the fitted source too: its volts follow the capture, not the design file's source. */
    @Test
    void renderUsesTheFittedSource() throws Exception {
        Path out = dir.resolve("fitted.csv");
        var r = AnalyzeCommandTest.run("render", "presets/random-voltage.json", "--control-rate", "100", "--seconds", "30",
                "-o", out.toString(), "--source-capture", capture.toString(), "--source-volts-per-fs",
                Double.toString(VOLTS_PER_FS));
        assertEquals(0, r.status(), r.err());
        assertTrue(r.out().contains("Source: fitted to junction.wav: d = "), r.out());
        java.util.regex.Matcher m = java.util.regex.Pattern.compile("white, 1/f corner ([0-9.]+) Hz").matcher(r.out());
        assertTrue(m.find(), r.out());
        // the render uses the capture's corner (about 250 Hz), not the design file's 120 Hz
        assertEquals(FC, Double.parseDouble(m.group(1)), 0.1 * FC, r.out());
        var refused = AnalyzeCommandTest.run("render", "presets/random-voltage.json", "--control-rate", "100", "-o",
                dir.resolve("x.csv").toString(), "--source-volts-per-fs", "1");
        assertEquals(2, refused.status());
        assertTrue(refused.err().startsWith("roseate: --source-volts-per-fs needs --source-capture"), refused.err());
    }

    @Test
    void aCaptureWithoutVoltsIsRefused() {
        var r = AnalyzeCommandTest.run("budget", "presets/random-voltage.json", "--source-capture", capture.toString());
        assertEquals(2, r.status());
        assertTrue(r.err().startsWith("roseate: --source-capture needs volts"), r.err());
        assertEquals(1, r.err().strip().lines().count());
        var v = AnalyzeCommandTest.run("budget", "presets/random-voltage.json", "--volts-per-fs", "1");
        assertEquals(2, v.status());
        assertTrue(v.err().startsWith("roseate: --volts-per-fs needs --source-capture"), v.err());
        assertFalse(v.err().contains("Exception"));
    }

    /** Writes a capture of S(f) = d²(1 + fc/f) (no DC line), float, at {@code voltsPerFs} V per full scale. */
    static void write(Path file, double d, double fc, int rate, int log2Frames, double voltsPerFs, long seed)
            throws IOException {
        int n = 1 << log2Frames;
        double[] re = new double[n];
        double[] im = new double[n];
        Random rnd = new Random(seed);
        for (int k = 1; k < n / 2; k++) {
            double f = (double) k * rate / n;
            double a = Math.sqrt(n * (double) rate * d * d * (1 + fc / f) / 4);
            re[k] = a * rnd.nextGaussian();
            im[k] = a * rnd.nextGaussian();
            re[n - k] = re[k];
            im[n - k] = -im[k];
        }
        fft(re, im);
        double[] frames = new double[n];
        for (int i = 0; i < n; i++) {
            frames[i] = re[i] / n / voltsPerFs;
        }
        try (OutputStream out = Files.newOutputStream(file)) {
            WavWriter w = WavWriter.withoutDither(out, new WavFormat(rate, 1, SampleEncoding.FLOAT_32), n);
            w.writeFrames(frames, n);
            w.finish();
        }
    }

    /** In-place radix-2 FFT with e^{+i…} (unscaled); the caller divides by n for the inverse. */
    static void fft(double[] re, double[] im) {
        int n = re.length;
        for (int i = 1, j = 0; i < n; i++) {
            int bit = n >> 1;
            for (; (j & bit) != 0; bit >>= 1) {
                j ^= bit;
            }
            j ^= bit;
            if (i < j) {
                double t = re[i];
                re[i] = re[j];
                re[j] = t;
                t = im[i];
                im[i] = im[j];
                im[j] = t;
            }
        }
        for (int len = 2; len <= n; len <<= 1) {
            double ang = 2 * Math.PI / len;
            for (int i = 0; i < n; i += len) {
                for (int k = 0; k < len / 2; k++) {
                    double wr = Math.cos(ang * k);
                    double wi = Math.sin(ang * k);
                    int a = i + k;
                    int b = a + len / 2;
                    double vr = re[b] * wr - im[b] * wi;
                    double vi = re[b] * wi + im[b] * wr;
                    re[b] = re[a] - vr;
                    im[b] = im[a] - vi;
                    re[a] += vr;
                    im[a] += vi;
                }
            }
        }
    }
}

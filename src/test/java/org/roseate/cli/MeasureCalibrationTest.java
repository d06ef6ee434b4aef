package org.roseate.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
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

/**
 * A loopback calibration of a sound card with AC coupling (a one-pole high-pass at 30 Hz) corrects a
 * noise-source reading, and the bands below its −1 dB corner are marked.
 */
class MeasureCalibrationTest {
    private static final int FS = 48000;
    private static final double CORNER_HZ = 30;
    /** a = RC/(RC + Δt) of the one-pole high-pass y[n] = a·(y[n−1] + x[n] − x[n−1]). */
    private static final double A = 1 / (1 + 2 * Math.PI * CORNER_HZ / FS);

    @TempDir
    Path dir;

    private static double[] highPass(double[] x) {
        double[] y = new double[x.length];
        double py = 0;
        double px = 0;
        for (int i = 0; i < x.length; i++) {
            py = A * (py + x[i] - px);
            px = x[i];
            y[i] = py;
        }
        return y;
    }

    /** |H|² = a²·2(1 − cos ω)/(1 − 2a·cos ω + a²), the closed form of that difference equation. */
    private static double highPassMagnitudeSquared(double hz) {
        double w = 2 * Math.PI * hz / FS;
        return A * A * 2 * (1 - Math.cos(w)) / (1 - 2 * A * Math.cos(w) + A * A);
    }

    private static double[] noise(long seed, int n, double sigma) {
        RandomGenerator r = RandomGeneratorFactory.<RandomGenerator>of("L64X128MixRandom").create(seed);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = sigma * r.nextGaussian();
        }
        return x;
    }

    private Path wav(String name, double[]... ch) throws Exception {
        Path p = dir.resolve(name);
        int n = ch[0].length;
        double[] inter = new double[n * ch.length];
        for (int i = 0; i < n; i++) {
            for (int c = 0; c < ch.length; c++) {
                inter[i * ch.length + c] = ch[c][i];
            }
        }
        try (OutputStream o = Files.newOutputStream(p)) {
            WavWriter w = WavWriter.withoutDither(o, new WavFormat(FS, ch.length, SampleEncoding.FLOAT_64), n);
            w.writeFrames(inter, n);
            w.finish();
        }
        return p;
    }

    @Test
    void aLoopbackCalibrationCorrectsNoiseSourceBandsAndMarksThoseBelowItsCorner() throws Exception {
        double[] x = noise(31, 8 * FS, 0.2);
        Path loop = wav("loop.wav", x, highPass(x));
        Path cal = dir.resolve("cal.json");
        MeasureCommandTest.Run saved = MeasureCommandTest.run("measure", loop.toString(), "--transfer", "--save-calibration",
                cal.toString(), "--format", "json");
        assertEquals(0, saved.status(), saved.err());

        double sigma = 0.1;
        Path cap = wav("card.wav", highPass(noise(32, 16 * FS, sigma)));
        MeasureCommandTest.Run raw = MeasureCommandTest.run("measure", cap.toString(), "--slope", "white", "--format", "json");
        MeasureCommandTest.Run fixed = MeasureCommandTest.run("measure", cap.toString(), "--slope", "white", "--format", "json",
                "--calibration", cal.toString());
        assertEquals(0, fixed.status(), fixed.err());
        assertTrue(fixed.err().contains("below the calibration's -1 dB corner"), fixed.err());
        JsonNode j = new ObjectMapper().readTree(fixed.out());
        JsonNode r = new ObjectMapper().readTree(raw.out());
        // the −1 dB corner of the closed form, by bisection: |H|² = 10^(−0.1)
        double lo = 1;
        double hi = 1000;
        for (int k = 0; k < 60; k++) {
            double mid = Math.sqrt(lo * hi);
            if (highPassMagnitudeSquared(mid) < Math.pow(10, -0.1)) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        // the corner is found on the measured loopback, bin by bin: a per-bin error of 0.05 dB (windowed
        // segments make even a noise-free H1 scatter slightly) over the response's slope at the corner,
        // d|H|dB/df = 10/ln10·(2/f − 2f/(f² + fc²)) = 0.030 dB/Hz at 59 Hz, moves it by up to 1.7 Hz
        assertEquals(lo, j.get("calibrationCornerHz").asDouble(), 1.7);
        for (int i = 0; i < j.get("bands").size(); i++) {
            JsonNode b = j.get("bands").get(i);
            double width = b.get("highHz").asDouble() - b.get("lowHz").asDouble();
            // white noise of variance σ² reads 10·log10(2σ²B/(fs/2)) dBFS in a band of width B (closed form)
            double expected = 10 * Math.log10(2 * sigma * sigma * width / (FS / 2.0));
            double u = b.get("uncertaintyDb").asDouble();
            // 4 standard deviations, plus 0.05 dB for the loopback estimate (γ² = 1, leakage bias only)
            assertEquals(expected, b.get("db").asDouble(), 4 * u + 0.05, b.get("nominalHz").asText());
            boolean below = b.get("lowHz").asDouble() < j.get("calibrationCornerHz").asDouble();
            assertEquals(below, b.get("belowCalibrationCorner").asBoolean(), b.get("nominalHz").asText());
            assertEquals(!below, b.get("counted").asBoolean());
        }
        // uncorrected, the 20 Hz band lies under the card's high-pass: |H(20 Hz)|² = 0.31, −5 dB (closed form)
        double rawLow = r.get("bands").get(0).get("db").asDouble();
        double fixedLow = j.get("bands").get(0).get("db").asDouble();
        assertEquals(10 * Math.log10(highPassMagnitudeSquared(20)), rawLow - fixedLow, 0.3);
        assertFalse(r.get("calibrated").asBoolean());
        assertTrue(j.get("calibrated").asBoolean());
    }
}

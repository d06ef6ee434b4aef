package org.roseate.spectrum;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import org.junit.jupiter.api.Test;

class WelchEstimatorTest {
    private static SpectralDensity estimate(double[] x, double fs, WelchSettings s, int block) {
        WelchEstimator e = new WelchEstimator();
        e.prepare(fs, s);
        for (int i = 0; i < x.length; i += block) {
            e.accept(x, i, Math.min(block, x.length - i));
        }
        return e.snapshot();
    }

    @Test
    void densityMatchesScipyWelch() {
        JsonNode ref = SpectrumReference.welch();
        double fs = ref.get("sampleRateHz").asDouble();
        double[] x = SpectrumReference.doubles(ref.get("x"));
        for (JsonNode c : ref.get("cases")) {
            SpectralDensity d = estimate(x, fs, SpectrumReference.settings(c), x.length);
            // reference: scipy.signal.welch(x, fs, window, nperseg, noverlap, detrend, scaling='density') 1.17.1,
            // see gen_spectrum_reference.py
            double[] f = SpectrumReference.doubles(c.get("frequenciesHz"));
            double[] p = SpectrumReference.doubles(c.get("pxx"));
            assertEquals(p.length, d.size());
            int segs = (x.length - c.get("nperseg").asInt()) / (c.get("nperseg").asInt() - c.get("noverlap").asInt()) + 1;
            assertEquals(segs, d.averages(), "scipy averages every whole segment and drops the tail");
            for (int k = 0; k < p.length; k++) {
                assertEquals(f[k], d.frequenciesHz()[k], 1e-9);
                // 1e-6 dB: same arithmetic, FFT rounding only; far inside the 0.01 dB asked of the analyzer.
                // DC with detrend 'constant' is rounding noise (~1e-33), so it is compared absolutely.
                if (p[k] > 1e-20) {
                    assertEquals(10 * Math.log10(p[k]), 10 * Math.log10(d.densityAt(k)), 1e-6,
                            c.get("window").asText() + " bin " + k);
                } else {
                    assertEquals(p[k], d.densityAt(k), 1e-20);
                }
            }
        }
    }

    @Test
    void blocksOfAnySizeGiveTheSameEstimate() {
        // chunked processing equals whole-signal processing (STYLE.md seam), including odd blocks
        double[] x = SpectrumReference.gaussian(11, 5000, 0.2);
        WelchSettings s = WelchSettings.of(256);
        SpectralDensity whole = estimate(x, 8000, s, x.length);
        for (int block : new int[] {1, 3, 64, 255, 257}) {
            assertArrayEquals(whole.density(), estimate(x, 8000, s, block).density(), 0.0, "block " + block);
        }
        WelchEstimator e = new WelchEstimator();
        e.prepare(8000, s);
        e.accept(x, 0, 0);
        assertEquals(0, e.averages());
        double[] inter = new double[2 * x.length];
        for (int i = 0; i < x.length; i++) {
            inter[2 * i + 1] = x[i];
            inter[2 * i] = 99;
        }
        e.acceptInterleaved(inter, x.length, 2, 1);
        assertArrayEquals(whole.density(), e.snapshot().density(), 0.0, "interleaved channel 2");
        e.reset();
        assertEquals(0, e.averages());
    }

    @Test
    void exponentialAveragingLimits() {
        double[] x = SpectrumReference.gaussian(12, 20000, 0.2);
        WelchSettings lin = WelchSettings.of(128);
        SpectralDensity linear = estimate(x, 8000, lin, 777);
        // With a time constant longer than the record, exponential averaging is the plain mean.
        SpectralDensity slow = estimate(x, 8000, lin.exponential(100000), 777);
        assertArrayEquals(linear.density(), slow.density(), 1e-15);
        assertEquals(linear.averages(), linear.effectiveAverages(), 1e-9, "linear: effective = K");
        // With time constant 1 only the last segment remains: equal to a one-segment estimate of it.
        SpectralDensity last = estimate(x, 8000, lin.exponential(1), 100);
        int start = (int) (linear.averages() - 1) * lin.hopSamples();
        double[] tail = java.util.Arrays.copyOfRange(x, start, start + 128);
        assertArrayEquals(estimate(tail, 8000, lin, 128).density(), last.density(), 1e-15);
        // Steady state with α = 1/τ: Σa² → α/(2 − α), effective averages → 2τ − 1 (geometric series, closed form)
        SpectralDensity tau = estimate(x, 8000, lin.exponential(4), 1000);
        assertEquals(7.0, tau.effectiveAverages(), 1e-6);
    }

    @Test
    void whiteNoiseReadsTheFlatDensity() {
        // Gaussian noise of variance σ² has one-sided density σ²/(fs/2) (Parseval, closed form)
        double sigma = 0.1;
        double fs = 48000;
        double[] x = SpectrumReference.gaussian(13, 1 << 16, sigma);
        SpectralDensity d = estimate(x, fs, WelchSettings.of(1024), 4096);
        double mean = 0;
        for (int k = 1; k < d.size() - 1; k++) {
            mean += d.densityAt(k);
        }
        mean /= d.size() - 2;
        // 2 %: 511 bins × 127 half-overlapped segments give a relative standard error of about
        // 1/√(511·127·0.95·2/1.94) ≈ 0.4 %, so this is 5 standard errors
        assertEquals(sigma * sigma / (fs / 2), mean, 0.02 * sigma * sigma / (fs / 2));
    }

    @Test
    void argumentsAreChecked() {
        WelchEstimator e = new WelchEstimator();
        assertThrows(IllegalStateException.class, () -> e.accept(new double[4], 0, 4));
        assertThrows(IllegalArgumentException.class, () -> e.prepare(-1, WelchSettings.of(64)));
        assertThrows(IllegalArgumentException.class, () -> WelchSettings.of(63));
        assertThrows(IllegalArgumentException.class, () -> WelchSettings.of(64).withOverlap(1.0));
        e.prepare(1000, WelchSettings.of(64));
        IllegalArgumentException ex = assertThrows(IllegalArgumentException.class, () -> e.accept(new double[4], 2, 3));
        assertTrue(ex.getMessage().contains("offset=2"));
    }
}

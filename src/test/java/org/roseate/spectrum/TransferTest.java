package org.roseate.spectrum;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.compare.TargetSlope;

class TransferTest {
    static final double FS = 48000;

    /** RBJ Audio EQ Cookbook low-pass (Bristow-Johnson), normalised so a0 = 1: {b0, b1, b2, a1, a2}. */
    static double[] lowpass(double f0, double q) {
        double w0 = 2 * Math.PI * f0 / FS;
        double alpha = Math.sin(w0) / (2 * q);
        double c = Math.cos(w0);
        double a0 = 1 + alpha;
        return new double[] {(1 - c) / 2 / a0, (1 - c) / a0, (1 - c) / 2 / a0, -2 * c / a0, (1 - alpha) / a0};
    }

    /** The difference equation y[n] = b0 x[n] + b1 x[n−1] + b2 x[n−2] − a1 y[n−1] − a2 y[n−2], written out. */
    static double[] filter(double[] c, double[] x) {
        double[] y = new double[x.length];
        double x1 = 0;
        double x2 = 0;
        double y1 = 0;
        double y2 = 0;
        for (int i = 0; i < x.length; i++) {
            double v = c[0] * x[i] + c[1] * x1 + c[2] * x2 - c[3] * y1 - c[4] * y2;
            x2 = x1;
            x1 = x[i];
            y2 = y1;
            y1 = v;
            y[i] = v;
        }
        return y;
    }

    /** H(e^{jω}) of the biquad at hz as {re, im} (closed form). */
    static double[] response(double[] c, double hz) {
        double w = 2 * Math.PI * hz / FS;
        double nr = c[0] + c[1] * Math.cos(w) + c[2] * Math.cos(2 * w);
        double ni = -c[1] * Math.sin(w) - c[2] * Math.sin(2 * w);
        double dr = 1 + c[3] * Math.cos(w) + c[4] * Math.cos(2 * w);
        double di = -c[3] * Math.sin(w) - c[4] * Math.sin(2 * w);
        double d = dr * dr + di * di;
        return new double[] {(nr * dr + ni * di) / d, (ni * dr - nr * di) / d};
    }

    static TransferEstimate measure(double[] x, double[] y, int n) {
        CrossSpectrumEstimator e = new CrossSpectrumEstimator();
        e.prepare(FS, WelchSettings.of(n));
        e.accept(x, y, 0, x.length);
        return e.snapshot().transfer();
    }

    @Test
    void recoversAKnownFilterWhereCoherenceIsOne() {
        double[] c = lowpass(1000, 0.9);
        double[] x = SpectrumReference.gaussian(21, 1 << 18, 0.2);
        TransferEstimate h = measure(x, filter(c, x), 4096);
        int checked = 0;
        for (int k = 1; k < h.size(); k++) {
            double f = h.frequenciesHz()[k];
            if (f < 20 || f > 15000) {
                continue;
            }
            double[] exact = response(c, f);
            double exactDb = 10 * Math.log10(exact[0] * exact[0] + exact[1] * exact[1]);
            // coherence ≈ 1: the response is a noise-free linear function of the reference
            assertTrue(h.coherence()[k] > 0.999, "coherence at " + f);
            // 0.05 dB (the bound); the residual is the window's smoothing of H across a bin
            assertEquals(exactDb, h.magnitudeDb(k), 0.05, "dB at " + f + " Hz");
            // 0.3°: the same smoothing on the phase
            assertEquals(Math.toDegrees(Math.atan2(exact[1], exact[0])), h.phaseDeg(k), 0.3, "deg at " + f);
            checked++;
        }
        assertTrue(checked > 1000);
        // interpolation between bins: a point halfway between two bins lies between them
        TransferEstimate.Point p = h.at(1000.5 * h.binWidthHz() / h.binWidthHz());
        double[] exact = response(c, 1000.5);
        assertEquals(10 * Math.log10(exact[0] * exact[0] + exact[1] * exact[1]), p.db(), 0.05);
        assertThrows(IllegalArgumentException.class, () -> h.at(1.0));
    }

    @Test
    void h1IsUnbiasedByResponseNoiseAndCoherenceDrops() {
        double[] c = lowpass(2000, 0.7);
        double[] x = SpectrumReference.gaussian(22, 1 << 18, 0.2);
        double[] y = filter(c, x);
        double[] noise = SpectrumReference.gaussian(23, x.length, 0.05);
        for (int i = 0; i < y.length; i++) {
            y[i] += noise[i];
        }
        TransferEstimate h = measure(x, y, 2048);
        int k = (int) Math.round(500 / h.binWidthHz());
        double[] exact = response(c, h.frequenciesHz()[k]);
        // γ² = |H|²Gxx/(|H|²Gxx + Gnn) with flat densities: Gxx ∝ 0.04, Gnn ∝ 0.0025 (closed form)
        double h2 = exact[0] * exact[0] + exact[1] * exact[1];
        double expectedCoherence = h2 * 0.04 / (h2 * 0.04 + 0.0025);
        double mean = 0;
        double meanDb = 0;
        int count = 0;
        for (int j = k - 20; j <= k + 20; j++) {
            mean += h.coherence()[j];
            double[] e = response(c, h.frequenciesHz()[j]);
            meanDb += h.magnitudeDb(j) - 10 * Math.log10(e[0] * e[0] + e[1] * e[1]);
            count++;
        }
        // 0.01: 41 bins × 255 averages put the coherence estimate's scatter near 0.001
        assertEquals(expectedCoherence, mean / count, 0.01);
        // H1 is unbiased by output noise (γ² ≈ 0.94 here): the per-bin error scatters by about 0.1 dB, so the mean
        // over 41 bins has a standard error near 0.02 dB; 0.05 dB also allows the small positive bias of averaging
        // a logarithm and of the window's smoothing (0.02–0.03 dB seen over four seeds). An H2- or noise-biased
        // estimate would read 10·log10(1/γ²) ≈ +0.27 dB high.
        assertEquals(0.0, meanDb / count, 0.05);
    }

    @Test
    void calibrationDividesOutTheChainAndRoundTrips(@TempDir Path dir) throws Exception {
        double[] chain = lowpass(15000, 0.6); // a sound card's own roll-off
        double[] device = lowpass(800, 1.2);
        double[] x = SpectrumReference.gaussian(24, 1 << 17, 0.2);
        TransferEstimate loop = measure(x, filter(chain, x), 2048);
        Calibration cal = Calibration.fromLoopback("cal.json", loop, 1.5);
        Path file = dir.resolve("cal.json");
        cal.write(file);
        Calibration back = Calibration.read(file);
        assertEquals(48000, back.sampleRateHz());
        assertEquals(1.5, back.voltsPerFullScale());
        assertEquals(cal.re()[100], back.re()[100], 0.0, "JSON keeps doubles exactly");
        // measured with another segment length, so the calibration is interpolated
        TransferEstimate raw = measure(x, filter(chain, filter(device, x)), 4096);
        TransferEstimate corrected = back.apply(raw);
        for (int k = 1; k < corrected.size(); k++) {
            double f = corrected.frequenciesHz()[k];
            if (f < 30 || f > 12000) {
                continue;
            }
            double[] e = response(device, f);
            // 0.05 dB: as for the plain filter; the linear interpolation of the smooth chain response between
            // 23 Hz bins adds below 0.001 dB
            assertEquals(10 * Math.log10(e[0] * e[0] + e[1] * e[1]), corrected.magnitudeDb(k), 0.05, "f=" + f);
        }
        CrossSpectrumEstimator other = new CrossSpectrumEstimator();
        other.prepare(44100, WelchSettings.of(2048));
        other.accept(x, x, 0, 8192);
        CalibrationException ex = assertThrows(CalibrationException.class, () -> back.apply(other.snapshot().transfer()));
        assertEquals(file + ": calibration was made at 48000 Hz, the capture is 44100 Hz", ex.getMessage());
    }
}

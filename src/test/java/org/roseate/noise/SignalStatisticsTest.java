package org.roseate.noise;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.roseate.noise.WhiteNoiseSource.Distribution;

class SignalStatisticsTest {

    private static final int N = 1_000_000;

    private static double[] sine(double amplitude, double hz, double sampleRateHz, int n) {
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = amplitude * Math.sin(2 * Math.PI * hz * i / sampleRateHz);
        }
        return x;
    }

    private static SignalStatistics of(double[] x) {
        SignalStatistics s = new SignalStatistics();
        s.accept(x, 0, x.length);
        return s;
    }

    @Test
    void sineLevelsFollowAes17() {
        // 1000 whole cycles: the mean of sin² over whole periods is exactly ½ (closed form), so
        // rms = A/√2 and, per AES17, a sine of amplitude A reads 20·log10(A) dBFS
        SignalStatistics s = of(sine(0.5, 1000, 48000, 48000));
        assertEquals(0.5 / Math.sqrt(2), s.rms(), 1e-15);
        assertEquals(20 * Math.log10(0.5), s.rmsDbfs(), 1e-12);
        assertEquals(0.5, s.peak(), 1e-15); // a sample falls on the crest (n = 12 mod 48)
        assertEquals(20 * Math.log10(0.5), s.peakDbfs(), 1e-12);
        assertEquals(10 * Math.log10(2), s.crestFactorDb(), 1e-12); // sine crest factor √2
        assertEquals(0.0, s.mean(), 1e-15); // whole cycles sum to 0 up to rounding
        assertEquals(0, s.clippedCount());
        // full-scale sine → 0 dBFS (AES17 definition)
        SignalStatistics full = of(sine(1.0, 1000, 48000, 48000));
        assertEquals(0.0, full.rmsDbfs(), 1e-12);
    }

    @Test
    void clippedSamplesAreThoseAtOrBeyondFullScale() {
        SignalStatistics s = of(new double[] {1.0, -1.0, Math.nextDown(1.0), 1.5, -2.0, 0.0, -0.999});
        assertEquals(4, s.clippedCount());
        assertEquals(2.0, s.peak());
        assertEquals(20 * Math.log10(2.0), s.peakDbfs(), 1e-15);
        assertEquals(1, s.aboveRangeCount());
        assertEquals(1, s.belowRangeCount());
    }

    @Test
    void uniformPercentilesAreLinear() {
        double scale = 0.9 / Math.sqrt(3.0); // uniform on ±0.9
        WhiteNoiseSource src = new WhiteNoiseSource(11L, Distribution.UNIFORM);
        SignalStatistics s = new SignalStatistics();
        double[] buf = new double[4096];
        for (int done = 0; done < N; done += buf.length) {
            src.fill(buf, 0, buf.length);
            for (int i = 0; i < buf.length; i++) {
                buf[i] *= scale;
            }
            s.accept(buf, 0, buf.length);
        }
        for (double p : new double[] {1, 5, 25, 50, 75, 95, 99}) {
            double expected = -0.9 + 1.8 * p / 100; // uniform quantile, closed form
            // sample-quantile se = width·√(p(1−p)/n); 5σ plus one bin (3.05e-5)
            double tol = 5 * 1.8 * Math.sqrt(p / 100 * (1 - p / 100) / s.count()) + s.resolution();
            assertEquals(expected, s.percentile(p), tol, "p=" + p);
        }
        // uniform on ±a: rms = a/√3 (closed form); var(x²) = 4a⁴/45, so se(rms) = a²·√(4/45/n)/(2·rms)
        // = 2.3e-4 at n = 1e6; 5σ
        assertEquals(0.9 / Math.sqrt(3), s.rms(), 1.2e-3);
    }

    @Test
    void gaussianPercentilesMatchTheNormalQuantile() throws IOException {
        double sigma = 0.1;
        WhiteNoiseSource src = new WhiteNoiseSource(12L);
        SignalStatistics s = new SignalStatistics();
        double[] buf = new double[N];
        src.fill(buf, 0, N);
        for (int i = 0; i < N; i++) {
            buf[i] *= sigma;
        }
        s.accept(buf, 0, N);
        // reference: scipy.stats.norm.ppf 1.17.1, see src/test/python/gen_noise_normal.py
        for (double[] row : readQuantiles()) {
            double p = row[0] / 100;
            double q = row[1];
            double density = Math.exp(-0.5 * q * q) / Math.sqrt(2 * Math.PI); // normal pdf, closed form
            // sample-quantile se = σ·√(p(1−p)/n)/φ(q) (asymptotic normality of quantiles); 5σ plus one bin
            double tol = 5 * sigma * Math.sqrt(p * (1 - p) / N) / density + s.resolution();
            assertEquals(sigma * q, s.percentile(row[0]), tol, "p=" + row[0] + "%");
        }
    }

    @Test
    void interpolationWithinBinsIsLinear() {
        // one sample at the centre of each of 1000 unit bins: the histogram's cumulative count is
        // the straight line q/1000, so percentile(p) = 10·p exactly (closed form of the convention)
        SignalStatistics s = new SignalStatistics(0, 1000, 1000);
        double[] x = new double[1000];
        for (int i = 0; i < x.length; i++) {
            x[i] = i + 0.5;
        }
        s.accept(x, 0, x.length);
        assertEquals(250.0, s.percentile(25), 1e-9);
        assertEquals(500.0, s.percentile(50), 1e-9);
        assertEquals(123.4, s.percentile(12.34), 1e-9);
        assertEquals(0.5, s.percentile(0), 0.0); // exact minimum
        assertEquals(999.5, s.percentile(100), 0.0); // exact maximum
        assertEquals(0.5, s.percentile(0.01), 0.0); // 0.1 ≤ 0.5: clamped to the observed minimum
    }

    @Test
    void percentilesOutsideTheRangeReportTheObservedExtreme() {
        SignalStatistics s = new SignalStatistics(0, 10, 100);
        s.accept(new double[] {-5, -4, 1, 2, 3, 4, 5, 6, 20, 30}, 0, 10);
        assertEquals(2, s.belowRangeCount());
        assertEquals(2, s.aboveRangeCount());
        assertEquals(-5.0, s.percentile(10), 0.0);
        assertEquals(30.0, s.percentile(95), 0.0);
        // 40 % of the count (4 samples) is reached at the top of the bin [2.0, 2.1) holding the 4th sample
        assertEquals(2.1, s.percentile(40), 1e-12);
    }

    @Test
    void blocksOfAnySizeGiveIdenticalResults() {
        double[] x = new double[10_000];
        new WhiteNoiseSource(13L).fill(x, 0, x.length);
        SignalStatistics whole = of(x);
        for (int block : new int[] {1, 3, 64}) {
            SignalStatistics s = new SignalStatistics();
            for (int off = 0; off < x.length; off += block) {
                s.accept(x, off, Math.min(block, x.length - off));
                s.accept(x, off, 0);
            }
            assertEquals(whole.count(), s.count());
            assertEquals(whole.mean(), s.mean(), 0.0);
            assertEquals(whole.rms(), s.rms(), 0.0);
            assertEquals(whole.peak(), s.peak(), 0.0);
            assertEquals(whole.percentile(37), s.percentile(37), 0.0);
        }
    }

    @Test
    void mergePoolsChannels() {
        double[] a = new double[5000];
        double[] b = new double[7001];
        WhiteNoiseSource src = new WhiteNoiseSource(14L);
        src.independent(0).fill(a, 0, a.length);
        src.independent(1).fill(b, 0, b.length);
        for (int i = 0; i < b.length; i++) {
            b[i] = 0.3 * b[i] + 0.05;
        }
        double[] ab = new double[a.length + b.length];
        System.arraycopy(a, 0, ab, 0, a.length);
        System.arraycopy(b, 0, ab, a.length, b.length);
        SignalStatistics pooled = of(ab);
        SignalStatistics merged = of(a);
        merged.merge(of(b));
        assertEquals(pooled.count(), merged.count());
        assertEquals(pooled.mean(), merged.mean(), 1e-16); // both compensated; differ by rounding only
        assertEquals(pooled.rms(), merged.rms(), 1e-15);
        assertEquals(pooled.peak(), merged.peak(), 0.0);
        assertEquals(pooled.clippedCount(), merged.clippedCount());
        for (double p : new double[] {0, 1, 50, 99, 100}) {
            assertEquals(pooled.percentile(p), merged.percentile(p), 0.0);
        }
        assertThrows(IllegalArgumentException.class, () -> merged.merge(new SignalStatistics(-2, 2, 65536)));
    }

    @Test
    void longRunsKeepFullPrecision() {
        // 10⁷ samples of 0.1: a plain running sum of x² drifts by ~1e-10 relative (measured with
        // numpy's sequential np.cumsum); the compensated sum stays within rounding of the product
        double x = 0.1;
        double[] buf = new double[1 << 16];
        java.util.Arrays.fill(buf, x);
        SignalStatistics s = new SignalStatistics();
        int n = 0;
        while (n < 10_000_000) {
            int m = Math.min(buf.length, 10_000_000 - n);
            s.accept(buf, 0, m);
            n += m;
        }
        assertEquals(10_000_000L, s.count());
        assertEquals(Math.sqrt(x * x), s.rms(), 2 * Math.ulp(x)); // a few ulp of the result
        assertEquals(x, s.mean(), 2 * Math.ulp(x));
    }

    @Test
    void nanIsCountedApartAndEmptyStatisticsAreNaN() {
        SignalStatistics s = new SignalStatistics();
        assertTrue(Double.isNaN(s.mean()));
        assertTrue(Double.isNaN(s.rms()));
        assertTrue(Double.isNaN(s.percentile(50)));
        assertEquals(0.0, s.peak());
        s.accept(new double[] {Double.NaN, 0.5, -0.5, Double.NaN}, 0, 4);
        assertEquals(2, s.count());
        assertEquals(2, s.nanCount());
        assertEquals(0.5, s.rms(), 0.0);
        assertFalse(Double.isNaN(s.percentile(50)));
        s.reset();
        assertEquals(0, s.count());
        assertTrue(Double.isNaN(s.mean()));
    }

    @Test
    void rejectsBadArguments() {
        assertTrue(assertThrows(IllegalArgumentException.class, () -> new SignalStatistics(1, 1, 10))
                .getMessage().contains("[1.0, 1.0]"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> new SignalStatistics(0, 1, 0))
                .getMessage().contains("bins=0"));
        SignalStatistics s = new SignalStatistics();
        assertTrue(assertThrows(IllegalArgumentException.class, () -> s.percentile(100.5))
                .getMessage().contains("p=100.5"));
        assertThrows(IndexOutOfBoundsException.class, () -> s.accept(new double[3], 2, 2));
    }

    private static List<double[]> readQuantiles() throws IOException {
        List<double[]> rows = new ArrayList<>();
        try (BufferedReader r = new BufferedReader(new InputStreamReader(
                SignalStatisticsTest.class.getResourceAsStream("/reference/noise/normal_quantiles.csv"),
                StandardCharsets.UTF_8))) {
            String line;
            while ((line = r.readLine()) != null) {
                if (line.startsWith("#") || line.startsWith("percent")) {
                    continue;
                }
                String[] f = line.split(",");
                rows.add(new double[] {Double.parseDouble(f[0]), Double.parseDouble(f[1])});
            }
        }
        assertEquals(13, rows.size());
        return rows;
    }
}

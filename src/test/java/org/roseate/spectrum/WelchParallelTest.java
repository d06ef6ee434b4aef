package org.roseate.spectrum;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Parallel segment transforms ({@link WelchCore#parallel}) give bitwise the results of the
 * sequential Welch path: same averages Gxx (Gyy, Gxy), same segment count, same effective averages
 * and duration, for segment lengths, overlaps, windows, detrending, linear and exponential averaging,
 * one and two channels, seeded random block splits (including blocks of 0–3 samples and blocks
 * longer than a batch) and results asked for at random points in between (each settles a partial
 * batch). The sequential path itself is checked against scipy.signal.welch and csd in
 * WelchEstimatorTest and CrossSpectrumTest; equality here is exact (assertArrayEquals with no
 * tolerance compares the doubles bit for bit, NaN aside), since the parallel path does the same
 * arithmetic in the same order.
 */
class WelchParallelTest {
    static Stream<Arguments> cases() {
        return Stream.of(
                Arguments.of(1, WelchSettings.of(4096), 20 * 4096 + 123, 11L),
                Arguments.of(1, WelchSettings.of(8192).withOverlap(0.75), 31 * 8192 / 4 + 7, 12L),
                Arguments.of(1, WelchSettings.of(16384).withOverlap(0).withWindow(Window.BLACKMAN_HARRIS), 9 * 16384, 13L),
                Arguments.of(1, WelchSettings.of(65536), 23 * 32768 + 5000, 14L),
                Arguments.of(1, WelchSettings.of(4096).withDetrend(WelchSettings.Detrend.NONE).withOverlap(0.6), 70_000, 15L),
                Arguments.of(1, WelchSettings.of(8192).exponential(5), 40 * 4096 + 1, 16L),
                Arguments.of(1, WelchSettings.of(6144), 25 * 3072, 17L),
                Arguments.of(2, WelchSettings.of(4096), 27 * 2048 + 99, 21L),
                Arguments.of(2, WelchSettings.of(16384).withOverlap(0.75).exponential(3), 30 * 4096, 22L),
                Arguments.of(2, WelchSettings.of(65536), 13 * 32768, 23L));
    }

    @ParameterizedTest(name = "{0} channel(s), {1}, {2} samples")
    @MethodSource("cases")
    void parallelEqualsSequentialBitwise(int channels, WelchSettings settings, int length, long seed) {
        Assumptions.assumeTrue(SegmentWorkers.helpers() > 0, "one processor: parallel transforms stay off");
        SplittableRandom rnd = new SplittableRandom(seed);
        double[] x = new double[length];
        double[] y = new double[length];
        for (int i = 0; i < length; i++) {
            x[i] = 0.3 + rnd.nextGaussian();
            y[i] = 0.5 * x[i] + 0.1 * rnd.nextGaussian();
        }
        WelchCore seq = new WelchCore(channels);
        WelchCore par = new WelchCore(channels);
        seq.prepare(48000, settings);
        par.prepare(48000, settings);
        par.parallel(true);
        assertTrue(par.parallelActive());
        assertFalse(seq.parallelActive());
        int n = settings.segmentLength();
        for (int done = 0; done < length; ) {
            int kind = rnd.nextInt(4);
            int m = switch (kind) {
                case 0 -> rnd.nextInt(4);
                case 1 -> 1 + rnd.nextInt(n);
                case 2 -> 1 + rnd.nextInt(12 * n);
                default -> 1 + rnd.nextInt(4096);
            };
            m = Math.min(m, length - done);
            seq.accept(x, done, y, done, 1, m);
            par.accept(x, done, y, done, 1, m);
            done += m;
            assertEquals(seq.segments(), par.segments(), "segments after " + done);
            if (rnd.nextInt(8) == 0) {
                assertSame(seq, par, "after " + done + " samples");
            }
        }
        assertTrue(seq.segments() > 2 * (1 + SegmentWorkers.helpers()), "the record spans several batches' lanes");
        assertSame(seq, par, "at the end");
    }

    private static void assertSame(WelchCore seq, WelchCore par, String where) {
        assertArrayEquals(seq.gxx(), par.gxx(), "Gxx " + where);
        if (seq.channels() == 2) {
            assertArrayEquals(seq.gyy(), par.gyy(), "Gyy " + where);
            assertArrayEquals(seq.gxyRe(), par.gxyRe(), "Re Gxy " + where);
            assertArrayEquals(seq.gxyIm(), par.gxyIm(), "Im Gxy " + where);
        }
        assertEquals(seq.segments(), par.segments(), "segments " + where);
        assertEquals(seq.effectiveAverages(), par.effectiveAverages(), 0.0, "effective averages " + where);
        assertEquals(seq.effectiveDurationSeconds(), par.effectiveDurationSeconds(), 0.0, "T_eff " + where);
    }

    @Test
    void estimatorSnapshotsMatchAndResetAndSwitchingKeepTheSequentialResult() {
        Assumptions.assumeTrue(SegmentWorkers.helpers() > 0, "one processor: parallel transforms stay off");
        SplittableRandom rnd = new SplittableRandom(31);
        double[] x = new double[300_000];
        for (int i = 0; i < x.length; i++) {
            x[i] = rnd.nextGaussian();
        }
        WelchEstimator seq = new WelchEstimator();
        WelchEstimator par = new WelchEstimator();
        par.transformInParallel(true);
        seq.prepare(44100, WelchSettings.of(8192));
        par.prepare(44100, WelchSettings.of(8192));
        par.accept(x, 0, 100_000);
        par.reset();
        for (int off = 0; off < x.length; off += 50_000) {
            seq.accept(x, off, 50_000);
            par.accept(x, off, 50_000);
            if (off == 150_000) {
                par.transformInParallel(false);
            }
            if (off == 200_000) {
                par.transformInParallel(true);
            }
        }
        SpectralDensity a = seq.snapshot();
        SpectralDensity b = par.snapshot();
        assertArrayEquals(a.density(), b.density());
        assertEquals(a.averages(), b.averages());
        assertEquals(a.effectiveDurationSeconds(), b.effectiveDurationSeconds(), 0.0);
    }

    /**
     * Both paths against a plain transcription of the density formula (class description of
     * WelchCore: P_k = c_k·|X_k|²/(fs·Σw²), linear running mean, scipy.signal.welch's scaling), with
     * the same JTransforms real FFT and the same operation order, so bit for bit.
     */
    @Test
    void bothPathsEqualThePlainFormulaBitwise() {
        int n = 8192;
        int hop = n / 2;
        double fs = 48000;
        SplittableRandom rnd = new SplittableRandom(41);
        double[] x = new double[hop * 40 + 77];
        for (int i = 0; i < x.length; i++) {
            x[i] = 0.1 + rnd.nextGaussian();
        }
        double[] w = Window.HANN.coefficients(n);
        double sumW2 = 0;
        for (double v : w) {
            sumW2 += v * v;
        }
        double scale = 1 / (fs * sumW2);
        int bins = n / 2 + 1;
        double[] expected = new double[bins];
        org.jtransforms.fft.DoubleFFT_1D fft = new org.jtransforms.fft.DoubleFFT_1D(n);
        long k = 0;
        for (int start = 0; start + n <= x.length; start += hop) {
            double mean = 0;
            for (int i = 0; i < n; i++) {
                mean += x[start + i];
            }
            mean /= n;
            double[] seg = new double[n];
            for (int i = 0; i < n; i++) {
                seg[i] = (x[start + i] - mean) * w[i];
            }
            fft.realForward(seg);
            k++;
            double alpha = 1.0 / k;
            double beta = 1 - alpha;
            for (int b = 0; b < bins; b++) {
                double re = b == 0 ? seg[0] : b == bins - 1 ? seg[1] : seg[2 * b];
                double im = b == 0 || b == bins - 1 ? 0 : seg[2 * b + 1];
                double c = (b == 0 || b == bins - 1) ? scale : 2 * scale;
                expected[b] = beta * expected[b] + alpha * c * (re * re + im * im);
            }
        }
        for (boolean parallel : new boolean[] {false, true}) {
            WelchCore core = new WelchCore(1);
            core.prepare(fs, WelchSettings.of(n));
            core.parallel(parallel);
            core.accept(x, 0, null, 0, 1, x.length);
            assertEquals(k, core.segments());
            assertArrayEquals(expected, core.gxx(), parallel ? "parallel" : "sequential");
        }
    }

    @Test
    void shortAndVeryLongSegmentsStaySequential() {
        WelchCore core = new WelchCore(1);
        core.prepare(48000, WelchSettings.of(WelchCore.PARALLEL_MIN_SEGMENT / 2));
        core.parallel(true);
        assertFalse(core.parallelActive());
        core.prepare(48000, WelchSettings.of(WelchCore.PARALLEL_MAX_SEGMENT * 2));
        assertFalse(core.parallelActive(), "longer than the parallel maximum");
    }
}

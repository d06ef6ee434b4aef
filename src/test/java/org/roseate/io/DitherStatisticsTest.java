package org.roseate.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Path;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * TPDF dither of 2 LSB peak to peak before rounding: the total error e = code − x·F has mean 0
 * and variance 1/12 (rounding) + 1/6 (triangular dither) = 1/4 LSB² whatever the input, and
 * |e| ≤ 1.5 LSB (Lipshitz, Wannamaker and Vanderkooy, "Quantization and Dither: A Theoretical
 * Survey", J. Audio Eng. Soc. 40(5), 1992, from memory; the figures are also common practice).
 */
class DitherStatisticsTest {
    private static final int N = 100_000;
    private static final double F = 32768; // 16-bit full scale

    @TempDir
    Path dir;

    private double[] errorsInLsb(double fraction, boolean dither, long seed) throws IOException {
        SplittableRandom r = new SplittableRandom(seed);
        double[] x = new double[N];
        for (int i = 0; i < N; i++) {
            x[i] = (r.nextInt(-16000, 16000) + fraction) / F;
        }
        WavFormat format = new WavFormat(48000, 1, SampleEncoding.PCM_16);
        java.io.ByteArrayOutputStream out = new java.io.ByteArrayOutputStream();
        WavWriter w = dither ? new WavWriter(out, format, N, seed)
                : WavWriter.withoutDither(out, format, N);
        w.writeFrames(x, N);
        w.finish();
        assertEquals(0, w.clippedSamples());
        Path p = WavTestSupport.writeTemp(dir, "d.wav", out.toByteArray());
        double[] y = WavReader.readAllChannel(p, 0);
        double[] e = new double[N];
        for (int i = 0; i < N; i++) {
            e[i] = (y[i] - x[i]) * F;
        }
        return e;
    }

    @Test
    void errorHasMeanZeroAndVarianceOneQuarterLsbAtEveryInputOffset() throws IOException {
        for (double fraction : new double[] {0.0, 0.25, 0.5, 0.75}) {
            double[] e = errorsInLsb(fraction, true, 42 + (long) (fraction * 4));
            double mean = 0;
            double max = 0;
            for (double v : e) {
                mean += v;
                max = Math.max(max, Math.abs(v));
            }
            mean /= N;
            double m2 = 0;
            double m4 = 0;
            for (double v : e) {
                double d = (v - mean) * (v - mean);
                m2 += d;
                m4 += d * d;
            }
            m2 /= N;
            m4 /= N;
            // tolerances: 5 standard errors of the estimates (σ/√N for the mean,
            // √((μ4 − σ⁴)/N) for the variance); the generator is seeded, so this is deterministic
            double meanTol = 5 * Math.sqrt(0.25 / N);
            double varTol = 5 * Math.sqrt((m4 - m2 * m2) / N);
            assertEquals(0.0, mean, meanTol, "mean at offset " + fraction);
            assertEquals(0.25, m2, varTol, "variance at offset " + fraction);
            assertTrue(max <= 1.5 + 1e-9, "peak error " + max + " at offset " + fraction);
        }
    }

    @Test
    void onIntegerInputTheErrorIsPlusMinusOneWithProbabilityOneEighthEach() throws IOException {
        // triangular density 1 − |d| on (−1, 1): P(d > 1/2) = ∫ from 1/2 to 1 of (1 − d) = 1/8
        // (closed form), so rounding gives e = +1 and e = −1 with probability 1/8 each
        double[] e = errorsInLsb(0.0, true, 9);
        int plus = 0;
        int minus = 0;
        for (double v : e) {
            plus += v > 0.5 ? 1 : 0;
            minus += v < -0.5 ? 1 : 0;
        }
        // tolerance: 5 binomial standard errors, √(p(1 − p)/N) with p = 1/8
        double tol = 5 * Math.sqrt(0.125 * 0.875 / N);
        assertEquals(0.125, plus / (double) N, tol);
        assertEquals(0.125, minus / (double) N, tol);
    }

    @Test
    void withoutDitherTheErrorFollowsTheSignal() throws IOException {
        // the contrast that makes the tests above meaningful: plain rounding of x + 1/4 LSB
        // always errs by exactly −1/4 LSB (closed form)
        for (double v : errorsInLsb(0.25, false, 3)) {
            assertEquals(-0.25, v, 1e-9, "rounding error of a quarter LSB; 1e-9 for arithmetic");
        }
    }
}

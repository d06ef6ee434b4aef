package org.roseate.noise;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.random.RandomGenerator;
import java.util.random.RandomGeneratorFactory;
import org.junit.jupiter.api.Test;
import org.roseate.noise.WhiteNoiseSource.Distribution;

class WhiteNoiseSourceTest {

    private static final long SEED = 0x5EEDL;
    private static final int N = 1_000_000;

    private static RandomGenerator jdk(long seed) {
        return RandomGeneratorFactory.of("L64X128MixRandom").create(seed);
    }

    private static double[] draw(WhiteNoiseSource src, int n) {
        double[] x = new double[n];
        src.fill(x, 0, n);
        return x;
    }

    @Test
    void gaussianStreamIsBitIdenticalToTheJdkGenerator() {
        // reference: the JDK 17 class jdk.random.L64X128MixRandom and its nextGaussian()
        for (long seed : new long[] {0L, 1L, -1L, SEED, Long.MIN_VALUE}) {
            RandomGenerator ref = jdk(seed);
            double[] x = draw(new WhiteNoiseSource(seed), 100_000);
            for (int i = 0; i < x.length; i++) {
                assertEquals(Double.doubleToRawLongBits(ref.nextGaussian()), Double.doubleToRawLongBits(x[i]),
                        "seed " + seed + " sample " + i);
            }
        }
    }

    @Test
    void uniformStreamUsesTheJdkOutputsAsDocumented() {
        // reference: JDK L64X128MixRandom.nextLong(), mapped by the formula in the class comment
        RandomGenerator ref = jdk(SEED);
        double[] x = draw(new WhiteNoiseSource(SEED, Distribution.UNIFORM), 100_000);
        for (double v : x) {
            assertEquals(((ref.nextLong() >> 11) + 0.5) * 0x1.0p-52 * Math.sqrt(3.0), v, 0.0);
        }
    }

    @Test
    void splitMatchesTheJdkSplit() {
        // reference: JDK SplittableGenerator.split() of L64X128MixRandom
        RandomGenerator.SplittableGenerator refParent = (RandomGenerator.SplittableGenerator) jdk(SEED);
        WhiteNoiseSource parent = new WhiteNoiseSource(SEED);
        RandomGenerator refChild = refParent.split();
        WhiteNoiseSource child = parent.split();
        for (double v : draw(child, 10_000)) {
            assertEquals(refChild.nextGaussian(), v, 0.0);
        }
        for (double v : draw(parent, 10_000)) {
            assertEquals(refParent.nextGaussian(), v, 0.0);
        }
    }

    @Test
    void gaussianHasUnitVarianceAndNormalTails() {
        double[] x = draw(new WhiteNoiseSource(SEED), N);
        double[] m = moments(x);
        // standard errors for n = 1e6: mean 1e-3, variance √(2/n) = 1.4e-3, kurtosis √(24/n) = 4.9e-3; 5σ bounds
        assertEquals(0.0, m[0], 5e-3);
        assertEquals(1.0, m[1], 7e-3);
        assertEquals(3.0, m[3], 2.5e-2); // normal kurtosis 3 (closed form)
        // P(|x| > 1.959964) = 0.05 (scipy.stats.norm.ppf(0.975), see gen_noise_normal.py); binomial se 2.2e-4
        long out = java.util.Arrays.stream(x).filter(v -> Math.abs(v) > 1.959963984540054).count();
        assertEquals(0.05, out / (double) N, 1.1e-3);
    }

    @Test
    void uniformHasUnitVarianceAndBounds() {
        double[] x = draw(new WhiteNoiseSource(SEED, Distribution.UNIFORM), N);
        double[] m = moments(x);
        double bound = Math.sqrt(3.0);
        for (double v : x) {
            assertTrue(v > -bound && v < bound, "sample " + v + " outside (−√3, √3)");
        }
        // uniform on ±√3: variance 1, kurtosis 9/5 (closed form); se of variance √(0.8/n) = 9e-4, 5σ
        assertEquals(0.0, m[0], 5e-3);
        assertEquals(1.0, m[1], 4.5e-3);
        assertEquals(1.8, m[3], 5.5e-3); // se of the sample kurtosis of a uniform, n = 1e6: 1.1e-3 (numpy, 200 runs); 5σ
    }

    @Test
    void samplesAreWhite() {
        double[] x = draw(new WhiteNoiseSource(SEED), N);
        // white: normalised autocorrelation at lags 1..8 has standard error 1/√n = 1e-3; 5σ
        for (int lag = 1; lag <= 8; lag++) {
            double r = 0;
            for (int i = lag; i < N; i++) {
                r += x[i] * x[i - lag];
            }
            assertEquals(0.0, r / N, 5e-3, "lag " + lag);
        }
    }

    @Test
    void fillInPiecesEqualsFillWhole() {
        double[] whole = draw(new WhiteNoiseSource(SEED), 1000);
        for (int block : new int[] {1, 3, 64, 1000}) {
            WhiteNoiseSource src = new WhiteNoiseSource(SEED);
            double[] pieces = new double[1000 + 5];
            int pos = 5;
            while (pos < pieces.length) {
                int n = Math.min(block, pieces.length - pos);
                src.fill(pieces, pos, n);
                src.fill(pieces, pos, 0);
                pos += n;
            }
            assertArrayEquals(whole, java.util.Arrays.copyOfRange(pieces, 5, pieces.length), "block " + block);
        }
    }

    @Test
    void identicalCopyAndResetReplayTheStream() {
        WhiteNoiseSource src = new WhiteNoiseSource(SEED, Distribution.UNIFORM);
        double[] start = draw(src, 500);
        WhiteNoiseSource copy = src.identicalCopy();
        double[] a = draw(src, 500);
        double[] b = draw(copy, 500);
        assertArrayEquals(a, b);
        copy.reset();
        assertArrayEquals(start, draw(copy, 500));
        src.reset();
        assertArrayEquals(start, draw(src, 500));
    }

    @Test
    void channelsAreReproducibleDistinctAndUncorrelated() {
        WhiteNoiseSource src = new WhiteNoiseSource(SEED);
        double[] c0 = draw(src.independent(0), N);
        double[] c1 = draw(src.independent(1), N);
        draw(src, 1234);
        assertArrayEquals(c1, draw(src.independent(1), N), "must not depend on the parent's position");
        assertNotEquals(c0[0], c1[0]);
        // different channels must also differ from the parent stream
        assertNotEquals(new WhiteNoiseSource(SEED).next(), c0[0]);
        double r = 0;
        for (int i = 0; i < N; i++) {
            r += c0[i] * c1[i];
        }
        assertEquals(0.0, r / N, 5e-3); // se of the correlation 1/√n = 1e-3; 5σ
        // channel seeds are the SplitMix64 outputs (Steele, Lea, Flood 2014): first output for seed 0
        // is 0xE220A8397B1DCDAF (from memory, the widely published first SplitMix64 value for seed 0)
        assertEquals(0xE220A8397B1DCDAFL, WhiteNoiseSource.channelSeed(0L, 0));
    }

    @Test
    void rejectsBadArguments() {
        WhiteNoiseSource src = new WhiteNoiseSource(SEED);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> src.independent(-2));
        assertTrue(e.getMessage().contains("-2"));
        assertThrows(IndexOutOfBoundsException.class, () -> src.fill(new double[4], 2, 3));
        assertThrows(IndexOutOfBoundsException.class, () -> src.fill(new double[4], -1, 1));
        assertThrows(NullPointerException.class, () -> new WhiteNoiseSource(1L, null));
    }

    /** mean, variance, skewness, kurtosis. */
    private static double[] moments(double[] x) {
        double mean = 0;
        for (double v : x) {
            mean += v;
        }
        mean /= x.length;
        double m2 = 0;
        double m3 = 0;
        double m4 = 0;
        for (double v : x) {
            double d = v - mean;
            double d2 = d * d;
            m2 += d2;
            m3 += d2 * d;
            m4 += d2 * d2;
        }
        m2 /= x.length;
        m3 /= x.length;
        m4 /= x.length;
        return new double[] {mean, m2, m3 / Math.pow(m2, 1.5), m4 / (m2 * m2)};
    }
}

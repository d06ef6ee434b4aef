package org.roseate.noise;

import java.util.Objects;
import java.util.random.RandomGenerator;

/**
 * Seeded, reproducible white noise of unit variance.
 *
 * <p><b>Generator.</b> The stream is exactly that of the JDK's LXM generator
 * {@code L64X128MixRandom} (Steele and Vigna, "LXM: better splittable pseudorandom number
 * generators (and almost as fast)", OOPSLA 2021) as created by
 * {@code RandomGeneratorFactory.of("L64X128MixRandom").create(seed)}: a 64-bit LCG plus a
 * xoroshiro128 generator, combined by the lea64 mixer. The JDK class offers no way to copy its
 * state, so the same algorithm and seeding are restated here (about twenty lines) to make
 * {@link #identicalCopy()} and {@link #reset()} exact and O(1); {@code WhiteNoiseSourceTest}
 * checks the raw 64-bit outputs, the Gaussian samples and {@link #split()} bit for bit against
 * the JDK class.
 *
 * <p><b>Distributions.</b> {@link Distribution#GAUSSIAN} takes each sample from
 * {@link RandomGenerator#nextGaussian()}, which in Java 17 is the modified ziggurat of
 * McFarland ("A modified ziggurat algorithm for generating exponentially and normally distributed
 * pseudorandom numbers", J. Stat. Comput. Simul. 2016): exact normal distribution, mean 0,
 * variance 1. {@link Distribution#UNIFORM} is uniform on (−√3, +√3), variance 1: sample
 * {@code ((v >> 11) + 0.5) · 2⁻⁵² · √3} for the next 64-bit output {@code v}, which takes
 * 2⁵³ equally spaced values placed symmetrically about zero (mean exactly 0).
 *
 * <p><b>Several channels.</b> {@link #independent(int)} gives channel {@code c} its own source
 * whose seed is the (c+1)-th output of SplitMix64 (Steele, Lea and Flood, OOPSLA 2014) started
 * at this source's seed: {@code mixStafford13(seed + (c + 1) · 0x9E3779B97F4A7C15)}. It depends
 * only on the seed and {@code c}, never on how far this source has run, and distinct channels get
 * distinct seeds. {@link #split()} is the LXM split of the JDK (the child's additive constant
 * and state are drawn from this source, which therefore advances by four outputs).
 *
 * <p>Not thread-safe: one source per thread. {@link #fill} allocates nothing.
 */
public final class WhiteNoiseSource {

    /** Amplitude distribution of the samples; both have mean 0 and variance 1. */
    public enum Distribution {
        /** Normal, by McFarland's modified ziggurat ({@link RandomGenerator#nextGaussian()}). */
        GAUSSIAN,
        /** Uniform on (−√3, +√3). */
        UNIFORM
    }

    /** The JDK algorithm name whose stream this class reproduces. */
    public static final String ALGORITHM = "L64X128MixRandom";

    private static final double SQRT3_ULP52 = Math.sqrt(3.0) * 0x1.0p-52;

    private final long seed;
    private final Distribution distribution;
    private final Lxm initial;
    private final Lxm rng;

    /** A Gaussian source with the given seed. */
    public WhiteNoiseSource(long seed) {
        this(seed, Distribution.GAUSSIAN);
    }

    /**
     * A source whose stream is fixed by {@code seed}.
     *
     * @param seed any long
     * @param distribution amplitude distribution, not null
     */
    public WhiteNoiseSource(long seed, Distribution distribution) {
        this(seed, distribution, Lxm.seeded(seed));
    }

    private WhiteNoiseSource(long seed, Distribution distribution, Lxm state) {
        this.seed = seed;
        this.distribution = Objects.requireNonNull(distribution, "distribution");
        this.initial = state.copy();
        this.rng = state;
    }

    /** The seed this source was made from (for a {@link #split()} child, the drawn split key). */
    public long seed() {
        return seed;
    }

    public Distribution distribution() {
        return distribution;
    }

    /**
     * Writes {@code n} samples to {@code buf[offset] .. buf[offset + n − 1]}. Allocates nothing.
     *
     * @throws IndexOutOfBoundsException if the range does not fit in {@code buf}
     */
    public void fill(double[] buf, int offset, int n) {
        Objects.checkFromIndexSize(offset, n, buf.length);
        final int end = offset + n;
        if (distribution == Distribution.GAUSSIAN) {
            for (int i = offset; i < end; i++) {
                buf[i] = rng.nextGaussian();
            }
        } else {
            for (int i = offset; i < end; i++) {
                buf[i] = ((rng.nextLong() >> 11) + 0.5) * SQRT3_ULP52;
            }
        }
    }

    /** The next single sample. */
    public double next() {
        return distribution == Distribution.GAUSSIAN
                ? rng.nextGaussian()
                : ((rng.nextLong() >> 11) + 0.5) * SQRT3_ULP52;
    }

    /** Returns this source to the state it had when it was created. Allocates nothing. */
    public void reset() {
        rng.setFrom(initial);
    }

    /**
     * A new source, same distribution, that from now on produces exactly the samples this one
     * will produce (same state, independent object). Use it to feed two filters the same noise.
     */
    public WhiteNoiseSource identicalCopy() {
        WhiteNoiseSource copy = new WhiteNoiseSource(seed, distribution, rng.copy());
        copy.initial.setFrom(initial);
        return copy;
    }

    /**
     * The LXM split, as {@code SplittableGenerator.split()} of the JDK's {@code L64X128MixRandom}:
     * draws four outputs from this source (a key, then the child's LCG state and two xoroshiro
     * words) and builds a child whose LCG additive constant is {@code (key << 1) | 1}. Children
     * of different splits follow different LCG sequences, which LXM's design makes statistically
     * independent. Reproducible: the same seed and the same call sequence give the same child.
     */
    public WhiteNoiseSource split() {
        long key = rng.nextLong();
        long s = rng.nextLong();
        long x0 = rng.nextLong();
        long x1 = rng.nextLong();
        return new WhiteNoiseSource(key, distribution, new Lxm(key << 1, s, x0, x1));
    }

    /**
     * An independent source for channel {@code channel}, seeded by SplitMix64 from this source's
     * seed (see the class comment). Same distribution; does not depend on this source's position.
     *
     * @param channel channel index, {@code >= 0}
     */
    public WhiteNoiseSource independent(int channel) {
        if (channel < 0) {
            throw new IllegalArgumentException("channel=" + channel + " must be >= 0");
        }
        return new WhiteNoiseSource(channelSeed(seed, channel), distribution);
    }

    /** The seed {@link #independent(int)} gives channel {@code channel} of a source seeded with {@code seed}. */
    static long channelSeed(long seed, int channel) {
        return Lxm.mixStafford13(seed + (channel + 1L) * Lxm.GOLDEN_RATIO_64);
    }

    /**
     * L64X128MixRandom: LCG64 + xoroshiro128 (v1.0) + lea64 mixing, seeded as the JDK seeds it.
     * Implements {@link RandomGenerator} so that the interface's default {@code nextGaussian()}
     * (the JDK's ziggurat, drawing from {@link #nextLong()}) gives exactly the JDK's samples.
     */
    private static final class Lxm implements RandomGenerator {
        static final long GOLDEN_RATIO_64 = 0x9e3779b97f4a7c15L;
        static final long SILVER_RATIO_64 = 0x6a09e667f3bcc909L;
        private static final long M = 0xd1342543de82ef95L;

        private long a;
        private long s;
        private long x0;
        private long x1;

        Lxm(long a, long s, long x0, long x1) {
            this.a = a | 1;
            this.s = s;
            this.x0 = x0;
            this.x1 = x1;
            if ((x0 | x1) == 0) {
                this.x0 = GOLDEN_RATIO_64;
                this.x1 = SILVER_RATIO_64;
            }
        }

        static Lxm seeded(long seed) {
            long t = seed ^ SILVER_RATIO_64;
            return new Lxm(mixMurmur64(t), 1, mixStafford13(t), mixStafford13(t + GOLDEN_RATIO_64));
        }

        Lxm copy() {
            Lxm c = new Lxm(a, s, x0, x1);
            c.setFrom(this);
            return c;
        }

        void setFrom(Lxm o) {
            a = o.a;
            s = o.s;
            x0 = o.x0;
            x1 = o.x1;
        }

        @Override
        public long nextLong() {
            final long result = mixLea64(s + x0);
            s = M * s + a;
            long q0 = x0;
            long q1 = x1 ^ q0;
            q0 = Long.rotateLeft(q0, 24) ^ q1 ^ (q1 << 16);
            q1 = Long.rotateLeft(q1, 37);
            x0 = q0;
            x1 = q1;
            return result;
        }

        static long mixLea64(long z) {
            z = (z ^ (z >>> 32)) * 0xdaba0b6eb09322e3L;
            z = (z ^ (z >>> 32)) * 0xdaba0b6eb09322e3L;
            return z ^ (z >>> 32);
        }

        static long mixMurmur64(long z) {
            z = (z ^ (z >>> 33)) * 0xff51afd7ed558ccdL;
            z = (z ^ (z >>> 33)) * 0xc4ceb9fe1a85ec53L;
            return z ^ (z >>> 33);
        }

        static long mixStafford13(long z) {
            z = (z ^ (z >>> 30)) * 0xbf58476d1ce4e5b9L;
            z = (z ^ (z >>> 27)) * 0x94d049bb133111ebL;
            return z ^ (z >>> 31);
        }
    }
}

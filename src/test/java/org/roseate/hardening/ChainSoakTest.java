package org.roseate.hardening;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.lang.management.ManagementFactory;
import java.lang.management.MemoryMXBean;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.roseate.circuit.DesignReader;
import org.roseate.digital.OversampledFilter;
import org.roseate.digital.SosFilter;
import org.roseate.model.CircuitModel;
import org.roseate.model.Zpk;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;

/**
 * Soak test of the streaming chain: each preset's zpk (through {@link CircuitModel}) rendered by
 * {@link NoiseChain} at 48 kHz stereo in blocks, checked for non-finite and subnormal samples,
 * allocation and heap growth, and bit-identical output for identical seeds.
 *
 * <p>Bounded for CI: {@value #DEFAULT_SECONDS} s of audio for bench-pink, a twentieth of that for the
 * other presets and a sixtieth (three times) for the seed check. {@code -Droseate.soak.seconds=14400}
 * runs four hours of bench-pink audio and scales the rest alike.
 */
class ChainSoakTest {
    static final double DEFAULT_SECONDS = 600;
    private static final double SECONDS = Double.parseDouble(System.getProperty("roseate.soak.seconds",
            String.valueOf(DEFAULT_SECONDS)));
    private static final int RATE_HZ = 48000;
    private static final int CHANNELS = 2;
    /** Odd on purpose, so block and internal-chunk boundaries never line up (STYLE: any n). */
    private static final int BLOCK_FRAMES = 1000 + 1;

    static Stream<Path> presets() throws Exception {
        return Files.list(Path.of("presets")).filter(p -> p.toString().endsWith(".json")).sorted();
    }

    static Zpk zpk(Path preset) {
        return CircuitModel.of(DesignReader.read(preset), preset.getFileName().toString()).zpk();
    }

    static NoiseChain chain(Path preset, long seed) {
        return NoiseChain.design(zpk(preset), new ChainSettings(RATE_HZ, CHANNELS, false, seed, -20));
    }

    /** What a stretch of rendering saw. */
    record Soak(long frames, long nonFinite, long subnormal, long hash, double rms, long allocatedBytes) {
    }

    /**
     * Renders {@code seconds} of audio in blocks; hashes every sample's bits in order. The hash is a
     * 64-bit multiply–xorshift mix (common practice; equality of two streams is what matters).
     */
    static Soak soak(NoiseChain chain, double seconds) {
        long frames = Math.round(seconds * RATE_HZ);
        double[] buf = new double[BLOCK_FRAMES * CHANNELS];
        long nonFinite = 0;
        long subnormal = 0;
        long h = 0x243F6A8885A308D3L;
        double sumSq = 0;
        long allocated0 = allocatedBytes();
        for (long done = 0; done < frames; ) {
            int n = (int) Math.min(BLOCK_FRAMES, frames - done);
            chain.render(buf, n);
            for (int i = 0; i < n * CHANNELS; i++) {
                double v = buf[i];
                if (!Double.isFinite(v)) {
                    nonFinite++;
                } else if (v != 0 && Math.abs(v) < Double.MIN_NORMAL) {
                    subnormal++;
                }
                sumSq += v * v;
                h = (h ^ Double.doubleToRawLongBits(v)) * 0x9E3779B97F4A7C15L;
                h ^= h >>> 31;
            }
            done += n;
        }
        long allocated = allocatedBytes() - allocated0;
        return new Soak(frames, nonFinite, subnormal, h, Math.sqrt(sumSq / (frames * CHANNELS)), allocated);
    }

    private static long allocatedBytes() {
        var bean = ManagementFactory.getThreadMXBean();
        if (bean instanceof com.sun.management.ThreadMXBean sun && sun.isThreadAllocatedMemorySupported()) {
            return sun.getThreadAllocatedBytes(Thread.currentThread().getId());
        }
        return 0;
    }

    private static long heapUsedAfterGc() throws InterruptedException {
        MemoryMXBean mem = ManagementFactory.getMemoryMXBean();
        long best = Long.MAX_VALUE;
        for (int i = 0; i < 3; i++) {
            System.gc();
            Thread.sleep(20);
            best = Math.min(best, mem.getHeapMemoryUsage().getUsed());
        }
        return best;
    }

    @ParameterizedTest
    @MethodSource("presets")
    void longRenderStaysFiniteNormalAndFlat(Path preset) throws Exception {
        String name = preset.getFileName().toString();
        double seconds = name.equals("bench-pink.json") ? SECONDS : SECONDS / 20;
        NoiseChain chain = chain(preset, 42);
        soak(chain, 1); // warm-up: class loading and JIT allocate, the steady state must not
        long heapBefore = heapUsedAfterGc();
        Soak s = soak(chain, seconds);
        long heapAfter = heapUsedAfterGc();

        assertEquals(0, s.nonFinite(), preset + ": NaN or infinite samples");
        assertEquals(0, s.subnormal(), preset + ": subnormal output samples");
        // -20 dBFS RMS = 0.1 × full-scale-sine RMS (AES17: sine peak 1 ⇒ RMS 1/√2); over minutes the
        // estimate is within 0.1 dB (long-run average of a stationary signal, common practice)
        // (random-voltage is skipped: its power lies below 1.6 Hz, so half a minute holds only about a
        // hundred independent values and the estimate scatters by ±0.5 dB)
        if (!name.equals("random-voltage.json")) {
            assertEquals(-20, 20 * Math.log10(s.rms() * Math.sqrt(2)), 0.1, preset + ": level drifted");
        }
        // render allocates nothing; the allowance covers the JIT's deoptimisation and MXBean calls
        assertTrue(s.allocatedBytes() < 256 * 1024, preset + ": render allocated " + s.allocatedBytes() + " bytes over "
                + s.frames() + " frames");
        // heap after GC is flat within 4 MB (headroom for surefire's own reporting thread, common practice)
        assertTrue(Math.abs(heapAfter - heapBefore) < 4L << 20,
                preset + ": heap after GC went from " + heapBefore + " to " + heapAfter + " bytes");
    }

    @ParameterizedTest
    @MethodSource("presets")
    void identicalSeedsGiveIdenticalStreams(Path preset) {
        double seconds = SECONDS / 60;
        Soak a = soak(chain(preset, 7), seconds);
        Soak b = soak(chain(preset, 7), seconds);
        Soak c = soak(chain(preset, 8), seconds);
        assertEquals(a.hash(), b.hash(), preset + ": the same seed gave a different stream");
        assertNotEquals(a.hash(), c.hash(), preset + ": another seed gave the same stream (the hash sees nothing)");
    }

    /**
     * Exact silence after noise: each preset's filter (at its oversampled rate) runs noise, then a
     * long stretch of zeros, then noise again. No output sample may be subnormal, and the silent
     * output must reach exact zero, which shows the state was flushed rather than left decaying
     * through the subnormal range (SosFilter's denormal guard; the decimator is FIR and empties).
     */
    @ParameterizedTest
    @MethodSource("presets")
    void silenceAfterNoiseFlushesToExactZeroWithoutSubnormals(Path preset) {
        OversampledFilter f = chain(preset, 1).filter().orElseThrow();
        int m = f.factor();
        SosFilter sections = new SosFilter(f.sections());
        OversampledFilter.Runtime runtime = f.newRuntime();
        SplittableRandom rng = new SplittableRandom(99);
        double[] in = new double[BLOCK_FRAMES * m];
        double[] sectionsOut = new double[in.length];
        double[] out = new double[BLOCK_FRAMES];
        long subnormal = 0;
        int second = RATE_HZ / BLOCK_FRAMES; // blocks in about 1 s
        int maxSilence = 120 * second; // far past the slowest pole's decay to 1e-200 at these rates
        int silentToZero = -1;
        int schedule = second + maxSilence + second;
        for (int block = 0, silentBlocks = 0; block < schedule; block++) {
            boolean silent = block >= second && block < schedule - second;
            for (int i = 0; i < in.length; i++) {
                in[i] = silent ? 0.0 : rng.nextDouble(-1, 1);
            }
            sections.process(in, sectionsOut, in.length);
            runtime.process(in, out, BLOCK_FRAMES);
            subnormal += countSubnormal(sectionsOut) + countSubnormal(out);
            if (silent) {
                boolean zero = allZero(sectionsOut) && allZero(out);
                if (silentToZero >= 0) {
                    assertTrue(zero, preset + ": output left exact zero during silence");
                } else if (zero) {
                    silentToZero = silentBlocks;
                    schedule = block + 2 * second; // one more second of silence, then noise again
                }
                silentBlocks++;
            }
        }
        assertEquals(0, subnormal, preset + ": subnormal samples in the filter output");
        assertTrue(silentToZero >= 0, preset + ": output never reached exact zero in " + maxSilence + " blocks of silence");
    }

    private static long countSubnormal(double[] x) {
        long n = 0;
        for (double v : x) {
            if (v != 0 && Math.abs(v) < Double.MIN_NORMAL) {
                n++;
            }
        }
        return n;
    }

    private static boolean allZero(double[] x) {
        for (double v : x) {
            if (v != 0) {
                return false;
            }
        }
        return true;
    }

    /** The checks can fail: a subnormal value is counted as one (guards the counting itself). */
    @Test
    void subnormalCounterSeesSubnormals() {
        assertEquals(1, countSubnormal(new double[] {0.0, Double.MIN_VALUE, Double.MIN_NORMAL, 1.0}));
    }
}

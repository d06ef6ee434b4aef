package org.roseate.spectrum;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.lang.management.ManagementFactory;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The Welch path's contract: {@link WelchEstimator#accept} allocates nothing on the calling thread and
 * starts no other threads' work, also for segments long enough that JTransforms would by default split
 * the transform over a thread pool (above 8192 points, ConcurrencyUtils' threshold, common practice of
 * that library). Allocation is read from the JVM's per-thread allocation counter
 * (com.sun.management.ThreadMXBean), which counts every byte of every object the thread allocates.
 * The contract covers power-of-two segment lengths (see WelchCore); other lengths are documented to allocate.
 */
class WelchAllocationTest {
    private static long allocatedBytes() {
        var bean = ManagementFactory.getThreadMXBean();
        if (bean instanceof com.sun.management.ThreadMXBean sun && sun.isThreadAllocatedMemorySupported()) {
            return sun.getThreadAllocatedBytes(Thread.currentThread().getId());
        }
        return -1;
    }

    @ParameterizedTest(name = "segment {0}")
    @ValueSource(ints = {4096, 131072, 1 << 20})
    void acceptAllocatesNothing(int segment) {
        Assumptions.assumeTrue(allocatedBytes() >= 0, "this JVM does not count allocations per thread");
        WelchEstimator w = new WelchEstimator();
        w.prepare(48000, WelchSettings.of(segment));
        double[] block = new double[4096];
        SplittableRandom rnd = new SplittableRandom(3);
        for (int i = 0; i < block.length; i++) {
            block[i] = rnd.nextGaussian();
        }
        // Warm up: several segments, so every path has run (and been compiled) at least once.
        for (int i = 0; i < 6 * segment / block.length + 8; i++) {
            w.accept(block, 0, block.length);
        }
        long before = allocatedBytes();
        long after = allocatedBytes();
        long counterCost = after - before;
        before = allocatedBytes();
        for (int i = 0; i < 8 * segment / block.length + 8; i++) {
            w.accept(block, 0, block.length);
        }
        after = allocatedBytes();
        assertEquals(0, after - before - counterCost, "bytes allocated while transforming segments of " + segment);
    }
}

package org.roseate.bench;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.roseate.noise.NoiseChain;
import org.roseate.spectrum.WelchEstimator;
import org.roseate.spectrum.WelchSettings;

/**
 * The performance target's case: the eight-section chain (8× oversampled) at 48 kHz stereo plus
 * what the measuring window runs beside playback, two exponential Welch estimators (8192 points,
 * Hann, 50 %) fed both channels and ten snapshots per second (display rate). One operation is one
 * second of audio: ms/op ÷ 1000 is the fraction of one core.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class LiveChainBench {
    private static final int BLOCK = ChainBench.BLOCK;
    private static final int FRAMES_PER_SECOND = ChainBench.FRAMES_PER_SECOND;

    private NoiseChain chain;
    private double[] buf;
    private WelchEstimator left;
    private WelchEstimator right;

    @Setup
    public void setup() {
        chain = BenchData.eightSectionChain();
        buf = new double[BLOCK * 2];
        WelchSettings w = WelchSettings.of(8192).exponential(8);
        left = new WelchEstimator();
        right = new WelchEstimator();
        left.prepare(FRAMES_PER_SECOND, w);
        right.prepare(FRAMES_PER_SECOND, w);
    }

    @Benchmark
    public double eightSectionsWithLiveAnalyzer() {
        double acc = 0;
        int sinceSnapshot = 0;
        for (int done = 0; done < FRAMES_PER_SECOND; done += BLOCK) {
            int n = Math.min(BLOCK, FRAMES_PER_SECOND - done);
            chain.render(buf, n);
            left.acceptInterleaved(buf, n, 2, 0);
            right.acceptInterleaved(buf, n, 2, 1);
            sinceSnapshot += n;
            if (sinceSnapshot >= FRAMES_PER_SECOND / 10) {
                sinceSnapshot -= FRAMES_PER_SECOND / 10;
                acc += left.snapshot().densityAt(10) + right.snapshot().densityAt(10);
            }
        }
        return acc;
    }
}

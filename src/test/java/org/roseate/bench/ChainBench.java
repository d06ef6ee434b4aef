package org.roseate.bench;

import java.nio.file.Path;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.roseate.circuit.DesignReader;
import org.roseate.model.CircuitModel;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;

/**
 * (c) The full chain, {@link NoiseChain#render}, at 48 kHz stereo (independent channels) for each
 * preset and for the eight-section design. One operation renders one second of audio (48 000
 * frames, in 512-frame blocks as a playback thread would), so the score in ms/op divided by 1000 is
 * the fraction of one core the chain needs.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class ChainBench {
    static final int BLOCK = 512;
    static final int FRAMES_PER_SECOND = 48000;

    @Param({"bench-pink", "wide-pink", "passive-pink", "random-voltage", "eight-sections"})
    public String design;

    private NoiseChain chain;
    private double[] buf;

    @Setup
    public void setup() {
        ChainSettings s = new ChainSettings(FRAMES_PER_SECOND, 2, false, 1, -20);
        chain = design.equals("eight-sections") ? BenchData.eightSectionChain()
                : NoiseChain.design(CircuitModel.of(DesignReader.read(Path.of("presets", design + ".json")), design).zpk(), s);
        buf = new double[BLOCK * 2];
    }

    @Benchmark
    public double oneSecondStereo() {
        double acc = 0;
        for (int done = 0; done < FRAMES_PER_SECOND; done += BLOCK) {
            int n = Math.min(BLOCK, FRAMES_PER_SECOND - done);
            chain.render(buf, n);
            acc += buf[0];
        }
        return acc;
    }
}

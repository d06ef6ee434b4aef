package org.roseate.bench;

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
import org.roseate.spectrum.SpectralDensity;
import org.roseate.spectrum.WelchEstimator;
import org.roseate.spectrum.WelchSettings;

/**
 * (b) {@link WelchEstimator#accept} of the shared 2^20-sample signal and one
 * {@link WelchEstimator#snapshot}, with scipy.signal.welch's defaults (Hann, nperseg 8192,
 * noverlap 4096, constant detrend, mean): the same work as
 * scipy.signal.welch(x, fs=48000, nperseg=8192). Score: ms per whole estimate.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class WelchBench {
    @Param("target/bench-data")
    public String dataDir;

    /** Segment length in points (default the shared {@code BenchData.WELCH_SEGMENT}). */
    @Param("8192")
    public int segment;

    /**
     * Transform segments on several threads ({@code WelchEstimator.transformInParallel}, as file
     * measurements do); e.g. {@code -p segment=65536 -p parallel=false,true}.
     */
    @Param("false")
    public boolean parallel;

    private double[] x;
    private WelchEstimator welch;

    @Setup
    public void setup() throws Exception {
        x = BenchData.signal(java.nio.file.Path.of(dataDir));
        welch = new WelchEstimator();
        welch.prepare(BenchData.RATE_HZ, WelchSettings.of(segment));
        welch.transformInParallel(parallel);
    }

    @Benchmark
    public SpectralDensity welch() {
        welch.reset();
        welch.accept(x, 0, x.length);
        return welch.snapshot();
    }
}

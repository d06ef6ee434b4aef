package org.roseate.bench;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.roseate.digital.SosDesign;
import org.roseate.digital.SosFilter;

/**
 * (a) The running cascade: {@link SosFilter#process} over the shared 2^20-sample signal through
 * the eight sections of {@link BenchData#EIGHT_SECTION_DESIGN}, the same call shape as
 * scipy.signal.sosfilt(sos, x). One JMH operation = one sample through one section, so the score
 * is section-samples per microsecond.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.MICROSECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class SosCascadeBench {
    /** Where BenchData wrote the shared signal (falls back to regenerating it). */
    @Param("target/bench-data")
    public String dataDir;

    private double[] in;
    private double[] out;
    private SosFilter filter;

    @Setup
    public void setup() throws Exception {
        in = BenchData.signal(java.nio.file.Path.of(dataDir));
        out = new double[in.length];
        SosDesign sos = BenchData.eightSections();
        if (sos.sections().size() != 8) {
            throw new IllegalStateException("expected 8 sections, found " + sos.sections().size());
        }
        filter = new SosFilter(sos);
    }

    @Benchmark
    @OperationsPerInvocation(8 * BenchData.SIGNAL_SAMPLES)
    public double[] cascade() {
        filter.process(in, out, in.length);
        return out;
    }
}

package org.roseate.bench;

import java.io.OutputStream;
import java.io.PrintWriter;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.roseate.cli.RoseateCommand;

/**
 * (d) {@code roseate analyze presets/bench-pink.json} end to end in process (read, model, bands,
 * formatting), output discarded. The JVM start of {@code java -jar} is timed separately by
 * {@code compare-with-scipy.sh} with hyperfine.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 1)
@Measurement(iterations = 5, time = 1)
@Fork(1)
public class AnalyzeCliBench {
    private final PrintWriter sink = new PrintWriter(OutputStream.nullOutputStream());

    @Benchmark
    public int analyzeBenchPink() {
        int status = RoseateCommand.run(sink, sink, "analyze", "presets/bench-pink.json");
        if (status != 0) {
            throw new IllegalStateException("analyze exited with " + status);
        }
        return status;
    }
}

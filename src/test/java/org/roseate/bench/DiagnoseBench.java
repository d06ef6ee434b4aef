package org.roseate.bench;

import java.io.OutputStream;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.cli.RoseateCommand;
import org.roseate.bands.BandFraction;
import org.roseate.bands.BandTable;
import org.roseate.compare.FrequencyRange;
import org.roseate.diagnose.CaptureGrid;
import org.roseate.diagnose.Diagnoser;
import org.roseate.diagnose.Diagnosis;
import org.roseate.diagnose.MeasuredResponse;
import org.roseate.diagnose.PartPrior;
import org.roseate.diagnose.SyntheticCapture;
import org.roseate.measure.FileMeasure;
import org.roseate.measure.MeasureRequest;

/**
 * Issue 16, speed: {@code diagnose} of a 10-part design (presets/passive-pink.json, two parts moved)
 * from a 60 s, 48 kHz two-channel transfer capture. {@code solver} times the estimation alone on the
 * capture's measured response (magnitude and phase); {@code wholeCommand} the command in process
 * (read the WAV through the measurement core, solve, format). Target: under 5 s for the whole command.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 2, time = 1)
@Measurement(iterations = 3, time = 1)
@Fork(1)
public class DiagnoseBench {
    private static final Path DESIGN = Path.of("presets/passive-pink.json");
    private static final int RATE_HZ = 48000;
    private static final int SEGMENT = 8192;
    private final PrintWriter sink = new PrintWriter(OutputStream.nullOutputStream());
    private Path capture;
    private Design design;
    private List<PartPrior> priors;
    private MeasuredResponse measured;

    /** Writes the benchmark's capture to {@code args[0]} for the whole-process timing (whole-process.sh). */
    public static void main(String[] args) throws Exception {
        Design d = DesignReader.read(DESIGN);
        SyntheticCapture.write(Path.of(args[0]), d.withValues(Map.of("R4", 6800 * 0.8, "C3", 33e-9 * 1.2)), RATE_HZ, 22,
                true, 0.01, 42, 60 * RATE_HZ);
    }

    @Setup(Level.Trial)
    public void setUp() throws Exception {
        design = DesignReader.read(DESIGN);
        priors = PartPrior.of(design, Map.of());
        capture = Files.createTempFile("roseate-diagnose-bench-", ".wav");
        SyntheticCapture.write(capture, design.withValues(Map.of("R4", 6800 * 0.8, "C3", 33e-9 * 1.2)), RATE_HZ, 22,
                true, 0.01, 42, 60 * RATE_HZ);
        // The capture's response as the command reads it: through the measurement core.
        double[] band = CaptureGrid.band(RATE_HZ, SEGMENT);
        MeasureRequest q = MeasureRequest.transfer(BandTable.of(BandFraction.OCTAVE, band[0] * 16, band[1]),
                new FrequencyRange(band[0], band[1]), null, 0, 1).withSegmentLength(SEGMENT)
                .withResponseHz(CaptureGrid.points(RATE_HZ, SEGMENT));
        measured = MeasuredResponse.of(FileMeasure.run(capture, q), "bench");
    }

    @TearDown(Level.Trial)
    public void tearDown() throws Exception {
        Files.deleteIfExists(capture);
    }

    @Benchmark
    public Diagnosis solver() {
        return Diagnoser.diagnose(design, "passive-pink.json", priors, measured, Diagnoser.DEFAULT_CONFIDENCE);
    }

    @Benchmark
    public int wholeCommand() {
        int status = RoseateCommand.run(sink, sink, "diagnose", DESIGN.toString(), capture.toString(),
                "--reference-channel", "1");
        if (status != 0) {
            throw new IllegalStateException("diagnose exited with " + status);
        }
        return status;
    }
}
